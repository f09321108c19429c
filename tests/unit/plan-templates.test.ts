import { describe, expect, it } from 'vitest';
import { ComputeError } from '../../shared/compute/errors';
import {
  HANDLING_CAUTIONS,
  HEAVY_CORE_GUIDE_KG,
  PLAN_TEMPLATES,
  TEMPLATE_IDS,
  cautionsFor,
  franklinResistanceOhmCm2,
  planTemplate,
  type TemplateId,
  type TemplatePart,
} from '../../shared/compute/plan-templates';
import { CONSTRUCTIONS, characteristicInputSchema, createPlanSchema, type CharacteristicInput } from '../../shared/schemas/master-data';

/** A 48-slot welded core like the demo's (OD 240 mm), 0.50 mm steel. */
function makePart(overrides: Partial<TemplatePart> = {}): TemplatePart {
  return {
    nominalBoreMm: 160,
    nominalOdMm: 240,
    nominalStackLengthMm: 100,
    laminationThicknessMm: 0.5,
    slotCount: 48,
    nominalMassKg: 14.2,
    ...overrides,
  };
}

const PARTS: Record<string, TemplatePart> = {
  welded48: makePart(),
  interlocked27: makePart({ nominalBoreMm: 100, nominalOdMm: 165, nominalStackLengthMm: 40, laminationThicknessMm: 0.35, slotCount: 27, nominalMassKg: 4.1 }),
  largeVented: makePart({ nominalBoreMm: 620, nominalOdMm: 900, nominalStackLengthMm: 420, laminationThicknessMm: 0.5, slotCount: 72, nominalMassKg: 610 }),
};

function byCode(list: CharacteristicInput[], code: string): CharacteristicInput {
  const c = list.find((x) => x.code === code);
  if (!c) throw new Error(`no characteristic ${code}`);
  return c;
}

function codes(template: TemplateId, part: TemplatePart = makePart()): string[] {
  return planTemplate(template, part).characteristics.map((c) => c.code);
}

describe('PLAN_TEMPLATES', () => {
  it('offers one template per core construction plus large vented cores', () => {
    const ids = PLAN_TEMPLATES.map((t) => t.id);
    expect([...ids].sort()).toEqual([...CONSTRUCTIONS, 'vented'].sort());
    expect(new Set(ids).size).toBe(ids.length);
    expect([...TEMPLATE_IDS].sort()).toEqual([...ids].sort());
    for (const t of PLAN_TEMPLATES) {
      expect(t.name.length).toBeGreaterThan(0);
      expect(t.description.length).toBeGreaterThan(0);
    }
  });
});

