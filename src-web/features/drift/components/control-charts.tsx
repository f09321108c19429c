/**
 * The control charts themselves (location chart over its R, s or MR chart, and an overview strip
 * with a brush for long histories). Loaded lazily: recharts is not in the first-load bundle.
 */
import { Caption1, makeStyles, tokens } from '@fluentui/react-components';
import { useEffect, useMemo, useState } from 'react';
import { Area, Brush, CartesianGrid, ComposedChart, Line, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis, type TooltipContentProps } from 'recharts';
import type { ChartResponse } from '@shared/schemas/drift';
import { chartColours } from '../../../theme/theme';
import { useThemeMode } from '../../../theme/theme-mode';
import { buildRows, fmt, thin, type DrawRow } from './chart-data';

const useStyles = makeStyles({
  wrap: { display: 'flex', flexDirection: 'column', gap: '6px' },
  label: { color: tokens.colorNeutralForeground3, fontWeight: 600, letterSpacing: '0.02em', textTransform: 'uppercase', fontSize: '11px' },
  tip: {
    backgroundColor: tokens.colorNeutralBackground1,
    border: `1px solid ${tokens.colorNeutralStroke1}`,
    borderRadius: tokens.borderRadiusMedium,
    boxShadow: tokens.shadow8,
    padding: '8px 10px',
    maxWidth: '340px',
    fontSize: tokens.fontSizeBase200,
    lineHeight: '18px',
  },
  tipHead: { fontWeight: 700, marginBottom: '2px' },
  tipMuted: { color: tokens.colorNeutralForeground3 },
  tipFlag: { marginTop: '6px', paddingTop: '6px', borderTop: `1px solid ${tokens.colorNeutralStroke2}` },
  tipRule: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 700 },
  note: { color: tokens.colorNeutralForeground3 },
});

const LOCATION_NAME: Record<ChartResponse['chart'], string> = { 'xbar-r': 'X̄ (subgroup mean)', 'xbar-s': 'X̄ (subgroup mean)', 'i-mr': 'Individual value', p: 'Fraction nonconforming' };
const DISPERSION_NAME: Record<ChartResponse['chart'], string | null> = { 'xbar-r': 'Range R', 'xbar-s': 'Standard deviation s', 'i-mr': 'Moving range', p: null };

/** A small tick on the overview strip where a flagged point lies. */
function OverviewMark(props: { cx?: number; cy?: number; fill?: string }) {
  const { cx, cy, fill } = props;
  if (cx == null || cy == null || !Number.isFinite(cx) || !Number.isFinite(cy)) return <g />;
  return <circle cx={cx} cy={cy} r={1.8} fill={fill} />;
}

/** A hollow diamond: reads as "flagged" without colour and stands out from the plotted dots. */
function FlagMark(props: { cx?: number; cy?: number; fill?: string }) {
  const { cx, cy, fill } = props;
  if (cx == null || cy == null || !Number.isFinite(cx) || !Number.isFinite(cy)) return <g />;
  const r = 6;
  return <path d={`M${cx},${cy - r}L${cx + r},${cy}L${cx},${cy + r}L${cx - r},${cy}Z`} fill="none" stroke={fill} strokeWidth={2.2} />;
}

function PointTip({ active, payload, chart, unit }: TooltipContentProps & { chart: ChartResponse; unit: string }) {
  const s = useStyles();
  const row = (payload?.[0]?.payload ?? null) as DrawRow | null;
  if (!active || !row) return null;
  const p = row.point;
  const u = unit ? ` ${unit}` : '';
  return (
    <div className={s.tip} role="status">
      <div className={s.tipHead}>
        Lot {p.lotRef}
        {p.serial !== undefined ? ` · core ${p.serial}` : ''}
        {p.chunk !== undefined ? ` · part ${p.chunk}` : ''}
      </div>
      <div className={s.tipMuted}>Received {p.receivedAt.slice(0, 10)} · subgroup {p.index + 1}</div>
      <div>
        {LOCATION_NAME[chart.chart]}: <strong>{chart.chart === 'p' ? `${fmt(p.value * 100, 2)} % (${p.defectives} of ${p.size})` : `${fmt(p.value)}${u}`}</strong>
      </div>
      {p.dispersion !== undefined ? <div>{DISPERSION_NAME[chart.chart]}: {fmt(p.dispersion)}{u}</div> : null}
      {row.ucl !== undefined ? (
        <div className={s.tipMuted}>
          Limits {fmt(row.lcl)} – {fmt(row.ucl)} ({row.limitVersion === null ? 'trial' : `version ${row.limitVersion}`})
        </div>
      ) : null}
      {(p.flags ?? []).map((f) => (
        <div key={`${f.chart}-${f.rule}`} className={s.tipFlag}>
          <span className={s.tipRule}>{f.rule}</span> {f.description}
          <div className={s.tipMuted}>{f.message}</div>
        </div>
      ))}
    </div>
  );
}

