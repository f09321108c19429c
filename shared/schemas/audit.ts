import { z } from 'zod';
import { pageQuerySchema } from './common';

export const auditQuerySchema = pageQuerySchema
  .extend({
    entity: z.string().trim().max(40).regex(/^[a-z_]+$/, 'entity is a table name like lot or ncr').optional(),
    entityId: z.string().trim().max(80).optional(),
    actor: z.string().trim().max(254).optional(),
    action: z.string().trim().max(60).optional(),
    from: z.iso.datetime({ offset: true, message: 'from must be a date-time' }).optional(),
    to: z.iso.datetime({ offset: true, message: 'to must be a date-time' }).optional(),
    sort: z.enum(['at', '-at']).optional(),
  })
  .strict()
  .refine((q) => !q.from || !q.to || q.from <= q.to, { path: ['to'], message: 'The end of the range is before its start' });

export const auditEventSchema = z.object({
  id: z.number(),
  actorId: z.string().nullable(),
  actorEmail: z.string().nullable(),
  at: z.string(),
  action: z.string(),
  entity: z.string(),
  entityId: z.string(),
  before: z.unknown(),
  after: z.unknown(),
  reason: z.string().nullable(),
  hash: z.string(),
  prevHash: z.string().nullable(),
});
export type AuditEvent = z.infer<typeof auditEventSchema>;

export const auditVerifySchema = z.object({ ok: z.boolean(), count: z.number(), firstBrokenId: z.number().optional(), checkedAt: z.string() });
export type AuditVerify = z.infer<typeof auditVerifySchema>;
