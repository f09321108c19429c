/**
 * Core geometry from probed points: bore and OD circles, roundness, bore-to-OD eccentricity,
 * two-point diameters and the end-face plane (stack length, parallelism, flatness, squareness).
 *
 * Definitions follow ISO 1101 (tolerance zones), ISO 12181 (roundness) and ISO 4291 (assessment
 * of roundness by least squares). Units are whatever the caller measured in (mm in Yokeline);
 * every function returns lengths in that same unit. Everything here is pure.
 */
import { ComputeError } from './errors';

/** A probed point, [x, y]. */
export type Point = [number, number];

/** A reading taken in polar form about the instrument's axis: angle in degrees, radius. */
export interface PolarReading {
  angleDeg: number;
  radius: number;
}

export interface CircleFit {
  centerX: number;
  centerY: number;
  radius: number;
  diameter: number;
  /** Peak-to-valley of the radial residuals about the least-squares centre (RONt, LSCI). */
  roundness: number;
  /** Distance from the fitted centre minus the fitted radius, one per input point, same order. */
  residuals: number[];
}

export interface LimaconFit {
  /** x offset of the part centre from the instrument axis (first harmonic, cosine term). */
  offsetX: number;
  /** y offset of the part centre from the instrument axis (first harmonic, sine term). */
  offsetY: number;
  /** √(offsetX² + offsetY²): how far the part sat off the instrument axis. */
  offset: number;
  meanRadius: number;
  /** Peak-to-valley of the residuals from the limaçon R + a cos θ + b sin θ. */
  roundness: number;
  residuals: number[];
}

export interface EccentricityResult {
  /** Distance between the least-squares centres of bore and OD. */
  eccentricity: number;
  /** Coaxiality / concentricity value: diameter of the zone holding the bore centre = 2 × eccentricity (ISO 1101). */
  coaxiality: number;
  bore: CircleFit;
  od: CircleFit;
}

export interface TwoPointDiameters {
  mean: number;
  min: number;
  max: number;
  /** max − min of the two-point diameters. */
  ovality: number;
}

/** One stack-height reading on an end face: where it was taken (polar) and the height there. */
export interface HeightReading {
  angleDeg: number;
  radius: number;
  height: number;
}

/** Heights taken at N equal angles on one probing radius, the first at `startDeg` (default 0). */
export interface EqualAngleHeights {
  heights: number[];
  radius: number;
  startDeg?: number;
}

export interface PlaneFitOptions {
  /**
   * Diameter across which squareness is stated (e.g. the core OD from the drawing). Defaults to
   * twice the largest probing radius, i.e. the circle the heights were actually taken on.
   */
  diameter?: number;
}

export interface PlaneFit {
  /** z = a + b·x + c·y, least squares. */
  a: number;
  b: number;
  c: number;
  /** Mean of the heights. */
  stackLength: number;
  /** max − min of the heights. */
  parallelism: number;
  /** max − min of the residuals from the fitted plane. */
  flatness: number;
  /** Slope of the fitted plane, √(b² + c²), length per length. */
  tiltMmPerMm: number;
  /** Rise of the fitted plane across `diameterUsed`: tilt × diameter. */
  squareness: number;
  diameterUsed: number;
  residuals: number[];
}

// ---------------------------------------------------------------------------------------------
// Helpers

function assertFinite(value: unknown, field: string, what: string): asserts value is number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new ComputeError(`${what} is not a finite number.`, field);
  }
}

function spread(values: readonly number[]): number {
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  return max - min;
}

function average(values: readonly number[]): number {
  let sum = 0;
  for (const v of values) sum += v;
  const first = sum / values.length;
  // Second pass removes the rounding left when values are large against their spread
  // (stack heights of 100 mm read to the micrometre).
  let correction = 0;
  for (const v of values) correction += v - first;
  return first + correction / values.length;
}

/**
 * Solves the 3×3 system M·s = r by Gaussian elimination with partial pivoting. The callers
 * have already rejected singular (collinear) inputs, so a zero pivot here means a bug.
 */
function solve3(m: number[][], r: number[]): [number, number, number] {
  const a = m.map((row, i) => [...row, r[i]]);
  for (let col = 0; col < 3; col++) {
    let pivot = col;
    for (let row = col + 1; row < 3; row++) {
      if (Math.abs(a[row][col]) > Math.abs(a[pivot][col])) pivot = row;
    }
    if (a[pivot][col] === 0) throw new ComputeError('The points do not determine a unique solution.');
    [a[col], a[pivot]] = [a[pivot], a[col]];
    for (let row = col + 1; row < 3; row++) {
      const f = a[row][col] / a[col][col];
      for (let k = col; k < 4; k++) a[row][k] -= f * a[col][k];
    }
  }
  const s = [0, 0, 0];
  for (let row = 2; row >= 0; row--) {
    let acc = a[row][3];
    for (let k = row + 1; k < 3; k++) acc -= a[row][k] * s[k];
    s[row] = acc / a[row][row];
  }
  return [s[0], s[1], s[2]];
}

