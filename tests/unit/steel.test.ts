import { describe, expect, it } from 'vitest';
import { ComputeError } from '../../shared/compute/errors';
import {
  NOMINAL_THICKNESSES_MM,
  defaultDensity,
  fluxPenalty,
  franklinCurrentForResistance,
  franklinResistance,
  insulationFromCurrents,
  parseSteelGrade,
  stackingFactorByCount,
  stackingFactorByMass,
  typicalMinimumStackingFactor,
  type StackingFactorByMassInput,
} from '../../shared/compute/steel';

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

describe('parseSteelGrade', () => {
  it('reads loss and thickness from IEC 60404-8-4 names', () => {
    const sut = parseSteelGrade('M270-35A');
    expect(sut.lossWPerKg).toBeCloseTo(2.7, 12); // IEC 60404-8-4 naming: M270 → 2.70 W/kg at 1.5 T 50 Hz
    expect(sut.thicknessMm).toBeCloseTo(0.35, 12); // IEC 60404-8-4 naming: -35 → 0.35 mm
    expect(sut.type).toBe('A');
    const m400 = parseSteelGrade('M400-50A');
    expect(m400.lossWPerKg).toBeCloseTo(4.0, 12); // REFERENCES Electrical steel: M400-50A = at most 4.00 W/kg
    expect(m400.thicknessMm).toBeCloseTo(0.5, 12); // REFERENCES Electrical steel: 0.50 mm thick
    expect(m400.designation).toBe('M400-50A');
  });

  it('forgives case and surrounding spaces and returns the upper-case designation', () => {
    const sut = parseSteelGrade('  m800-50a ');
    expect(sut.designation).toBe('M800-50A');
    expect(sut.lossWPerKg).toBeCloseTo(8.0, 12); // IEC 60404-8-4 naming
  });

  it('reads four-digit loss and three-digit thickness codes', () => {
    const sut = parseSteelGrade('M1000-100A');
    expect(sut.lossWPerKg).toBeCloseTo(10.0, 12); // IEC 60404-8-4 naming (memory: 1.00 mm grades exist)
    expect(sut.thicknessMm).toBeCloseTo(1.0, 12); // IEC 60404-8-4 naming
  });

  it('accepts every listed nominal thickness and says where each comes from', () => {
    for (const t of NOMINAL_THICKNESSES_MM) {
      const code = Math.round(t.thicknessMm * 100);
      expect(parseSteelGrade(`M500-${code}A`).thicknessMm).toBeCloseTo(t.thicknessMm, 12);
      expect(t.source).toMatch(/IEC 60404-8-4|memory/);
    }
  });

  it('refuses other shapes with a message naming the expected pattern', () => {
    expectComputeError(() => parseSteelGrade('M400-50'), 'steelGrade', /M<loss × 100>-<thickness × 100>A/);
    expectComputeError(() => parseSteelGrade('400-50A'), 'steelGrade', /Expected M/);
    expectComputeError(() => parseSteelGrade('M 400-50A'), 'steelGrade', /Expected M/);
    expectComputeError(() => parseSteelGrade(''), 'steelGrade', /Expected M/);
    expectComputeError(() => parseSteelGrade('M400-50D'), 'steelGrade', /type letter A/); // D = semi-processed, not IEC 60404-8-4
    expectComputeError(() => parseSteelGrade('M0400-050A'), 'steelGrade', /leading zero/);
    expectComputeError(() => parseSteelGrade('M400-40A'), 'steelGrade', /not a nominal thickness/);
  });
});

describe('defaultDensity', () => {
  it('returns the conventional densities listed in REFERENCES', () => {
    expect(defaultDensity('M270-35A')).toMatchObject({ density: 7.65, source: 'table' }); // REFERENCES (memory, IEC 60404-8-4)
    expect(defaultDensity('M400-50A').density).toBe(7.7); // REFERENCES (memory, IEC 60404-8-4)
    expect(defaultDensity(parseSteelGrade('m800-50a')).density).toBe(7.8); // REFERENCES (memory, IEC 60404-8-4)
  });

  it('places other grades between their loss neighbours, falling with lower loss (more Si + Al)', () => {
    const m530 = defaultDensity('M530-50A');
    expect(m530.source).toBe('interpolated');
    expect(m530.density).toBeGreaterThan(7.7); // REFERENCES: density rises as loss rises (less Si + Al)
    expect(m530.density).toBeLessThan(7.8); // REFERENCES: below M800-50A
    expect(m530.basis).toMatch(/estimate/);

    const grades = ['M235-35A', 'M270-35A', 'M330-50A', 'M400-50A', 'M600-50A', 'M800-50A', 'M1000-65A', 'M1300-100A'];
    const densities = grades.map((g) => defaultDensity(g).density);
    for (let i = 1; i < densities.length; i++) {
      expect(densities[i]).toBeGreaterThanOrEqual(densities[i - 1]); // REFERENCES: density falls with Si + Al
    }
    for (const d of densities) {
      expect(d).toBeGreaterThanOrEqual(7.6); // REFERENCES: conventional range 7.60–7.85 (memory)
      expect(d).toBeLessThanOrEqual(7.85); // REFERENCES: conventional range 7.60–7.85 (memory)
    }
    expect(defaultDensity('M235-35A').source).toBe('extrapolated');
    expect(defaultDensity('M1300-100A').density).toBe(7.85); // held to the top of the REFERENCES range
  });

  it('refuses a bad grade name', () => {
    expectComputeError(() => defaultDensity('steel'), 'steelGrade');
  });
});

