import { ComputeError } from '../errors';

/**
 * Numerics the SPC code rests on: stable moments, the normal and Student t distributions, and
 * simple linear regression with prediction bounds. Everything is written out here (no
 * dependency) so the browser and the server compute the same limits to the last digit.
 */

/** Throws unless `values` is an array of at least `min` finite numbers. */
export function assertFiniteValues(values: readonly number[], field: string, min = 1): void {
  if (!Array.isArray(values)) throw new ComputeError(`${field} must be a list of numbers`, field);
  if (values.length < min) {
    throw new ComputeError(`${field} needs at least ${min} value${min === 1 ? '' : 's'}`, field);
  }
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw new ComputeError(`${field}: value ${i + 1} is not a finite number`, field);
    }
  }
}

/**
 * Arithmetic mean by two passes: the second pass adds back the mean of the residuals, which
 * removes the rounding left by summing large, nearly equal numbers (NIST StRD NumAcc3/4).
 */
export function mean(values: readonly number[]): number {
  assertFiniteValues(values, 'values', 1);
  const n = values.length;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += values[i];
  const first = sum / n;
  let correction = 0;
  for (let i = 0; i < n; i++) correction += values[i] - first;
  return first + correction / n;
}

/**
 * Sample variance (divisor n − 1) by the corrected two-pass formula
 * Σ(x − m)² − (Σ(x − m))²/n. The textbook one-pass Σx² − (Σx)²/n cancels catastrophically
 * when the mean is large against the spread, which NumAcc4 is built to expose.
 */
export function sampleVariance(values: readonly number[]): number {
  assertFiniteValues(values, 'values', 2);
  const n = values.length;
  const m = mean(values);
  let ss = 0;
  let s = 0;
  for (let i = 0; i < n; i++) {
    const d = values[i] - m;
    ss += d * d;
    s += d;
  }
  return Math.max(0, (ss - (s * s) / n) / (n - 1));
}

/** Sample standard deviation, divisor n − 1. */
export function sampleSd(values: readonly number[]): number {
  return Math.sqrt(sampleVariance(values));
}

// ---------------------------------------------------------------------------------------------
// Gamma and incomplete gamma / beta functions

const HALF_LOG_2PI = 0.5 * Math.log(2 * Math.PI);
/** B₂ₖ / (2k(2k − 1)) for k = 1..7, from the Bernoulli numbers 1/6, −1/30, 1/42, −1/30, 5/66, −691/2730, 7/6. */
const STIRLING = [1 / 12, -1 / 360, 1 / 1260, -1 / 1680, 1 / 1188, -691 / 360360, 1 / 156];

/**
 * ln Γ(x) for x > 0. Stirling's series is used above 15, where seven terms are below 1e-17;
 * smaller arguments are shifted up with Γ(x) = Γ(x + k) / (x(x+1)…(x+k−1)). Chosen over a
 * Lanczos fit because every coefficient here follows from the Bernoulli numbers.
 */
export function lnGamma(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) throw new ComputeError('lnGamma needs a positive finite argument');
  let shift = 0;
  let product = 1;
  let z = x;
  while (z < 15) {
    product *= z;
    z += 1;
    // Keep the running product away from overflow for tiny x (it cannot overflow otherwise).
    if (product > 1e250) {
      shift += Math.log(product);
      product = 1;
    }
  }
  shift += Math.log(product);
  const inv = 1 / z;
  const inv2 = inv * inv;
  let series = 0;
  let power = inv;
  for (const c of STIRLING) {
    series += c * power;
    power *= inv2;
  }
  return (z - 0.5) * Math.log(z) - z + HALF_LOG_2PI + series - shift;
}

/** Smallest magnitude used by the Lentz continued-fraction algorithm to avoid dividing by 0. */
const TINY = 1e-300;
const EPS = 1e-16;

/** Regularized lower incomplete gamma P(a, x) by its power series (good for x < a + 1). */
function gammaPSeries(a: number, x: number): number {
  let term = 1 / a;
  let sum = term;
  for (let k = 1; k < 1000; k++) {
    term *= x / (a + k);
    sum += term;
    if (Math.abs(term) < Math.abs(sum) * EPS) break;
  }
  return sum * Math.exp(-x + a * Math.log(x) - lnGamma(a));
}

/** Regularized upper incomplete gamma Q(a, x) by its continued fraction (good for x ≥ a + 1). */
function gammaQContinuedFraction(a: number, x: number): number {
  let b = x + 1 - a;
  let c = 1 / TINY;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 1000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < TINY) d = TINY;
    c = b + an / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < EPS) break;
  }
  return Math.exp(-x + a * Math.log(x) - lnGamma(a)) * h;
}

/**
 * Complementary error function, erfc(x) = Q(½, x²), from the incomplete gamma series or
 * continued fraction. Relative accuracy is near machine precision across the range, including
 * the far tail, which is what ppm-out-of-specification figures need.
 */
