import { NCR_STATUS_LABELS, NCR_STATUS_TONE, type NcrStatus } from '@shared/schemas/ncr';
import { StatusPill } from '../../../components/status-pill';

export function NcrStatusPill({ status }: { status: NcrStatus }) {
  return <StatusPill tone={NCR_STATUS_TONE[status]}>{NCR_STATUS_LABELS[status]}</StatusPill>;
}

/** Costs as plain amounts with two decimals (the plant's currency is implied, as on its cost reports). */
export const formatMoney = (v: number) => v.toLocaleString(undefined, { minimumFractionDigits: 2, maximumFractionDigits: 2 });
/** A measured value as people read it: at most four decimals, no float noise (77.9497162666 → 77.9497). */
export const formatValue = (v: number | null | undefined) => (v == null ? '' : String(Number(v.toFixed(4))));

/** Audit actions in words for the NCR and SCAR histories. */
export function actionLabel(action: string): string {
  const [, verb = action] = action.split('.');
  const words: Record<string, string> = {
    raised: 'Raised',
    review_started: 'Review started',
    dispositioned: 'Dispositioned (e-signed)',
    closed: 'Closed',
    updated: 'Description corrected',
    photo_added: 'Photo added',
    photos_linked: 'Lot photos linked',
    scar_issued: 'Corrective action issued',
    issued: 'Issued to the supplier',
    acknowledged: 'Acknowledged by the supplier',
    'containment-in': 'Containment answered',
    'root-cause-in': 'Root cause answered',
    'actions-in': 'Actions answered',
    accepted: 'Actions accepted',
    returned: 'Returned to the supplier',
    verifying: 'Effectiveness check started',
    reopened: 'Reopened: the defect returned',
    step_submitted: 'Step submitted',
    step_draft_saved: 'Draft saved',
    step_accepted: 'Step accepted',
    step_returned: 'Step returned',
    evidence_added: 'Evidence added',
    verification_lot: 'A lot passed the effectiveness check',
    recurrence: 'The defect returned',
  };
  return words[verb] ?? verb.replace(/[_-]/g, ' ');
}
