import type { ReadingInput } from '@shared/schemas/receiving';
import { api } from '../../../lib/api-client';

/** PUT /api/lots/:id/readings — idempotent per core × characteristic, so a resend after a lost reply is safe. */
export const putReadings = (lotId: string, readings: ReadingInput[]) => api<{ saved: number }>(`/lots/${lotId}/readings`, { method: 'PUT', body: { readings } });