const makeMassInput = (overrides: Partial<StackingFactorByMassInput> = {}): StackingFactorByMassInput => ({
  massG: 5900,
  densityGcm3: 7.65,
  areaCm2: 80,
  stackLengthMm: 100,
  ...overrides,
});

describe('stackingFactorByMass', () => {
  it('matches the REFERENCES core check', () => {
    const sut = stackingFactorByMass(makeMassInput());
    expect(sut).toBeCloseTo(0.964, 3); // REFERENCES Electrical steel: 5.90 kg, 80 cm², 100 mm, 7.65 → 0.964
  });

  it('agrees with the lamination count for a core built from a known number of sheets', () => {
    // 194 sheets of 0.50 mm steel, 80 cm² net, stacked to 100 mm: the steel mass is
    // n · t · A · ρ, so both methods must give n · t / L = 0.97 (ASTM A719 definition).
    const n = 194;
    const massG = n * 0.05 * 80 * 7.7; // t in cm
    const byMass = stackingFactorByMass(makeMassInput({ massG, densityGcm3: 7.7 }));
    const byCount = stackingFactorByCount({ laminationCount: n, thicknessMm: 0.5, stackLengthMm: 100 });
    expect(byCount).toBeCloseTo(0.97, 12); // ASTM A719: S = stacked steel thickness / stack height
    expect(byMass).toBeCloseTo(byCount, 12); // ASTM A719 / IEC 60404-13: mass and count agree on solid steel volume
  });

  it('refuses non-positive or non-finite inputs, naming the field', () => {
    for (const field of ['massG', 'densityGcm3', 'areaCm2', 'stackLengthMm'] as const) {
      for (const bad of [0, -1, Number.NaN, Infinity]) {
        expectComputeError(() => stackingFactorByMass(makeMassInput({ [field]: bad })), field);
      }
    }
  });
});

describe('stackingFactorByCount', () => {
  it('refuses a fractional count and bad lengths', () => {
    expectComputeError(() => stackingFactorByCount({ laminationCount: 10.5, thicknessMm: 0.5, stackLengthMm: 5 }), 'laminationCount');
    expectComputeError(() => stackingFactorByCount({ laminationCount: 0, thicknessMm: 0.5, stackLengthMm: 5 }), 'laminationCount');
    expectComputeError(() => stackingFactorByCount({ laminationCount: 10, thicknessMm: 0, stackLengthMm: 5 }), 'thicknessMm');
    expectComputeError(() => stackingFactorByCount({ laminationCount: 10, thicknessMm: 0.5, stackLengthMm: Number.NaN }), 'stackLengthMm');
  });
});

describe('typicalMinimumStackingFactor', () => {
  it('gives the typical minimums for 0.35 and 0.50 mm and nothing for unlisted thicknesses', () => {
    expect(typicalMinimumStackingFactor(0.35)?.minimum).toBe(0.95); // REFERENCES (memory, IEC 60404-8-4): 0.95 at 0.35 mm
    expect(typicalMinimumStackingFactor(0.5)?.minimum).toBe(0.97); // REFERENCES (memory, IEC 60404-8-4): 0.97 at 0.50 mm
    expect(typicalMinimumStackingFactor(0.5)?.source).toMatch(/memory/);
    expect(typicalMinimumStackingFactor(0.65)).toBeNull(); // no sourced value: the drawing decides
    expectComputeError(() => typicalMinimumStackingFactor(-0.5), 'thicknessMm');
  });
});