export interface ControlChartsProps {
  chart: ChartResponse;
}

export default function ControlCharts({ chart }: ControlChartsProps) {
  const s = useStyles();
  const { mode } = useThemeMode();
  const c = chartColours[mode];
  const rows = useMemo(() => buildRows(chart), [chart]);
  const [win, setWin] = useState<[number, number]>([0, Math.max(0, rows.length - 1)]);
  useEffect(() => setWin([0, Math.max(0, rows.length - 1)]), [rows.length]);
  const visible = useMemo(() => rows.slice(win[0], win[1] + 1), [rows, win]);
  const drawn = useMemo(() => thin(visible), [visible]);
  // Markers get their own data: only the flagged rows (never thinned away).
  const flags = useMemo(() => drawn.filter((r) => r.flag !== undefined), [drawn]);
  const dFlags = useMemo(() => drawn.filter((r) => r.dFlag !== undefined), [drawn]);
  const overview = useMemo(() => thin(rows, 500), [rows]);
  const thinned = drawn.length < visible.length;
  const unit = chart.characteristic.unit ?? '';
  const refAt = useMemo(() => new Map(rows.map((r) => [r.x, r.point.lotRef])), [rows]);
  const tickLot = (x: number) => (refAt.has(x) ? `lot ${refAt.get(x)}` : '');
  const dots = drawn.length <= 250 ? { r: 2.4, fill: c.line, strokeWidth: 0 } : false;
  const dispersion = DISPERSION_NAME[chart.chart];
  const yTick = (v: number) => (chart.chart === 'p' ? `${fmt(v * 100, 1)} %` : fmt(v));
  const axis = { stroke: c.axis, fontSize: 11 };
  const common = { isAnimationActive: false as const };
  const tip = (props: TooltipContentProps) => <PointTip {...props} chart={chart} unit={unit} />;

  return (
    <div className={s.wrap}>
      <div data-export="chart">
        <Caption1 className={s.label}>{LOCATION_NAME[chart.chart]}{unit && chart.chart !== 'p' ? ` (${unit})` : ''}</Caption1>
        <ResponsiveContainer width="100%" height={300}>
          <ComposedChart data={drawn} margin={{ top: 8, right: 16, bottom: 4, left: 4 }}>
            <CartesianGrid stroke={c.grid} strokeDasharray="2 4" vertical={false} />
            <XAxis dataKey="x" type="number" domain={['dataMin', 'dataMax']} tickFormatter={tickLot} tick={axis} stroke={c.grid} minTickGap={28} />
            <YAxis domain={['auto', 'auto']} tickFormatter={yTick} tick={axis} stroke={c.grid} width={64} />
            <Area dataKey="z3" type="stepAfter" stroke="none" fill={c.zoneA} fillOpacity={1} {...common} />
            <Area dataKey="z2" type="stepAfter" stroke="none" fill={c.zoneB} fillOpacity={1} {...common} />
            <Area dataKey="z1" type="stepAfter" stroke="none" fill={c.zoneC} fillOpacity={1} {...common} />
            <Line dataKey="ucl" type="stepAfter" stroke={c.limit} strokeWidth={1.6} dot={false} {...common} name="UCL" />
            <Line dataKey="lcl" type="stepAfter" stroke={c.limit} strokeWidth={1.6} dot={false} {...common} name="LCL" />
            <Line dataKey="center" type="stepAfter" stroke={c.center} strokeWidth={1.2} strokeDasharray="6 3" dot={false} {...common} name="Centre" />
            <Line dataKey="value" type="linear" stroke={c.line} strokeWidth={1.4} dot={dots} activeDot={{ r: 4 }} {...common} name="Value" />
            <Scatter data={flags} dataKey="flag" fill={c.flag} shape={<FlagMark />} {...common} name="Flagged" />
            <Tooltip content={tip} cursor={{ stroke: c.axis, strokeDasharray: '3 3' }} isAnimationActive={false} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      {dispersion ? (
        <div data-export="chart">
          <Caption1 className={s.label}>{dispersion}{unit ? ` (${unit})` : ''}</Caption1>
          <ResponsiveContainer width="100%" height={160}>
            <ComposedChart data={drawn} margin={{ top: 6, right: 16, bottom: 4, left: 4 }}>
              <CartesianGrid stroke={c.grid} strokeDasharray="2 4" vertical={false} />
              <XAxis dataKey="x" type="number" domain={['dataMin', 'dataMax']} tickFormatter={tickLot} tick={axis} stroke={c.grid} minTickGap={28} />
              <YAxis domain={[0, 'auto']} tickFormatter={(v: number) => fmt(v)} tick={axis} stroke={c.grid} width={64} />
              <Line dataKey="dUcl" type="stepAfter" stroke={c.limit} strokeWidth={1.6} dot={false} {...common} name="UCL" />
              <Line dataKey="dLcl" type="stepAfter" stroke={c.limit} strokeWidth={1.2} strokeDasharray="2 3" dot={false} {...common} name="LCL" />
              <Line dataKey="dCenter" type="stepAfter" stroke={c.center} strokeWidth={1.2} strokeDasharray="6 3" dot={false} {...common} name="Centre" />
              <Line dataKey="dispersion" type="linear" stroke={c.line} strokeWidth={1.2} dot={dots} connectNulls {...common} name="Dispersion" />
              <Scatter data={dFlags} dataKey="dFlag" fill={c.flag} shape={<FlagMark />} {...common} name="Flagged" />
              <Tooltip content={tip} cursor={{ stroke: c.axis, strokeDasharray: '3 3' }} isAnimationActive={false} />
            </ComposedChart>
          </ResponsiveContainer>
        </div>
      ) : null}
      {rows.length > 40 ? (
        <div aria-label="History overview: drag the handles to choose the lots shown">
          <ResponsiveContainer width="100%" height={70}>
            <ComposedChart data={overview} margin={{ top: 4, right: 16, bottom: 0, left: 68 }}>
              <XAxis dataKey="x" type="number" domain={['dataMin', 'dataMax']} hide />
              <YAxis hide domain={['auto', 'auto']} />
              <Line dataKey="value" stroke={c.line} strokeWidth={1} dot={false} {...common} />
              <Scatter data={overview.filter((r) => r.flag !== undefined)} dataKey="flag" fill={c.flag} shape={<OverviewMark />} {...common} />
              <Brush
                dataKey="x"
                height={26}
                stroke={c.center}
                fill={c.background}
                travellerWidth={12}
                tickFormatter={tickLot}
                onChange={(r) => {
                  const a = overview[r.startIndex ?? 0];
                  const b = overview[r.endIndex ?? overview.length - 1];
                  if (a && b) setWin([a.pos, b.pos]);
                }}
              />
            </ComposedChart>
          </ResponsiveContainer>
        </div>
      ) : null}
      <Caption1 className={s.note}>
        Showing subgroups {visible.length ? visible[0].x + 1 : 0}–{visible.length ? visible[visible.length - 1].x + 1 : 0} of {chart.totalPoints}
        {thinned ? ` · line thinned to ${drawn.length} points for drawing; every flagged point is drawn` : ''}. Shaded bands: within 1σ, 2σ and the 3σ limits.
      </Caption1>
    </div>
  );
}
