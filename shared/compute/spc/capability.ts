import { ComputeError } from '../errors';
import { c4, d2 } from './constants';
import { assertFiniteValues, mean, normalCdf, normalUpperTail, sampleSd } from './stats';

/**
 * Process capability and performance (AIAG SPC manual; ISO 22514-2; NIST/SEMATECH e-Handbook
 * §6.1.6):
 *   Cp = (USL − LSL)/6σw,  Cpk = min(USL − μ, μ − LSL)/3σw   with σw the within-subgroup σ
 *   Pp, Ppk the same with σ the overall sample standard deviation (n − 1).
 * Cp and Pp need both limits; with one limit Cpk/Ppk are the one-sided index.
 * Expected ppm out of specification assume a normal distribution with the estimated μ and σ.
 */

export interface SpecLimits {
  lsl?: number;
  usl?: number;
}

export interface CapabilityIndices {
  cp?: number;
  cpk: number;
  /** (USL − μ)/3σ, when USL is given. */
  cpu?: number;
  /** (μ − LSL)/3σ, when LSL is given. */
  cpl?: number;
}

export interface PpmOutOfSpec {
  below: number;
  above: number;
  total: number;
}

function checkLimits({ lsl, usl }: SpecLimits): void {
  if (lsl === undefined && usl === undefined) {
    throw new ComputeError('give at least one specification limit (lsl or usl)', 'usl');
  }
  if (lsl !== undefined && !Number.isFinite(lsl)) throw new ComputeError('lsl must be a finite number', 'lsl');
  if (usl !== undefined && !Number.isFinite(usl)) throw new ComputeError('usl must be a finite number', 'usl');
  if (lsl !== undefined && usl !== undefined && !(lsl < usl)) throw new ComputeError('lsl must be below usl', 'lsl');
}

function checkSigma(sigma: number, field: string): void {
  if (!(Number.isFinite(sigma) && sigma > 0)) {
    throw new ComputeError(`${field} must be above 0; capability cannot be computed when the spread is zero`, field);
  }
}

/** Capability indices for a given mean and σ. */
export function capabilityIndices(input: SpecLimits & { mean: number; sigma: number }): CapabilityIndices {
  checkLimits(input);
  checkSigma(input.sigma, 'sigma');
  if (!Number.isFinite(input.mean)) throw new ComputeError('mean must be a finite number', 'mean');
  const { lsl, usl, mean: mu, sigma } = input;
  const cpu = usl !== undefined ? (usl - mu) / (3 * sigma) : undefined;
  const cpl = lsl !== undefined ? (mu - lsl) / (3 * sigma) : undefined;
  const cp = lsl !== undefined && usl !== undefined ? (usl - lsl) / (6 * sigma) : undefined;
  const cpk = Math.min(cpu ?? Infinity, cpl ?? Infinity);
  return { ...(cp !== undefined && { cp }), cpk, ...(cpu !== undefined && { cpu }), ...(cpl !== undefined && { cpl }) };
}

/** Expected parts per million outside the limits for a normal distribution N(mean, σ²). */
export function expectedPpm(input: SpecLimits & { mean: number; sigma: number }): PpmOutOfSpec {
  checkLimits(input);
  checkSigma(input.sigma, 'sigma');
  const { lsl, usl, mean: mu, sigma } = input;
  // Tails computed directly (not 1 − Φ) so a few ppm keep their digits.
  const below = lsl !== undefined ? 1e6 * normalCdf((lsl - mu) / sigma) : 0;
  const above = usl !== undefined ? 1e6 * normalUpperTail((usl - mu) / sigma) : 0;
  return { below, above, total: below + above };
}

export interface CapabilityInput extends SpecLimits {
  /** Individual measurements in time order (σw from MR̄/d2(2)). */
  values?: readonly number[];
  /** Rational subgroups of equal size (σw from R̄/d2 for n ≤ 10, otherwise s̄/c4). */
  subgroups?: readonly (readonly number[])[];
  /** Overrides the σw estimate, e.g. with the σ of a chart in phase II. */
  sigmaWithin?: number;
}

