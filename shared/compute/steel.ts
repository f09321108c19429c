/**
 * Electrical steel: grade names, conventional density, stacking factor, Franklin-type surface
 * insulation resistance and the flux-density penalty of a core built light.
 *
 * Sources: IEC 60404-8-4 (non-oriented fully processed grades), ASTM A719 / IEC 60404-13
 * (stacking factor), ASTM A717 / IEC 60404-11 (Franklin test), ASTM A937 (insulation classes).
 * Values marked (memory) were recalled, not read in the standard; the part's drawing or purchase
 * order decides every real limit. Everything here is pure.
 */
import { ComputeError } from './errors';

// ---------------------------------------------------------------------------------------------
// Helpers

function assertPositive(value: unknown, field: string, label: string): asserts value is number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new ComputeError(`${label} must be a finite number.`, field);
  }
  if (value <= 0) throw new ComputeError(`${label} must be greater than zero.`, field);
}

function assertStackingFactor(value: unknown, field: string, label: string): asserts value is number {
  assertPositive(value, field, label);
  if (value > 1) {
    throw new ComputeError(`${label} is a fraction of solid steel and cannot exceed 1 (got ${value}).`, field);
  }
}

/** Nominal thicknesses compare to 1e-9 mm: inputs come from forms and JSON, not arithmetic. */
function sameThickness(a: number, b: number): boolean {
  return Math.abs(a - b) < 1e-9;
}

// ---------------------------------------------------------------------------------------------
// Grade names

/**
 * Nominal thicknesses accepted in a grade name, in mm, with where each comes from.
 * 0.35 and 0.50 appear in the grade names of REFERENCES (M270-35A, M400-50A, M800-50A).
 * 0.65 and 1.00 complete the IEC 60404-8-4 range (memory). 0.30 and the thin gauges 0.20,
 * 0.25 and 0.27 are sold under the same naming pattern for high-frequency machines (memory,
 * unverified: they may belong to another part of IEC 60404-8 in the edition on a purchase order).
 */
export const NOMINAL_THICKNESSES_MM: readonly { thicknessMm: number; source: string }[] = [
  { thicknessMm: 0.2, source: 'thin-gauge grade (memory, unverified)' },
  { thicknessMm: 0.25, source: 'thin-gauge grade (memory, unverified)' },
  { thicknessMm: 0.27, source: 'thin-gauge grade (memory, unverified)' },
  { thicknessMm: 0.3, source: 'thin-gauge grade (memory, unverified)' },
  { thicknessMm: 0.35, source: 'IEC 60404-8-4 (REFERENCES grade names)' },
  { thicknessMm: 0.5, source: 'IEC 60404-8-4 (REFERENCES grade names)' },
  { thicknessMm: 0.65, source: 'IEC 60404-8-4 (memory)' },
  { thicknessMm: 1.0, source: 'IEC 60404-8-4 (memory)' },
];

export interface SteelGrade {
  /** Upper-case designation, e.g. "M400-50A". */
  designation: string;
  /** Maximum specific total loss at 1.5 T, 50 Hz, W/kg (IEC 60404-8-4). */
  lossWPerKg: number;
  thicknessMm: number;
  /** A = non-oriented, fully processed (IEC 60404-8-4). */
  type: 'A';
}

const GRADE_PATTERN = /^M(\d{3,4})-(\d{2,3})([A-Z])$/;
const EXPECTED = 'M<loss × 100>-<thickness × 100>A, e.g. M400-50A (4.00 W/kg at 1.5 T 50 Hz, 0.50 mm)';

/**
 * Parses an IEC 60404-8-4 grade name: M + maximum loss at 1.5 T 50 Hz × 100 + '-' + nominal
 * thickness in mm × 100 + 'A'. Case and surrounding spaces are forgiven because the name is
 * typed from certificates; anything else is refused so a typo cannot pass as a grade.
 */
