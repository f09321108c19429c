/**
 * Turns the raw readings of one sampled core into the value each characteristic is judged by,
 * and judges it against the plan's limits. The bench sheet runs this as the inspector types;
 * the server runs the same code on save and is the authority.
 *
 * Conventions (see shared/compute/plan-templates.ts for how templates wire characteristics):
 * - single layout, r readings: the value is their mean; the core conforms only when every
 *   reading is within the limits (a burr is as high as its highest reading).
 * - two-point: the value is the mean diameter; every diameter must be within the limits.
 * - probed: readings are radii at N equal angles (first at 0°) on M levels, level by level,
 *   all in one setup; the points of all levels are fitted with one least-squares circle.
 * - heights: heights at N equal angles on the back iron (radius ≈ 45 % of the OD, the middle of
 *   the yoke: a convention of ours, only the squareness figure depends on it and it is scaled
 *   to the OD).
 * - derived: computed from the raw readings of the characteristics named in `inputs`; a
 *   derived value is missing (null) until all its inputs have readings.
 * - attribute: conforming = pass.
 */
import { circleFit, eccentricity, planeFromHeights, pointsFromAngles, twoPointDiameters, type Point } from './geometry';
import { fluxPenalty, insulationFromCurrents, stackingFactorByMass } from './steel';
import { ComputeError } from './errors';

export interface EvalCharacteristic {
  code: string;
  kind: 'variable' | 'attribute' | 'derived';
  lsl: number | null;
  usl: number | null;
  layout: 'single' | 'two-point' | 'probed' | 'heights' | 'pass-fail';
  angles: number | null;
  levels: number | null;
  readingsPerSample: number;
  derivedFormula: string | null;
  inputs: string[] | null;
  unit: string | null;
}

export interface EvalPart {
  nominalOdMm: number;
  nominalStackLengthMm: number;
  laminationAreaCm2: number;
  densityGcm3: number;
  laminationThicknessMm: number;
  designStackingFactor: number | null;
  designToothT: number | null;
  designYokeT: number | null;
}

export interface RawReading {
  values: number[];
  pass?: boolean | null;
}

export interface Evaluation {
  value: number | null;
  conforming: boolean | null;
  /** Readings outside the limits (indices), for flagging single cells on the bench sheet. */
  outOfLimits: number[];
  details?: Record<string, number>;
  error?: string;
}

/** How many numbers a core takes for this characteristic (0 for pass/fail and derived). */
export function expectedReadings(c: Pick<EvalCharacteristic, 'kind' | 'layout' | 'angles' | 'levels' | 'readingsPerSample'>): number {
  if (c.kind === 'attribute' || c.kind === 'derived' || c.layout === 'pass-fail') return 0;
  switch (c.layout) {
    case 'two-point':
    case 'heights':
      return c.angles ?? 1;
    case 'probed':
      return (c.angles ?? 1) * (c.levels ?? 1);
    default:
      return c.readingsPerSample;
  }
}

export function withinLimits(v: number, lsl: number | null, usl: number | null): boolean {
  return (lsl == null || v >= lsl) && (usl == null || v <= usl);
}

/** Single values and diameters are judged reading by reading; fitted figures (probed, heights) by the fit. */
export function judgesEachReading(layout: string): boolean {
  return layout === 'single' || layout === 'two-point';
}

function probedPoints(c: EvalCharacteristic, values: number[]): Point[] {
  const n = c.angles ?? values.length;
  return pointsFromAngles(values.map((radius, i) => ({ angleDeg: ((i % n) * 360) / n, radius })));
}

function heightsFit(c: EvalCharacteristic, values: number[], part: EvalPart) {
  return planeFromHeights({ heights: values, radius: part.nominalOdMm * 0.45 }, { diameter: part.nominalOdMm });
}

