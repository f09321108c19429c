import { describe, expect, it } from 'vitest';
import { DISPOSITION_KINDS, checkSplit, lineCost, lotStatusAfter, outcomeQuantities } from '../../shared/compute/disposition';
import { dispositionLineSchema, dispositionLinesFor } from '../../shared/schemas/ncr';

describe('lineCost', () => {
  it('is hours × rate + scrap value + freight, to the cent', () => {
    expect(lineCost({ hours: 6, rate: 42 })).toBe(252);
    expect(lineCost({ hours: 1.5, rate: 38.5, scrapValue: 10.005, freight: 80 })).toBe(147.76);
    expect(lineCost({})).toBe(0);
    expect(() => lineCost({ hours: -1, rate: 10 })).toThrow(/negative/);
  });
});

describe('checkSplit', () => {
  it('accepts lines that give every suspect core exactly one fate', () => {
    const sut = checkSplit([{ kind: 'scrap', quantity: 10, scrapValue: 125 }, { kind: 'sort', quantity: 90, hours: 6, rate: 42 }], 100);
    expect(sut).toEqual({ assigned: 100, remaining: 0, ok: true, message: null, totalCost: 377 });
  });

  it('says how many are missing or too many', () => {
    expect(checkSplit([{ kind: 'scrap', quantity: 30 }], 100)).toMatchObject({ ok: false, remaining: 70, message: '30 of 100 cores assigned: 70 still need a disposition' });
    expect(checkSplit([{ kind: 'scrap', quantity: 60 }, { kind: 'rework', quantity: 50 }], 100)).toMatchObject({ ok: false, remaining: -10, message: '110 cores assigned but only 100 are suspect: 10 too many' });
    expect(checkSplit([], 5).message).toBe('Add at least one disposition');
    expect(checkSplit([{ kind: 'scrap', quantity: 0 }, { kind: 'scrap', quantity: 5 }], 5).ok).toBe(false);
  });

  it('is what the shared form schema checks', () => {
    const sut = dispositionLinesFor(20);
    expect(sut.safeParse({ lines: [{ kind: 'scrap', quantity: 20, rationale: 'Bent laminations' }] }).success).toBe(true);
    const r = sut.safeParse({ lines: [{ kind: 'scrap', quantity: 19, rationale: 'Bent laminations' }] });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]).toMatchObject({ path: ['lines'], message: '19 of 20 cores assigned: 1 still need a disposition' });
  });
});

describe('dispositionLineSchema', () => {
  it('needs a concession reference for use as is (ISO 9001:2015 §8.7.2: the concession is recorded)', () => {
    expect(dispositionLineSchema.safeParse({ kind: 'use-as-is', quantity: 3, rationale: 'Within margin' }).success).toBe(false);
    expect(dispositionLineSchema.safeParse({ kind: 'use-as-is', quantity: 3, rationale: 'Within margin', concessionRef: 'CON-7' }).success).toBe(true);
  });
});

describe('lotStatusAfter', () => {
  // ISO 9000:2015 §3.12 (memory): rework, repair and regrade make product usable; scrap precludes its use.
  it.each([
    [[{ kind: 'scrap', quantity: 5 }], 'scrapped'],
    [[{ kind: 'return-to-supplier', quantity: 5 }], 'returned'],
    [[{ kind: 'use-as-is', quantity: 5 }], 'released'],
    [[{ kind: 'scrap', quantity: 1 }, { kind: 'sort', quantity: 4 }], 'released'],
    [[{ kind: 'scrap', quantity: 1 }, { kind: 'return-to-supplier', quantity: 4 }], 'returned'],
  ] as const)('%j → %s', (lines, status) => {
    expect(lotStatusAfter(lines)).toBe(status);
  });

  it('maps every kind to an outcome and adds up the quantities', () => {
    for (const kind of DISPOSITION_KINDS) expect(['released', 'returned', 'scrapped']).toContain(lotStatusAfter([{ kind, quantity: 1 }]));
    expect(outcomeQuantities([{ kind: 'scrap', quantity: 10 }, { kind: 'sort', quantity: 85 }, { kind: 'rework', quantity: 5 }])).toEqual({ released: 90, returned: 0, scrapped: 10 });
    expect(() => lotStatusAfter([])).toThrow();
  });
});
