import { z } from 'zod';
import { ROLES } from './auth';

/**
 * GET /api/dashboard: the home page's counts, one shape per role. Kept to zod and the role list
 * so the home page (the first page after sign-in) bundles nothing heavy.
 */

/** Gauges falling due within this many days (the Gauges page's "due soon" filter uses the same). */
export const DASHBOARD_GAUGE_DAYS = 30;
/** SCAR steps falling due within this many days. */
export const DASHBOARD_STEP_DAYS = 7;
/** How long one process reuses the audit chain's verification before hashing it again. */
export const CHAIN_STATUS_CACHE_SECONDS = 60;

const dueStepSchema = z.object({
  scarId: z.string(),
  scarNumber: z.string(),
  supplierCode: z.string(),
  step: z.string(),
  title: z.string(),
  dueOn: z.string(),
  overdue: z.boolean(),
});
export type DashboardDueStep = z.infer<typeof dueStepSchema>;

export const inspectorDashboardSchema = z.object({
  role: z.literal('inspector'),
  dock: z.object({
    /** Lots received and not yet decided (received or being inspected): the Dock queue. */
    queue: z.number().int(),
    /** Of those, the ones with inspection under way. */
    inspecting: z.number().int(),
    oldestReceivedAt: z.string().nullable(),
    oldestAgeHours: z.number().nullable(),
  }),
  today: z.object({ date: z.string(), received: z.number().int(), decided: z.number().int(), accepted: z.number().int(), rejected: z.number().int() }),
});

export const engineerDashboardSchema = z.object({
  role: z.literal('engineer'),
  ncrs: z.object({ notClosed: z.number().int(), open: z.number().int(), inReview: z.number().int(), dispositioned: z.number().int(), heldLotsWithoutNcr: z.number().int() }),
  driftSignals: z.object({ open: z.number().int(), latestAt: z.string().nullable() }),
  scarSteps: z.object({ dueSoon: z.number().int(), overdue: z.number().int(), items: z.array(dueStepSchema) }),
  gauges: z.object({
    dueSoon: z.number().int(),
    overdue: z.number().int(),
    items: z.array(z.object({ id: z.string(), assetTag: z.string(), description: z.string(), calibrationDueOn: z.string(), overdue: z.boolean() })),
  }),
});

export const supplierDashboardSchema = z.object({
  role: z.literal('supplier'),
  supplierName: z.string(),
  /** Steps of its open corrective actions that wait on the supplier (open or returned), soonest due first. */
  openSteps: z.array(dueStepSchema.extend({ dueOn: z.string().nullable(), status: z.string() })),
  notices: z.array(z.object({ id: z.string(), title: z.string(), body: z.string(), createdAt: z.string() })),
  lotsOnHold: z.number().int(),
});

export const auditorDashboardSchema = z.object({
  role: z.literal('auditor'),
  recent: z.array(z.object({ id: z.number(), at: z.string(), actorEmail: z.string().nullable(), action: z.string(), entity: z.string(), entityId: z.string(), reason: z.string().nullable() })),
  chain: z.object({
    ok: z.boolean(),
    count: z.number().int(),
    firstBrokenId: z.number().optional(),
    checkedAt: z.string(),
    /** True when this answer reuses a verification less than CHAIN_STATUS_CACHE_SECONDS old. */
    cached: z.boolean(),
  }),
});

export const adminDashboardSchema = z.object({
  role: z.literal('admin'),
  users: z.object({
    total: z.number().int(),
    active: z.number().int(),
    inactive: z.number().int(),
    locked: z.number().int(),
    byRole: z.record(z.enum(ROLES), z.number().int()),
  }),
  lockedAccounts: z.array(z.object({ id: z.string(), email: z.string(), name: z.string(), role: z.enum(ROLES), lockedUntil: z.string() })),
});

export const dashboardSchema = z.discriminatedUnion('role', [inspectorDashboardSchema, engineerDashboardSchema, supplierDashboardSchema, auditorDashboardSchema, adminDashboardSchema]);
export type Dashboard = z.infer<typeof dashboardSchema>;
export type InspectorDashboard = z.infer<typeof inspectorDashboardSchema>;
export type EngineerDashboard = z.infer<typeof engineerDashboardSchema>;
export type SupplierDashboard = z.infer<typeof supplierDashboardSchema>;
export type AuditorDashboard = z.infer<typeof auditorDashboardSchema>;
export type AdminDashboard = z.infer<typeof adminDashboardSchema>;
