/**
 * The control charts themselves (location chart over its R, s or MR chart, and an overview strip
 * with a brush for long histories). Loaded lazily: recharts is not in the first-load bundle.
 */
import { Caption1, makeStyles, tokens } from '@fluentui/react-components';
import { useEffect, useMemo, useState } from 'react';
import { Area, Brush, CartesianGrid, ComposedChart, Line, ReferenceArea, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis, useXAxisScale, useYAxisScale, type TooltipContentProps } from 'recharts';
import type { ChartResponse } from '@shared/schemas/drift';
import { chartColours } from '../../../theme/theme';
import { useThemeMode } from '../../../theme/theme-mode';
import { buildRows, fmt, thin, type DrawRow } from './chart-data';
import { formatDay } from '../../../lib/format';

const useStyles = makeStyles({
  wrap: { display: 'flex', flexDirection: 'column', gap: '6px' },
  label: { color: tokens.colorNeutralForeground2, fontWeight: 600, fontSize: tokens.fontSizeBase200 },
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

/** Rules spelled out in a tooltip; further ones are listed by id so the tooltip stays readable. */
const TIP_FLAGS = 3;

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
      <div className={s.tipMuted}>Received {formatDay(p.receivedAt)} · subgroup {p.index + 1}</div>
      <div>
        {LOCATION_NAME[chart.chart]}: <strong>{chart.chart === 'p' ? `${fmt(p.value * 100, 2)} % (${p.defectives} of ${p.size})` : `${fmt(p.value)}${u}`}</strong>
      </div>
      {p.dispersion !== undefined ? <div>{DISPERSION_NAME[chart.chart]}: {fmt(p.dispersion)}{u}</div> : null}
      {row.ucl !== undefined ? (
        <div className={s.tipMuted}>
          Limits {fmt(row.lcl)} – {fmt(row.ucl)} ({row.limitVersion === null ? 'trial' : `version ${row.limitVersion}`})
        </div>
      ) : null}
      {(p.flags ?? []).slice(0, TIP_FLAGS).map((f) => (
        <div key={`${f.chart}-${f.rule}`} className={s.tipFlag}>
          <span className={s.tipRule}>{f.rule}</span> {f.description}
          <div className={s.tipMuted}>{f.message}</div>
        </div>
      ))}
      {(p.flags?.length ?? 0) > TIP_FLAGS ? <div className={s.tipMuted}>and {(p.flags?.length ?? 0) - TIP_FLAGS} more: {(p.flags ?? []).slice(TIP_FLAGS).map((f) => f.rule).join(', ')}</div> : null}
    </div>
  );
}

export interface ControlChartsProps {
  chart: ChartResponse;
}

/** Flag markers drawn from the chart's own scales (no extra series, so the tooltip stays on the points). */
function FlagLayer({ rows, field, colour, Mark }: { rows: readonly DrawRow[]; field: 'flag' | 'dFlag'; colour: string; Mark: typeof FlagMark }) {
  const x = useXAxisScale();
  const y = useYAxisScale();
  if (!x || !y) return null;
  return (
    <g className="drift-flags" aria-hidden>
      {rows.map((r) => {
        const v = r[field];
        return v === undefined ? null : <Mark key={r.x} cx={x(r.x)} cy={y(v)} fill={colour} />;
      })}
    </g>
  );
}

interface Band {
  x1: number;
  x2: number;
  limitVersion: number | null;
  center: number;
  ucl: number;
  lcl: number;
  sigma: number;
  dCenter: number | null;
  dUcl: number | null;
  dLcl: number | null;
}

