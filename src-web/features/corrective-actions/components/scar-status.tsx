import { Caption1, tokens } from '@fluentui/react-components';
import { SCAR_STATUS_LABELS, SCAR_STATUS_TONE, STEP_STATUS_LABELS, type ScarStatus, type StepStatus } from '@shared/schemas/corrective-action';
import { StatusPill, type Tone } from '../../../components/status-pill';
import { formatCalendarDay } from '../../../lib/format';

export function ScarStatusPill({ status }: { status: ScarStatus }) {
  return <StatusPill tone={SCAR_STATUS_TONE[status]}>{SCAR_STATUS_LABELS[status]}</StatusPill>;
}

const STEP_TONE: Record<StepStatus, Tone> = { locked: 'neutral', open: 'pending', submitted: 'info', accepted: 'ok', returned: 'bad' };

/** The step's state; `internal` words it for Harrowgate's side ("with the supplier" rather than "to answer"). */
export function StepStatusPill({ status, internal }: { status: StepStatus; internal?: boolean }) {
  const label = internal && status === 'open' ? 'With the supplier' : internal && status === 'returned' ? 'Returned, with the supplier' : STEP_STATUS_LABELS[status];
  return <StatusPill tone={STEP_TONE[status]}>{label}</StatusPill>;
}

/** "Due Mon 5 Jan 2026", red and marked when overdue (words as well as colour). */
export function DueDate({ dueOn, overdue, done }: { dueOn: string | null; overdue: boolean; done?: boolean }) {
  if (!dueOn) return null;
  return (
    <Caption1 style={{ color: overdue ? tokens.colorPaletteRedForeground1 : done ? tokens.colorNeutralForeground3 : undefined, fontWeight: overdue ? 700 : undefined }}>
      {overdue ? 'Overdue: was due ' : 'Due '}
      {formatCalendarDay(dueOn, true)}
    </Caption1>
  );
}
