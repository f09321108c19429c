import type { ErrorEnvelope } from '@shared/schemas/common';
import type { Photo } from '@shared/schemas/receiving';
import { ApiError, csrfHeader } from '../../../lib/api-client';

export interface PhotoMeta {
  sampleId?: string;
  characteristicCode?: string;
  caption?: string;
}

/** Readable words for what the server refuses, when its own message is not there. */
function uploadError(status: number, env: Partial<ErrorEnvelope>): ApiError {
  if (status === 413) return new ApiError(413, env.error ?? 'too_large', env.message ?? 'This photo is too large: at most 20 MB each.');
  if (status === 415) return new ApiError(415, env.error ?? 'unsupported_media_type', env.message ?? 'Only JPEG, PNG or WebP photos are accepted.');
  return new ApiError(status, env.error ?? 'error', env.message ?? `Upload failed (${status})`, env.fields);
}

function send(lotId: string, file: File, meta: PhotoMeta, headers: Record<string, string>, onProgress: (fraction: number) => void, signal?: AbortSignal) {
  return new Promise<{ status: number; body: unknown }>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/lots/${lotId}/photos`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('accept', 'application/json');
    for (const [k, v] of Object.entries(headers)) xhr.setRequestHeader(k, v);
    // fetch() cannot report upload progress; XMLHttpRequest can.
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      let body: unknown;
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : undefined;
      } catch {
        body = undefined;
      }
      resolve({ status: xhr.status, body });
    };
    xhr.onerror = () => reject(new ApiError(0, 'offline', 'The server cannot be reached; the photo was not sent. Try again when the connection is back.'));
    xhr.onabort = () => reject(new DOMException('Upload cancelled', 'AbortError'));
    signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    const form = new FormData();
    if (meta.sampleId) form.append('sampleId', meta.sampleId);
    if (meta.characteristicCode) form.append('characteristicCode', meta.characteristicCode);
    if (meta.caption) form.append('caption', meta.caption);
    // The file goes last so the text fields reach the server before the bytes.
    form.append('file', file, file.name);
    xhr.send(form);
  });
}

/** POST /api/lots/:id/photos with upload progress (0…1), the CSRF token, and the error envelope mapped. */
export async function uploadPhoto(lotId: string, file: File, meta: PhotoMeta, onProgress: (fraction: number) => void, signal?: AbortSignal): Promise<Photo> {
  let res = await send(lotId, file, meta, await csrfHeader(), onProgress, signal);
  let env = (res.body ?? {}) as Partial<ErrorEnvelope>;
  if (res.status === 403 && env.error === 'csrf') {
    res = await send(lotId, file, meta, await csrfHeader(true), onProgress, signal);
    env = (res.body ?? {}) as Partial<ErrorEnvelope>;
  }
  if (res.status >= 200 && res.status < 300) return res.body as Photo;
  throw uploadError(res.status, env);
}