export type SigmaWithinMethod = 'given' | 'rbar-d2' | 'sbar-c4' | 'mrbar-d2';

export interface CapabilityResult {
  cp?: number;
  cpk: number;
  cpu?: number;
  cpl?: number;
  pp?: number;
  ppk: number;
  ppu?: number;
  ppl?: number;
  mean: number;
  sigmaWithin: number;
  sigmaWithinMethod: SigmaWithinMethod;
  sigmaOverall: number;
  n: number;
  /** Expected ppm out of specification using σw (potential) and σ overall (performance). */
  ppmWithin: PpmOutOfSpec;
  ppmOverall: PpmOutOfSpec;
}

function estimateSigmaWithin(input: CapabilityInput): { sigma: number; method: SigmaWithinMethod } {
  if (input.sigmaWithin !== undefined) {
    checkSigma(input.sigmaWithin, 'sigmaWithin');
    return { sigma: input.sigmaWithin, method: 'given' };
  }
  if (input.subgroups) {
    const size = input.subgroups[0].length;
    if (input.subgroups.some((g) => g.length !== size)) {
      throw new ComputeError('subgroups must all be the same size to estimate the within-subgroup sigma', 'subgroups');
    }
    if (size < 2) throw new ComputeError('subgroups need at least 2 measurements each', 'subgroups');
    if (size <= 10) {
      const rBar = mean(input.subgroups.map((g) => Math.max(...g) - Math.min(...g)));
      return { sigma: rBar / d2(size), method: 'rbar-d2' };
    }
    const sBar = mean(input.subgroups.map((g) => sampleSd(g)));
    return { sigma: sBar / c4(size), method: 'sbar-c4' };
  }
  const v = input.values as readonly number[];
  const mrs: number[] = [];
  for (let i = 1; i < v.length; i++) mrs.push(Math.abs(v[i] - v[i - 1]));
  return { sigma: mean(mrs) / d2(2), method: 'mrbar-d2' };
}

/** Capability (Cp, Cpk) and performance (Pp, Ppk) of measured data against specification limits. */
export function capability(input: CapabilityInput): CapabilityResult {
  checkLimits(input);
  if ((input.values === undefined) === (input.subgroups === undefined)) {
    throw new ComputeError('give either values or subgroups', 'values');
  }
  let all: number[];
  if (input.subgroups) {
    if (!Array.isArray(input.subgroups) || input.subgroups.length === 0) {
      throw new ComputeError('subgroups must be a non-empty list of subgroups', 'subgroups');
    }
    all = input.subgroups.flatMap((g, i) => {
      if (!Array.isArray(g)) throw new ComputeError(`subgroup ${i + 1} must be a list of measurements`, 'subgroups');
      return g;
    });
    assertFiniteValues(all, 'subgroups', 2);
  } else {
    all = [...(input.values as readonly number[])];
    assertFiniteValues(all, 'values', 2);
  }
  const mu = mean(all);
  const sigmaOverall = sampleSd(all);
  const within = estimateSigmaWithin(input);
  checkSigma(within.sigma, 'sigmaWithin');
  checkSigma(sigmaOverall, 'sigmaOverall');
  const limits = { lsl: input.lsl, usl: input.usl };
  const w = capabilityIndices({ ...limits, mean: mu, sigma: within.sigma });
  const o = capabilityIndices({ ...limits, mean: mu, sigma: sigmaOverall });
  return {
    ...w,
    ...(o.cp !== undefined && { pp: o.cp }),
    ppk: o.cpk,
    ...(o.cpu !== undefined && { ppu: o.cpu }),
    ...(o.cpl !== undefined && { ppl: o.cpl }),
    mean: mu,
    sigmaWithin: within.sigma,
    sigmaWithinMethod: within.method,
    sigmaOverall,
    n: all.length,
    ppmWithin: expectedPpm({ ...limits, mean: mu, sigma: within.sigma }),
    ppmOverall: expectedPpm({ ...limits, mean: mu, sigma: sigmaOverall }),
  };
}
