import { Button, Caption1, Dialog, DialogActions, DialogBody, DialogContent, DialogSurface, DialogTitle, Input, ProgressBar, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { useRef, useState } from 'react';
import type { Photo } from '@shared/schemas/receiving';
import { photoUrl, thumbnailUrl } from '../api/lots';
import type { PhotoUpload } from '../api/use-photo-uploads';
import { formatWhen } from '../../../lib/format';

const useStyles = makeStyles({
  bar: { display: 'flex', gap: '8px', alignItems: 'flex-end', flexWrap: 'wrap', marginBottom: '12px' },
  touch: { minHeight: '44px' },
  caption: { minWidth: '260px', minHeight: '44px' },
  hidden: { display: 'none' },
  uploads: { listStyle: 'none', margin: '0 0 12px', padding: 0, display: 'flex', flexDirection: 'column', gap: '8px', maxWidth: '640px' },
  upload: { display: 'grid', gridTemplateColumns: 'minmax(0, 1fr) auto', gap: '4px 12px', alignItems: 'center' },
  name: { overflow: 'hidden', textOverflow: 'ellipsis', whiteSpace: 'nowrap' },
  error: { color: tokens.colorPaletteRedForeground1, gridColumn: '1 / -1' },
  grid: { display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(150px, 1fr))', gap: '10px' },
  thumbBtn: {
    display: 'flex',
    flexDirection: 'column',
    gap: '4px',
    padding: '4px',
    border: `1px solid ${tokens.colorNeutralStroke2}`,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground2,
    cursor: 'zoom-in',
    textAlign: 'left',
    fontFamily: 'inherit',
    color: tokens.colorNeutralForeground1,
    ':focus-visible': { outline: `3px solid ${tokens.colorBrandStroke1}` },
  },
  thumb: { width: '100%', aspectRatio: '4 / 3', objectFit: 'cover', borderRadius: '4px', backgroundColor: tokens.colorNeutralBackground3, display: 'block' },
  thumbCap: { fontSize: tokens.fontSizeBase200, overflow: 'hidden', textOverflow: 'ellipsis', whiteSpace: 'nowrap' },
  big: { maxWidth: '100%', maxHeight: '70vh', display: 'block', margin: '0 auto', borderRadius: '6px' },
  surface: { maxWidth: 'min(1100px, 96vw)', width: 'auto' },
  muted: { color: tokens.colorNeutralForeground3 },
});

/** Photo buttons: the camera (tablets open it directly) or several files at once. */
export function PhotoPickers({ onFiles, label }: { onFiles: (files: File[]) => void; label: string }) {
  const s = useStyles();
  const camera = useRef<HTMLInputElement>(null);
  const files = useRef<HTMLInputElement>(null);
  const take = (l: FileList | null) => l?.length && onFiles([...l]);
  return (
    <>
      <Button className={s.touch} appearance="primary" onClick={() => camera.current?.click()}>Take photo</Button>
      <Button className={s.touch} onClick={() => files.current?.click()}>Choose photos…</Button>
      <input ref={camera} className={s.hidden} type="file" accept="image/*" capture="environment" multiple aria-label={`${label} (camera)`} onChange={(e) => { take(e.target.files); e.target.value = ''; }} />
      <input ref={files} className={s.hidden} type="file" accept="image/*" multiple aria-label={label} onChange={(e) => { take(e.target.files); e.target.value = ''; }} />
    </>
  );
}

export function UploadList({ uploads, onRetry, onDismiss }: { uploads: PhotoUpload[]; onRetry: (id: number) => void; onDismiss: (id: number) => void }) {
  const s = useStyles();
  const live = uploads.filter((u) => u.state !== 'done');
  if (!live.length) return null;
  return (
    <ul className={s.uploads} aria-label="Photo uploads">
      {live.map((u) => (
        <li key={u.id} className={s.upload}>
          <span className={s.name}>
            {u.file.name}
            {u.state === 'uploading' ? ` — ${Math.round(u.progress * 100)} %` : ''}
          </span>
          {u.state === 'failed' ? (
            <span>
              {u.retryable ? <Button className={s.touch} size="small" onClick={() => onRetry(u.id)}>Retry</Button> : null}
              <Button className={s.touch} size="small" appearance="subtle" onClick={() => onDismiss(u.id)}>Dismiss</Button>
            </span>
          ) : <span />}
          {u.state === 'uploading' ? <ProgressBar value={u.progress} max={1} thickness="large" aria-label={`Uploading ${u.file.name}`} style={{ gridColumn: '1 / -1' }} /> : null}
          {u.error ? <span className={s.error} role="alert">{u.error}</span> : null}
        </li>
      ))}
    </ul>
  );
}

/** Thumbnails; a click (or Enter) opens the web copy. */
export function PhotoGrid({ photos, coreOf }: { photos: Photo[]; coreOf: (sampleId: string | null) => string | null }) {
  const s = useStyles();
  const [open, setOpen] = useState<Photo | null>(null);
  if (!photos.length) return <Caption1 className={s.muted}>No photos yet.</Caption1>;
  const label = (p: Photo) => [coreOf(p.sampleId), p.characteristicCode, p.caption].filter(Boolean).join(' · ') || 'Lot photo';
  return (
    <>
      <div className={s.grid}>
        {photos.map((p) => (
          <button key={p.id} type="button" className={s.thumbBtn} onClick={() => setOpen(p)} aria-label={`Open photo: ${label(p)}`}>
            <img className={s.thumb} src={thumbnailUrl(p.id)} alt={label(p)} loading="lazy" />
            <span className={s.thumbCap}>{label(p)}</span>
          </button>
        ))}
      </div>
      <Dialog open={!!open} onOpenChange={(_, d) => !d.open && setOpen(null)}>
        <DialogSurface className={s.surface}>
          {open ? (
            <DialogBody>
              <DialogTitle>{label(open)}</DialogTitle>
              <DialogContent>
                <img className={s.big} src={photoUrl(open.id)} alt={label(open)} />
                <Caption1 className={s.muted}>{open.width} × {open.height} px · added {formatWhen(open.createdAt)} · metadata removed on upload</Caption1>
              </DialogContent>
              <DialogActions>
                <Button className={s.touch} as="a" href={photoUrl(open.id)} target="_blank" rel="noreferrer">Open full size</Button>
                <Button className={s.touch} appearance="primary" onClick={() => setOpen(null)}>Close</Button>
              </DialogActions>
            </DialogBody>
          ) : null}
        </DialogSurface>
      </Dialog>
    </>
  );
}

/** The Lot file's photo section: pickers with an optional caption, progress, thumbnails. */
export function PhotoSection({ photos, uploads, editable, onAdd, onRetry, onDismiss, coreOf }: {
  photos: Photo[];
  uploads: PhotoUpload[];
  editable: boolean;
  onAdd: (files: File[], caption?: string) => void;
  onRetry: (id: number) => void;
  onDismiss: (id: number) => void;
  coreOf: (sampleId: string | null) => string | null;
}) {
  const s = useStyles();
  const [caption, setCaption] = useState('');
  return (
    <div>
      {editable ? (
        <div className={mergeClasses(s.bar, 'no-print')}>
          <Input className={s.caption} aria-label="Caption for the next photos" placeholder="Caption (optional), e.g. rust on top lamination" value={caption} maxLength={300} onChange={(_, d) => setCaption(d.value)} />
          <PhotoPickers label="Add photos to the lot" onFiles={(f) => onAdd(f, caption.trim() || undefined)} />
          <Caption1 className={s.muted}>JPEG, PNG or WebP, up to 20 MB each. Location and camera data are removed.</Caption1>
        </div>
      ) : null}
      <UploadList uploads={uploads} onRetry={onRetry} onDismiss={onDismiss} />
      <PhotoGrid photos={photos} coreOf={coreOf} />
    </div>
  );
}
