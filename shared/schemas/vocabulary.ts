/**
 * Words the app shows on every page (roles, lot states), kept apart from the zod schemas so that
 * the app's frame and the Dock can show them without loading the validation library: the schema
 * modules import these and re-export them.
 */

export const ROLES = ['inspector', 'engineer', 'supplier', 'auditor', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  inspector: 'Receiving inspector',
  engineer: 'Quality engineer',
  supplier: 'Supplier',
  auditor: 'Auditor',
  admin: 'Administrator',
};

export const LOT_STATUSES = ['received', 'inspecting', 'accepted', 'rejected', 'on-hold', 'released', 'returned', 'scrapped', 'closed'] as const;
export type LotStatus = (typeof LOT_STATUSES)[number];
export const LOT_STATUS_LABELS: Record<LotStatus, string> = {
  received: 'Waiting',
  inspecting: 'Inspecting',
  accepted: 'Accepted',
  rejected: 'Rejected',
  'on-hold': 'On hold',
  released: 'Released',
  returned: 'Returned',
  scrapped: 'Scrapped',
  closed: 'Closed',
};
/** Trade colours: green good, amber waiting or held for a decision, red rejected. */
export const LOT_STATUS_TONE: Record<LotStatus, 'ok' | 'pending' | 'bad' | 'info'> = {
  received: 'info',
  inspecting: 'pending',
  accepted: 'ok',
  rejected: 'bad',
  'on-hold': 'bad',
  released: 'ok',
  returned: 'bad',
  scrapped: 'bad',
  closed: 'info',
};
