import { Button, Caption1, Spinner, makeStyles, tokens } from '@fluentui/react-components';
import { useRef, useState } from 'react';
import type { NcrPhoto } from '@shared/schemas/ncr';
import { EmptyState } from '../../../components/empty-state';
import { ncrPhotoUrl, ncrThumbUrl, useUploadNcrPhoto } from '../api/ncrs';

const useStyles = makeStyles({
  grid: { display: 'flex', flexWrap: 'wrap', gap: '12px', margin: '0 0 12px', padding: 0, listStyle: 'none' },
  item: { width: '168px', display: 'flex', flexDirection: 'column', gap: '4px' },
  img: { width: '168px', height: '126px', objectFit: 'cover', borderRadius: tokens.borderRadiusMedium, border: `1px solid ${tokens.colorNeutralStroke2}`, display: 'block', backgroundColor: tokens.colorNeutralBackground3 },
  row: { display: 'flex', gap: '10px', alignItems: 'center', flexWrap: 'wrap' },
  hidden: { display: 'none' },
  touch: { minHeight: '44px' },
  error: { color: tokens.colorPaletteRedForeground1 },
  muted: { color: tokens.colorNeutralForeground3 },
});

/** The NCR's photos (from the lot or added here); new ones go through the same image checks as the bench's. */
export function NcrPhotos({ ncrId, photos, canAdd }: { ncrId: string; photos: NcrPhoto[]; canAdd: boolean }) {
  const s = useStyles();
  const upload = useUploadNcrPhoto();
  const input = useRef<HTMLInputElement>(null);
  const [error, setError] = useState<string | null>(null);
  const [progress, setProgress] = useState<{ done: number; total: number } | null>(null);
  const add = async (files: File[]) => {
    setError(null);
    setProgress({ done: 0, total: files.length });
    for (const [i, file] of files.entries()) {
      try {
        await upload.mutateAsync({ id: ncrId, file });
      } catch (err) {
        setError(`${file.name}: ${(err as Error).message}`);
      }
      setProgress({ done: i + 1, total: files.length });
    }
    setProgress(null);
  };
  return (
    <>
      {photos.length ? (
        <ul className={s.grid}>
          {photos.map((p) => (
            <li key={p.id} className={s.item}>
              <a href={ncrPhotoUrl(ncrId, p.id)} target="_blank" rel="noreferrer">
                <img className={s.img} src={ncrThumbUrl(ncrId, p.id)} alt={p.caption ?? 'Photo of the nonconformity'} loading="lazy" />
              </a>
              <Caption1 className={s.muted}>{p.caption ?? (p.fromLot ? 'From the lot file' : 'Added to the NCR')}</Caption1>
            </li>
          ))}
        </ul>
      ) : (
        <EmptyState title="No photos yet">{canAdd ? 'Add a close-up of the defect: it helps the review board and the supplier.' : undefined}</EmptyState>
      )}
      {canAdd ? (
        <div className={s.row}>
          <Button className={s.touch} disabled={!!progress} onClick={() => input.current?.click()}>Add photos</Button>
          {progress ? <Spinner size="tiny" label={`Uploading ${progress.done} of ${progress.total}…`} /> : null}
          <input
            ref={input}
            className={s.hidden}
            type="file"
            accept="image/jpeg,image/png,image/webp"
            multiple
            aria-label="Photos of the nonconformity"
            onChange={(e) => {
              const files = [...(e.target.files ?? [])];
              e.target.value = '';
              if (files.length) void add(files);
            }}
          />
          {error ? <Caption1 role="alert" className={s.error}>{error}</Caption1> : null}
        </div>
      ) : null}
    </>
  );
}