describe('planTemplate', () => {
  for (const id of TEMPLATE_IDS) {
    for (const [partName, part] of Object.entries(PARTS)) {
      describe(`${id} on ${partName}`, () => {
        const sut = planTemplate(id, part);

        it('names itself like the list entry', () => {
          const summary = PLAN_TEMPLATES.find((t) => t.id === id)!;
          expect({ id: sut.id, name: sut.name, description: sut.description }).toEqual(summary);
        });

        it('gives characteristics that each parse with characteristicInputSchema', () => {
          for (const c of sut.characteristics) {
            const r = characteristicInputSchema.safeParse(c);
            expect(r.success, `${c.code}: ${r.success ? '' : JSON.stringify(r.error.issues)}`).toBe(true);
          }
        });

        it('makes a valid draft plan as a whole (unique codes, at most 80)', () => {
          const r = createPlanSchema.safeParse({
            partId: '0b7d5a0e-9f55-4c1e-8a55-3a3f0f6b1c2d',
            samplingKind: 'aql',
            inspectionLevel: 'II',
            aql: 1.0,
            characteristics: sut.characteristics,
          });
          expect(r.success, r.success ? '' : JSON.stringify(r.error.issues)).toBe(true);
        });

        it('uses unique upper-case codes', () => {
          const list = sut.characteristics.map((c) => c.code);
          expect(new Set(list).size).toBe(list.length);
          for (const code of list) expect(code).toBe(code.toUpperCase());
        });

        it('keeps every lower limit below its upper limit', () => {
          for (const c of sut.characteristics) {
            if (c.lsl != null && c.usl != null) expect(c.lsl, c.code).toBeLessThan(c.usl);
            if (c.nominal != null && c.lsl != null) expect(c.nominal, c.code).toBeGreaterThan(c.lsl);
            if (c.nominal != null && c.usl != null) expect(c.nominal, c.code).toBeLessThan(c.usl);
          }
        });

        it('computes derived values only from characteristics in the plan that carry readings', () => {
          for (const c of sut.characteristics.filter((x) => x.kind === 'derived')) {
            expect(c.inputs?.length, c.code).toBeGreaterThan(0);
            for (const input of c.inputs ?? []) {
              const source = byCode(sut.characteristics, input);
              expect(source.kind, `${c.code} ← ${input}`).toBe('variable');
            }
          }
        });

        it('asks for as many readings as the layout lays out', () => {
          for (const c of sut.characteristics) {
            if (c.layout === 'probed') expect(c.readingsPerSample, c.code).toBe((c.angles ?? 0) * (c.levels ?? 1));
            if (c.layout === 'heights' || c.layout === 'two-point') expect(c.readingsPerSample, c.code).toBe(c.angles);
          }
        });

        it('gives every check a method an inspector can follow', () => {
          for (const c of sut.characteristics) expect((c.method ?? '').length, c.code).toBeGreaterThan(20);
        });
      });
    }
  }

  it('has the checks common to every construction', () => {
    const common = ['BORE_D', 'BORE_RND', 'OD', 'ECC', 'STACK_L', 'SQUARE', 'MASS', 'SF', 'BURR', 'BURR_SIDE', 'SLOT_GO', 'INS_I', 'INS_R', 'RUST_PACK', 'PAPERS'];
    for (const id of TEMPLATE_IDS) expect(codes(id)).toEqual(expect.arrayContaining(common));
  });

  it('adds weld checks to the welded template only', () => {
    const sut = planTemplate('welded', makePart()).characteristics;
    expect(sut.map((c) => c.code)).toEqual(expect.arrayContaining(['WELD_COUNT', 'WELD_BUILDUP', 'WELD_CRACK']));
    expect(byCode(sut, 'WELD_CRACK')).toMatchObject({ kind: 'attribute', severity: 'critical' });
    expect(codes('interlocked').some((c) => c.startsWith('WELD'))).toBe(false);
  });

  it('adds the interlock checks to the interlocked template', () => {
    const sut = planTemplate('interlocked', PARTS.interlocked27).characteristics;
    expect(byCode(sut, 'IL_ENGAGED')).toMatchObject({ kind: 'attribute' });
    expect(byCode(sut, 'IL_GAP')).toMatchObject({ kind: 'variable', unit: 'mm', gaugeKind: 'feeler-gauge', usl: 0.05 }); // common practice starting value
    const hold = byCode(sut, 'IL_HOLD');
    expect(hold).toMatchObject({ kind: 'variable', unit: 'N' });
    expect(hold.lsl).toBeGreaterThan(0);
    expect(codes('welded').some((c) => c.startsWith('IL_'))).toBe(false);
  });

  it('adds construction checks for bonded, segmented, cleated, riveted and vented cores', () => {
    expect(codes('bonded')).toEqual(expect.arrayContaining(['BOND_DELAM', 'BOND_COUPON']));
    expect(byCode(planTemplate('bonded', makePart()).characteristics, 'BOND_COUPON')).toMatchObject({ unit: 'N', usl: null });
    expect(codes('segmented')).toEqual(expect.arrayContaining(['SEG_STEP', 'SEG_GAP']));
    expect(codes('cleated')).toEqual(expect.arrayContaining(['CLEAT_COUNT', 'CLEAT_SEATED']));
    expect(codes('riveted')).toEqual(expect.arrayContaining(['RIVET_COUNT', 'RIVET_SEATED']));
    expect(codes('vented', PARTS.largeVented)).toEqual(expect.arrayContaining(['VENT_SPACERS', 'END_PLATES']));
    expect(codes('welded')).not.toContain('VENT_SPACERS');
  });

  it('makes burr height wear-driven, charted with one subgroup per core', () => {
    const sut = byCode(planTemplate('interlocked', PARTS.interlocked27).characteristics, 'BURR');
    expect(sut).toMatchObject({ wearDriven: true, chartKind: 'xbar-r', unit: 'µm', lsl: null });
    expect(sut.subgroupSize).toBe(sut.readingsPerSample);
    expect(sut.readingsPerSample).toBe(4);
  });

  it('sets the burr limit to the smaller of 50 µm and 10 % of the thickness', () => {
    const burrAt = (t: number) => byCode(planTemplate('welded', makePart({ laminationThicknessMm: t })).characteristics, 'BURR').usl;
    expect(burrAt(0.35)).toBe(35); // common practice: burr limit 5–10 % of thickness, 0.02–0.05 mm
    expect(burrAt(0.27)).toBe(27); // common practice: 10 % of 0.27 mm
    expect(burrAt(0.5)).toBe(50); // common practice: 10 % of 0.50 mm = 50 µm cap
    expect(burrAt(0.65)).toBe(50); // common practice: capped at 0.05 mm
  });

  it('draws dimensional limits from the nominal sizes', () => {
    const small = planTemplate('interlocked', PARTS.interlocked27).characteristics;
    const large = planTemplate('welded', PARTS.welded48).characteristics;
    expect(byCode(small, 'BORE_D')).toMatchObject({ nominal: 100, lsl: 99.95, usl: 100.05 }); // common practice starting value: ±0.05 below 150 mm
    expect(byCode(large, 'BORE_D')).toMatchObject({ nominal: 160, lsl: 159.92, usl: 160.08 }); // common practice starting value: ±0.08 from 150 mm
    expect(byCode(large, 'OD')).toMatchObject({ nominal: 240, lsl: 239.9, usl: 240.1 }); // common practice starting value: ±0.1
    expect(byCode(small, 'STACK_L')).toMatchObject({ lsl: 39.7, usl: 40.3 }); // common practice: 0.3 mm beats 0.5 % of 40 mm
    expect(byCode(large, 'STACK_L')).toMatchObject({ lsl: 99.5, usl: 100.5 }); // common practice: 0.5 % of 100 mm beats 0.3 mm
    expect(byCode(large, 'ECC').usl).toBe(0.05); // common practice starting value
    expect(byCode(large, 'SQUARE').usl).toBe(0.1); // common practice starting value
    const mass = byCode(large, 'MASS');
    expect(mass.lsl).toBeCloseTo(14.2 * 0.98, 9); // common practice: ±2 %
    expect(mass.usl).toBeCloseTo(14.2 * 1.02, 9); // common practice: ±2 %
  });

  it('takes eccentricity from the probed bore and OD points', () => {
    const sut = planTemplate('welded', makePart()).characteristics;
    expect(byCode(sut, 'ECC')).toMatchObject({ kind: 'derived', derivedFormula: 'eccentricity', inputs: ['BORE_D', 'OD'], severity: 'critical' });
    expect(byCode(sut, 'BORE_D')).toMatchObject({ layout: 'probed', angles: 8, levels: 2, derivedFormula: 'circle-fit-diameter' });
    expect(byCode(sut, 'OD')).toMatchObject({ layout: 'probed', angles: 8, levels: 1, derivedFormula: 'circle-fit-diameter' });
    expect(byCode(sut, 'BORE_RND')).toMatchObject({ derivedFormula: 'circle-fit-roundness', inputs: ['BORE_D'] });
    expect(byCode(sut, 'SQUARE')).toMatchObject({ derivedFormula: 'squareness', inputs: ['STACK_L'] });
  });

  it('sets the stacking factor minimum from the lamination thickness', () => {
    const sfAt = (t: number) => byCode(planTemplate('welded', makePart({ laminationThicknessMm: t })).characteristics, 'SF');
    expect(sfAt(0.35).lsl).toBe(95); // IEC 60404-8-4 (memory): 0.95 at 0.35 mm, in %
    expect(sfAt(0.5).lsl).toBe(97); // IEC 60404-8-4 (memory): 0.97 at 0.50 mm, in %
    expect(sfAt(0.5)).toMatchObject({ unit: '%', derivedFormula: 'stacking-factor-mass', inputs: ['MASS', 'STACK_L'] });
  });

  it('makes the insulation resistance limit agree with the Franklin current limit', () => {
    const sut = planTemplate('bonded', makePart()).characteristics;
    expect(byCode(sut, 'INS_I')).toMatchObject({ unit: 'A', gaugeKind: 'franklin-tester', usl: 0.1 });
    expect(byCode(sut, 'INS_R').lsl).toBeCloseTo(58.05, 6); // ASTM A717 / IEC 60404-11: I 0.10 A → 6.45 (1/0.10 − 1) = 58.1 Ω·cm² as printed
    expect(byCode(sut, 'INS_R')).toMatchObject({ unit: 'Ω·cm²', derivedFormula: 'insulation-resistance', inputs: ['INS_I'] });
  });

  it('names the slot count on the slot alignment check', () => {
    expect(byCode(planTemplate('welded', PARTS.welded48).characteristics, 'SLOT_GO').name).toContain('go/no-go gauge through all 48 slots');
    expect(byCode(planTemplate('interlocked', PARTS.interlocked27).characteristics, 'SLOT_GO').name).toContain('all 27 slots');
  });

  it('marks the paperwork check critical', () => {
    expect(byCode(planTemplate('riveted', makePart()).characteristics, 'PAPERS')).toMatchObject({ kind: 'attribute', severity: 'critical', layout: 'pass-fail' });
  });

  it('refuses a part it cannot build limits for', () => {
    expect(() => planTemplate('welded', makePart({ nominalBoreMm: 250 }))).toThrow(ComputeError);
    expect(() => planTemplate('welded', makePart({ nominalBoreMm: 250 }))).toThrow(/bore must be smaller than the OD/);
    expect(() => planTemplate('welded', makePart({ slotCount: 0 }))).toThrow(/slot count/);
    expect(() => planTemplate('welded', makePart({ slotCount: 12.5 }))).toThrow(/slot count/);
    expect(() => planTemplate('welded', makePart({ laminationThicknessMm: -0.5 }))).toThrow(/lamination thickness/);
    expect(() => planTemplate('welded', makePart({ nominalMassKg: Number.NaN }))).toThrow(/core mass/);
    expect(() => planTemplate('stapled' as TemplateId, makePart())).toThrow(/Unknown template/);
  });
});

