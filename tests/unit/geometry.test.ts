import { describe, expect, it } from 'vitest';
import { ComputeError } from '../../shared/compute/errors';
import {
  circleFit,
  eccentricity,
  eccentricityFromRunout,
  limaconFit,
  planeFromHeights,
  pointsFromAngles,
  twoPointDiameters,
  type HeightReading,
  type Point,
} from '../../shared/compute/geometry';

// -----------------------------------------------------------------------------------------------
// Independent references written for these tests only.
// -----------------------------------------------------------------------------------------------

/** Deterministic noise so a failure can be reproduced (mulberry32). */
function makeRandom(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function circlePoints(cx: number, cy: number, r: number, n: number, radial: (i: number) => number = () => 0): Point[] {
  return Array.from({ length: n }, (_, i) => {
    const t = (2 * Math.PI * i) / n;
    const ri = r + radial(i);
    return [cx + ri * Math.cos(t), cy + ri * Math.sin(t)] as Point;
  });
}

/**
 * Geometric least-squares circle (the ISO 12181 LSCI definition: minimise Σ(dᵢ − r)²) by
 * Gauss-Newton, started from the centroid. A different method from the algebraic fit under test.
 */
function geometricFit(points: Point[]): { cx: number; cy: number; r: number } {
  let cx = points.reduce((s, p) => s + p[0], 0) / points.length;
  let cy = points.reduce((s, p) => s + p[1], 0) / points.length;
  let r = points.reduce((s, p) => s + Math.hypot(p[0] - cx, p[1] - cy), 0) / points.length;
  for (let iter = 0; iter < 100; iter++) {
    // J rows: ∂(dᵢ − r)/∂(cx, cy, r) = (−(x−cx)/d, −(y−cy)/d, −1); solve JᵀJ δ = −Jᵀres.
    const jtj = [
      [0, 0, 0],
      [0, 0, 0],
      [0, 0, 0],
    ];
    const jtr = [0, 0, 0];
    for (const [x, y] of points) {
      const d = Math.hypot(x - cx, y - cy);
      const row = [-(x - cx) / d, -(y - cy) / d, -1];
      const res = d - r;
      for (let i = 0; i < 3; i++) {
        jtr[i] += row[i] * res;
        for (let j = 0; j < 3; j++) jtj[i][j] += row[i] * row[j];
      }
    }
    // Cramer's rule: small, and unlike the module's elimination.
    const det3 = (m: number[][]) =>
      m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) -
      m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
      m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
    const det = det3(jtj);
    const delta = [0, 1, 2].map((k) => det3(jtj.map((row, i) => row.map((val, j) => (j === k ? -jtr[i] : val)))) / det);
    cx += delta[0];
    cy += delta[1];
    r += delta[2];
    if (Math.hypot(delta[0], delta[1], delta[2]) < 1e-14) break;
  }
  return { cx, cy, r };
}

/** Circumcircle of three points (textbook perpendicular-bisector formula). */
function circumcircle([ax, ay]: Point, [bx, by]: Point, [cx, cy]: Point) {
  const d = 2 * (ax * (by - cy) + bx * (cy - ay) + cx * (ay - by));
  const ux = ((ax * ax + ay * ay) * (by - cy) + (bx * bx + by * by) * (cy - ay) + (cx * cx + cy * cy) * (ay - by)) / d;
  const uy = ((ax * ax + ay * ay) * (cx - bx) + (bx * bx + by * by) * (ax - cx) + (cx * cx + cy * cy) * (bx - ax)) / d;
  return { cx: ux, cy: uy, r: Math.hypot(ax - ux, ay - uy) };
}

function expectComputeError(fn: () => unknown, field: string, message?: RegExp): void {
  try {
    fn();
  } catch (err) {
    expect(err).toBeInstanceOf(ComputeError);
    expect((err as ComputeError).field).toBe(field);
    if (message) expect((err as ComputeError).message).toMatch(message);
    return;
  }
  throw new Error('expected a ComputeError');
}

// -----------------------------------------------------------------------------------------------

