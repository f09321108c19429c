/**
 * A supplier's trend on its scorecard: lots received per period as bars, PPM as a line on its own
 * axis. Loaded lazily (React.lazy): recharts stays out of the first-load bundle.
 */
import { Bar, CartesianGrid, ComposedChart, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { PeriodBucket } from '@shared/compute/scorecard';
import type { ScorecardTrendPoint } from '@shared/schemas/scorecard';
import { chartColours } from '../../../theme/theme';
import { useThemeMode } from '../../../theme/theme-mode';
import { formatPpm } from './format';

export interface TrendChartProps {
  trend: ScorecardTrendPoint[];
  periods: PeriodBucket[];
  /** For the chart's accessible name. */
  supplierName: string;
}

export default function TrendChart({ trend, periods, supplierName }: TrendChartProps) {
  const { mode } = useThemeMode();
  const c = chartColours[mode];
  const labels = new Map(periods.map((p) => [p.key, p.label]));
  const rows = trend.map((t) => ({ ...t, label: labels.get(t.period) ?? t.period }));
  const summary = rows.map((r) => `${r.label}: ${r.lotsReceived} lots, PPM ${formatPpm(r.ppm)}`).join('; ');
  return (
    <div role="img" aria-label={`Trend for ${supplierName}. ${summary}`} data-testid="scorecard-trend">
      <ResponsiveContainer width="100%" height={150}>
        <ComposedChart data={rows} margin={{ top: 8, right: 4, bottom: 0, left: -8 }}>
          <CartesianGrid stroke={c.grid} vertical={false} />
          <XAxis dataKey="label" tick={{ fill: c.axis, fontSize: 11 }} tickLine={false} axisLine={{ stroke: c.grid }} interval="preserveStartEnd" />
          <YAxis yAxisId="lots" allowDecimals={false} tick={{ fill: c.axis, fontSize: 11 }} tickLine={false} axisLine={false} width={32} />
          <YAxis yAxisId="ppm" orientation="right" tick={{ fill: c.axis, fontSize: 11 }} tickLine={false} axisLine={false} width={52} tickFormatter={(v: number) => (v >= 1000 ? `${Math.round(v / 1000)}k` : String(v))} />
          <Tooltip
            contentStyle={{ background: c.background, borderColor: c.grid, color: c.text, fontSize: 12 }}
            formatter={(value, name) => (name === 'PPM' ? formatPpm(typeof value === 'number' ? value : null) : String(value))}
          />
          <Bar yAxisId="lots" dataKey="lotsReceived" name="Lots received" fill={c.bar} radius={[3, 3, 0, 0]} maxBarSize={28} isAnimationActive={false} />
          <Bar yAxisId="lots" dataKey="lotsRejected" name="Lots rejected" fill={c.flag} radius={[3, 3, 0, 0]} maxBarSize={28} isAnimationActive={false} />
          <Line yAxisId="ppm" dataKey="ppm" name="PPM" stroke={c.limit} strokeWidth={2} dot={{ r: 3 }} connectNulls={false} isAnimationActive={false} />
        </ComposedChart>
      </ResponsiveContainer>
    </div>
  );
}
