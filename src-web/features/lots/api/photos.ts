import type { ErrorEnvelope } from '@shared/schemas/common';
import type { Photo } from '@shared/schemas/receiving';
import { ApiError } from '../../../lib/api-client';
import { uploadWithProgress } from '../../../lib/upload';

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

/** POST /api/lots/:id/photos with upload progress (0…1), the CSRF token, and the error envelope mapped. */
export function uploadPhoto(lotId: string, file: File, meta: PhotoMeta, onProgress: (fraction: number) => void, signal?: AbortSignal): Promise<Photo> {
  const fields: [string, string][] = [];
  if (meta.sampleId) fields.push(['sampleId', meta.sampleId]);
  if (meta.characteristicCode) fields.push(['characteristicCode', meta.characteristicCode]);
  if (meta.caption) fields.push(['caption', meta.caption]);
  return uploadWithProgress<Photo>({
    url: `/api/lots/${lotId}/photos`,
    fields,
    file,
    onProgress,
    signal,
    offline: 'The server cannot be reached; the photo was not sent. Try again when the connection is back.',
    cancelled: 'Upload cancelled',
    refusal: uploadError,
  });
}
