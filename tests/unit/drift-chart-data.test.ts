import { describe, expect, it } from 'vitest';
import type { ChartPoint, ChartResponse } from '../../shared/schemas/drift';
import { buildRows, fmt, pointsCsv, thin } from '../../src-web/features/drift/components/chart-data';

function chartWith(points: ChartPoint[], segments: ChartResponse['segments']): ChartResponse {
  return {
    supplier: { id: 's', code: 'S', name: 'S' },
    part: { id: 'p', partNumber: 'P', revision: 'A' },
    characteristic: { code: 'BURR', name: 'Burr height', kind: 'variable', unit: 'µm', lsl: null, usl: 50, chartKind: 'i-mr', subgroupSize: 1, readingsPerSample: 1, ruleSet: 'western-electric', wearDriven: true, planRevision: 1 },
    chart: 'i-mr',
    subgrouping: { mode: 'individual', n: 1, explanation: '' },
    points,
    totalPoints: points.length,
    segments,
    skipped: [],
    limits: null,
    versions: [],
    trial: null,
    trialNote: null,
    signals: [],
    capability: null,
    capabilityWarnings: [],
    histogram: [],
    forecast: null,
    forecastNote: null,
  };
}

const point = (i: number, value: number, flagged = false): ChartPoint => ({
  index: i,
  lotId: `l${i}`,
  lotRef: 100 + i,
  lotSeq: i + 1,
  receivedAt: '2026-01-01T00:00:00.000Z',
  serial: 1,
  value,
  segment: 0,
  ...(flagged ? { flags: [{ rule: 'we1', chart: 'location', message: `lot ${100 + i} core 1 is above the upper 3σ limit (we1)`, description: 'one point beyond 3σ', signalId: null }] } : {}),
});

const limits = { center: 0, ucl: 3, lcl: -3, sigma: 1, dispersionCenter: 1.128, dispersionUcl: 3.686, dispersionLcl: 0 };

describe('thin', () => {
  it('keeps everything up to the budget', () => {
    const rows = buildRows(chartWith([point(0, 1), point(1, 2)], [{ from: 0, to: 1, limitVersion: null, center: 0, sigmaWithin: 1, limits }]));
    expect(thin(rows, 10)).toHaveLength(2);
  });

  it('thins 5 000 points to about the budget but never drops a flagged point or a spike', () => {
    const pts = Array.from({ length: 5000 }, (_, i) => point(i, Math.sin(i / 7), i % 997 === 13));
    pts[2500] = point(2500, 9);
    const sut = thin(buildRows(chartWith(pts, [{ from: 0, to: 4999, limitVersion: null, center: 0, sigmaWithin: 1, limits }])), 2000);
    expect(sut.length).toBeLessThanOrEqual(2000 + 6);
    expect(sut.length).toBeGreaterThan(1000);
    const kept = new Set(sut.map((r) => r.x));
    for (const p of pts) if (p.flags) expect(kept.has(p.index)).toBe(true);
    expect(kept.has(2500)).toBe(true);
    expect(kept.has(0) && kept.has(4999)).toBe(true);
  });
});

describe('buildRows', () => {
  it('shades 1σ and 2σ zones around the centre and marks flagged points', () => {
    const [row] = buildRows(chartWith([point(0, 4, true)], [{ from: 0, to: 0, limitVersion: 2, center: 0, sigmaWithin: 1, limits }]));
    expect(row).toMatchObject({ center: 0, ucl: 3, lcl: -3, z1: [-1, 1], z2: [-2, 2], z3: [-3, 3], flag: 4, limitVersion: 2 });
  });
});

describe('pointsCsv', () => {
  it('writes every point with its limits and rules, quoting text with commas', () => {
    const csv = pointsCsv(chartWith([point(0, 4, true), point(1, 0.5)], [{ from: 0, to: 1, limitVersion: null, center: 0, sigmaWithin: 1, limits }]));
    const lines = csv.trim().split('\n');
    expect(lines[0]).toBe('index,lot_ref,lot_id,received_at,core,part,value,moving_range,unit,center,lcl,ucl,limit_version,rules,messages');
    expect(lines[1]).toBe('1,100,l0,2026-01-01T00:00:00.000Z,1,,4,,µm,0,-3,3,trial,we1,lot 100 core 1 is above the upper 3σ limit (we1)');
    expect(lines).toHaveLength(3);
  });
});

describe('fmt', () => {
  it('drops float noise', () => {
    expect(fmt(0.30000000000000004)).toBe('0.3');
    expect(fmt(74.01458128)).toBe('74.015');
    expect(fmt(null)).toBe('—');
  });
});