export function erfc(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (x < 0) return 2 - erfc(-x);
  if (x === 0) return 1;
  if (x > 27.3) return 0; // erfc underflows double precision past here
  const x2 = x * x;
  return x2 < 1.5 ? 1 - gammaPSeries(0.5, x2) : gammaQContinuedFraction(0.5, x2);
}

/** Error function. */
export function erf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (x < 0) return -erf(-x);
  const x2 = x * x;
  return x2 < 1.5 ? gammaPSeries(0.5, x2) : 1 - erfc(x);
}

/** Standard normal density φ(z). */
export function normalPdf(z: number): number {
  return Math.exp(-0.5 * z * z - HALF_LOG_2PI);
}

/** Standard normal distribution function Φ(z), via erfc so that the lower tail keeps its digits. */
export function normalCdf(z: number): number {
  return 0.5 * erfc(-z / Math.SQRT2);
}

/** Upper tail 1 − Φ(z), computed directly (no cancellation for large z). */
export function normalUpperTail(z: number): number {
  return 0.5 * erfc(z / Math.SQRT2);
}

/**
 * Standard normal quantile Φ⁻¹(p). Starts from Abramowitz & Stegun 26.2.23 (|error| < 4.5e-4)
 * and polishes with Halley steps on the erfc-based tail until the step is below 1e-15, so the
 * result is as good as normalCdf itself.
 */
export function normalQuantile(p: number): number {
  if (!(p >= 0 && p <= 1)) throw new ComputeError('a probability must lie between 0 and 1');
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  if (p === 0.5) return 0;
  const q = p < 0.5 ? p : 1 - p; // work in the upper tail: find z > 0 with Q(z) = q
  const t = Math.sqrt(-2 * Math.log(q));
  let z = t - (2.515517 + 0.802853 * t + 0.010328 * t * t) / (1 + 1.432788 * t + 0.189269 * t * t + 0.001308 * t * t * t);
  for (let i = 0; i < 50; i++) {
    const g = normalUpperTail(z) - q;
    const u = g / -normalPdf(z); // Newton step g / g'
    const step = u / (1 + (u * z) / 2); // Halley correction, g'' = zφ(z)
    z -= step;
    if (Math.abs(step) <= 1e-15 * Math.max(1, Math.abs(z))) break;
  }
  return p < 0.5 ? -z : z;
}

/** ln B(a, b). */
function lnBeta(a: number, b: number): number {
  return lnGamma(a) + lnGamma(b) - lnGamma(a + b);
}

/** Continued fraction for the incomplete beta function (modified Lentz). */
function betaContinuedFraction(a: number, b: number, x: number): number {
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < TINY) d = TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m < 10000; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < EPS) break;
  }
  return h;
}

/**
 * Regularized incomplete beta I_x(a, b). `y` = 1 − x may be passed when the caller can form it
 * without cancellation (the Student t tail does), which keeps digits when x is close to 1.
 */
export function incompleteBeta(a: number, b: number, x: number, y = 1 - x): number {
  if (x <= 0) return 0;
  if (y <= 0) return 1;
  const front = Math.exp(a * Math.log(x) + b * Math.log(y) - lnBeta(a, b));
  if (x < (a + 1) / (a + b + 2)) return (front * betaContinuedFraction(a, b, x)) / a;
  return 1 - (front * betaContinuedFraction(b, a, y)) / b;
}

// ---------------------------------------------------------------------------------------------
// Student t

function assertDf(df: number): void {
  if (!(df > 0) || !Number.isFinite(df)) throw new ComputeError('degrees of freedom must be a positive number');
}

/** Upper tail P(T > t) for t ≥ 0: ½ I_{ν/(ν+t²)}(ν/2, ½). */
function studentTUpperTail(t: number, df: number): number {
  const t2 = t * t;
  const x = df / (df + t2);
  const y = t2 / (df + t2);
  return 0.5 * incompleteBeta(df / 2, 0.5, x, y);
}

/** Student t distribution function P(T ≤ t) with `df` degrees of freedom. */
export function studentTCdf(t: number, df: number): number {
  assertDf(df);
  if (Number.isNaN(t)) return NaN;
  if (t === Infinity) return 1;
  if (t === -Infinity) return 0;
  const tail = studentTUpperTail(Math.abs(t), df);
  return t >= 0 ? 1 - tail : tail;
}

/** Student t density. */
export function studentTPdf(t: number, df: number): number {
  assertDf(df);
  const logC = lnGamma((df + 1) / 2) - lnGamma(df / 2) - 0.5 * Math.log(df * Math.PI);
  return Math.exp(logC - ((df + 1) / 2) * Math.log1p((t * t) / df));
}

/**
 * Student t quantile: the t with P(T ≤ t) = p. Closed forms for ν = 1 and 2; otherwise Newton's
 * method on the upper tail, safeguarded by a bracket that is bisected whenever a Newton step
 * would leave it, so it converges for any ν > 0 and any p in (0, 1).
 */
