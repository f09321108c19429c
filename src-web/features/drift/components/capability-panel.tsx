import { Caption1, MessageBar, MessageBarBody, Subtitle2, makeStyles, tokens } from '@fluentui/react-components';
import type { ChartResponse } from '@shared/schemas/drift';
import { chartColours } from '../../../theme/theme';
import { useThemeMode } from '../../../theme/theme-mode';
import { fmt } from './chart-data';

const useStyles = makeStyles({
  card: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '14px 16px', backgroundColor: tokens.colorNeutralBackground1, display: 'flex', flexDirection: 'column', gap: '10px' },
  indices: { display: 'grid', gridTemplateColumns: 'repeat(5, minmax(0, 1fr))', gap: '8px', margin: 0 },
  dt: { color: tokens.colorNeutralForeground3, fontSize: tokens.fontSizeBase200 },
  dd: { margin: 0, fontWeight: 700, fontSize: tokens.fontSizeBase500, fontVariantNumeric: 'tabular-nums' },
  muted: { color: tokens.colorNeutralForeground3 },
  svg: { width: '100%', height: 'auto', display: 'block' },
});

/** Histogram of the individual measurements against the specification limits (plain SVG). */
function Histogram({ chart }: { chart: ChartResponse }) {
  const s = useStyles();
  const { mode } = useThemeMode();
  const c = chartColours[mode];
  const bins = chart.histogram;
  if (!bins.length) return null;
  const W = 360;
  const H = 150;
  const left = 8;
  const bottom = 22;
  const lo = bins[0].from;
  const hi = bins[bins.length - 1].to;
  const span = hi - lo || 1;
  const x = (v: number) => left + ((v - lo) / span) * (W - 2 * left);
  const top = Math.max(...bins.map((b) => b.count)) || 1;
  const y = (n: number) => H - bottom - (n / top) * (H - bottom - 16);
  const { lsl, usl, unit } = chart.characteristic;
  const limit = (v: number, label: string) => (
    <g key={label}>
      <line x1={x(v)} x2={x(v)} y1={10} y2={H - bottom} stroke={c.spec} strokeWidth={1.6} strokeDasharray="5 3" />
      <text x={x(v)} y={9} textAnchor={x(v) > W - 40 ? 'end' : 'middle'} fontSize={10} fill={c.spec} fontWeight={700}>
        {label} {fmt(v)}
      </text>
    </g>
  );
  const n = bins.reduce((a, b) => a + b.count, 0);
  return (
    <svg className={s.svg} viewBox={`0 0 ${W} ${H}`} role="img" aria-label={`Histogram of ${n} measurements${lsl != null ? `, lower limit ${lsl}` : ''}${usl != null ? `, upper limit ${usl}` : ''}`}>
      {bins.map((b, i) => (
        <rect key={i} x={x(b.from) + 0.5} width={Math.max(0.5, x(b.to) - x(b.from) - 1)} y={y(b.count)} height={H - bottom - y(b.count)} fill={c.bar} opacity={0.85}>
          <title>{`${fmt(b.from)} – ${fmt(b.to)}${unit ? ` ${unit}` : ''}: ${b.count}`}</title>
        </rect>
      ))}
      <line x1={left} x2={W - left} y1={H - bottom} y2={H - bottom} stroke={c.axis} strokeWidth={1} />
      <text x={left} y={H - 6} fontSize={10} fill={c.axis}>{fmt(lo)}</text>
      <text x={W - left} y={H - 6} fontSize={10} fill={c.axis} textAnchor="end">{fmt(hi)}{unit ? ` ${unit}` : ''}</text>
      {lsl != null ? limit(lsl, 'LSL') : null}
      {usl != null ? limit(usl, 'USL') : null}
    </svg>
  );
}

export function CapabilityPanel({ chart }: { chart: ChartResponse }) {
  const s = useStyles();
  const cap = chart.capability;
  const item = (label: string, v: number | null | undefined, hint: string) => (
    <div title={hint}>
      <dt className={s.dt}>{label}</dt>
      <dd className={s.dd}>{v == null ? '—' : fmt(v, 2)}</dd>
    </div>
  );
  return (
    <section className={s.card} aria-label="Capability">
      <Subtitle2 as="h2">Capability</Subtitle2>
      {cap ? (
        <>
          <dl className={s.indices}>
            {item('Cp', cap.cp, 'Potential: (USL − LSL) / 6σ within subgroups')}
            {item('Cpk', cap.cpk, 'Potential, allowing for centring: σ within subgroups')}
            {item('Pp', cap.pp, 'Performance: (USL − LSL) / 6σ overall')}
            {item('Ppk', cap.ppk, 'Performance, allowing for centring: σ overall')}
            <div>
              <dt className={s.dt}>Subgroups</dt>
              <dd className={s.dd}>{cap.subgroups}</dd>
            </div>
          </dl>
          <Caption1 className={s.muted}>
            Mean {fmt(cap.mean)} · σ within {fmt(cap.sigmaWithin)} · σ overall {fmt(cap.sigmaOverall)} · {cap.n} measurements
          </Caption1>
        </>
      ) : null}
      {chart.capabilityWarnings.map((w) => (
        <MessageBar key={w} intent="warning">
          <MessageBarBody>{w}</MessageBarBody>
        </MessageBar>
      ))}
      <Histogram chart={chart} />
    </section>
  );
}
