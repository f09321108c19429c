import type { Construction } from '@shared/schemas/master-data';

export const CONSTRUCTION_LABELS: Record<Construction, string> = {
  welded: 'Welded',
  interlocked: 'Interlocked',
  bonded: 'Bonded',
  cleated: 'Cleated',
  riveted: 'Riveted',
  segmented: 'Segmented',
};