export function parseSteelGrade(name: string): SteelGrade {
  if (typeof name !== 'string') throw new ComputeError(`Steel grade must be text in the form ${EXPECTED}.`, 'steelGrade');
  const designation = name.trim().toUpperCase();
  const match = GRADE_PATTERN.exec(designation);
  if (!match) {
    throw new ComputeError(`"${name.trim()}" is not a steel grade name. Expected ${EXPECTED}.`, 'steelGrade');
  }
  const [, lossCode, thicknessCode, type] = match;
  if (type !== 'A') {
    throw new ComputeError(
      `"${designation}" is not a fully processed non-oriented grade (type letter A, IEC 60404-8-4). Expected ${EXPECTED}.`,
      'steelGrade',
    );
  }
  // Leading zeros would let "M0400-050A" pass as M400-50A; the standard never writes them.
  if (lossCode.startsWith('0') || thicknessCode.startsWith('0')) {
    throw new ComputeError(`"${designation}" has a leading zero. Expected ${EXPECTED}.`, 'steelGrade');
  }
  const lossWPerKg = Number(lossCode) / 100;
  const thicknessMm = Number(thicknessCode) / 100;
  if (!NOMINAL_THICKNESSES_MM.some((t) => sameThickness(t.thicknessMm, thicknessMm))) {
    const known = NOMINAL_THICKNESSES_MM.map((t) => t.thicknessMm.toFixed(2)).join(', ');
    throw new ComputeError(
      `"${designation}" names a thickness of ${thicknessMm.toFixed(2)} mm, which is not a nominal thickness (${known} mm).`,
      'steelGrade',
    );
  }
  return { designation, lossWPerKg, thicknessMm, type: 'A' };
}

// ---------------------------------------------------------------------------------------------
// Density

export interface DefaultDensity {
  /** g/cm³ */
  density: number;
  /** table: a listed grade; interpolated: between listed loss classes; extrapolated: beyond them, held to 7.60–7.85. */
  source: 'table' | 'interpolated' | 'extrapolated';
  /** What the value rests on, for the user to see beside it. */
  basis: string;
}

/**
 * Conventional densities (memory, IEC 60404-8-4, as given in REFERENCES). Ordered by loss.
 * Density falls as silicon + aluminium rise, and low-loss grades carry more of both, so loss
 * class is a usable proxy for alloy content.
 */
const DENSITY_TABLE: readonly { designation: string; lossWPerKg: number; density: number }[] = [
  { designation: 'M270-35A', lossWPerKg: 2.7, density: 7.65 },
  { designation: 'M400-50A', lossWPerKg: 4.0, density: 7.7 },
  { designation: 'M800-50A', lossWPerKg: 8.0, density: 7.8 },
];
/** Range of conventional densities for these grades (memory, IEC 60404-8-4). */
const DENSITY_MIN = 7.6;
const DENSITY_MAX = 7.85;

/**
 * Default steel density for a grade when the part record has none. Listed grades return their
 * conventional value; others are interpolated linearly on loss between the listed grades (or
 * extended along the end segment and held to the 7.60–7.85 g/cm³ range), rounded to 0.01 as
 * conventional densities are stated. Loss also depends on thickness, so this is an estimate:
 * the supplier's certificate or the standard's table wins whenever it is at hand.
 */
export function defaultDensity(grade: string | SteelGrade): DefaultDensity {
  const parsed = typeof grade === 'string' ? parseSteelGrade(grade) : parseSteelGrade(grade.designation);
  const listed = DENSITY_TABLE.find((row) => row.designation === parsed.designation);
  if (listed) {
    return { density: listed.density, source: 'table', basis: `${listed.designation} conventional density (memory, IEC 60404-8-4)` };
  }
  const loss = parsed.lossWPerKg;
  const first = DENSITY_TABLE[0];
  const last = DENSITY_TABLE[DENSITY_TABLE.length - 1];
  let lo = first;
  let hi = DENSITY_TABLE[1];
  if (loss > first.lossWPerKg) {
    for (let i = 1; i < DENSITY_TABLE.length; i++) {
      lo = DENSITY_TABLE[i - 1];
      hi = DENSITY_TABLE[i];
      if (loss <= hi.lossWPerKg) break;
    }
  }
  const raw = lo.density + ((loss - lo.lossWPerKg) * (hi.density - lo.density)) / (hi.lossWPerKg - lo.lossWPerKg);
  const density = Math.round(Math.min(DENSITY_MAX, Math.max(DENSITY_MIN, raw)) * 100) / 100;
  const inside = loss >= first.lossWPerKg && loss <= last.lossWPerKg;
  return {
    density,
    source: inside ? 'interpolated' : 'extrapolated',
    basis: inside
      ? `interpolated on loss class between ${lo.designation} and ${hi.designation} (estimate; prefer the certificate)`
      : `extended from ${lo.designation}–${hi.designation} and held to ${DENSITY_MIN.toFixed(2)}–${DENSITY_MAX.toFixed(2)} g/cm³ (estimate; prefer the certificate)`,
  };
}

