import { z } from 'zod';
import { emailSchema } from './auth';
import { pageQuerySchema, text, uuidSchema } from './common';
import { historyEntrySchema } from './ncr';
import { EIGHT_D_STEPS, SCAR_STATUSES, STEP_STATUSES, type EightDStep, type ScarStatus, type StepStatus } from '../compute/workflow';

export { EIGHT_D_STEPS, SCAR_STATUSES, STEP_STATUSES };
export type { EightDStep, ScarStatus, StepStatus };

export const SCAR_STATUS_LABELS: Record<ScarStatus, string> = {
  issued: 'Issued',
  acknowledged: 'Acknowledged',
  'containment-in': 'Containment answered',
  'root-cause-in': 'Root cause answered',
  'actions-in': 'Actions answered',
  accepted: 'Accepted',
  returned: 'Returned to supplier',
  verifying: 'Verifying',
  closed: 'Closed',
};
export const SCAR_STATUS_TONE: Record<ScarStatus, 'bad' | 'pending' | 'ok' | 'info'> = {
  issued: 'pending',
  acknowledged: 'pending',
  'containment-in': 'pending',
  'root-cause-in': 'pending',
  'actions-in': 'info',
  accepted: 'info',
  returned: 'bad',
  verifying: 'info',
  closed: 'ok',
};
export const STEP_STATUS_LABELS: Record<StepStatus, string> = {
  locked: 'Not open yet',
  open: 'To answer',
  submitted: 'Waiting for review',
  accepted: 'Accepted',
  returned: 'Returned',
};

/** The 8D steps (D0 "prepare" is the engineer's issuing of the request). */
export const STEP_INFO: Record<EightDStep, { title: string; purpose: string }> = {
  D1: { title: 'Team', purpose: 'Who works on this at your company: names and roles.' },
  D2: { title: 'Problem', purpose: 'The problem as you understand it: what, where, when, how many.' },
  D3: { title: 'Containment', purpose: 'What protects us now: stock checked at your plant and in transit, and how clean shipments are marked.' },
  D4: { title: 'Root cause', purpose: 'Why it happened (occurrence) and why it was not caught (escape point).' },
  D5: { title: 'Chosen actions', purpose: 'The permanent corrective actions chosen, each with an owner and a date.' },
  D6: { title: 'Implemented and validated', purpose: 'What was done, when, and the evidence that it works.' },
  D7: { title: 'Prevent recurrence', purpose: 'Changes to procedures, FMEA, control plan, and similar processes or dies.' },
  D8: { title: 'Closure', purpose: 'Summary and recognition of the team, after the effectiveness check.' },
};

// ───────── Step answers ─────────
const count = (label: string) => z.number({ message: `${label} must be a number` }).int(`${label} is a whole number`).min(0, `${label} cannot be negative`).max(10_000_000);
const isoDate = (label: string) => z.iso.date({ message: `${label} must be a date like 2026-01-31` });
const checked = z
  .object({ checked: count('cores checked'), nonconforming: count('nonconforming cores') })
  .strict()
  .refine((v) => v.nonconforming <= v.checked, { path: ['nonconforming'], message: 'More nonconforming cores than were checked' });

export const stepAnswerSchemas = {
  D1: z.object({ members: z.array(z.object({ name: text(120, 'name'), role: text(120, 'role') }).strict()).min(1, 'Name at least one team member').max(20) }).strict(),
  D2: z.object({ description: text(4000, 'the problem description') }).strict(),
  D3: z
    .object({
      actions: text(4000, 'the containment actions'),
      atSupplier: checked,
      inTransit: checked,
      cleanMark: z.string().trim().max(200).nullable().optional(),
      effectiveFrom: isoDate('effective from').nullable().optional(),
    })
    .strict(),
  D4: z.object({ rootCause: text(4000, 'the root cause'), escapePoint: text(4000, 'the escape point'), method: z.string().trim().max(200).nullable().optional() }).strict(),
  D5: z.object({ actions: z.array(z.object({ action: text(500, 'the action'), owner: text(120, 'the owner'), dueOn: isoDate('due') }).strict()).min(1, 'Add at least one action').max(20) }).strict(),
  D6: z
    .object({
      actions: z.array(z.object({ action: text(500, 'the action'), owner: text(120, 'the owner'), doneOn: isoDate('done on') }).strict()).min(1, 'Add at least one action').max(20),
      validation: text(4000, 'the validation'),
    })
    .strict(),
  D7: z.object({ prevention: text(4000, 'the prevention') }).strict(),
  D8: z.object({ summary: text(4000, 'the summary') }).strict(),
} satisfies Record<EightDStep, z.ZodType>;
export type StepAnswer<S extends EightDStep> = z.infer<(typeof stepAnswerSchemas)[S]>;

export const stepParamSchema = z.object({ id: uuidSchema, step: z.enum(EIGHT_D_STEPS, { message: 'step must be D1 … D8' }) });

/** A draft may be incomplete; the answer is checked in full on submission. */
export const putStepSchema = z
  .object({
    answer: z.record(z.string(), z.unknown(), { message: 'answer must be an object' }),
    submit: z.boolean({ message: 'submit must be true or false' }),
    version: z.number({ message: 'version is required' }).int(),
  })
  .strict();
export type PutStepInput = z.infer<typeof putStepSchema>;