/**
 * Centres xy data on its mean and returns the second moments. Centring is what keeps the fit
 * accurate when a CMM reports points far from its origin: the raw normal equations would mix
 * terms of order x⁴ ≈ 10¹³ with the residuals we need at 10⁻³.
 */
function centredMoments(xs: readonly number[], ys: readonly number[]) {
  const mx = average(xs);
  const my = average(ys);
  const u = xs.map((x) => x - mx);
  const v = ys.map((y) => y - my);
  let suu = 0;
  let svv = 0;
  let suv = 0;
  for (let i = 0; i < u.length; i++) {
    suu += u[i] * u[i];
    svv += v[i] * v[i];
    suv += u[i] * v[i];
  }
  return { mx, my, u, v, suu, svv, suv };
}

/**
 * Points lie on a line (or on one spot) when the 2×2 scatter matrix is singular. Relative test:
 * the determinant is compared with the square of the trace so the unit does not matter.
 */
function isCollinear(suu: number, svv: number, suv: number): boolean {
  const trace = suu + svv;
  if (trace === 0) return true;
  return suu * svv - suv * suv <= 1e-12 * trace * trace;
}

function readPoints(points: readonly Point[], field: string): { xs: number[]; ys: number[] } {
  if (!Array.isArray(points)) throw new ComputeError('Points must be a list of [x, y] pairs.', field);
  if (points.length < 3) {
    throw new ComputeError(`A circle needs at least 3 points (got ${points.length}).`, field);
  }
  const xs: number[] = [];
  const ys: number[] = [];
  points.forEach((p, i) => {
    if (!Array.isArray(p) || p.length !== 2) {
      throw new ComputeError(`Point ${i + 1} must be an [x, y] pair.`, field);
    }
    assertFinite(p[0], field, `Point ${i + 1}: x`);
    assertFinite(p[1], field, `Point ${i + 1}: y`);
    xs.push(p[0]);
    ys.push(p[1]);
  });
  return { xs, ys };
}

function fitCircle(points: readonly Point[], field: string): CircleFit {
  const { xs, ys } = readPoints(points, field);
  const n = xs.length;
  const { mx, my, u, v, suu, svv, suv } = centredMoments(xs, ys);
  if (isCollinear(suu, svv, suv)) {
    throw new ComputeError('The points lie on a straight line (or coincide); they do not define a circle.', field);
  }
  // Kåsa: minimise Σ(u² + v² + D·u + E·v + F)². Normal equations in (D, E, F); with centred
  // data Σu = Σv = 0, but the full system is kept so the formula reads as in REFERENCES.
  let su = 0;
  let sv = 0;
  let suz = 0;
  let svz = 0;
  let sz = 0;
  for (let i = 0; i < n; i++) {
    const z = u[i] * u[i] + v[i] * v[i];
    su += u[i];
    sv += v[i];
    suz += u[i] * z;
    svz += v[i] * z;
    sz += z;
  }
  const [d, e, f] = solve3(
    [
      [suu, suv, su],
      [suv, svv, sv],
      [su, sv, n],
    ],
    [-suz, -svz, -sz],
  );
  const cu = -d / 2;
  const cv = -e / 2;
  const radius = Math.sqrt(cu * cu + cv * cv - f);
  const residuals = u.map((ui, i) => Math.hypot(ui - cu, v[i] - cv) - radius);
  return {
    centerX: mx + cu,
    centerY: my + cv,
    radius,
    diameter: 2 * radius,
    roundness: spread(residuals),
    residuals,
  };
}

// ---------------------------------------------------------------------------------------------
// Circles

/**
 * Least-squares circle through probed points by the algebraic (Kåsa) fit, on mean-centred data.
 *
 * The Kåsa centre equals the geometric least-squares centre (ISO 12181 LSCI) for points spread
 * evenly around the circle and differs from it only by second order in the form error
 * otherwise; for cores (form error of micrometres on radii of tens of mm) the difference is far
 * below gauge resolution. Roundness is the spread (max − min) of the radial residuals about
 * that centre: RONt against the least-squares reference circle.
 *
 * Needs at least 3 finite, non-collinear points.
 */
export function circleFit(points: readonly Point[]): CircleFit {
  return fitCircle(points, 'points');
}

/**
 * Converts polar readings to xy points about the instrument axis (angle counter-clockwise
 * from +x, in degrees).
 */
