import { LOT_STATUS_LABELS, LOT_STATUS_TONE, type LotStatus } from '@shared/schemas/vocabulary';
import { StatusPill } from '../../../components/status-pill';

/** The lot's state in words, coloured as the trade colours it (StatusPill adds a glyph too). */
export function LotStatusPill({ status }: { status: LotStatus }) {
  return <StatusPill tone={LOT_STATUS_TONE[status]}>{LOT_STATUS_LABELS[status]}</StatusPill>;
}

/** Lots still open to readings and a decision. */
export const isOpenLot = (status: LotStatus) => status === 'received' || status === 'inspecting';

/** "12 min", "3 h", "2 d": how long a lot has waited at the dock. */
export function formatAge(fromIso: string, now = Date.now()): string {
  const ms = Math.max(0, now - Date.parse(fromIso));
  const min = Math.floor(ms / 60_000);
  if (min < 60) return `${min} min`;
  const h = Math.floor(min / 60);
  if (h < 48) return `${h} h`;
  return `${Math.floor(h / 24)} d`;
}