// ---------------------------------------------------------------------------------------------
// Stacking factor

export interface StackingFactorByMassInput {
  /** Core mass, g (steel only: weigh before winding, without clamps or cleats). */
  massG: number;
  /** Steel density, g/cm³. */
  densityGcm3: number;
  /** Net area of one lamination (outline minus slots and holes), cm². */
  areaCm2: number;
  stackLengthMm: number;
}

/**
 * Stacking factor from the core's mass: S = m / (ρ · A · L), the core form of the ASTM A719 /
 * IEC 60404-13 pack test. L is converted from mm to cm so the volume is in cm³. A value above 1
 * is returned as is: it means the density, area or length entered is wrong, which the caller
 * should say rather than hide.
 */
export function stackingFactorByMass(input: StackingFactorByMassInput): number {
  assertPositive(input?.massG, 'massG', 'Core mass');
  assertPositive(input.densityGcm3, 'densityGcm3', 'Steel density');
  assertPositive(input.areaCm2, 'areaCm2', 'Lamination net area');
  assertPositive(input.stackLengthMm, 'stackLengthMm', 'Stack length');
  return input.massG / (input.densityGcm3 * input.areaCm2 * (input.stackLengthMm / 10));
}

export interface StackingFactorByCountInput {
  laminationCount: number;
  /** Nominal lamination thickness, mm. */
  thicknessMm: number;
  stackLengthMm: number;
}

/**
 * Stacking factor from a lamination count: S = n · t / L. Uses the nominal thickness, so a
 * steel coil running thick or thin within its tolerance shifts the result; the mass method
 * does not depend on thickness and is the better check when a scale is at hand.
 */
export function stackingFactorByCount(input: StackingFactorByCountInput): number {
  const n = input?.laminationCount;
  if (typeof n !== 'number' || !Number.isInteger(n) || n < 1) {
    throw new ComputeError('Lamination count must be a whole number of at least 1.', 'laminationCount');
  }
  assertPositive(input.thicknessMm, 'thicknessMm', 'Lamination thickness');
  assertPositive(input.stackLengthMm, 'stackLengthMm', 'Stack length');
  return (n * input.thicknessMm) / input.stackLengthMm;
}

export interface TypicalStackingFactor {
  minimum: number;
  source: string;
}

const TYPICAL_MINIMUM_SF: readonly { thicknessMm: number; minimum: number; source: string }[] = [
  { thicknessMm: 0.35, minimum: 0.95, source: 'IEC 60404-8-4 (memory, REFERENCES)' },
  { thicknessMm: 0.5, minimum: 0.97, source: 'IEC 60404-8-4 (memory, REFERENCES)' },
];

/**
 * Typical minimum stacking factor of the strip for a nominal thickness, or null when no value
 * is on record (the plan's limit must come from the drawing then). Not interpolated: the values
 * are per thickness class, and a guessed limit would decide accept/reject without a source.
 */
export function typicalMinimumStackingFactor(thicknessMm: number): TypicalStackingFactor | null {
  assertPositive(thicknessMm, 'thicknessMm', 'Lamination thickness');
  const row = TYPICAL_MINIMUM_SF.find((r) => sameThickness(r.thicknessMm, thicknessMm));
  return row ? { minimum: row.minimum, source: row.source } : null;
}

// ---------------------------------------------------------------------------------------------
// Franklin-type surface insulation test

/**
 * Contact area term of the Franklin test, Ω·cm²: the ten contacts total 6.45 cm² (1 in²) and
 * the circuit passes 1 A into a dead short (memory, ASTM A717 / IEC 60404-11).
 */
const FRANKLIN_AREA_CM2 = 6.45;