export function pointsFromAngles(readings: readonly PolarReading[]): Point[] {
  if (!Array.isArray(readings)) throw new ComputeError('Readings must be a list of { angleDeg, radius }.', 'readings');
  return readings.map((r, i) => {
    assertFinite(r?.angleDeg, 'readings', `Reading ${i + 1}: angle`);
    assertFinite(r?.radius, 'readings', `Reading ${i + 1}: radius`);
    const t = (r.angleDeg * Math.PI) / 180;
    return [r.radius * Math.cos(t), r.radius * Math.sin(t)];
  });
}

/**
 * Limaçon fit for a roundness instrument: N radial readings rᵢ at equal angles θᵢ = 2πi/N,
 * the first at 0, counter-clockwise (ISO 4291). a = (2/N)Σrᵢcosθᵢ, b = (2/N)Σrᵢsinθᵢ,
 * R = (1/N)Σrᵢ are the least-squares fit of rᵢ ≈ R + a cosθᵢ + b sinθᵢ because cos and sin are
 * orthogonal over equal angles. The limaçon is the small-offset form of an off-axis circle, so
 * (a, b) is the part centre relative to the spindle axis.
 *
 * Readings may be absolute radii or deviations from a fixed reference radius (the instrument
 * zero): the offsets and roundness are the same either way, meanRadius shifts by the reference.
 * Needs at least 3 finite readings.
 */
export function limaconFit(radii: readonly number[]): LimaconFit {
  if (!Array.isArray(radii)) throw new ComputeError('Radii must be a list of numbers.', 'radii');
  const n = radii.length;
  if (n < 3) throw new ComputeError(`A limaçon fit needs at least 3 readings at equal angles (got ${n}).`, 'radii');
  radii.forEach((r, i) => assertFinite(r, 'radii', `Reading ${i + 1}`));
  let sc = 0;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const t = (2 * Math.PI * i) / n;
    sc += radii[i] * Math.cos(t);
    ss += radii[i] * Math.sin(t);
  }
  const a = (2 / n) * sc;
  const b = (2 / n) * ss;
  const meanRadius = average(radii);
  const residuals = radii.map((r, i) => {
    const t = (2 * Math.PI * i) / n;
    return r - (meanRadius + a * Math.cos(t) + b * Math.sin(t));
  });
  return { offsetX: a, offsetY: b, offset: Math.hypot(a, b), meanRadius, roundness: spread(residuals), residuals };
}

/**
 * Bore-to-OD eccentricity: distance between the least-squares centres of the two circles,
 * both probed in the same coordinate frame. Coaxiality (ISO 1101) is the diameter of the
 * cylindrical zone about the datum axis that holds the other axis, hence twice the offset.
 */
export function eccentricity(bore: readonly Point[], od: readonly Point[]): EccentricityResult {
  const boreFit = fitCircle(bore, 'bore');
  const odFit = fitCircle(od, 'od');
  const e = Math.hypot(boreFit.centerX - odFit.centerX, boreFit.centerY - odFit.centerY);
  return { eccentricity: e, coaxiality: 2 * e, bore: boreFit, od: odFit };
}

/**
 * Eccentricity from a dial-indicator total indicated runout on a mandrel: a round surface whose
 * centre sits e off the axis of rotation swings the indicator between R + e and R − e, so
 * TIR = 2e and e = TIR / 2. Form error also shows in the TIR, so this overstates e on an
 * out-of-round part; it is the shop-floor estimate, not a replacement for the circle fit.
 */
export function eccentricityFromRunout(tir: number): number {
  assertFinite(tir, 'tir', 'Runout (TIR)');
  if (tir < 0) throw new ComputeError('Runout (TIR) cannot be negative: it is the max − min indicator reading.', 'tir');
  return tir / 2;
}

/**
 * Two-point diameters (micrometer or bore gauge) at several angles: mean diameter and ovality
 * = max − min. Note that two-point readings cannot see odd-lobed form (a 3-lobe shape has a
 * constant two-point diameter), which is why the circle fit is preferred when points exist.
 */
export function twoPointDiameters(diameters: readonly number[]): TwoPointDiameters {
  if (!Array.isArray(diameters)) throw new ComputeError('Diameters must be a list of numbers.', 'diameters');
  if (diameters.length < 2) {
    throw new ComputeError(`Ovality needs two-point diameters at 2 or more angles (got ${diameters.length}).`, 'diameters');
  }
  diameters.forEach((d, i) => {
    assertFinite(d, 'diameters', `Diameter ${i + 1}`);
    if (d <= 0) throw new ComputeError(`Diameter ${i + 1} must be greater than zero.`, 'diameters');
  });
  const min = Math.min(...diameters);
  const max = Math.max(...diameters);
  return { mean: average(diameters), min, max, ovality: max - min };
}