/** The figure a layout's readings reduce to, with the formula the characteristic names. */
function reduceOwn(c: EvalCharacteristic, values: number[], part: EvalPart): { value: number; details?: Record<string, number> } {
  switch (c.layout) {
    case 'two-point': {
      const d = twoPointDiameters(values);
      return c.derivedFormula === 'ovality' ? { value: d.ovality, details: { ...d } } : { value: d.mean, details: { ...d } };
    }
    case 'probed': {
      const fit = circleFit(probedPoints(c, values));
      const details = { centerX: fit.centerX, centerY: fit.centerY, diameter: fit.diameter, roundness: fit.roundness };
      return c.derivedFormula === 'circle-fit-roundness' ? { value: fit.roundness, details } : { value: fit.diameter, details };
    }
    case 'heights': {
      const p = heightsFit(c, values, part);
      const details = { stackLength: p.stackLength, parallelism: p.parallelism, squareness: p.squareness };
      if (c.derivedFormula === 'parallelism') return { value: p.parallelism, details };
      if (c.derivedFormula === 'squareness') return { value: p.squareness, details };
      return { value: p.stackLength, details };
    }
    default:
      return { value: values.reduce((s, v) => s + v, 0) / values.length };
  }
}

type Lookup = (code: string) => { c: EvalCharacteristic; r: RawReading | undefined } | undefined;

function derive(c: EvalCharacteristic, part: EvalPart, lookup: Lookup): { value: number; details?: Record<string, number> } | null {
  const inputs = (c.inputs ?? []).map((code) => lookup(code));
  const ready = (i: number) => {
    const x = inputs[i];
    if (!x || !x.r) return null;
    const need = expectedReadings(x.c);
    return x.r.values.length >= Math.max(1, need) ? x : null;
  };
  const a = ready(0);
  switch (c.derivedFormula) {
    case 'circle-fit-roundness':
    case 'circle-fit-diameter': {
      if (!a) return null;
      const fit = circleFit(probedPoints(a.c, a.r!.values));
      return { value: c.derivedFormula === 'circle-fit-roundness' ? fit.roundness : fit.diameter, details: { diameter: fit.diameter, roundness: fit.roundness } };
    }
    case 'eccentricity': {
      const b = ready(1);
      if (!a || !b) return null;
      const e = eccentricity(probedPoints(a.c, a.r!.values), probedPoints(b.c, b.r!.values));
      return { value: e.eccentricity, details: { eccentricity: e.eccentricity, coaxiality: e.coaxiality } };
    }
    case 'runout-eccentricity': {
      if (!a) return null;
      const tir = Math.max(...a.r!.values);
      return { value: tir / 2, details: { tir } };
    }
    case 'mean-diameter':
    case 'ovality': {
      if (!a) return null;
      const d = twoPointDiameters(a.r!.values);
      return { value: c.derivedFormula === 'ovality' ? d.ovality : d.mean, details: { ...d } };
    }
    case 'stack-length':
    case 'parallelism':
    case 'squareness': {
      if (!a) return null;
      const p = heightsFit(a.c, a.r!.values, part);
      const value = c.derivedFormula === 'stack-length' ? p.stackLength : c.derivedFormula === 'parallelism' ? p.parallelism : p.squareness;
      return { value, details: { stackLength: p.stackLength, parallelism: p.parallelism, squareness: p.squareness } };
    }
    case 'stacking-factor-mass': {
      if (!a) return null;
      const massKg = a.r!.values.reduce((s, v) => s + v, 0) / a.r!.values.length;
      const massG = a.c.unit === 'g' ? massKg : massKg * 1000;
      const len = ready(1);
      const stackLengthMm = len ? reduceOwn(len.c, len.r!.values, part).value : part.nominalStackLengthMm;
      const sf = stackingFactorByMass({ massG, densityGcm3: part.densityGcm3, areaCm2: part.laminationAreaCm2, stackLengthMm });
      const factor = typeof sf === 'number' ? sf : (sf as { stackingFactor: number }).stackingFactor;
      return { value: c.unit === '%' ? factor * 100 : factor, details: { stackingFactor: factor, stackLengthMm } };
    }
    case 'insulation-resistance': {
      if (!a) return null;
      const ins = insulationFromCurrents(a.r!.values);
      return { value: ins.resistanceOhmCm2, details: { meanCurrentA: ins.meanCurrentA, resistanceOhmCm2: ins.resistanceOhmCm2 } };
    }
    case 'flux-penalty': {
      if (!a || part.designStackingFactor == null || part.designToothT == null) return null;
      const sf = a.r ? a.r.values[0] : null;
      if (sf == null) return null;
      const measured = a.c.unit === '%' ? sf / 100 : sf;
      const f = fluxPenalty({ designB: part.designToothT, designStackingFactor: part.designStackingFactor, measuredStackingFactor: measured });
      return { value: f.effectiveB, details: { effectiveB: f.effectiveB, ratio: f.ratio } };
    }
    default:
      return null;
  }
}