describe('franklinResistanceOhmCm2', () => {
  it('follows the Franklin-type test relation', () => {
    // The published figures are rounded (58.1, 316), so allow half their last printed digit.
    expect(Math.abs(franklinResistanceOhmCm2(0.1) - 58.1)).toBeLessThanOrEqual(0.05 + 1e-9); // ASTM A717 / IEC 60404-11: 0.10 A → 58.1 Ω·cm²
    expect(Math.abs(franklinResistanceOhmCm2(0.02) - 316)).toBeLessThanOrEqual(0.5); // ASTM A717 / IEC 60404-11: 0.02 A → 316 Ω·cm²
    expect(franklinResistanceOhmCm2(1)).toBe(0); // ASTM A717: 1 A is a short circuit
  });

  it('refuses currents outside 0–1 A', () => {
    expect(() => franklinResistanceOhmCm2(0)).toThrow(ComputeError);
    expect(() => franklinResistanceOhmCm2(1.2)).toThrow(ComputeError);
  });
});

describe('cautionsFor', () => {
  const welded = planTemplate('welded', PARTS.welded48).characteristics;
  const vented = planTemplate('vented', PARTS.largeVented).characteristics;

  it('warns of sharp edges on burr and dimensional checks', () => {
    expect(cautionsFor(byCode(welded, 'BURR'))).toContain(HANDLING_CAUTIONS.sharpEdges);
    expect(cautionsFor(byCode(welded, 'BORE_D'))).toContain(HANDLING_CAUTIONS.sharpEdges);
    expect(HANDLING_CAUTIONS.sharpEdges).toMatch(/cut-resistant gloves/);
  });

  it('warns of a heavy core on its mass check, and not for a light core', () => {
    expect(cautionsFor(byCode(vented, 'MASS'))).toContain(HANDLING_CAUTIONS.heavyCore);
    expect(cautionsFor(byCode(planTemplate('interlocked', PARTS.interlocked27).characteristics, 'MASS'))).not.toContain(HANDLING_CAUTIONS.heavyCore);
    expect(HANDLING_CAUTIONS.heavyCore).toMatch(/team lift or a hoist/);
    expect(HEAVY_CORE_GUIDE_KG).toBe(23); // common practice manual-handling guide value, (memory) revised NIOSH lifting equation load constant
  });

  it('uses the part mass for other hands-on checks on a heavy core', () => {
    expect(cautionsFor(byCode(vented, 'STACK_L'), { coreMassKg: 610 })).toContain(HANDLING_CAUTIONS.heavyCore);
    expect(cautionsFor(byCode(vented, 'STACK_L'), { coreMassKg: 23 })).not.toContain(HANDLING_CAUTIONS.heavyCore);
    expect(cautionsFor({ code: 'MASS_G', kind: 'variable', unit: 'g', nominal: 30_000, gaugeKind: 'scale' })).toContain(HANDLING_CAUTIONS.heavyCore);
  });

  it('warns of voltage on the core for insulation and core-loss tests', () => {
    expect(cautionsFor(byCode(welded, 'INS_I'))).toContain(HANDLING_CAUTIONS.energized);
    expect(cautionsFor({ code: 'IR', kind: 'variable', unit: 'MΩ', gaugeKind: 'insulation-tester' })).toContain(HANDLING_CAUTIONS.energized);
    expect(cautionsFor({ code: 'LOSS', name: 'Core loss at 1.32 T', kind: 'variable', unit: 'W/kg', gaugeKind: null })).toContain(HANDLING_CAUTIONS.energized);
    expect(cautionsFor(byCode(welded, 'BURR'))).not.toContain(HANDLING_CAUTIONS.energized);
    expect(HANDLING_CAUTIONS.energized).toMatch(/trained and authorised/);
  });

  it('shows nothing for paperwork and computed values', () => {
    expect(cautionsFor(byCode(welded, 'PAPERS'))).toEqual([]);
    expect(cautionsFor(byCode(welded, 'ECC'), { coreMassKg: 610 })).toEqual([]);
  });

  it('ends every caution by deferring to the site', () => {
    for (const text of Object.values(HANDLING_CAUTIONS)) {
      const sentences = text.split(/(?<=\.)\s+/);
      expect(sentences[sentences.length - 1]).toMatch(/site's/);
    }
  });
});