export const reviewStepSchema = z
  .object({
    decision: z.enum(['accept', 'return'], { message: 'decision must be accept or return' }),
    comment: z.string().trim().max(2000).nullable().optional(),
    version: z.number({ message: 'version is required' }).int(),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.decision === 'return' && !v.comment) ctx.addIssue({ code: 'custom', path: ['comment'], message: 'Say what the supplier must change' });
  });
export type ReviewStepInput = z.infer<typeof reviewStepSchema>;

export const scarTransitionSchema = z
  .object({
    to: z.enum(SCAR_STATUSES, { message: `to must be one of ${SCAR_STATUSES.join(', ')}` }),
    version: z.number({ message: 'version is required' }).int(),
    note: z.string().trim().max(2000).nullable().optional(),
  })
  .strict();
export type ScarTransitionInput = z.infer<typeof scarTransitionSchema>;

export const createScarSchema = z
  .object({
    ncrId: uuidSchema,
    title: text(160, 'title').optional(),
    problem: text(4000, 'the problem statement').optional(),
    recipients: z.array(emailSchema).min(1, 'Send it to at least one address').max(10).optional(),
  })
  .strict();
export type CreateScarInput = z.input<typeof createScarSchema>;

export const scarListQuerySchema = pageQuerySchema.extend({
  status: z.union([z.enum(SCAR_STATUSES), z.literal('active')]).optional(),
  supplierId: z.uuid().optional(),
  ncrId: z.uuid().optional(),
  q: z.string().trim().max(60).optional(),
  sort: z.enum(['issuedAt', '-issuedAt', 'number', '-number', 'status', '-status']).optional(),
});
export type ScarListQuery = z.infer<typeof scarListQuerySchema>;

// ───────── Responses ─────────
export const evidenceSchema = z.object({ id: z.string(), step: z.enum(EIGHT_D_STEPS), name: z.string(), contentType: z.string(), bytes: z.number(), caption: z.string().nullable(), createdAt: z.string() });
export type Evidence = z.infer<typeof evidenceSchema>;

export const scarStepSchema = z.object({
  step: z.enum(EIGHT_D_STEPS),
  title: z.string(),
  status: z.enum(STEP_STATUSES),
  answer: z.record(z.string(), z.unknown()).nullable(),
  draft: z.record(z.string(), z.unknown()).nullable(),
  draftSavedAt: z.string().nullable(),
  submittedAt: z.string().nullable(),
  reviewedAt: z.string().nullable(),
  reviewDecision: z.enum(['accept', 'return']).nullable(),
  reviewComment: z.string().nullable(),
  dueOn: z.string().nullable(),
  overdue: z.boolean(),
  version: z.number().int(),
  evidence: z.array(evidenceSchema),
});
export type ScarStep = z.infer<typeof scarStepSchema>;

export const scarSummarySchema = z.object({
  id: z.string(),
  number: z.string(),
  status: z.enum(SCAR_STATUSES),
  title: z.string(),
  supplierId: z.string(),
  supplierCode: z.string(),
  supplierName: z.string(),
  partId: z.string().nullable(),
  partNumber: z.string().nullable(),
  partRevision: z.string().nullable(),
  ncrId: z.string(),
  ncrNumber: z.string(),
  defectCodes: z.array(z.string()),
  issuedAt: z.string(),
  nextDueOn: z.string().nullable(),
  nextDueStep: z.enum(EIGHT_D_STEPS).nullable(),
  overdue: z.boolean(),
  version: z.number().int(),
});
export type ScarSummary = z.infer<typeof scarSummarySchema>;

export const OUTBOX_STATUSES = ['pending', 'sent', 'failed'] as const;
export const outboxMessageSchema = z.object({
  id: z.string(),
  kind: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  status: z.enum(OUTBOX_STATUSES),
  attempts: z.number().int(),
  nextAttemptAt: z.string().nullable(),
  lastError: z.string().nullable(),
  sentAt: z.string().nullable(),
  createdAt: z.string(),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;

export const scarSchema = scarSummarySchema.extend({
  problem: z.string(),
  recipients: z.array(z.string()),
  acknowledgedAt: z.string().nullable(),
  acceptedAt: z.string().nullable(),
  closedAt: z.string().nullable(),
  steps: z.array(scarStepSchema),
  verification: z.object({
    required: z.number().int(),
    passed: z.number().int(),
    lots: z.array(z.object({ lotId: z.string(), ref: z.number().nullable(), at: z.string() })),
    startedAt: z.string().nullable(),
    recurrence: z.object({ lotId: z.string().nullable(), ncrId: z.string().nullable(), ncrNumber: z.string().nullable(), at: z.string() }).nullable(),
  }),
  /** Internal roles only: the mails this request caused and whether they went out. */
  mail: z.array(outboxMessageSchema).nullable(),
  history: z.array(historyEntrySchema).nullable(),
});
export type Scar = z.infer<typeof scarSchema>;

export const outboxListQuerySchema = pageQuerySchema.extend({
  status: z.enum(OUTBOX_STATUSES).optional(),
  entityId: z.uuid().optional(),
});

// ───────── Supplier notices ─────────
export const supplierNoticeSchema = z.object({
  id: z.string(),
  kind: z.enum(['die-service-due']),
  title: z.string(),
  body: z.string(),
  partId: z.string().nullable(),
  partNumber: z.string().nullable(),
  partRevision: z.string().nullable(),
  characteristicCode: z.string().nullable(),
  lotsRemaining: z.number().nullable(),
  createdAt: z.string(),
});
export type SupplierNotice = z.infer<typeof supplierNoticeSchema>;