describe('franklinResistance', () => {
  it('converts test currents by Rᵢ = 6.45 (1/I − 1)', () => {
    expect(franklinResistance(0.1)).toBeCloseTo(58.05, 10); // ASTM A717 / IEC 60404-11 formula; REFERENCES 58.1
    expect(franklinResistance(0.02)).toBeCloseTo(316.05, 10); // ASTM A717 / IEC 60404-11 formula; REFERENCES 316
    expect(franklinResistance(1)).toBe(0); // ASTM A717: 1 A = short circuit
    expect(franklinResistance(0)).toBe(Infinity); // ASTM A717: 0 A = perfect insulator
  });

  it('agrees with the ASTM A937 reading: below 0.02 A ↔ above 0.3 kΩ·cm²', () => {
    expect(franklinResistance(0.02)).toBeGreaterThan(300); // ASTM A937: 0.02 A is above 0.3 kΩ·cm²
    expect(franklinResistance(0.019)).toBeGreaterThan(franklinResistance(0.02)); // lower current, higher resistance
    const currentAt300 = franklinCurrentForResistance(300);
    expect(currentAt300).toBeGreaterThan(0.02); // ASTM A937: the 0.02 A criterion is inside the 0.3 kΩ·cm² one
    expect(currentAt300).toBeCloseTo(0.021, 3); // 6.45 / 306.45
    expect(franklinResistance(currentAt300)).toBeCloseTo(300, 9); // inverse round trip
  });

  it('refuses currents outside 0–1 A', () => {
    expectComputeError(() => franklinResistance(1.2), 'currentA', /between 0 A/);
    expectComputeError(() => franklinResistance(-0.1), 'currentA', /between 0 A/);
    expectComputeError(() => franklinResistance(Number.NaN), 'currentA');
  });
});

describe('insulationFromCurrents', () => {
  it('averages the currents, then converts', () => {
    const sut = insulationFromCurrents([0.08, 0.12, 0.1, 0.06, 0.14]);
    expect(sut.meanCurrentA).toBeCloseTo(0.1, 12);
    expect(sut.resistanceOhmCm2).toBeCloseTo(58.05, 10); // ASTM A717: mean current 0.10 A → 58.1 Ω·cm² (REFERENCES)
    const meanOfResistances = [0.08, 0.12, 0.1, 0.06, 0.14].map(franklinResistance).reduce((s, r) => s + r, 0) / 5;
    expect(meanOfResistances).toBeGreaterThan(sut.resistanceOhmCm2 + 1); // Jensen: averaging resistances would read higher
  });

  it('refuses an empty list or a bad reading, naming the reading', () => {
    expectComputeError(() => insulationFromCurrents([]), 'currentsA');
    expectComputeError(() => insulationFromCurrents([0.1, 1.5]), 'currentsA', /Reading 2/);
  });
});

describe('fluxPenalty', () => {
  it('matches B = Φ / (SF · A) with the flux fixed by the winding voltage', () => {
    // Independent construction (common practice, REFERENCES Electrical steel): E = 4.44 f N Φ
    // (sinusoidal EMF equation) fixes Φ; the steel section is SF × the gross section.
    const volts = 230;
    const hz = 50;
    const turns = 120;
    const grossAreaM2 = 0.006;
    const phi = volts / (4.44 * hz * turns);
    const bAt = (sf: number) => phi / (sf * grossAreaM2);
    const designB = bAt(0.97);
    const sut = fluxPenalty({ designB, designStackingFactor: 0.97, measuredStackingFactor: 0.93 });
    expect(sut.effectiveB).toBeCloseTo(bAt(0.93), 12); // EMF equation: same Φ through less steel
    expect(sut.ratio).toBeCloseTo(0.97 / 0.93, 12); // REFERENCES: raised by the ratio of stacking factors
    expect(sut.exceedsLimit).toBeNull(); // no limit given
  });

  it('flags an effective flux density above the limit', () => {
    const sut = fluxPenalty({ designB: 1.5, designStackingFactor: 0.97, measuredStackingFactor: 0.93, limitB: 1.55 });
    expect(sut.effectiveB).toBeCloseTo(1.564516, 6); // 1.5 × 0.97 / 0.93 (common practice, REFERENCES)
    expect(sut.exceedsLimit).toBe(true);
    expect(fluxPenalty({ designB: 1.5, designStackingFactor: 0.97, measuredStackingFactor: 0.96, limitB: 1.55 }).exceedsLimit).toBe(false);
  });

  it('refuses impossible stacking factors and flux densities', () => {
    expectComputeError(() => fluxPenalty({ designB: 1.5, designStackingFactor: 0.97, measuredStackingFactor: 1.2 }), 'measuredStackingFactor', /cannot exceed 1/);
    expectComputeError(() => fluxPenalty({ designB: 1.5, designStackingFactor: 0, measuredStackingFactor: 0.95 }), 'designStackingFactor');
    expectComputeError(() => fluxPenalty({ designB: -1, designStackingFactor: 0.97, measuredStackingFactor: 0.95 }), 'designB');
    expectComputeError(() => fluxPenalty({ designB: 1.5, designStackingFactor: 0.97, measuredStackingFactor: 0.95, limitB: 0 }), 'limitB');
  });
});