/**
 * Evaluates every characteristic of one core. `raw` holds what was entered (by code); derived
 * characteristics are computed from it.
 */
export function evaluateSample(chars: EvalCharacteristic[], part: EvalPart, raw: Record<string, RawReading | undefined>): Record<string, Evaluation> {
  const byCode = new Map(chars.map((c) => [c.code, c]));
  const out: Record<string, Evaluation> = {};
  const lookup: Lookup = (code) => {
    const c = byCode.get(code);
    return c ? { c, r: raw[code] } : undefined;
  };
  for (const c of chars) {
    const r = raw[c.code];
    try {
      if (c.kind === 'attribute' || c.layout === 'pass-fail') {
        const pass = r?.pass ?? null;
        out[c.code] = { value: null, conforming: pass, outOfLimits: [] };
        continue;
      }
      if (c.kind === 'derived') {
        const d = derive(c, part, lookup);
        out[c.code] = d ? { value: d.value, conforming: withinLimits(d.value, c.lsl, c.usl), outOfLimits: [], details: d.details } : { value: null, conforming: null, outOfLimits: [] };
        continue;
      }
      const need = expectedReadings(c);
      if (!r || r.values.length === 0) {
        out[c.code] = { value: null, conforming: null, outOfLimits: [] };
        continue;
      }
      if (r.values.length < need) {
        // Partly entered: flag what is out already, judge when complete.
        const outOf = judgesEachReading(c.layout) ? r.values.flatMap((v, i) => (withinLimits(v, c.lsl, c.usl) ? [] : [i])) : [];
        out[c.code] = { value: null, conforming: outOf.length ? false : null, outOfLimits: outOf };
        continue;
      }
      const reduced = reduceOwn(c, r.values, part);
      const perReading = judgesEachReading(c.layout);
      const outOf = perReading ? r.values.flatMap((v, i) => (withinLimits(v, c.lsl, c.usl) ? [] : [i])) : [];
      const conforming = perReading ? outOf.length === 0 : withinLimits(reduced.value, c.lsl, c.usl);
      out[c.code] = { value: reduced.value, conforming, outOfLimits: outOf, details: reduced.details };
    } catch (err) {
      out[c.code] = { value: null, conforming: null, outOfLimits: [], error: err instanceof ComputeError ? err.message : String(err) };
    }
  }
  return out;
}

/** A core is nonconforming when any characteristic is; a critical failure rejects the lot outright. */
export function proposeDecision(
  perCore: Record<string, Evaluation>[],
  chars: Pick<EvalCharacteristic, 'code'>[] & { severity?: string }[],
  accept: number,
  reject: number,
): { proposal: 'accept' | 'reject' | null; nonconforming: number; criticalFailures: number; incomplete: number; reason: string } {
  let nonconforming = 0;
  let critical = 0;
  let incomplete = 0;
  const sev = new Map((chars as { code: string; severity?: string }[]).map((c) => [c.code, c.severity]));
  for (const core of perCore) {
    const results = Object.entries(core);
    if (results.some(([, e]) => e.conforming === false)) nonconforming++;
    if (results.some(([code, e]) => e.conforming === false && sev.get(code) === 'critical')) critical++;
    if (results.some(([, e]) => e.conforming === null)) incomplete++;
  }
  if (critical > 0) return { proposal: 'reject', nonconforming, criticalFailures: critical, incomplete, reason: `${critical} core${critical === 1 ? '' : 's'} failed a critical characteristic` };
  if (nonconforming >= reject) return { proposal: 'reject', nonconforming, criticalFailures: 0, incomplete, reason: `${nonconforming} nonconforming ≥ Re ${reject}` };
  if (incomplete > 0) return { proposal: null, nonconforming, criticalFailures: 0, incomplete, reason: `${incomplete} core${incomplete === 1 ? '' : 's'} not fully inspected yet` };
  return { proposal: 'accept', nonconforming, criticalFailures: 0, incomplete: 0, reason: `${nonconforming} nonconforming ≤ Ac ${accept}` };
}
