import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useMemo, useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { getLotQueryOptions } from './lots';
import { uploadPhoto, type PhotoMeta } from './photos';

export interface PhotoUpload {
  id: number;
  file: File;
  meta: PhotoMeta;
  progress: number;
  state: 'uploading' | 'done' | 'failed';
  error?: string;
  /** 413 and 415 will fail the same way again; anything else may be retried. */
  retryable?: boolean;
}

export const MAX_PHOTO_MB = 20;
let nextId = 1;

/**
 * Photos go one after another (a tablet's upload link is narrow), each with its progress.
 * A failed upload stays in the list with the reason, to retry or dismiss.
 */
export function usePhotoUploads(lotId: string) {
  const qc = useQueryClient();
  const [uploads, setUploads] = useState<PhotoUpload[]>([]);
  const patch = useCallback((id: number, p: Partial<PhotoUpload>) => setUploads((list) => list.map((u) => (u.id === id ? { ...u, ...p } : u))), []);

  const run = useCallback(
    async (items: PhotoUpload[]) => {
      for (const u of items) {
        if (u.file.size > MAX_PHOTO_MB * 1024 * 1024) {
          patch(u.id, { state: 'failed', error: `${u.file.name} is ${(u.file.size / 1048576).toFixed(1)} MB; a photo may be at most ${MAX_PHOTO_MB} MB.`, retryable: false });
          continue;
        }
        try {
          await uploadPhoto(lotId, u.file, u.meta, (f) => patch(u.id, { progress: f }));
          patch(u.id, { state: 'done', progress: 1 });
          await qc.invalidateQueries({ queryKey: getLotQueryOptions(lotId).queryKey });
        } catch (err) {
          const e = err instanceof ApiError ? err : null;
          patch(u.id, { state: 'failed', error: e?.message ?? (err as Error).message, retryable: !(e && (e.status === 413 || e.status === 415)) });
        }
      }
    },
    [lotId, patch, qc],
  );

  const add = useCallback(
    (files: File[], meta: PhotoMeta = {}) => {
      const items = files.map((file) => ({ id: nextId++, file, meta, progress: 0, state: 'uploading' as const }));
      setUploads((list) => [...list.filter((u) => u.state !== 'done'), ...items]);
      void run(items);
    },
    [run],
  );
  const retry = useCallback(
    (id: number) => {
      const u = uploads.find((x) => x.id === id);
      if (!u) return;
      patch(id, { state: 'uploading', progress: 0, error: undefined });
      void run([{ ...u, state: 'uploading', progress: 0 }]);
    },
    [uploads, patch, run],
  );
  const dismiss = useCallback((id: number) => setUploads((list) => list.filter((u) => u.id !== id)), []);

  /** Upload progress per core (mean of that core's uploads in flight). */
  const progressBySample = useMemo(() => {
    const acc: Record<string, { sum: number; n: number }> = {};
    for (const u of uploads) {
      if (u.state !== 'uploading' || !u.meta.sampleId) continue;
      const a = (acc[u.meta.sampleId] ??= { sum: 0, n: 0 });
      a.sum += u.progress;
      a.n++;
    }
    return Object.fromEntries(Object.entries(acc).map(([k, a]) => [k, a.sum / a.n]));
  }, [uploads]);

  return { uploads, add, retry, dismiss, progressBySample };
}