describe('circleFit', () => {
  it('recovers a perfect circle exactly from 8 points at 45°', () => {
    const sut = circleFit(circlePoints(10, -5, 25, 8));
    expect(sut.centerX).toBeCloseTo(10, 12); // REFERENCES Geometry: 8 points at 45° on (10, −5), r 25 → exact
    expect(sut.centerY).toBeCloseTo(-5, 12); // REFERENCES Geometry
    expect(sut.radius).toBeCloseTo(25, 12); // REFERENCES Geometry
    expect(sut.diameter).toBeCloseTo(50, 12); // REFERENCES Geometry
    expect(sut.roundness).toBeLessThan(1e-12); // ISO 12181: a perfect circle has RONt 0
    expect(sut.residuals).toHaveLength(8);
  });

  it('gives roundness 2δ for a perfect circle with alternating ±δ radial residuals', () => {
    // 4-fold symmetric construction: the ±δ pattern is a 4-lobe form, orthogonal to the centre
    // terms, so the least-squares centre stays on the true centre and RONt = (+δ) − (−δ).
    const delta = 0.004;
    const sut = circleFit(circlePoints(10, -5, 25, 8, (i) => (i % 2 === 0 ? delta : -delta)));
    expect(sut.centerX).toBeCloseTo(10, 12); // construction: symmetric form does not move the centre
    expect(sut.centerY).toBeCloseTo(-5, 12); // construction
    expect(sut.roundness).toBeCloseTo(2 * delta, 12); // ISO 12181 RONt = max − min residual = 2δ
    expect(sut.radius).toBeCloseTo(Math.sqrt(25 ** 2 + delta ** 2), 12); // Kåsa r² = mean of dᵢ² (REFERENCES formula)
  });

  it('equals the circumcircle for three points', () => {
    const pts: Point[] = [
      [3, 1],
      [-2, 7.5],
      [-4, -3],
    ];
    const ref = circumcircle(pts[0], pts[1], pts[2]);
    const sut = circleFit(pts);
    expect(sut.centerX).toBeCloseTo(ref.cx, 10); // three points fix one circle (Euclid)
    expect(sut.centerY).toBeCloseTo(ref.cy, 10); // circumcircle
    expect(sut.radius).toBeCloseTo(ref.r, 10); // circumcircle
    expect(sut.roundness).toBeLessThan(1e-10); // every point is on the circle
  });

  it('agrees with an iterative geometric least-squares fit on noisy, unevenly spaced points', () => {
    const rand = makeRandom(42);
    // 40 points over 300° (a probe that cannot reach one sector), ±5 µm noise on r 60 mm.
    const pts: Point[] = Array.from({ length: 40 }, () => {
      const t = (rand() * 300 * Math.PI) / 180;
      const r = 60 + (rand() - 0.5) * 0.01;
      return [120.5 + r * Math.cos(t), -33.2 + r * Math.sin(t)];
    });
    const ref = geometricFit(pts);
    const sut = circleFit(pts);
    // Kåsa and geometric centres differ by second order in the form error (≈ δ²/r ≈ 1e-6 mm here).
    expect(Math.hypot(sut.centerX - ref.cx, sut.centerY - ref.cy)).toBeLessThan(1e-5); // ISO 12181 LSCI via Gauss-Newton
    expect(Math.abs(sut.radius - ref.r)).toBeLessThan(1e-5); // ISO 12181 LSCI
    const refResiduals = pts.map(([x, y]) => Math.hypot(x - ref.cx, y - ref.cy) - ref.r);
    const refRoundness = Math.max(...refResiduals) - Math.min(...refResiduals);
    expect(Math.abs(sut.roundness - refRoundness)).toBeLessThan(2e-5); // ISO 12181 RONt about the LSCI centre
    expect(sut.roundness).toBeGreaterThan(0.005); // the noise spans most of ±5 µm, so RONt is not ~0
    // The points lie in a 10 µm band about the true centre; moving the centre by Δ changes each
    // distance by at most |Δ| (triangle inequality), so RONt ≤ 0.010 + 2|Δ|.
    const shift = Math.hypot(sut.centerX - 120.5, sut.centerY + 33.2);
    expect(shift).toBeLessThan(0.005); // construction: noise ±5 µm cannot pull the centre further
    expect(sut.roundness).toBeLessThanOrEqual(0.01 + 2 * shift); // construction + triangle inequality
  });

  it('keeps micrometre accuracy far from the machine origin (centred normal equations)', () => {
    const delta = 0.001;
    const sut = circleFit(circlePoints(2500, 1800, 20, 16, (i) => (i % 2 === 0 ? delta : -delta)));
    expect(sut.centerX).toBeCloseTo(2500, 8); // construction, REFERENCES Geometry: "centre the data first"
    expect(sut.centerY).toBeCloseTo(1800, 8); // construction
    expect(sut.roundness).toBeCloseTo(2 * delta, 8); // construction: RONt 2δ
  });

  it('refuses fewer than 3 points, collinear points and non-finite numbers', () => {
    expectComputeError(
      () =>
        circleFit([
          [0, 0],
          [1, 1],
        ]),
      'points',
      /at least 3/,
    );
    expectComputeError(
      () =>
        circleFit([
          [0, 0],
          [1, 1],
          [2, 2],
          [5, 5],
        ]),
      'points',
      /straight line/,
    );
    expectComputeError(
      () =>
        circleFit([
          [1, 1],
          [1, 1],
          [1, 1],
        ]),
      'points',
      /straight line/,
    );
    expectComputeError(
      () =>
        circleFit([
          [0, 0],
          [1, Number.NaN],
          [2, 0],
        ]),
      'points',
      /Point 2: y/,
    );
    expectComputeError(
      () =>
        circleFit([
          [0, 0],
          [Infinity, 1],
          [2, 0],
        ]),
      'points',
      /Point 2: x/,
    );
  });
});

