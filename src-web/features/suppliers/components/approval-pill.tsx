import type { ApprovalStatus } from '@shared/schemas/master-data';
import { StatusPill, type Tone } from '../../../components/status-pill';

export const APPROVAL_LABELS: Record<ApprovalStatus, string> = { approved: 'Approved', conditional: 'Conditional', disapproved: 'Disapproved' };
const TONE: Record<ApprovalStatus, Tone> = { approved: 'ok', conditional: 'pending', disapproved: 'bad' };

export function ApprovalPill({ status, reason }: { status: ApprovalStatus; reason?: string | null }) {
  return <StatusPill tone={TONE[status]} title={reason ?? undefined}>{APPROVAL_LABELS[status]}</StatusPill>;
}
