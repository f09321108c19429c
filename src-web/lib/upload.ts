import type { ErrorEnvelope } from '@shared/schemas/common';
import { ApiError, csrfHeader } from './api-client';

export interface UploadOptions {
  /** API path, e.g. `/api/lots/<id>/photos`. */
  url: string;
  /** Text fields in order; the file is appended last so the server reads them before its bytes. */
  fields: readonly (readonly [string, string])[];
  file: File;
  onProgress: (fraction: number) => void;
  signal?: AbortSignal;
  /** What to say when the server cannot be reached. */
  offline: string;
  /** What an abort is called in the AbortError. */
  cancelled: string;
  /** Readable words for a refusal whose envelope says little (413, 415, 409…). */
  refusal: (status: number, env: Partial<ErrorEnvelope>) => ApiError;
}

function send(o: UploadOptions, headers: Record<string, string>) {
  return new Promise<{ status: number; body: unknown }>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', o.url);
    xhr.withCredentials = true;
    xhr.setRequestHeader('accept', 'application/json');
    for (const [k, v] of Object.entries(headers)) xhr.setRequestHeader(k, v);
    // fetch() cannot report upload progress; XMLHttpRequest can.
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) o.onProgress(e.loaded / e.total);
    };
    xhr.upload.onload = () => o.onProgress(1);
    xhr.onload = () => {
      let body: unknown;
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : undefined;
      } catch {
        body = undefined;
      }
      resolve({ status: xhr.status, body });
    };
    xhr.onerror = () => reject(new ApiError(0, 'offline', o.offline));
    xhr.onabort = () => reject(new DOMException(o.cancelled, 'AbortError'));
    o.signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    const form = new FormData();
    for (const [k, v] of o.fields) form.append(k, v);
    form.append('file', o.file, o.file.name);
    xhr.send(form);
  });
}

/**
 * A multipart POST with upload progress (0…1) and the CSRF token, sent again once with a fresh
 * token if the session's token had changed; a refusal becomes an ApiError with readable words.
 */
export async function uploadWithProgress<T>(o: UploadOptions): Promise<T> {
  let res = await send(o, await csrfHeader());
  let env = (res.body ?? {}) as Partial<ErrorEnvelope>;
  if (res.status === 403 && env.error === 'csrf') {
    o.onProgress(0);
    res = await send(o, await csrfHeader(true));
    env = (res.body ?? {}) as Partial<ErrorEnvelope>;
  }
  if (res.status >= 200 && res.status < 300) return res.body as T;
  throw o.refusal(res.status, env);
}
