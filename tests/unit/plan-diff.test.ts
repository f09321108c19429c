import { describe, expect, it } from 'vitest';
import { ComputeError } from '../../shared/compute/errors';
import { diffPlans, type CharacteristicLike, type PlanLike } from '../../shared/compute/plan-diff';
import { planTemplate } from '../../shared/compute/plan-templates';
import { planChangeSchema } from '../../shared/schemas/master-data';

function makeCharacteristic(overrides: Partial<CharacteristicLike> = {}): CharacteristicLike {
  return { code: 'OD', name: 'Outside diameter', kind: 'variable', unit: 'mm', nominal: 240, lsl: 239.9, usl: 240.1, gaugeKind: 'micrometer', layout: 'two-point', angles: 4, readingsPerSample: 4, ...overrides };
}

function makePlan(overrides: Partial<PlanLike> = {}): PlanLike {
  return {
    samplingKind: 'aql',
    inspectionLevel: 'II',
    aql: 1.0,
    zeroSampleSize: null,
    notes: null,
    characteristics: [
      makeCharacteristic(),
      makeCharacteristic({ code: 'MASS', name: 'Stack mass', unit: 'kg', nominal: 14.2, lsl: 13.9, usl: 14.5, gaugeKind: 'scale', layout: 'single', angles: null, readingsPerSample: 1 }),
      { code: 'PAPERS', name: 'Certificate present', kind: 'attribute', layout: 'pass-fail', severity: 'critical' },
    ],
    ...overrides,
  };
}

describe('diffPlans', () => {
  it('finds nothing between identical plans', () => {
    expect(diffPlans(makePlan(), makePlan())).toEqual([]);
  });

  it('finds nothing between a full template and a copy of it', () => {
    const characteristics = planTemplate('welded', { nominalBoreMm: 160, nominalOdMm: 240, nominalStackLengthMm: 100, laminationThicknessMm: 0.5, slotCount: 48, nominalMassKg: 14.2 }).characteristics;
    const plan = makePlan({ characteristics });
    expect(diffPlans(plan, structuredClone(plan))).toEqual([]);
  });

  it('reports a changed limit as one row with before and after', () => {
    const before = makePlan();
    const after = makePlan({ characteristics: before.characteristics.map((c) => (c.code === 'OD' ? { ...c, usl: 240.15 } : c)) });
    expect(diffPlans(before, after)).toEqual([{ kind: 'changed', scope: 'characteristic', code: 'OD', field: 'usl', before: 240.1, after: 240.15 }]);
  });

  it('reports added and removed characteristics by code, removed last', () => {
    const before = makePlan();
    const burr = makeCharacteristic({ code: 'BURR', name: 'Burr height', unit: 'µm', nominal: null, lsl: null, usl: 50, layout: 'single', angles: null, wearDriven: true });
    const after = makePlan({ characteristics: [burr, ...before.characteristics.filter((c) => c.code !== 'MASS')] });
    const sut = diffPlans(before, after);
    expect(sut.map((c) => [c.kind, c.code])).toEqual([
      ['added', 'BURR'],
      ['removed', 'MASS'],
    ]);
    expect(sut[0]).toMatchObject({ scope: 'characteristic', field: null, before: null, after: { code: 'BURR', usl: 50, wearDriven: true } });
    expect(sut[1]).toMatchObject({ before: { code: 'MASS', nominal: 14.2 }, after: null });
  });

  it('reports sampling changes first', () => {
    const before = makePlan();
    const after = makePlan({ samplingKind: 'zero-acceptance', inspectionLevel: null, aql: null, zeroSampleSize: 13, characteristics: before.characteristics.map((c) => (c.code === 'MASS' ? { ...c, lsl: 13.8 } : c)) });
    expect(diffPlans(before, after)).toEqual([
      { kind: 'changed', scope: 'sampling', code: null, field: 'samplingKind', before: 'aql', after: 'zero-acceptance' },
      { kind: 'changed', scope: 'sampling', code: null, field: 'inspectionLevel', before: 'II', after: null },
      { kind: 'changed', scope: 'sampling', code: null, field: 'aql', before: 1.0, after: null },
      { kind: 'changed', scope: 'sampling', code: null, field: 'zeroSampleSize', before: null, after: 13 },
      { kind: 'changed', scope: 'characteristic', code: 'MASS', field: 'lsl', before: 13.9, after: 13.8 },
    ]);
  });

  it('reports an AQL change and a note change', () => {
    const sut = diffPlans(makePlan(), makePlan({ aql: 0.65, notes: 'Tightened after NCR-2026-0042' }));
    expect(sut.map((c) => c.field)).toEqual(['aql', 'notes']);
    expect(sut[0]).toMatchObject({ before: 1.0, after: 0.65 });
  });

  it('lists field changes of one characteristic in schema order and characteristics in the after-plan order', () => {
    const before = makePlan();
    const [od, mass, papers] = before.characteristics;
    const after = makePlan({ characteristics: [papers, { ...mass, severity: 'critical', name: 'Core mass' }, { ...od, method: 'New method', inputs: ['BORE_D'] }] });
    expect(diffPlans(before, after).map((c) => `${c.code}.${c.field}`)).toEqual(['MASS.name', 'MASS.severity', 'OD.method', 'OD.inputs']);
  });

  it('treats schema defaults, absent values and code case as the same', () => {
    const before = makePlan();
    const after = makePlan({
      characteristics: before.characteristics.map((c) =>
        c.code === 'MASS' ? { ...c, code: ' mass ', severity: 'major', chartKind: 'none', wearDriven: false, ruleSet: 'western-electric', method: '', id: 'row-7', seq: 2 } : c,
      ),
    });
    expect(diffPlans(before, after)).toEqual([]);
  });

  it('sees a change between two input lists', () => {
    const before = makePlan();
    const after = makePlan({ characteristics: before.characteristics.map((c) => (c.code === 'OD' ? { ...c, inputs: ['BORE_D', 'OD'] } : c)) });
    const withInputs = makePlan({ characteristics: before.characteristics.map((c) => (c.code === 'OD' ? { ...c, inputs: ['BORE_D'] } : c)) });
    expect(diffPlans(withInputs, after)).toEqual([{ kind: 'changed', scope: 'characteristic', code: 'OD', field: 'inputs', before: ['BORE_D'], after: ['BORE_D', 'OD'] }]);
  });

  it('returns rows that fit the change schema', () => {
    const before = makePlan();
    const after = makePlan({ aql: 2.5, characteristics: [makeCharacteristic({ usl: 240.2 }), makeCharacteristic({ code: 'ECC', kind: 'derived', nominal: null, lsl: null, usl: 0.05 })] });
    const sut = diffPlans(before, after);
    expect(sut.length).toBeGreaterThan(0);
    for (const row of sut) expect(planChangeSchema.safeParse(row).success).toBe(true);
  });

  it('refuses a plan that uses a code twice', () => {
    const bad = makePlan({ characteristics: [makeCharacteristic(), makeCharacteristic({ code: 'od' })] });
    expect(() => diffPlans(makePlan(), bad)).toThrow(ComputeError);
    expect(() => diffPlans(makePlan(), bad)).toThrow(/OD is used twice/);
  });
});
