// Relative import (not @shared): tests/unit load this file under the root tsconfig too.
import type { ChartPoint, ChartResponse } from '../../../../shared/schemas/drift';

/** Above this many subgroups the drawn line is thinned (flagged points are always drawn). */
export const MAX_DRAWN = 2000;

/** One drawn x position: the point, its limits and zones, and flag markers (undefined = none). */
export interface DrawRow {
  /** Position in the whole history (ChartPoint.index). */
  x: number;
  /** Position in the response's `points`. */
  pos: number;
  point: ChartPoint;
  value: number;
  center?: number;
  ucl?: number;
  lcl?: number;
  /** Shaded zones as [low, high] bands: within 1σ, 2σ and the 3σ limits. */
  z1?: [number, number];
  z2?: [number, number];
  z3?: [number, number];
  flag?: number;
  dispersion?: number;
  dCenter?: number;
  dUcl?: number;
  dLcl?: number;
  dFlag?: number;
  limitVersion: number | null;
  segmentStart: boolean;
}

export function buildRows(chart: ChartResponse): DrawRow[] {
  return chart.points.map((p, pos) => {
    const seg = chart.segments[p.segment];
    const lim = seg?.limits ?? null;
    const row: DrawRow = { x: p.index, pos, point: p, value: p.value, limitVersion: seg?.limitVersion ?? null, segmentStart: !!seg && seg.from === p.index };
    if (lim && seg) {
      const center = lim.center;
      // p charts: limits follow each lot's sample size; σ of the fraction is σw/√n.
      const ucl = p.ucl ?? lim.ucl;
      const lcl = p.lcl ?? lim.lcl;
      const sigma = p.size !== undefined && seg.sigmaWithin != null ? seg.sigmaWithin / Math.sqrt(p.size) : lim.sigma;
      const clip = (v: number) => (p.size !== undefined ? Math.min(1, Math.max(0, v)) : v);
      Object.assign(row, {
        center,
        ucl,
        lcl,
        z1: [clip(center - sigma), clip(center + sigma)],
        z2: [clip(center - 2 * sigma), clip(center + 2 * sigma)],
        z3: [lcl, ucl],
        dCenter: lim.dispersionCenter ?? undefined,
        dUcl: lim.dispersionUcl ?? undefined,
        dLcl: lim.dispersionLcl ?? undefined,
      });
    }
    if (p.dispersion !== undefined) row.dispersion = p.dispersion;
    if (p.flags?.some((f) => f.chart === 'location')) row.flag = p.value;
    if (p.flags?.some((f) => f.chart === 'dispersion') && p.dispersion !== undefined) row.dFlag = p.dispersion;
    return row;
  });
}

/**
 * Thins rows for drawing: at most `max` by keeping each bucket's lowest and highest value (so
 * spikes stay visible), the first and last row, the first row of every limit segment (where the
 * limit lines step) and every flagged row, whatever the budget.
 */
export function thin(rows: readonly DrawRow[], max = MAX_DRAWN): DrawRow[] {
  if (rows.length <= max) return [...rows];
  const keep = new Uint8Array(rows.length);
  const buckets = Math.max(1, Math.floor(max / 2));
  const size = rows.length / buckets;
  for (let b = 0; b < buckets; b++) {
    const from = Math.floor(b * size);
    const to = Math.min(rows.length, Math.floor((b + 1) * size));
    let lo = from;
    let hi = from;
    for (let i = from; i < to; i++) {
      if (rows[i].value < rows[lo].value) lo = i;
      if (rows[i].value > rows[hi].value) hi = i;
    }
    keep[lo] = 1;
    keep[hi] = 1;
  }
  keep[0] = 1;
  keep[rows.length - 1] = 1;
  for (let i = 0; i < rows.length; i++) if (rows[i].flag !== undefined || rows[i].dFlag !== undefined || rows[i].segmentStart) keep[i] = 1;
  return rows.filter((_, i) => keep[i] === 1);
}

