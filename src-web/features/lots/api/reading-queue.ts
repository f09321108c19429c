/**
 * The bench sheet's outbox: every completed reading goes here first (and into localStorage)
 * and leaves only when the server has stored it. Pure functions, so the rules are testable
 * without a browser; `use-reading-queue.ts` wires them to React and the network.
 */
// Relative, not @shared: the unit tests (root tsconfig, no path alias) import this file too.
import type { ReadingInput } from '../../../../shared/schemas/receiving';

export interface QueuedReading {
  /** `${sampleId}|${characteristicCode}`: one entry per core × characteristic (the last write wins). */
  key: string;
  sampleId: string;
  characteristicCode: string;
  values: number[];
  gaugeId: string | null;
  pass: boolean | null;
  note: string | null;
  /** When it was entered; tells a newer edit apart from the copy that was in flight. */
  stamp: number;
  /** Set when the server refused it (field → message); a refused reading waits for an edit. */
  refused?: Record<string, string>;
}

export const readingKey = (sampleId: string, code: string) => `${sampleId}|${code}`;
export const queueStorageKey = (lotId: string) => `yokeline.unsent.${lotId}`;

/** What is stored is checked on the way back in: a damaged entry is dropped, never sent. */
function isQueued(x: unknown): x is QueuedReading {
  const r = x as QueuedReading;
  return (
    !!r &&
    typeof r.key === 'string' &&
    typeof r.sampleId === 'string' &&
    typeof r.characteristicCode === 'string' &&
    Array.isArray(r.values) &&
    r.values.every((v) => typeof v === 'number' && Number.isFinite(v)) &&
    typeof r.stamp === 'number'
  );
}

export function loadQueue(storage: Pick<Storage, 'getItem'>, lotId: string): QueuedReading[] {
  try {
    const raw = storage.getItem(queueStorageKey(lotId));
    const parsed: unknown = raw ? JSON.parse(raw) : [];
    return Array.isArray(parsed) ? parsed.filter(isQueued) : [];
  } catch {
    return [];
  }
}

export function saveQueue(storage: Pick<Storage, 'setItem' | 'removeItem'>, lotId: string, items: QueuedReading[]): boolean {
  try {
    if (items.length) storage.setItem(queueStorageKey(lotId), JSON.stringify(items));
    else storage.removeItem(queueStorageKey(lotId));
    return true;
  } catch {
    // Storage full or blocked: the reading is still held in memory and shown as unsent.
    return false;
  }
}

/** Adds or replaces the entry for its core × characteristic; a new edit clears an old refusal. */
export function upsert(items: QueuedReading[], r: Omit<QueuedReading, 'key' | 'refused'>): QueuedReading[] {
  const key = readingKey(r.sampleId, r.characteristicCode);
  const entry: QueuedReading = { ...r, key };
  const i = items.findIndex((x) => x.key === key);
  return i < 0 ? [...items, entry] : items.map((x, j) => (j === i ? entry : x));
}

/** The entries the next send carries: everything not waiting for an edit. */
export const sendable = (items: QueuedReading[]) => items.filter((x) => !x.refused);

export const toInput = (r: QueuedReading): ReadingInput => ({
  sampleId: r.sampleId,
  characteristicCode: r.characteristicCode,
  values: r.values,
  gaugeId: r.gaugeId,
  ...(r.pass === null ? {} : { pass: r.pass }),
  note: r.note,
});

const sameCopy = (a: QueuedReading, b: QueuedReading) => a.key === b.key && a.stamp === b.stamp;

/** After the server stored `sent`: drop those copies, keep anything edited while they travelled. */
export function removeSent(items: QueuedReading[], sent: QueuedReading[]): QueuedReading[] {
  return items.filter((x) => !sent.some((s) => sameCopy(s, x)));
}

/**
 * The server refuses a whole request when any reading in it is wrong (nothing partial is
 * stored) and names the culprits as `readings.<i>.<field>`. Those are marked refused; the
 * others were refused only for company and go again. With no usable field names, every
 * reading sent is marked with the general message.
 */
export function markRefused(items: QueuedReading[], sent: QueuedReading[], message: string, fields?: Record<string, string>): QueuedReading[] {
  const byKey = new Map<string, Record<string, string>>();
  for (const [path, msg] of Object.entries(fields ?? {})) {
    const m = /^readings\.(\d+)(?:\.(\w+))?/.exec(path);
    const s = m ? sent[Number(m[1])] : undefined;
    if (!s) continue;
    byKey.set(s.key, { ...(byKey.get(s.key) ?? {}), [m![2] ?? '_']: msg });
  }
  if (byKey.size === 0) for (const s of sent) byKey.set(s.key, { _: message });
  return items.map((x) => {
    const why = byKey.get(x.key);
    return why && sent.some((s) => sameCopy(s, x)) ? { ...x, refused: why } : x;
  });
}

/** 1 s, 2 s, 4 s … at most 30 s between tries while the server cannot be reached. */
export const retryDelayMs = (attempt: number) => Math.min(30_000, 1000 * 2 ** Math.max(0, attempt));

/** Failures worth retrying as they are: no connection, a server fault, an expired session, throttling. */
export const isTransient = (status: number) => status === 0 || status >= 500 || status === 401 || status === 408 || status === 429;
