import { describe, expect, it } from 'vitest';
import { evaluateSample } from '../../shared/compute/evaluate';
import {
  asEntered,
  cellCount,
  cellLabels,
  draftSignature,
  draftState,
  formatValue,
  initialDrafts,
  leadingValues,
  limitsText,
  parseReading,
  readingSignature,
  type SheetChar,
} from '../../src-web/features/lots/components/sheet-model';

const base = { name: 'x', unit: 'mm', nominal: null, lsl: null, usl: null, angles: null, levels: null, readingsPerSample: 1, gaugeKind: null, derivedFormula: null, severity: 'major', method: null } as const;
const char = (over: Partial<SheetChar> & Pick<SheetChar, 'code' | 'kind' | 'layout'>): SheetChar => ({ ...base, ...over }) as SheetChar;

const BORE = char({ code: 'BORE', kind: 'variable', layout: 'single', lsl: 149.95, usl: 150.05, nominal: 150 });
const BURR = char({ code: 'BURR', kind: 'variable', layout: 'single', readingsPerSample: 4, usl: 25, unit: 'µm' });
const PROBED = char({ code: 'BORE_D', kind: 'variable', layout: 'probed', angles: 8, levels: 2, lsl: 149.92, usl: 150.08 });
const TWO = char({ code: 'OD2', kind: 'variable', layout: 'two-point', angles: 4, lsl: 239.9, usl: 240.1 });
const PAPERS = char({ code: 'PAPERS', kind: 'attribute', layout: 'pass-fail', unit: null });

describe('bench sheet model: parseReading', () => {
  it('takes numbers as a gauge display shows them, a comma decimal included', () => {
    expect(['150.012', ' 150,012 ', '-0.5', '.5', '12', '1e-3'].map(parseReading)).toEqual([150.012, 150.012, -0.5, 0.5, 12, 0.001]);
  });
  it('tells an empty cell from text that is not a number', () => {
    expect(parseReading('')).toBeNull();
    expect(['15o.2', '1.2.3', 'abc', '12-', 'Infinity', '0x10'].map(parseReading)).toEqual(Array(6).fill('invalid'));
  });
});

describe('bench sheet model: layouts', () => {
  it('has the cells each layout asks for', () => {
    expect([BORE, BURR, PROBED, TWO, PAPERS].map(cellCount)).toEqual([1, 4, 16, 4, 0]);
  });
  it('labels probed points by level and angle, diameters over half a turn', () => {
    const probed = cellLabels(PROBED);
    expect(probed.slice(0, 2)).toEqual(['L1 0°', 'L1 45°']);
    expect(probed[8]).toBe('L2 0°');
    expect(cellLabels(TWO)).toEqual(['⌀ 0°', '⌀ 45°', '⌀ 90°', '⌀ 135°']);
    expect(cellLabels(BURR)).toEqual(['#1', '#2', '#3', '#4']);
    expect(cellLabels(BORE)).toEqual(['Value']);
  });
  it('writes limits with their unit', () => {
    expect([limitsText(BORE), limitsText(BURR), limitsText(char({ code: 'SF', kind: 'derived', layout: 'single', lsl: 0.95, unit: null }))]).toEqual(['149.95 – 150.05 mm', '≤ 25 µm', '≥ 0.95']);
  });
  it('shows a stored reading with at least the decimals of its limits', () => {
    expect([asEntered(150.2, BORE), asEntered(150.012, BORE), asEntered(12, BURR)]).toEqual(['150.20', '150.012', '12']);
  });
  it('shows a computed figure with one decimal more than its limits', () => {
    expect(formatValue(150.01234, BORE)).toBe('150.012');
    expect(formatValue(null, BORE)).toBe('');
  });
});

describe('bench sheet model: drafts', () => {
  it('is complete only when every cell holds a number', () => {
    expect(draftState(BURR, { texts: ['12', '', '11', '13'], pass: null, note: '' }).complete).toBe(false);
    expect(draftState(BURR, { texts: ['12', 'x', '11', '13'], pass: null, note: '' }).invalid).toEqual([1]);
    expect(draftState(BURR, { texts: ['12', '14', '11', '13'], pass: null, note: '' }).complete).toBe(true);
  });
  it('needs a note before a failed check is complete', () => {
    expect(draftState(PAPERS, { texts: [], pass: false, note: ' ' })).toMatchObject({ complete: false, needsNote: true });
    expect(draftState(PAPERS, { texts: [], pass: false, note: 'heat H24-0818 not on the certificate' }).complete).toBe(true);
    expect(draftState(PAPERS, { texts: [], pass: true, note: '' }).complete).toBe(true);
  });
  it('hands evaluateSample the run typed so far, which flags an out reading before the rest is in', () => {
    const st = draftState(BURR, { texts: ['31', '12', '', '13'], pass: null, note: '' });
    expect(leadingValues(st)).toEqual([31, 12]);
    const ev = evaluateSample([{ ...BURR, inputs: null }], { nominalOdMm: 240, nominalStackLengthMm: 120, laminationAreaCm2: 245, densityGcm3: 7.65, laminationThicknessMm: 0.5, designStackingFactor: null, designToothT: null, designYokeT: null }, { BURR: { values: leadingValues(st) } });
    expect(ev.BURR).toMatchObject({ conforming: false, outOfLimits: [0], value: null });
  });
  it('recognises a draft that equals the stored reading, so it is not sent again', () => {
    const stored = { sampleId: 's', characteristicCode: 'BURR', values: [12, 14, 11, 13], pass: null, note: null };
    expect(draftSignature(BURR, { texts: ['12', '14.0', '11', '13'], pass: null, note: '' })).toBe(readingSignature(stored));
    expect(draftSignature(BURR, { texts: ['12', '14', '11', '15'], pass: null, note: '' })).not.toBe(readingSignature(stored));
  });
});

describe('bench sheet model: initialDrafts', () => {
  it('layers stored readings, then unsent ones, then what was typed but not complete', () => {
    const saved = [
      { sampleId: 's1', characteristicCode: 'BORE', values: [150.01], pass: null, note: null },
      { sampleId: 's1', characteristicCode: 'BURR', values: [10, 10, 10, 10], pass: null, note: null },
      { sampleId: 's1', characteristicCode: 'RND', values: [], pass: null, note: null },
    ];
    const unsent = [{ sampleId: 's1', characteristicCode: 'BORE', values: [150.02], pass: null, note: null }];
    const typed = { 's1|BURR': { texts: ['11', '12', '', ''], pass: null, note: '' } };
    const sut = initialDrafts([BORE, BURR, char({ code: 'RND', kind: 'derived', layout: 'single' })], saved, unsent, typed);
    expect(sut.s1.BORE.texts).toEqual(['150.02']);
    expect(sut.s1.BURR.texts).toEqual(['11', '12', '', '']);
    // Derived values are computed, never drafted.
    expect(sut.s1.RND).toBeUndefined();
  });
});
