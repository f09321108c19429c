import type { Role } from '@shared/schemas/auth';
import { paths } from './paths';

export interface NavItem {
  label: string;
  to: string;
  roles: Role[];
  /** One line telling what the page is for, shown on empty pages and as a tooltip. */
  purpose: string;
}

const internal: Role[] = ['inspector', 'engineer', 'auditor'];

/** Navigation by role, in the order people use it. */
export const NAV: NavItem[] = [
  { label: 'Dock', to: paths.dock, roles: ['inspector', 'engineer', 'auditor'], purpose: 'Lots waiting for inspection, oldest first, and receiving a new lot.' },
  { label: 'Lot file', to: paths.lots, roles: [...internal, 'supplier'], purpose: 'Every lot with its paperwork, sampling, bench sheet, photos and decision.' },
  { label: 'Drift watch', to: paths.drift, roles: internal, purpose: 'Control charts per supplier, part and characteristic, with run-rule flags and the die-wear forecast.' },
  { label: 'Nonconformances', to: paths.ncrs, roles: internal, purpose: 'Held lots, their NCRs and the review board that decides what happens to them.' },
  { label: 'Corrective actions', to: paths.scars, roles: ['engineer', 'auditor'], purpose: 'Supplier corrective action requests, answered step by step in the 8D discipline.' },
  { label: 'Supplier desk', to: paths.supplierDesk, roles: ['supplier'], purpose: 'Your lots, nonconformances, corrective actions and notices from Harrowgate.' },
  { label: 'Scorecards', to: paths.scorecards, roles: ['engineer', 'auditor', 'supplier'], purpose: 'Supplier performance per period: lots, PPM, corrective actions and cost of poor quality.' },
  { label: 'Plans & parts', to: paths.plans, roles: internal, purpose: 'Parts, their inspection plans and revisions.' },
  { label: 'Suppliers', to: paths.suppliers, roles: internal, purpose: 'Stamping suppliers, their contacts and approval status.' },
  { label: 'Gauges', to: paths.gauges, roles: internal, purpose: 'Measuring equipment and calibration due dates.' },
  { label: 'Calculators', to: paths.calculators, roles: internal, purpose: 'Circle fit, eccentricity, stacking factor and insulation resistance, the same maths the bench sheet uses.' },
  { label: 'History ledger', to: paths.ledger, roles: ['auditor', 'engineer', 'admin'], purpose: 'The tamper-evident record of every change, and each lot’s whole story.' },
  { label: 'Admin', to: paths.admin, roles: ['admin'], purpose: 'Users, roles and access.' },
];

export function navFor(role: Role): NavItem[] {
  return NAV.filter((n) => n.roles.includes(role));
}