describe('pointsFromAngles', () => {
  it('converts polar readings to xy, counter-clockwise from +x', () => {
    const sut = pointsFromAngles([
      { angleDeg: 0, radius: 2 },
      { angleDeg: 90, radius: 3 },
      { angleDeg: 225, radius: Math.SQRT2 },
    ]);
    expect(sut[0][0]).toBeCloseTo(2, 14);
    expect(sut[0][1]).toBeCloseTo(0, 14);
    expect(sut[1][0]).toBeCloseTo(0, 14);
    expect(sut[1][1]).toBeCloseTo(3, 14);
    expect(sut[2][0]).toBeCloseTo(-1, 14);
    expect(sut[2][1]).toBeCloseTo(-1, 14);
  });

  it('refuses a non-finite angle', () => {
    expectComputeError(() => pointsFromAngles([{ angleDeg: Number.NaN, radius: 1 }]), 'readings');
  });
});

/** Radius from the spindle axis, at angle θ, of a perfect circle (radius R) whose centre sits at (e cos φ, e sin φ). */
function offsetCircleRadius(theta: number, e: number, phi: number, R: number): number {
  const psi = theta - phi;
  return e * Math.cos(psi) + Math.sqrt(R * R - e * e * Math.sin(psi) ** 2);
}

describe('limaconFit', () => {
  it('recovers the offset of an off-axis perfect circle', () => {
    const e = 0.05;
    const phi = (30 * Math.PI) / 180;
    const R = 25;
    const n = 360;
    const radii = Array.from({ length: n }, (_, i) => offsetCircleRadius((2 * Math.PI * i) / n, e, phi, R));
    const sut = limaconFit(radii);
    // √(R² − e²sin²ψ) holds only even harmonics, so the first harmonic is exactly e·cos(θ − φ).
    expect(sut.offsetX).toBeCloseTo(e * Math.cos(phi), 12); // REFERENCES Geometry: a = (2/N)Σrᵢcosθᵢ
    expect(sut.offsetY).toBeCloseTo(e * Math.sin(phi), 12); // REFERENCES Geometry: b = (2/N)Σrᵢsinθᵢ
    expect(sut.offset).toBeCloseTo(e, 12); // construction
    // Mean radius: R − e²/(4R) to second order (expansion of the square root).
    expect(sut.meanRadius).toBeCloseTo(R - (e * e) / (4 * R), 9); // REFERENCES Geometry: R = (1/N)Σrᵢ
    // The limaçon approximation leaves a 2-lobe residual of peak-to-valley ≈ e²/(2R) = 0.05 µm.
    expect(sut.roundness).toBeCloseTo((e * e) / (2 * R), 7); // ISO 4291 limaçon: error second order in e/R
  });

  it('reports the roundness of a 3-lobe form on-axis', () => {
    const h = 0.003;
    const radii = Array.from({ length: 72 }, (_, i) => 40 + h * Math.cos(3 * ((2 * Math.PI * i) / 72)));
    const sut = limaconFit(radii);
    expect(sut.offset).toBeLessThan(1e-12); // 3-lobe form is orthogonal to the first harmonic
    expect(sut.roundness).toBeCloseTo(2 * h, 12); // ISO 12181 RONt = peak-to-valley = 2h
    expect(sut.meanRadius).toBeCloseTo(40, 12);
  });

  it('refuses fewer than 3 readings and non-finite readings', () => {
    expectComputeError(() => limaconFit([1, 2]), 'radii', /at least 3/);
    expectComputeError(() => limaconFit([1, 2, Number.NaN]), 'radii', /Reading 3/);
  });
});

