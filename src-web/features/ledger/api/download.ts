import { useCallback, useEffect, useRef, useState } from 'react';
import type { ErrorEnvelope } from '@shared/schemas/common';
import { ApiError } from '../../../lib/api-client';

export interface DownloadProgress {
  bytes: number;
  /** From Content-Length, when the server knows it (the PDF). */
  totalBytes: number | null;
  /** Data rows received so far (CSV only; the header row is not counted). */
  rows: number;
  /** From X-Total-Rows (CSV exports). */
  totalRows: number | null;
}

/** A fraction 0…1 when the total is known, else null (the bar then runs without an end). */
export function progressFraction(p: DownloadProgress): number | null {
  if (p.totalRows) return Math.min(1, p.rows / p.totalRows);
  if (p.totalBytes) return Math.min(1, p.bytes / p.totalBytes);
  return null;
}

/**
 * Counts CSV records as bytes arrive: a line feed ends a record unless it is inside quotes. An
 * escaped quote ("") toggles twice, so the state stays right across chunk boundaries.
 */
export class CsvRowCounter {
  private inQuotes = false;
  records = 0;
  push(chunk: Uint8Array): void {
    for (let i = 0; i < chunk.length; i++) {
      const b = chunk[i];
      if (b === 0x22) this.inQuotes = !this.inQuotes;
      else if (b === 0x0a && !this.inQuotes) this.records++;
    }
  }
}

const fileNameOf = (disposition: string | null, fallback: string) => /filename="([^"]+)"/.exec(disposition ?? '')?.[1] ?? fallback;

async function errorOf(res: Response): Promise<ApiError> {
  let env: Partial<ErrorEnvelope> = {};
  try {
    env = (await res.json()) as Partial<ErrorEnvelope>;
  } catch {
    /* not JSON */
  }
  // The field messages say what to change (the limit, the range): show them, not only the headline.
  const detail = env.fields ? Object.values(env.fields).join(' ') : '';
  return new ApiError(res.status, env.error ?? 'error', detail || env.message || `The export failed (${res.status})`, env.fields);
}

/**
 * Fetches an export as a stream, reporting bytes and rows as they arrive, then hands the file
 * to the browser as a download. Cancelling aborts the request (the server stops its query).
 */
export async function downloadWithProgress(url: string, onProgress: (p: DownloadProgress) => void, signal?: AbortSignal): Promise<{ fileName: string; progress: DownloadProgress }> {
  let res: Response;
  try {
    res = await fetch(url, { credentials: 'same-origin', signal, headers: { accept: 'text/csv, application/pdf, application/json' } });
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err;
    throw new ApiError(0, 'offline', 'The server cannot be reached. Check the connection and try again.');
  }
  if (!res.ok || !res.body) throw await errorOf(res);
  const isCsv = (res.headers.get('content-type') ?? '').startsWith('text/csv');
  const totalRowsHeader = res.headers.get('x-total-rows');
  const lengthHeader = res.headers.get('content-length');
  const progress: DownloadProgress = { bytes: 0, totalBytes: lengthHeader ? Number(lengthHeader) : null, rows: 0, totalRows: totalRowsHeader != null ? Number(totalRowsHeader) : null };
  const counter = new CsvRowCounter();
  const chunks: Uint8Array<ArrayBuffer>[] = [];
  const reader = res.body.getReader();
  let last = 0;
  onProgress({ ...progress });
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    chunks.push(value as Uint8Array<ArrayBuffer>);
    progress.bytes += value.length;
    if (isCsv) {
      counter.push(value);
      progress.rows = Math.max(0, counter.records - 1);
    }
    // A few updates a second are enough for the eye and cheap for React.
    const now = performance.now();
    if (now - last > 100) {
      last = now;
      onProgress({ ...progress });
    }
  }
  onProgress({ ...progress });
  const fileName = fileNameOf(res.headers.get('content-disposition'), isCsv ? 'export.csv' : 'report.pdf');
  const blob = new Blob(chunks, { type: res.headers.get('content-type') ?? 'application/octet-stream' });
  const href = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = href;
  a.download = fileName;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(href), 60_000);
  return { fileName, progress };
}

export type DownloadState =
  | { state: 'idle' }
  | { state: 'running'; progress: DownloadProgress }
  | { state: 'done'; fileName: string; progress: DownloadProgress }
  | { state: 'failed'; message: string };

/** One download at a time per button, with progress, cancel, and the outcome in words. */
export function useDownload() {
  const [s, setS] = useState<DownloadState>({ state: 'idle' });
  const ctrl = useRef<AbortController | null>(null);
  useEffect(() => () => ctrl.current?.abort(), []);
  const start = useCallback(async (url: string) => {
    ctrl.current?.abort();
    const c = new AbortController();
    ctrl.current = c;
    setS({ state: 'running', progress: { bytes: 0, totalBytes: null, rows: 0, totalRows: null } });
    try {
      const r = await downloadWithProgress(url, (progress) => setS({ state: 'running', progress }), c.signal);
      setS({ state: 'done', fileName: r.fileName, progress: r.progress });
    } catch (err) {
      if ((err as Error).name === 'AbortError') setS({ state: 'idle' });
      else setS({ state: 'failed', message: (err as Error).message });
    } finally {
      if (ctrl.current === c) ctrl.current = null;
    }
  }, []);
  const cancel = useCallback(() => ctrl.current?.abort(), []);
  return { download: s, start, cancel };
}
