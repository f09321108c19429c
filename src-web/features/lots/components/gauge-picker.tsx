import { Caption1, makeStyles, tokens } from '@fluentui/react-components';
import { GAUGE_KIND_LABELS, type Gauge, type GaugeKind } from '@shared/schemas/master-data';

const useStyles = makeStyles({
  wrap: { display: 'flex', flexDirection: 'column', gap: '2px', minWidth: 0 },
  select: {
    minHeight: '44px',
    width: '100%',
    maxWidth: '100%',
    fontSize: tokens.fontSizeBase300,
    fontFamily: 'inherit',
    padding: '0 10px',
    borderRadius: tokens.borderRadiusMedium,
    border: `1px solid ${tokens.colorNeutralStroke1}`,
    backgroundColor: tokens.colorNeutralBackground1,
    color: tokens.colorNeutralForeground1,
    ':focus-visible': { outline: `2px solid ${tokens.colorBrandStroke1}`, outlineOffset: '1px' },
  },
  missing: { border: `2px solid ${tokens.colorPaletteMarigoldBorder2}` },
  problem: { color: tokens.colorPaletteRedForeground1 },
  muted: { color: tokens.colorNeutralForeground3 },
});

/** A gauge may take readings when it is in service and its calibration is not past due. */
export const usableGauge = (g: Gauge) => g.status === 'in-service' && !g.calibrationOverdue;

export function gaugeOptionLabel(g: Gauge): string {
  if (g.status !== 'in-service') return `${g.assetTag} · out of service`;
  if (g.calibrationOverdue) return `${g.assetTag} · calibration overdue since ${g.calibrationDueOn}`;
  return `${g.assetTag} · ${g.description} · due ${g.calibrationDueOn}`;
}

/**
 * Which gauge measures a characteristic: in-calibration gauges of the kind the plan names are
 * selectable; overdue or out-of-service ones are listed, disabled, with the reason.
 */
export function GaugePicker({ code, kind, gauges, value, onChange, loading, disabled, optional }: {
  code: string;
  /** A visual check may name its aid; nothing is refused without one. */
  optional?: boolean;
  kind: GaugeKind;
  gauges: Gauge[];
  value: string | null;
  onChange: (id: string | null) => void;
  loading?: boolean;
  disabled?: boolean;
}) {
  const s = useStyles();
  const usable = gauges.filter(usableGauge);
  const others = gauges.filter((g) => !usableGauge(g));
  const kindLabel = GAUGE_KIND_LABELS[kind].toLowerCase();
  return (
    <div className={s.wrap}>
      <select
        className={value || optional ? s.select : `${s.select} ${s.missing}`}
        aria-label={`Gauge for ${code} (${kindLabel})`}
        value={value ?? ''}
        disabled={disabled || loading}
        onChange={(e) => onChange(e.target.value || null)}
      >
        <option value="">{loading ? 'Loading gauges…' : optional ? `No ${kindLabel} named (optional)` : usable.length ? `Choose the ${kindLabel}…` : `No ${kindLabel} in calibration`}</option>
        {usable.map((g) => (
          <option key={g.id} value={g.id}>{gaugeOptionLabel(g)}</option>
        ))}
        {others.map((g) => (
          <option key={g.id} value={g.id} disabled>{gaugeOptionLabel(g)}</option>
        ))}
      </select>
      {!loading && usable.length === 0 && !optional ? (
        <Caption1 className={s.problem}>No {kindLabel} is in calibration. Readings need one: ask an engineer to record a calibration.</Caption1>
      ) : others.length && !optional ? (
        <Caption1 className={s.muted}>{others.length} other {others.length === 1 ? 'gauge is' : 'gauges are'} overdue or out of service</Caption1>
      ) : null}
    </div>
  );
}