describe('eccentricity', () => {
  it('is the distance between the bore and OD centres; coaxiality is twice that', () => {
    const sut = eccentricity(circlePoints(0.03, -0.04, 40, 12), circlePoints(0, 0, 120, 24));
    expect(sut.eccentricity).toBeCloseTo(0.05, 12); // 3-4-5 triangle: √(0.03² + 0.04²)
    expect(sut.coaxiality).toBeCloseTo(0.1, 12); // REFERENCES Geometry / ISO 1101: coaxiality = 2 × offset
    expect(sut.bore.diameter).toBeCloseTo(80, 12);
    expect(sut.od.diameter).toBeCloseTo(240, 12);
  });

  it('matches TIR / 2 for an offset perfect circle turned on a mandrel', () => {
    // OD of radius 120 whose centre sits e off the mandrel (bore) axis; the indicator reads the
    // radius from the axis at each angle.
    const e = 0.025;
    const phi = (70 * Math.PI) / 180;
    const R = 120;
    const angles = Array.from({ length: 360 }, (_, i) => (i * Math.PI) / 180);
    const readings = angles.map((t) => offsetCircleRadius(t, e, phi, R));
    const tir = Math.max(...readings) - Math.min(...readings);
    expect(tir).toBeCloseTo(2 * e, 12); // REFERENCES Geometry: radial runout of a circle offset by e is 2e
    expect(eccentricityFromRunout(tir)).toBeCloseTo(e, 12); // REFERENCES Geometry: eccentricity = TIR / 2

    const od = pointsFromAngles(angles.map((t, i) => ({ angleDeg: (t * 180) / Math.PI, radius: readings[i] })));
    const bore = circlePoints(0, 0, 40, 12); // the mandrel axis is the bore centre
    const sut = eccentricity(bore, od);
    expect(sut.eccentricity).toBeCloseTo(eccentricityFromRunout(tir), 10); // ISO 1101: same e both ways
    expect(sut.coaxiality).toBeCloseTo(tir, 10); // ISO 1101: coaxiality 2e = TIR for a perfect circle
  });

  it('names which circle is bad', () => {
    const good = circlePoints(0, 0, 10, 6);
    expectComputeError(
      () =>
        eccentricity(
          [
            [0, 0],
            [1, 0],
          ],
          good,
        ),
      'bore',
    );
    expectComputeError(
      () =>
        eccentricity(good, [
          [0, 0],
          [1, 0],
          [2, 0],
        ]),
      'od',
    );
  });
});

describe('eccentricityFromRunout', () => {
  it('halves the TIR and refuses negative or non-finite readings', () => {
    expect(eccentricityFromRunout(0.08)).toBeCloseTo(0.04, 15); // REFERENCES Geometry: TIR / 2
    expect(eccentricityFromRunout(0)).toBe(0);
    expectComputeError(() => eccentricityFromRunout(-0.01), 'tir', /negative/);
    expectComputeError(() => eccentricityFromRunout(Number.NaN), 'tir');
  });
});

describe('twoPointDiameters', () => {
  it('gives the mean diameter and ovality = max − min', () => {
    const sut = twoPointDiameters([80.012, 80.004, 79.998, 80.006]);
    expect(sut.mean).toBeCloseTo(80.005, 12);
    expect(sut.min).toBe(79.998);
    expect(sut.max).toBe(80.012);
    expect(sut.ovality).toBeCloseTo(0.014, 12); // PRODUCT §4: ovality from two-point diameters = max − min
  });

  it('matches 2 × the radial spread for a 2-lobe (elliptical) form', () => {
    // r(θ) = R + h cos 2θ: the two-point diameter at θ is r(θ) + r(θ + π) = 2R + 2h cos 2θ.
    const h = 0.01;
    const diameters = [0, 30, 60, 90, 120, 150].map((deg) => 2 * 50 + 2 * h * Math.cos((2 * deg * Math.PI) / 180));
    const sut = twoPointDiameters(diameters);
    expect(sut.ovality).toBeCloseTo(4 * h, 12); // construction: ovality = 2 × RONt for a pure ellipse
  });

  it('refuses fewer than 2, non-positive or non-finite diameters', () => {
    expectComputeError(() => twoPointDiameters([80]), 'diameters');
    expectComputeError(() => twoPointDiameters([80, 0]), 'diameters', /greater than zero/);
    expectComputeError(() => twoPointDiameters([80, Number.NaN]), 'diameters');
  });
});