// ---------------------------------------------------------------------------------------------
// End-face plane

function readHeights(input: readonly HeightReading[] | EqualAngleHeights): HeightReading[] {
  if (Array.isArray(input)) {
    return input.map((r: HeightReading, i) => {
      assertFinite(r?.angleDeg, 'heights', `Height reading ${i + 1}: angle`);
      assertFinite(r?.radius, 'heights', `Height reading ${i + 1}: radius`);
      assertFinite(r?.height, 'heights', `Height reading ${i + 1}: height`);
      if (r.radius < 0) throw new ComputeError(`Height reading ${i + 1}: radius cannot be negative.`, 'heights');
      return r;
    });
  }
  const eq = input as EqualAngleHeights;
  if (!eq || !Array.isArray(eq.heights)) {
    throw new ComputeError('Heights must be a list of readings or { heights, radius }.', 'heights');
  }
  assertFinite(eq.radius, 'radius', 'Probing radius');
  if (eq.radius <= 0) throw new ComputeError('Probing radius must be greater than zero.', 'radius');
  const start = eq.startDeg ?? 0;
  assertFinite(start, 'startDeg', 'Start angle');
  const n = eq.heights.length;
  return eq.heights.map((h, i) => {
    assertFinite(h, 'heights', `Height ${i + 1}`);
    return { angleDeg: start + (360 * i) / n, radius: eq.radius, height: h };
  });
}

/**
 * Least-squares plane z = a + b·x + c·y through stack heights on an end face, and the
 * values the inspection plan judges. Heights are measured from a reference perpendicular to
 * the core axis (the surface plate the other end face stands on, or a mandrel shoulder).
 *
 * - stackLength: mean of the heights (the stack length the core was built to).
 * - parallelism: max − min of the heights. With the opposite face as datum on the plate this is
 *   the width of the ISO 1101 parallelism zone that the probed points occupy.
 * - flatness: max − min of the residuals from the least-squares plane (least-squares reference,
 *   like RONt for circles; it is never smaller than the minimum-zone value).
 * - tiltMmPerMm: √(b² + c²), the slope of the fitted face against the reference.
 * - squareness: tilt × diameter, the rise of the fitted face across the diameter — how far the
 *   face leans over the part's width, the shop-floor reading of end-face squareness.
 *
 * Accepts readings with their own angle and radius, or heights at N equal angles on one
 * radius. Needs at least 3 finite points that are not on one line.
 */
export function planeFromHeights(
  input: readonly HeightReading[] | EqualAngleHeights,
  options: PlaneFitOptions = {},
): PlaneFit {
  const readings = readHeights(input);
  if (readings.length < 3) {
    throw new ComputeError(`A plane needs at least 3 height readings (got ${readings.length}).`, 'heights');
  }
  const xs = readings.map((r) => r.radius * Math.cos((r.angleDeg * Math.PI) / 180));
  const ys = readings.map((r) => r.radius * Math.sin((r.angleDeg * Math.PI) / 180));
  const zs = readings.map((r) => r.height);
  const n = readings.length;
  const { mx, my, u, v, suu, svv, suv } = centredMoments(xs, ys);
  if (isCollinear(suu, svv, suv)) {
    throw new ComputeError('The height readings lie on one line across the face; they do not define a plane.', 'heights');
  }
  const mz = average(zs);
  let su = 0;
  let sv = 0;
  let suw = 0;
  let svw = 0;
  let sw = 0;
  for (let i = 0; i < n; i++) {
    const w = zs[i] - mz;
    su += u[i];
    sv += v[i];
    suw += u[i] * w;
    svw += v[i] * w;
    sw += w;
  }
  // Centred model w = a' + b·u + c·v; a' ≈ 0 on centred data, kept so the system is the full 3×3.
  const [b, c, a0] = solve3(
    [
      [suu, suv, su],
      [suv, svv, sv],
      [su, sv, n],
    ],
    [suw, svw, sw],
  );
  const a = mz + a0 - b * mx - c * my;
  const residuals = zs.map((z, i) => z - (a + b * xs[i] + c * ys[i]));

  let diameterUsed: number;
  if (options.diameter !== undefined) {
    assertFinite(options.diameter, 'diameter', 'Diameter');
    if (options.diameter <= 0) throw new ComputeError('Diameter must be greater than zero.', 'diameter');
    diameterUsed = options.diameter;
  } else {
    diameterUsed = 2 * Math.max(...readings.map((r) => r.radius));
  }
  const tilt = Math.hypot(b, c);
  return {
    a,
    b,
    c,
    stackLength: mz,
    parallelism: spread(zs),
    flatness: spread(residuals),
    tiltMmPerMm: tilt,
    squareness: tilt * diameterUsed,
    diameterUsed,
    residuals,
  };
}
