import type { ErrorEnvelope } from '@shared/schemas/common';
import { importMappingSchema, type ImportMapping } from '@shared/schemas/receiving';
import { ApiError, csrfHeader } from '../../../lib/api-client';

/** What POST /api/lots/:id/imports answers with when every row went in. */
export interface ImportResult {
  importId: string;
  rows: number;
  readings: number;
}

/** The server's limit (src-api/lots/imports.service.ts MAX_CSV_BYTES), checked before sending. */
export const MAX_CSV_MB = 50;

/** Readable words for what the server refuses, when its own message is not there. */
function importError(status: number, env: Partial<ErrorEnvelope>): ApiError {
  if (status === 413) return new ApiError(413, env.error ?? 'too_large', env.message ?? `This file is too large: a gauge CSV may be at most ${MAX_CSV_MB} MB.`);
  if (status === 415) return new ApiError(415, env.error ?? 'unsupported_media_type', env.message ?? 'This is not a text CSV file.');
  if (status === 409) return new ApiError(409, env.error ?? 'conflict', env.message ?? 'This file was already imported into this lot; it was not imported again.');
  return new ApiError(status, env.error ?? 'error', env.message ?? `Import failed (${status})`, env.fields);
}

function send(lotId: string, file: File, mapping: ImportMapping, headers: Record<string, string>, onProgress: (fraction: number) => void, signal?: AbortSignal) {
  return new Promise<{ status: number; body: unknown }>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/lots/${lotId}/imports`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('accept', 'application/json');
    for (const [k, v] of Object.entries(headers)) xhr.setRequestHeader(k, v);
    // fetch() cannot report upload progress; XMLHttpRequest can.
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total);
    };
    xhr.upload.onload = () => onProgress(1);
    xhr.onload = () => {
      let body: unknown;
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : undefined;
      } catch {
        body = undefined;
      }
      resolve({ status: xhr.status, body });
    };
    xhr.onerror = () => reject(new ApiError(0, 'offline', 'The server cannot be reached; nothing was imported. Try again when the connection is back.'));
    xhr.onabort = () => reject(new DOMException('Import cancelled', 'AbortError'));
    signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    const form = new FormData();
    // The mapping goes first so the server has it before the bytes of the file.
    form.append('mapping', JSON.stringify(mapping));
    form.append('file', file, file.name);
    xhr.send(form);
  });
}

/**
 * POST /api/lots/:id/imports with upload progress (0…1) and the CSRF token. All or nothing on
 * the server: a 400 carries each bad row in `fields.rows` ("line N: …", one per line), a 409
 * says the same file was imported before.
 */
export async function importGaugeCsv(lotId: string, file: File, mapping: ImportMapping, onProgress: (fraction: number) => void, signal?: AbortSignal): Promise<ImportResult> {
  const body = importMappingSchema.parse(mapping);
  let res = await send(lotId, file, body, await csrfHeader(), onProgress, signal);
  let env = (res.body ?? {}) as Partial<ErrorEnvelope>;
  if (res.status === 403 && env.error === 'csrf') {
    onProgress(0);
    res = await send(lotId, file, body, await csrfHeader(true), onProgress, signal);
    env = (res.body ?? {}) as Partial<ErrorEnvelope>;
  }
  if (res.status >= 200 && res.status < 300) return res.body as ImportResult;
  throw importError(res.status, env);
}

/** The server's row problems ("line N: …"), one string each, from a refused import. */
export function rowProblems(err: ApiError): string[] {
  return (err.fields?.rows ?? '').split('\n').map((x) => x.trim()).filter(Boolean);
}

/**
 * Every other reason a refused import carries (mapping, file, readings refused by the lot's
 * rules), each once: the same refusal repeats for every core (e.g. an overdue gauge).
 */
export function otherProblems(err: ApiError): string[] {
  const out = new Set<string>();
  for (const [k, v] of Object.entries(err.fields ?? {})) {
    if (k === 'rows') continue;
    for (const part of v.split(/;\s+(?=mapping: )/)) out.add(part.replace(/^mapping: /, ''));
  }
  return [...out];
}

/** The line numbers named in row problems, to mark them in the preview. */
export function problemLines(problems: string[]): Set<number> {
  const lines = new Set<number>();
  for (const p of problems) {
    const m = /^line (\d+):/.exec(p);
    if (m) lines.add(Number(m[1]));
  }
  return lines;
}
