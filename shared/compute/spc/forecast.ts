import { ComputeError } from '../errors';
import { linearRegression, studentTQuantile, upperPredictionBound } from './stats';

/**
 * Wear forecast: a straight line through a characteristic that grows with use (burr height
 * against lot number or die hits) and how far ahead it reaches the upper limit. Burr grows with
 * die wear and the die is resharpened as the trend nears the limit (common practice).
 *
 * The conservative figure uses the one-sided upper prediction bound for a single new
 * observation, ŷ(x) + t(conf, n−2)·s·√(1 + 1/n + (x − x̄)²/Sxx) (Montgomery & Runger, Applied
 * Statistics and Probability for Engineers, ch. 11): the first x at which a single part could
 * plausibly reach the limit.
 */

export interface WearForecastInput {
  /** Lot sequence numbers or cumulative die hits, one per measurement. */
  x: readonly number[];
  y: readonly number[];
  usl: number;
  /** One-sided confidence of the upper prediction bound; default 0.95. */
  confidence?: number;
}

export interface WearForecast {
  slope: number;
  intercept: number;
  r2: number;
  n: number;
  residualSd: number;
  /** The last (largest) x observed; forecasts count from here. */
  xLast: number;
  /**
   * How many more x units (lots, hits) until the fitted line reaches usl; 0 if it already has;
   * null when the slope is ≤ 0 (no upward trend to extrapolate).
   */
  lotsToLimit: number | null;
  /** x at which the fitted line reaches usl (xLast + lotsToLimit), or null. */
  xAtLimit: number | null;
  /**
   * Conservative: x units from xLast to the first x where the upper prediction bound reaches
   * usl; 0 if it is there already; null when the slope is ≤ 0.
   */
  lotsToLimitLower: number | null;
  xAtLimitLower: number | null;
  confidence: number;
  /** t quantile used by the bound (one-sided, df = n − 2). */
  t: number;
}

/** Fits y on x and forecasts when the wear trend reaches `usl`. */
export function wearForecast(input: WearForecastInput): WearForecast {
  const { x, y, usl } = input;
  const confidence = input.confidence ?? 0.95;
  if (!Number.isFinite(usl)) throw new ComputeError('usl must be a finite number', 'usl');
  if (!(confidence > 0 && confidence < 1)) throw new ComputeError('confidence must be between 0 and 1 (e.g. 0.95)', 'confidence');
  if (!Array.isArray(x) || x.length < 3) {
    throw new ComputeError('a wear forecast needs at least 3 measurements', 'x');
  }
  const fit = linearRegression(x, y);
  const xLast = Math.max(...x);
  const t = studentTQuantile(confidence, fit.df);
  const base = {
    slope: fit.slope,
    intercept: fit.intercept,
    r2: fit.r2,
    n: fit.n,
    residualSd: fit.residualSd,
    xLast,
    confidence,
    t,
  };
  if (!(fit.slope > 0)) {
    return { ...base, lotsToLimit: null, xAtLimit: null, lotsToLimitLower: null, xAtLimitLower: null };
  }

  // Point estimate: where the fitted line meets usl.
  const xLine = fit.xMean + (usl - fit.yMean) / fit.slope;
  const lotsToLimit = Math.max(0, xLine - xLast);

  // Conservative: the bound ŷ + t·se is convex in x and rises without end for slope > 0, so
  // from xLast it crosses usl at most once. Bracket by doubling, then bisect.
  const bound = (xv: number) => upperPredictionBound(fit, xv, confidence) - usl;
  let xLower: number;
  if (bound(xLast) >= 0) xLower = xLast;
  else {
    let lo = xLast;
    let step = Math.max(lotsToLimit, Math.abs(xLast) * 1e-9, 1e-9);
    let hi = xLast + step;
    while (bound(hi) < 0) {
      lo = hi;
      step *= 2;
      hi = xLast + step;
      if (!Number.isFinite(hi)) throw new ComputeError('the forecast does not reach the limit within a finite range', 'usl');
    }
    for (let i = 0; i < 200 && hi - lo > 1e-12 * Math.max(1, Math.abs(hi)); i++) {
      const mid = 0.5 * (lo + hi);
      if (bound(mid) < 0) lo = mid;
      else hi = mid;
    }
    xLower = hi;
  }
  return {
    ...base,
    lotsToLimit,
    xAtLimit: xLast + lotsToLimit,
    lotsToLimitLower: xLower - xLast,
    xAtLimitLower: xLower,
  };
}