function assertFranklinCurrent(currentA: unknown, field: string, label: string): asserts currentA is number {
  if (typeof currentA !== 'number' || !Number.isFinite(currentA)) {
    throw new ComputeError(`${label} must be a finite number of amperes.`, field);
  }
  if (currentA < 0 || currentA > 1) {
    throw new ComputeError(
      `${label} must be between 0 A (perfect insulator) and 1 A (short circuit); got ${currentA} A.`,
      field,
    );
  }
}

/**
 * Surface insulation resistance per lamination from a Franklin test current:
 * Rᵢ = 6.45 (1/I − 1) Ω·cm² (ASTM A717 / IEC 60404-11). I = 1 A is a short (0 Ω·cm²); I = 0 A
 * means no current flowed, a perfect insulator, returned as Infinity so that it passes any
 * minimum-resistance limit and fails none.
 */
export function franklinResistance(currentA: number): number {
  assertFranklinCurrent(currentA, 'currentA', 'Franklin test current');
  if (currentA === 0) return Infinity;
  return FRANKLIN_AREA_CM2 * (1 / currentA - 1);
}

/** Inverse of franklinResistance: the current that corresponds to Rᵢ Ω·cm², for drawing a limit on the ammeter scale. */
export function franklinCurrentForResistance(resistanceOhmCm2: number): number {
  if (resistanceOhmCm2 === Infinity) return 0;
  if (typeof resistanceOhmCm2 !== 'number' || !Number.isFinite(resistanceOhmCm2) || resistanceOhmCm2 < 0) {
    throw new ComputeError('Insulation resistance must be zero or more Ω·cm².', 'resistanceOhmCm2');
  }
  return FRANKLIN_AREA_CM2 / (resistanceOhmCm2 + FRANKLIN_AREA_CM2);
}

export interface InsulationResult {
  meanCurrentA: number;
  resistanceOhmCm2: number;
}

/**
 * Insulation from several Franklin readings (positions and faces of the test strips). The
 * standard averages the current readings and converts the mean current (memory, ASTM A717;
 * REFERENCES: "Average several readings"), not the mean of the resistances: 1/I is convex, so
 * one reading near 0 A (a huge resistance) would swamp the shorts found elsewhere.
 */
export function insulationFromCurrents(currentsA: readonly number[]): InsulationResult {
  if (!Array.isArray(currentsA) || currentsA.length === 0) {
    throw new ComputeError('Enter at least one Franklin test current.', 'currentsA');
  }
  currentsA.forEach((c, i) => assertFranklinCurrent(c, 'currentsA', `Reading ${i + 1}`));
  const meanCurrentA = currentsA.reduce((s, c) => s + c, 0) / currentsA.length;
  return { meanCurrentA, resistanceOhmCm2: franklinResistance(meanCurrentA) };
}

// ---------------------------------------------------------------------------------------------
// Flux density penalty

export interface FluxPenaltyInput {
  /** Flux density the design assumed, T. */
  designB: number;
  designStackingFactor: number;
  measuredStackingFactor: number;
  /** Optional ceiling to compare against, T (from the design; none is assumed here). */
  limitB?: number;
}

export interface FluxPenaltyResult {
  /** designB × designSF / measuredSF, T. */
  effectiveB: number;
  /** designSF / measuredSF: the factor by which the flux density rises. */
  ratio: number;
  /** effectiveB > limitB; null when no limit was given. */
  exceedsLimit: boolean | null;
}

/**
 * The winding voltage fixes the flux Φ; the steel carrying it is SF × the gross core section,
 * so B = Φ / (SF · A) and a core built light runs at designB × designSF / measuredSF (common
 * practice, REFERENCES "Electrical steel").
 */
export function fluxPenalty(input: FluxPenaltyInput): FluxPenaltyResult {
  assertPositive(input?.designB, 'designB', 'Design flux density');
  assertStackingFactor(input.designStackingFactor, 'designStackingFactor', 'Design stacking factor');
  assertStackingFactor(input.measuredStackingFactor, 'measuredStackingFactor', 'Measured stacking factor');
  if (input.limitB !== undefined) assertPositive(input.limitB, 'limitB', 'Flux density limit');
  const ratio = input.designStackingFactor / input.measuredStackingFactor;
  const effectiveB = input.designB * ratio;
  return { effectiveB, ratio, exceedsLimit: input.limitB === undefined ? null : effectiveB > input.limitB };
}
