import { describe, expect, it } from 'vitest';
import {
  isTransient,
  loadQueue,
  markRefused,
  queueStorageKey,
  removeSent,
  retryDelayMs,
  saveQueue,
  sendable,
  toInput,
  upsert,
  type QueuedReading,
} from '../../src-web/features/lots/api/reading-queue';

const S1 = '11111111-1111-4111-8111-111111111111';
const S2 = '22222222-2222-4222-8222-222222222222';
const entry = (sampleId: string, code: string, values: number[], stamp: number, over: Partial<QueuedReading> = {}) => ({ sampleId, characteristicCode: code, values, gaugeId: null, pass: null, note: null, stamp, ...over });

/** A Storage stand-in (the browser's localStorage is not there in node). */
function memoryStorage(failWrites = false) {
  const m = new Map<string, string>();
  return {
    m,
    getItem: (k: string) => m.get(k) ?? null,
    setItem: (k: string, v: string) => {
      if (failWrites) throw new Error('QuotaExceededError');
      m.set(k, v);
    },
    removeItem: (k: string) => void m.delete(k),
  };
}

describe('reading queue: upsert', () => {
  it('keeps one entry per core × characteristic, the last write winning', () => {
    let sut = upsert([], entry(S1, 'BORE', [150.01], 1));
    sut = upsert(sut, entry(S1, 'BURR', [12, 13], 2));
    sut = upsert(sut, entry(S1, 'BORE', [150.02], 3));
    expect(sut.map((x) => [x.characteristicCode, x.values])).toEqual([
      ['BORE', [150.02]],
      ['BURR', [12, 13]],
    ]);
  });

  it('clears a refusal when the reading is entered again', () => {
    const refused = markRefused(upsert([], entry(S1, 'BORE', [150.01], 1)), [{ ...entry(S1, 'BORE', [150.01], 1), key: `${S1}|BORE` }], 'no');
    expect(sendable(refused)).toHaveLength(0);
    const sut = upsert(refused, entry(S1, 'BORE', [150.0], 2));
    expect(sendable(sut)).toHaveLength(1);
  });
});

describe('reading queue: after a send', () => {
  it('removes the copies the server stored and keeps an edit made while they travelled', () => {
    const before = upsert(upsert([], entry(S1, 'BORE', [150.01], 1)), entry(S2, 'BORE', [150.0], 1));
    const sent = sendable(before);
    const edited = upsert(before, entry(S1, 'BORE', [150.03], 2));
    const sut = removeSent(edited, sent);
    expect(sut).toHaveLength(1);
    expect(sut[0].values).toEqual([150.03]);
  });

  it('marks only the readings the server named, so the others go again', () => {
    const items = [entry(S1, 'BORE', [150.01], 1), entry(S2, 'BORE', [150.0], 1)].reduce<QueuedReading[]>((q, e) => upsert(q, e), []);
    const sut = markRefused(items, items, 'Some readings were refused', { 'readings.1.gaugeId': 'Gauge G-1 was due for calibration on 2026-01-01' });
    expect(sut[0].refused).toBeUndefined();
    expect(sut[1].refused).toEqual({ gaugeId: 'Gauge G-1 was due for calibration on 2026-01-01' });
    expect(sendable(sut).map((x) => x.sampleId)).toEqual([S1]);
  });

  it('marks every reading sent with the message when the server names no field', () => {
    const items = upsert([], entry(S1, 'BORE', [150.01], 1));
    const sut = markRefused(items, items, 'This lot is already on-hold; its readings can no longer change.');
    expect(sut[0].refused).toEqual({ _: 'This lot is already on-hold; its readings can no longer change.' });
  });
});

describe('reading queue: storage', () => {
  it('survives a round trip through storage, keyed by lot', () => {
    const store = memoryStorage();
    const items = upsert([], entry(S1, 'BURR', [12, 14, 11, 13], 5, { gaugeId: 'g' }));
    expect(saveQueue(store, 'lot-a', items)).toBe(true);
    expect(loadQueue(store, 'lot-a')).toEqual(items);
    expect(loadQueue(store, 'lot-b')).toEqual([]);
    saveQueue(store, 'lot-a', []);
    expect(store.m.has(queueStorageKey('lot-a'))).toBe(false);
  });

  it('drops damaged entries instead of sending them', () => {
    const store = memoryStorage();
    store.m.set(queueStorageKey('lot-a'), JSON.stringify([{ key: 'x', sampleId: S1, characteristicCode: 'BORE', values: ['150'], stamp: 1 }, { nonsense: true }]));
    expect(loadQueue(store, 'lot-a')).toEqual([]);
    store.m.set(queueStorageKey('lot-a'), '{not json');
    expect(loadQueue(store, 'lot-a')).toEqual([]);
  });

  it('reports a storage that refuses to keep the copy', () => {
    expect(saveQueue(memoryStorage(true), 'lot-a', upsert([], entry(S1, 'BORE', [1], 1)))).toBe(false);
  });
});

describe('reading queue: sending rules', () => {
  it('backs off 1 s, 2 s, 4 s … up to 30 s', () => {
    expect([0, 1, 2, 3, 4, 5, 6, 10].map(retryDelayMs)).toEqual([1000, 2000, 4000, 8000, 16000, 30000, 30000, 30000]);
  });

  it('retries when the server cannot be reached or fails, not when it refuses', () => {
    expect([0, 500, 502, 503, 401, 429].every(isTransient)).toBe(true);
    expect([400, 403, 404, 409, 413].some(isTransient)).toBe(false);
  });

  it('sends pass/fail only for checks and keeps the gauge', () => {
    const [v, a] = [upsert([], entry(S1, 'BORE', [150], 1, { gaugeId: 'g1' }))[0], upsert([], entry(S1, 'PAPERS', [], 1, { pass: false, note: 'heat number missing' }))[0]];
    expect(toInput(v)).toEqual({ sampleId: S1, characteristicCode: 'BORE', values: [150], gaugeId: 'g1', note: null });
    expect(toInput(a)).toEqual({ sampleId: S1, characteristicCode: 'PAPERS', values: [], gaugeId: null, pass: false, note: 'heat number missing' });
  });
});