const csvCell = (v: unknown): string => {
  const s = v === undefined || v === null ? '' : String(v);
  return /[",\n;]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
};

/** Every point (not the thinned drawing) with its limits and flags, for a spreadsheet. */
export function pointsCsv(chart: ChartResponse): string {
  const head = ['index', 'lot_ref', 'lot_id', 'received_at', 'core', 'part', 'value', chart.chart === 'xbar-s' ? 's' : chart.chart === 'i-mr' ? 'moving_range' : chart.chart === 'p' ? 'defectives' : 'range', chart.chart === 'p' ? 'sample_size' : 'unit', 'center', 'lcl', 'ucl', 'limit_version', 'rules', 'messages'];
  const lines = [head.join(',')];
  for (const r of buildRows(chart)) {
    const p = r.point;
    lines.push(
      [
        p.index + 1,
        p.lotRef,
        p.lotId,
        p.receivedAt,
        p.serial,
        p.chunk,
        p.value,
        chart.chart === 'p' ? p.defectives : p.dispersion,
        chart.chart === 'p' ? p.size : chart.characteristic.unit,
        r.center,
        r.lcl,
        r.ucl,
        r.limitVersion ?? 'trial',
        (p.flags ?? []).map((f) => f.rule).join(' '),
        (p.flags ?? []).map((f) => f.message).join(' | '),
      ]
        .map(csvCell)
        .join(','),
    );
  }
  return `${lines.join('\n')}\n`;
}

export function download(name: string, blob: Blob): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/**
 * Renders the chart SVGs inside `container` onto one canvas (stacked, with a title line) and
 * returns it as PNG. Works offline: the SVG is serialised and drawn from a blob URL.
 */
export async function chartsPng(container: HTMLElement, title: string, colours: { background: string; text: string }): Promise<Blob> {
  const svgs = [...container.querySelectorAll<SVGSVGElement>('svg.recharts-surface')].filter((s) => s.closest('[data-export="chart"]'));
  if (!svgs.length) throw new Error('There is no chart to export yet.');
  const scale = 2;
  const pad = 16;
  const titleH = 28;
  const sizes = svgs.map((s) => s.getBoundingClientRect());
  // Each chart's caption (what is plotted, in which unit) goes above it in the image too.
  const captions = svgs.map((s) => s.closest('[data-export="chart"]')?.querySelector('[data-caption]')?.textContent ?? '');
  const captionH = 20;
  const width = Math.max(...sizes.map((r) => r.width)) + 2 * pad;
  const height = sizes.reduce((a, r) => a + r.height + 8 + captionH, 0) + titleH + 2 * pad;
  const canvas = document.createElement('canvas');
  canvas.width = Math.ceil(width * scale);
  canvas.height = Math.ceil(height * scale);
  const ctx = canvas.getContext('2d');
  if (!ctx) throw new Error('This browser cannot draw the image.');
  ctx.scale(scale, scale);
  ctx.fillStyle = colours.background;
  ctx.fillRect(0, 0, width, height);
  ctx.fillStyle = colours.text;
  ctx.font = "600 14px 'Open Sans', system-ui, sans-serif";
  ctx.fillText(title, pad, pad + 14);
  let y = pad + titleH;
  for (let i = 0; i < svgs.length; i++) {
    ctx.fillStyle = colours.text;
    ctx.font = "600 12px 'Open Sans', system-ui, sans-serif";
    ctx.fillText(captions[i], pad, y + 13);
    y += captionH;
    const clone = svgs[i].cloneNode(true) as SVGSVGElement;
    clone.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
    clone.setAttribute('width', String(sizes[i].width));
    clone.setAttribute('height', String(sizes[i].height));
    clone.style.fontFamily = "'Open Sans', system-ui, sans-serif";
    const url = URL.createObjectURL(new Blob([new XMLSerializer().serializeToString(clone)], { type: 'image/svg+xml' }));
    try {
      const img = new Image();
      await new Promise<void>((resolve, reject) => {
        img.onload = () => resolve();
        img.onerror = () => reject(new Error('The chart could not be drawn as an image.'));
        img.src = url;
      });
      ctx.drawImage(img, pad, y, sizes[i].width, sizes[i].height);
    } finally {
      URL.revokeObjectURL(url);
    }
    y += sizes[i].height + 8;
  }
  return new Promise((resolve, reject) => canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('The image could not be made.'))), 'image/png'));
}

/** Numbers as engineers read them: up to 4 significant decimals, no float noise. */
export function fmt(v: number | null | undefined, digits = 4): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  const a = Math.abs(v);
  const d = a >= 1000 ? 1 : a >= 100 ? 2 : a >= 1 ? Math.min(digits, 3) : digits;
  return v.toFixed(d).replace(/(\.\d*?)0+$/, '$1').replace(/\.$/, '');
}
