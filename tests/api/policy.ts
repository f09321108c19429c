/**
 * Who may call what: the authorization policy as one table, independent of the code's @Roles
 * decorators. tests/api/authorization.test.ts calls every route of the OpenAPI document as every
 * role and checks the answer against this table; a route missing here fails that test.
 *
 * `supplier`: how a supplier user's access is scoped on that route —
 *   'own'  it may call the route, and only sees its own company's records (another's → 404)
 *   'none' it is refused (403)
 */
import type { Role } from '../../shared/schemas/auth';

export type Access = 'public' | Role[];
export interface Rule {
  allow: Access;
  supplier?: 'own' | 'none';
  /** A POST that computes and stores nothing (calculators): not a write. */
  pure?: true;
}

const ALL: Role[] = ['inspector', 'engineer', 'supplier', 'auditor', 'admin'];
const INTERNAL: Role[] = ['inspector', 'engineer', 'auditor', 'admin'];
const RECEIVERS: Role[] = ['inspector', 'engineer'];
const ENGINEER: Role[] = ['engineer'];
const QUALITY_READ: Role[] = ['inspector', 'engineer', 'auditor'];
const RECORD_READ: Role[] = ['auditor', 'engineer', 'admin'];

export const POLICY: Record<string, Rule> = {
  'GET /api/health': { allow: 'public' },
  'GET /api/auth/csrf': { allow: 'public' },
  'POST /api/auth/login': { allow: 'public' },
  'POST /api/auth/logout': { allow: ALL, supplier: 'own' },
  'GET /api/auth/me': { allow: ALL, supplier: 'own' },
  'POST /api/auth/password': { allow: ALL, supplier: 'own' },

  'GET /api/users': { allow: ['admin'] },
  'POST /api/users': { allow: ['admin'] },
  'PATCH /api/users/{id}': { allow: ['admin'] },

  'GET /api/suppliers': { allow: ALL, supplier: 'own' },
  'GET /api/suppliers/{id}': { allow: ALL, supplier: 'own' },
  'POST /api/suppliers': { allow: ENGINEER },
  'PATCH /api/suppliers/{id}': { allow: ENGINEER },
  'GET /api/suppliers/{id}/switching': { allow: ALL, supplier: 'own' },
  'POST /api/suppliers/{id}/switching/resume': { allow: ENGINEER },
  'POST /api/suppliers/{id}/switching/approve-reduced': { allow: ENGINEER },

  'GET /api/parts': { allow: ALL, supplier: 'own' },
  'GET /api/parts/{id}': { allow: ALL, supplier: 'own' },
  'POST /api/parts': { allow: ENGINEER },
  'PATCH /api/parts/{id}': { allow: ENGINEER },
  'POST /api/parts/{id}/drawing': { allow: ENGINEER },
  'GET /api/parts/{id}/drawing': { allow: INTERNAL },

  'GET /api/gauges': { allow: INTERNAL },
  'GET /api/gauges/{id}': { allow: INTERNAL },
  'POST /api/gauges': { allow: ENGINEER },
  'PATCH /api/gauges/{id}': { allow: ENGINEER },

  'GET /api/plans': { allow: INTERNAL },
  'GET /api/plans/{id}': { allow: INTERNAL },
  'GET /api/plans/{id}/changes': { allow: INTERNAL },
  'POST /api/plans': { allow: ENGINEER },
  'PATCH /api/plans/{id}': { allow: ENGINEER },
  'POST /api/plans/{id}/activate': { allow: ENGINEER },
  'POST /api/plans/{id}/revise': { allow: ENGINEER },
  'GET /api/plan-templates': { allow: INTERNAL },
  'POST /api/plans/from-template': { allow: ENGINEER },

  'GET /api/sampling/plan': { allow: INTERNAL },
  'POST /api/calc/circle-fit': { allow: INTERNAL, pure: true },
  'POST /api/calc/eccentricity': { allow: INTERNAL, pure: true },
  'POST /api/calc/stacking-factor': { allow: INTERNAL, pure: true },
  'POST /api/calc/stacking-factor/by-count': { allow: INTERNAL, pure: true },
  'POST /api/calc/insulation': { allow: INTERNAL, pure: true },

  'POST /api/lots': { allow: RECEIVERS },
  'GET /api/lots': { allow: ALL, supplier: 'own' },
  'GET /api/lots/{id}': { allow: ALL, supplier: 'own' },
  'GET /api/lots/{id}/proposal': { allow: QUALITY_READ },
  'PUT /api/lots/{id}/readings': { allow: RECEIVERS },
  'POST /api/lots/{id}/decision': { allow: RECEIVERS },
  'POST /api/lots/{id}/photos': { allow: RECEIVERS },
  'POST /api/lots/{id}/certificate': { allow: RECEIVERS },
  'GET /api/lots/{id}/certificate': { allow: INTERNAL },
  'POST /api/lots/{id}/imports': { allow: RECEIVERS },
  'GET /api/photos/{id}': { allow: ALL, supplier: 'own' },
  'GET /api/photos/{id}/thumbnail': { allow: ALL, supplier: 'own' },

  'GET /api/spc/watch': { allow: QUALITY_READ },
  'GET /api/spc/charts': { allow: QUALITY_READ },
  'POST /api/spc/limits': { allow: ENGINEER },
  'POST /api/spc/signals/{id}/ack': { allow: ENGINEER },
  'POST /api/spc/analyze': { allow: QUALITY_READ, pure: true },

  'GET /api/audit-events': { allow: RECORD_READ },
  'GET /api/audit-events/verify': { allow: RECORD_READ },

  'GET /api/ledger/lots/{id}': { allow: RECORD_READ },
  'GET /api/exports/lots.csv': { allow: RECORD_READ },
  'GET /api/exports/readings.csv': { allow: RECORD_READ },
  'GET /api/exports/audit-events.csv': { allow: RECORD_READ },
  'GET /api/exports/lots/{id}/report.pdf': { allow: RECORD_READ },
  'GET /api/exports/ncrs.csv': { allow: RECORD_READ },
  'GET /api/exports/corrective-actions.csv': { allow: RECORD_READ },
  'GET /api/exports/ncrs/{id}/report.pdf': { allow: RECORD_READ },
  'GET /api/exports/corrective-actions/{id}/report.pdf': { allow: RECORD_READ },

  'GET /api/scorecards': { allow: ['engineer', 'auditor', 'admin', 'supplier'], supplier: 'own' },
  'GET /api/scorecards/{supplierId}': { allow: ['engineer', 'auditor', 'admin', 'supplier'], supplier: 'own' },
  'GET /api/dashboard': { allow: ALL, supplier: 'own' },

  'GET /api/ncrs': { allow: ALL, supplier: 'own' },
  'POST /api/ncrs': { allow: RECEIVERS },
  'GET /api/ncrs/held-lots': { allow: INTERNAL },
  'GET /api/ncrs/{id}': { allow: ALL, supplier: 'own' },
  'PATCH /api/ncrs/{id}': { allow: RECEIVERS },
  'POST /api/ncrs/{id}/transition': { allow: ENGINEER },
  'POST /api/ncrs/{id}/dispositions': { allow: ENGINEER },
  'GET /api/ncrs/{id}/hold-tag': { allow: INTERNAL },
  'GET /api/ncrs/{id}/qr.svg': { allow: INTERNAL },
  'POST /api/ncrs/{id}/photos': { allow: RECEIVERS },
  'POST /api/ncrs/{id}/photo-links': { allow: RECEIVERS },
  'GET /api/ncrs/{id}/photos/{photoId}': { allow: ALL, supplier: 'own' },
  'GET /api/ncrs/{id}/photos/{photoId}/thumbnail': { allow: ALL, supplier: 'own' },
  'GET /api/defect-codes': { allow: ALL, supplier: 'own' },
  'POST /api/defect-codes': { allow: ENGINEER },
  'PATCH /api/defect-codes/{id}': { allow: ENGINEER },
  'GET /api/corrective-actions': { allow: ALL, supplier: 'own' },
  'POST /api/corrective-actions': { allow: ENGINEER },
  'GET /api/corrective-actions/open-steps': { allow: ['engineer', 'supplier'], supplier: 'own' },
  'GET /api/corrective-actions/{id}': { allow: ALL, supplier: 'own' },
  'POST /api/corrective-actions/{id}/transition': { allow: ['engineer', 'supplier'], supplier: 'own' },
  'PUT /api/corrective-actions/{id}/steps/{step}': { allow: ['supplier'], supplier: 'own' },
  'POST /api/corrective-actions/{id}/steps/{step}/review': { allow: ENGINEER },
  'POST /api/corrective-actions/{id}/steps/{step}/evidence': { allow: ['supplier', 'engineer'], supplier: 'own' },
  'GET /api/corrective-actions/{id}/evidence/{evidenceId}': { allow: ALL, supplier: 'own' },
  'GET /api/supplier-notices': { allow: ALL, supplier: 'own' },
  'GET /api/mail/outbox': { allow: RECORD_READ },
  'POST /api/mail/outbox/{id}/retry': { allow: ['engineer', 'admin'] },

  'GET /api/dev/mailbox': { allow: ALL, supplier: 'own' },
};
