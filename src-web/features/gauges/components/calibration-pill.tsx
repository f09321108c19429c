import type { Gauge } from '@shared/schemas/master-data';
import { StatusPill } from '../../../components/status-pill';

/** Matches the API's "due soon" window (gauges.service DUE_SOON_DAYS). */
export const DUE_SOON_DAYS = 30;

const days = (n: number) => `${n} day${n === 1 ? '' : 's'}`;

/** Calibration state in words: "Overdue", "Due in N days" (within 30) or "OK". */
export function calibrationLabel(g: Pick<Gauge, 'dueInDays'>): { tone: 'bad' | 'pending' | 'ok'; label: string } {
  if (g.dueInDays < 0) return { tone: 'bad', label: `Overdue by ${days(-g.dueInDays)}` };
  if (g.dueInDays === 0) return { tone: 'pending', label: 'Due today' };
  if (g.dueInDays <= DUE_SOON_DAYS) return { tone: 'pending', label: `Due in ${days(g.dueInDays)}` };
  return { tone: 'ok', label: 'OK' };
}

export function CalibrationPill({ gauge }: { gauge: Pick<Gauge, 'dueInDays' | 'calibrationDueOn'> }) {
  const { tone, label } = calibrationLabel(gauge);
  return <StatusPill tone={tone} title={`Calibration due on ${gauge.calibrationDueOn}`}>{label}</StatusPill>;
}