/** Limit segments over the drawn range; neighbouring segments meet half-way between their points. */
function bandsOf(chart: ChartResponse, lo: number, hi: number): Band[] {
  const out: Band[] = [];
  for (const g of chart.segments) {
    if (!g.limits || g.to < lo || g.from > hi) continue;
    const x1 = Math.max(lo, g.from - 0.5);
    const x2 = Math.min(hi, g.to + 0.5);
    if (x2 <= x1 && !(lo === hi)) continue;
    const l = g.limits;
    out.push({ x1, x2, limitVersion: g.limitVersion, center: l.center, ucl: l.ucl, lcl: l.lcl, sigma: l.sigma, dCenter: l.dispersionCenter, dUcl: l.dispersionUcl, dLcl: l.dispersionLcl });
  }
  return out;
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
  const overview = useMemo(() => thin(rows, 500), [rows]);
  const thinned = drawn.length < visible.length;
  const lo = drawn.length ? drawn[0].x : 0;
  const hi = drawn.length ? drawn[drawn.length - 1].x : 0;
  // Variables charts: limits are constant per segment, so each is one rectangle and three lines.
  // p charts: limits follow each lot's size, so they are drawn point by point.
  const perPoint = chart.chart === 'p';
  const bands = useMemo(() => (perPoint ? [] : bandsOf(chart, lo, hi)), [chart, perPoint, lo, hi]);
  const unit = chart.characteristic.unit ?? '';
  const refAt = useMemo(() => new Map(rows.map((r) => [r.x, r.point.lotRef])), [rows]);
  const tickLot = (x: number) => (refAt.has(x) ? `lot ${refAt.get(x)}` : '');
  const dots = drawn.length <= 250 ? { r: 2.4, fill: c.line, strokeWidth: 0 } : false;
  const dispersion = DISPERSION_NAME[chart.chart];
  const yTick = (v: number) => (chart.chart === 'p' ? `${fmt(v * 100, 1)} %` : fmt(v));
  const axis = { stroke: c.axis, fontSize: 11 };
  const common = { isAnimationActive: false as const, activeDot: false as const, dot: false as const };
  const tip = (props: TooltipContentProps) => <PointTip {...props} chart={chart} unit={unit} />;
  const cursor = { stroke: c.axis, strokeDasharray: '3 3' };
  const hLine = (x1: number, x2: number, y: number, colour: string, width: number, dash?: string, key?: string) => (
    <ReferenceLine key={key} segment={[{ x: x1, y }, { x: x2, y }]} stroke={colour} strokeWidth={width} strokeDasharray={dash} ifOverflow="extendDomain" />
  );

  return (
    <div className={s.wrap}>
      <div data-export="chart">
        <Caption1 className={s.label} data-caption>{LOCATION_NAME[chart.chart]}{unit && chart.chart !== 'p' ? ` (${unit})` : ''}</Caption1>
        <ResponsiveContainer width="100%" height={300}>
          <ComposedChart data={drawn} margin={{ top: 8, right: 30, bottom: 4, left: 4 }}>
            <CartesianGrid stroke={c.grid} strokeDasharray="2 4" vertical={false} />
            <XAxis dataKey="x" type="number" domain={['dataMin', 'dataMax']} tickFormatter={tickLot} tick={axis} stroke={c.grid} minTickGap={28} />
            <YAxis domain={['auto', 'auto']} tickFormatter={yTick} tick={axis} stroke={c.grid} width={64} />
            {bands.flatMap((b, i) => [
              <ReferenceArea key={`a${i}`} x1={b.x1} x2={b.x2} y1={b.lcl} y2={b.ucl} fill={c.zoneA} fillOpacity={1} stroke="none" ifOverflow="extendDomain" />,
              <ReferenceArea key={`b${i}`} x1={b.x1} x2={b.x2} y1={b.center - 2 * b.sigma} y2={b.center + 2 * b.sigma} fill={c.zoneB} fillOpacity={1} stroke="none" />,
              <ReferenceArea key={`c${i}`} x1={b.x1} x2={b.x2} y1={b.center - b.sigma} y2={b.center + b.sigma} fill={c.zoneC} fillOpacity={1} stroke="none" />,
              hLine(b.x1, b.x2, b.ucl, c.limit, 1.6, undefined, `u${i}`),
              hLine(b.x1, b.x2, b.lcl, c.limit, 1.6, undefined, `l${i}`),
              hLine(b.x1, b.x2, b.center, c.center, 1.2, '6 3', `m${i}`),
            ])}
            {perPoint ? <Area dataKey="z3" type="stepAfter" stroke="none" fill={c.zoneA} fillOpacity={1} {...common} /> : null}
            {perPoint ? <Area dataKey="z2" type="stepAfter" stroke="none" fill={c.zoneB} fillOpacity={1} {...common} /> : null}
            {perPoint ? <Area dataKey="z1" type="stepAfter" stroke="none" fill={c.zoneC} fillOpacity={1} {...common} /> : null}
            {perPoint ? <Line dataKey="ucl" type="stepAfter" stroke={c.limit} strokeWidth={1.6} {...common} name="UCL" /> : null}
            {perPoint ? <Line dataKey="lcl" type="stepAfter" stroke={c.limit} strokeWidth={1.6} {...common} name="LCL" /> : null}
            {perPoint ? <Line dataKey="center" type="stepAfter" stroke={c.center} strokeWidth={1.2} strokeDasharray="6 3" {...common} name="Centre" /> : null}
            <Line dataKey="value" type="linear" stroke={c.line} strokeWidth={1.4} isAnimationActive={false} dot={dots} activeDot={{ r: 4 }} name="Value" />
            <FlagLayer rows={drawn} field="flag" colour={c.flag} Mark={FlagMark} />
            <Tooltip content={tip} cursor={cursor} isAnimationActive={false} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      {dispersion ? (
        <div data-export="chart">
          <Caption1 className={s.label} data-caption>{dispersion}{unit ? ` (${unit})` : ''}</Caption1>
          <ResponsiveContainer width="100%" height={160}>
            <ComposedChart data={drawn} margin={{ top: 6, right: 30, bottom: 4, left: 4 }}>
              <CartesianGrid stroke={c.grid} strokeDasharray="2 4" vertical={false} />
              <XAxis dataKey="x" type="number" domain={['dataMin', 'dataMax']} tickFormatter={tickLot} tick={axis} stroke={c.grid} minTickGap={28} />
              <YAxis domain={[0, 'auto']} tickFormatter={(v: number) => fmt(v)} tick={axis} stroke={c.grid} width={64} />
              {bands.flatMap((b, i) => [
                b.dUcl != null ? hLine(b.x1, b.x2, b.dUcl, c.limit, 1.6, undefined, `u${i}`) : null,
                b.dLcl != null && b.dLcl > 0 ? hLine(b.x1, b.x2, b.dLcl, c.limit, 1.2, '2 3', `l${i}`) : null,
                b.dCenter != null ? hLine(b.x1, b.x2, b.dCenter, c.center, 1.2, '6 3', `m${i}`) : null,
              ])}
              <Line dataKey="dispersion" type="linear" stroke={c.line} strokeWidth={1.2} isAnimationActive={false} dot={dots} activeDot={{ r: 3.5 }} connectNulls name="Dispersion" />
              <FlagLayer rows={drawn} field="dFlag" colour={c.flag} Mark={FlagMark} />
              <Tooltip content={tip} cursor={cursor} isAnimationActive={false} />
            </ComposedChart>
          </ResponsiveContainer>
        </div>
      ) : null}
      {rows.length > 40 ? (
        <div aria-label="History overview: drag the handles to choose the lots shown">
          <ResponsiveContainer width="100%" height={70}>
            <ComposedChart data={overview} margin={{ top: 4, right: 30, bottom: 0, left: 68 }}>
              <XAxis dataKey="x" type="number" domain={['dataMin', 'dataMax']} hide />
              <YAxis hide domain={['auto', 'auto']} />
              <Line dataKey="value" stroke={c.line} strokeWidth={1} {...common} />
              <FlagLayer rows={overview} field="flag" colour={c.flag} Mark={OverviewMark} />
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