describe('planeFromHeights', () => {
  it('recovers the tilt of a plane with known slope from heights at equal angles', () => {
    // z = 50 + 0.002·x on a probing radius of 60 (12 angles, 0° and 180° included).
    const r = 60;
    const heights = Array.from({ length: 12 }, (_, i) => 50 + 0.002 * r * Math.cos((i * 30 * Math.PI) / 180));
    const sut = planeFromHeights({ heights, radius: r });
    expect(sut.b).toBeCloseTo(0.002, 12); // construction: known slope
    expect(sut.c).toBeCloseTo(0, 12);
    expect(sut.a).toBeCloseTo(50, 12);
    expect(sut.tiltMmPerMm).toBeCloseTo(0.002, 12); // construction: √(b² + c²)
    expect(sut.stackLength).toBeCloseTo(50, 12); // mean height
    expect(sut.parallelism).toBeCloseTo(0.24, 12); // max − min = 2·slope·r (0° and 180° are probed)
    expect(sut.flatness).toBeLessThan(1e-12); // a plane is flat
    expect(sut.diameterUsed).toBe(120);
    expect(sut.squareness).toBeCloseTo(0.24, 12); // tilt across the diameter = slope × 2r
  });

  it('separates a 2-lobe (saddle) form from the tilt', () => {
    // Tilt in both x and y plus a saddle w·cos 2θ: the saddle is orthogonal to the plane terms
    // over equal angles, so the tilt is unchanged and flatness = 2w.
    const r = 50;
    const w = 0.005;
    const heights = Array.from({ length: 8 }, (_, i) => {
      const t = (i * 45 * Math.PI) / 180;
      return 100 + 0.0003 * r * Math.cos(t) - 0.0004 * r * Math.sin(t) + w * Math.cos(2 * t);
    });
    const sut = planeFromHeights({ heights, radius: r }, { diameter: 240 });
    expect(sut.tiltMmPerMm).toBeCloseTo(0.0005, 12); // construction: 3-4-5 slopes
    expect(sut.flatness).toBeCloseTo(2 * w, 12); // construction: saddle peak-to-valley
    expect(sut.squareness).toBeCloseTo(0.0005 * 240, 12); // tilt × the stated diameter
    expect(sut.stackLength).toBeCloseTo(100, 12);
  });

  it('fits readings at arbitrary angles and radii (annular face)', () => {
    const plane = (x: number, y: number) => 80.1 - 0.0007 * x + 0.0011 * y;
    const readings: HeightReading[] = [
      [10, 40],
      [95, 40],
      [200, 42],
      [300, 41],
      [20, 110],
      [130, 112],
      [250, 115],
    ].map(([deg, rad]) => {
      const t = (deg * Math.PI) / 180;
      return { angleDeg: deg, radius: rad, height: plane(rad * Math.cos(t), rad * Math.sin(t)) };
    });
    const sut = planeFromHeights(readings);
    expect(sut.b).toBeCloseTo(-0.0007, 12); // construction: known plane
    expect(sut.c).toBeCloseTo(0.0011, 12); // construction
    expect(sut.a).toBeCloseTo(80.1, 10);
    expect(sut.tiltMmPerMm).toBeCloseTo(Math.hypot(0.0007, 0.0011), 12);
    expect(sut.diameterUsed).toBe(230); // default: twice the largest probing radius
    expect(sut.flatness).toBeLessThan(1e-10);
    const hs = readings.map((rd) => rd.height);
    expect(sut.parallelism).toBeCloseTo(Math.max(...hs) - Math.min(...hs), 12);
  });

  it('refuses too few, collinear or non-finite readings', () => {
    expectComputeError(() => planeFromHeights({ heights: [1, 2], radius: 10 }), 'heights', /at least 3/);
    expectComputeError(
      () =>
        planeFromHeights([
          { angleDeg: 0, radius: 10, height: 1 },
          { angleDeg: 180, radius: 10, height: 1 },
          { angleDeg: 0, radius: 30, height: 1 },
        ]),
      'heights',
      /one line/,
    );
    expectComputeError(() => planeFromHeights({ heights: [1, Number.NaN, 2], radius: 10 }), 'heights');
    expectComputeError(() => planeFromHeights({ heights: [1, 2, 3], radius: 0 }), 'radius');
    expectComputeError(() => planeFromHeights({ heights: [1, 2, 3], radius: 10 }, { diameter: -1 }), 'diameter');
  });
});
