import type { ErrorEnvelope } from '@shared/schemas/common';
import { importMappingSchema, type ImportMapping } from '@shared/schemas/receiving';
import { ApiError } from '../../../lib/api-client';
import { uploadWithProgress } from '../../../lib/upload';

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

/**
 * POST /api/lots/:id/imports with upload progress (0…1) and the CSRF token. All or nothing on
 * the server: a 400 carries each bad row in `fields.rows` ("line N: …", one per line), a 409
 * says the same file was imported before.
 */
export async function importGaugeCsv(lotId: string, file: File, mapping: ImportMapping, onProgress: (fraction: number) => void, signal?: AbortSignal): Promise<ImportResult> {
  const body = importMappingSchema.parse(mapping);
  return uploadWithProgress<ImportResult>({
    url: `/api/lots/${lotId}/imports`,
    // The mapping goes first so the server has it before the bytes of the file.
    fields: [['mapping', JSON.stringify(body)]],
    file,
    onProgress,
    signal,
    offline: 'The server cannot be reached; nothing was imported. Try again when the connection is back.',
    cancelled: 'Import cancelled',
    refusal: importError,
  });
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