export function studentTQuantile(p: number, df: number): number {
  assertDf(df);
  if (!(p >= 0 && p <= 1)) throw new ComputeError('a probability must lie between 0 and 1');
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  if (p === 0.5) return 0;
  const q = p < 0.5 ? p : 1 - p; // upper-tail probability of the positive root
  const sign = p < 0.5 ? -1 : 1;
  if (df === 1) return sign * Math.tan(Math.PI * (0.5 - q));
  if (df === 2) return (sign * (1 - 2 * q)) / Math.sqrt(2 * q * (1 - q));

  // Start from the normal quantile widened by the first Cornish–Fisher term.
  const z = normalQuantile(1 - q);
  let t = z + (z * z * z + z) / (4 * df);
  let lo = 0; // upper tail at lo is ½ > q
  let hi = Math.max(2 * t, 1);
  while (studentTUpperTail(hi, df) > q) {
    lo = hi;
    hi *= 2;
    if (!Number.isFinite(hi)) return sign * Infinity;
  }
  if (!(t > lo && t < hi)) t = 0.5 * (lo + hi);
  for (let i = 0; i < 200; i++) {
    const g = studentTUpperTail(t, df) - q; // decreasing in t
    if (g === 0) break;
    if (g > 0) lo = t;
    else hi = t;
    let next = t + g / studentTPdf(t, df);
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    const step = Math.abs(next - t);
    t = next;
    if (step <= 1e-15 * t || hi - lo <= 1e-15 * t) break;
  }
  return sign * t;
}

// ---------------------------------------------------------------------------------------------
// Simple linear regression

export interface LinearFit {
  n: number;
  slope: number;
  intercept: number;
  /** Coefficient of determination; 1 when every y is equal (the flat line fits exactly). */
  r2: number;
  /** Residual standard deviation √(SSE / (n − 2)); 0 when n = 2. */
  residualSd: number;
  slopeSe: number;
  interceptSe: number;
  xMean: number;
  yMean: number;
  /** Σ(x − x̄)². */
  sxx: number;
  sse: number;
  /** Degrees of freedom of the residual, n − 2. */
  df: number;
}

/** Least-squares line y = intercept + slope·x, fitted about the means for accuracy (NIST StRD Norris). */
export function linearRegression(x: readonly number[], y: readonly number[]): LinearFit {
  assertFiniteValues(x, 'x', 2);
  assertFiniteValues(y, 'y', 2);
  if (x.length !== y.length) throw new ComputeError('x and y must have the same number of values', 'y');
  const n = x.length;
  const xMean = mean(x);
  const yMean = mean(y);
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i] - xMean;
    const dy = y[i] - yMean;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  if (sxx === 0) throw new ComputeError('x values are all equal, so no line can be fitted', 'x');
  const slope = sxy / sxx;
  const intercept = yMean - slope * xMean;
  let sse = 0;
  for (let i = 0; i < n; i++) {
    const r = y[i] - yMean - slope * (x[i] - xMean);
    sse += r * r;
  }
  const df = n - 2;
  const residualSd = df > 0 ? Math.sqrt(sse / df) : 0;
  return {
    n,
    slope,
    intercept,
    r2: syy === 0 ? 1 : 1 - sse / syy,
    residualSd,
    slopeSe: residualSd / Math.sqrt(sxx),
    interceptSe: residualSd * Math.sqrt(1 / n + (xMean * xMean) / sxx),
    xMean,
    yMean,
    sxx,
    sse,
    df,
  };
}

function assertConfidence(confidence: number): void {
  if (!(confidence > 0 && confidence < 1)) throw new ComputeError('confidence must be between 0 and 1 (e.g. 0.95)', 'confidence');
}

function assertCanPredict(fit: LinearFit): void {
  if (fit.df < 1) throw new ComputeError('a prediction bound needs at least 3 points', 'x');
}

/** Fitted value at x0. */
export function predict(fit: LinearFit, x0: number): number {
  return fit.yMean + fit.slope * (x0 - fit.xMean);
}

/** Standard error of a single new observation at x0: s·√(1 + 1/n + (x0 − x̄)²/Sxx). */
export function predictionSe(fit: LinearFit, x0: number): number {
  const dx = x0 - fit.xMean;
  return fit.residualSd * Math.sqrt(1 + 1 / fit.n + (dx * dx) / fit.sxx);
}

/** Two-sided prediction interval for one new observation at x0, t quantile 1 − α/2. */
export function predictionInterval(fit: LinearFit, x0: number, confidence = 0.95): { fit: number; lower: number; upper: number } {
  assertConfidence(confidence);
  assertCanPredict(fit);
  const yHat = predict(fit, x0);
  const half = studentTQuantile(1 - (1 - confidence) / 2, fit.df) * predictionSe(fit, x0);
  return { fit: yHat, lower: yHat - half, upper: yHat + half };
}

/** One-sided upper prediction bound for one new observation at x0, t quantile = confidence. */
export function upperPredictionBound(fit: LinearFit, x0: number, confidence = 0.95): number {
  assertConfidence(confidence);
  assertCanPredict(fit);
  return predict(fit, x0) + studentTQuantile(confidence, fit.df) * predictionSe(fit, x0);
}
