import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { putReadings } from './readings';
import { isTransient, loadQueue, markRefused, removeSent, retryDelayMs, saveQueue, sendable, toInput, upsert, type QueuedReading } from './reading-queue';

export type QueuePhase = 'idle' | 'sending' | 'waiting';

export interface ReadingQueue {
  items: QueuedReading[];
  /** Entries not yet stored by the server (refused ones included). */
  unsent: number;
  refused: QueuedReading[];
  phase: QueuePhase;
  /** When the next try happens while waiting (ms since epoch). */
  retryAt: number | null;
  /** Why the last try failed, in words. */
  lastError: string | null;
  /** The browser's storage refused the copy: the readings live only in this tab. */
  storageFailed: boolean;
  enqueue: (r: Omit<QueuedReading, 'key' | 'refused'>) => void;
  retryNow: () => void;
}

/**
 * Sends completed readings, keeps unsent ones in localStorage (keyed by lot) and retries with
 * backoff while the server cannot be reached. Reloading the page brings them back and sends them.
 */
export function useReadingQueue(lotId: string, opts: { enabled: boolean; onSaved?: () => void }): ReadingQueue {
  const [items, setItems] = useState<QueuedReading[]>(() => loadQueue(localStorage, lotId));
  const [phase, setPhase] = useState<QueuePhase>('idle');
  const [retryAt, setRetryAt] = useState<number | null>(null);
  const [lastError, setLastError] = useState<string | null>(null);
  const [storageFailed, setStorageFailed] = useState(false);
  const itemsRef = useRef(items);
  const inFlight = useRef(false);
  const attempt = useRef(0);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const onSaved = useRef(opts.onSaved);
  onSaved.current = opts.onSaved;
  const enabled = opts.enabled;

  // Every change reaches storage before anything is sent: a reading entered is never lost.
  const commit = useCallback(
    (next: QueuedReading[]) => {
      itemsRef.current = next;
      setItems(next);
      setStorageFailed(!saveQueue(localStorage, lotId, next));
    },
    [lotId],
  );

  const flush = useCallback(async () => {
    if (inFlight.current || !enabled) return;
    const batch = sendable(itemsRef.current);
    if (!batch.length) {
      setPhase('idle');
      return;
    }
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    inFlight.current = true;
    setPhase('sending');
    setRetryAt(null);
    let again = false;
    try {
      await putReadings(lotId, batch.map(toInput));
      attempt.current = 0;
      setLastError(null);
      commit(removeSent(itemsRef.current, batch));
      onSaved.current?.();
      again = sendable(itemsRef.current).length > 0;
    } catch (err) {
      const e = err instanceof ApiError ? err : new ApiError(0, 'offline', (err as Error).message);
      if (isTransient(e.status)) {
        const wait = retryDelayMs(attempt.current++);
        setLastError(e.message);
        setRetryAt(Date.now() + wait);
        setPhase('waiting');
        timer.current = setTimeout(() => void flush(), wait);
        inFlight.current = false;
        return;
      }
      commit(markRefused(itemsRef.current, batch, e.message, e.status === 400 ? e.fields : undefined));
      setLastError(null);
      // Readings refused only because another in the same request was wrong go again.
      again = sendable(itemsRef.current).length > 0;
    } finally {
      inFlight.current = false;
    }
    if (again) void flush();
    else setPhase('idle');
  }, [enabled, lotId, commit]);

  const enqueue = useCallback(
    (r: Omit<QueuedReading, 'key' | 'refused'>) => {
      commit(upsert(itemsRef.current, r));
      // A short pause lets a quick run of entries travel in one request.
      if (!inFlight.current && phase !== 'waiting') {
        if (timer.current) clearTimeout(timer.current);
        timer.current = setTimeout(() => void flush(), 150);
      }
    },
    [commit, flush, phase],
  );

  const retryNow = useCallback(() => {
    attempt.current = 0;
    void flush();
  }, [flush]);

  // Send what a previous visit left behind, and try again as soon as the network is back.
  useEffect(() => {
    if (!enabled) return;
    void flush();
    const online = () => {
      attempt.current = 0;
      void flush();
    };
    window.addEventListener('online', online);
    return () => {
      window.removeEventListener('online', online);
      if (timer.current) clearTimeout(timer.current);
    };
  }, [enabled, flush]);

  const refused = useMemo(() => items.filter((x) => x.refused), [items]);
  return {
    items,
    unsent: items.length,
    refused,
    phase,
    retryAt,
    lastError,
    storageFailed,
    enqueue,
    retryNow,
  };
}
