import { Button, Caption1, Link as FluentLink, MessageBar, MessageBarBody, Spinner, makeStyles, tokens } from '@fluentui/react-components';
import { useRef } from 'react';
import type { Part } from '@shared/schemas/master-data';
import { drawingUrl, useUploadDrawing } from '../api/parts';

const useStyles = makeStyles({
  box: { display: 'flex', flexDirection: 'column', gap: '10px', alignItems: 'flex-start' },
  row: { display: 'flex', gap: '12px', alignItems: 'center', flexWrap: 'wrap' },
  touch: { minHeight: '44px' },
  hidden: { display: 'none' },
  muted: { color: tokens.colorNeutralForeground3 },
});

const size = (n: number) => (n >= 1024 * 1024 ? `${(n / 1024 / 1024).toFixed(1)} MB` : `${Math.max(1, Math.round(n / 1024))} kB`);

/** The part's drawing: a link that opens the PDF, and (for engineers) upload or replace. */
export function DrawingCard({ part, canWrite }: { part: Part; canWrite: boolean }) {
  const s = useStyles();
  const input = useRef<HTMLInputElement>(null);
  const upload = useUploadDrawing();
  return (
    <div className={s.box}>
      {part.drawing ? (
        <div className={s.row}>
          <FluentLink href={drawingUrl(part.id)} target="_blank" rel="noopener">{part.drawing.name}</FluentLink>
          <Caption1 className={s.muted}>PDF · {size(part.drawing.size)}</Caption1>
        </div>
      ) : (
        <Caption1 className={s.muted}>No drawing attached yet.</Caption1>
      )}
      {canWrite ? (
        <div className={s.row}>
          <input
            ref={input}
            className={s.hidden}
            type="file"
            accept="application/pdf,.pdf"
            aria-label="Drawing PDF file"
            onChange={(e) => {
              const file = e.target.files?.[0];
              e.target.value = '';
              if (file) upload.mutate({ id: part.id, file });
            }}
          />
          <Button className={s.touch} disabled={upload.isPending} onClick={() => input.current?.click()}>
            {part.drawing ? 'Replace drawing (PDF)' : 'Upload drawing (PDF)'}
          </Button>
          {upload.isPending ? <Spinner size="tiny" label="Uploading…" /> : null}
        </div>
      ) : null}
      {upload.error ? (
        <MessageBar intent="error" role="alert"><MessageBarBody>{upload.error.message}</MessageBarBody></MessageBar>
      ) : upload.isSuccess ? (
        <Caption1 role="status">Drawing attached.</Caption1>
      ) : null}
    </div>
  );
}
