import { Button, Caption1, ProgressBar, makeStyles, tokens } from '@fluentui/react-components';
import { progressFraction, useDownload, type DownloadProgress } from '../api/download';

const useStyles = makeStyles({
  // A fixed width: the progress line and the outcome must not push the page header around.
  box: { display: 'inline-flex', flexDirection: 'column', gap: '4px', width: '240px' },
  row: { display: 'flex', alignItems: 'center', gap: '8px' },
  touch: { minHeight: '44px' },
  bar: { width: '100%' },
  error: { color: tokens.colorPaletteRedForeground1, maxWidth: '48ch' },
  muted: { color: tokens.colorNeutralForeground3 },
});

const kb = (n: number) => (n < 1024 * 1024 ? `${Math.max(1, Math.round(n / 1024))} KB` : `${(n / 1024 / 1024).toFixed(1)} MB`);
const int = (n: number) => n.toLocaleString();

/** "1 200 of 4 800 rows · 96 KB" while it runs. */
export function progressText(p: DownloadProgress): string {
  if (p.totalRows != null) return `${int(p.rows)} of ${int(p.totalRows)} rows · ${kb(p.bytes)}`;
  if (p.totalBytes) return `${kb(p.bytes)} of ${kb(p.totalBytes)}`;
  return kb(p.bytes);
}

/**
 * A download button that streams the export and shows how far it has got, with a way to stop
 * it; a refusal from the server (a range too large, an unknown filter) is shown beside it.
 */
export function ExportButton({ url, label, appearance = 'secondary', disabled }: { url: string; label: string; appearance?: 'primary' | 'secondary'; disabled?: boolean }) {
  const s = useStyles();
  const { download: d, start, cancel } = useDownload();
  const running = d.state === 'running';
  return (
    <div className={s.box}>
      <div className={s.row}>
        <Button className={s.touch} appearance={appearance} disabled={disabled || running} onClick={() => void start(url)}>
          {running ? `${label}…` : label}
        </Button>
        {running ? <Button className={s.touch} appearance="subtle" onClick={cancel}>Cancel</Button> : null}
      </div>
      {running ? (
        <div role="status" aria-label={`${label} progress`}>
          <ProgressBar className={s.bar} value={progressFraction(d.progress) ?? undefined} thickness="large" />
          <Caption1 className={s.muted}>{progressText(d.progress)}</Caption1>
        </div>
      ) : d.state === 'done' ? (
        <Caption1 className={s.muted} role="status">Downloaded {d.fileName} · {d.progress.totalRows != null ? `${int(d.progress.rows)} rows, ` : ''}{kb(d.progress.bytes)}</Caption1>
      ) : d.state === 'failed' ? (
        <Caption1 className={s.error} role="alert">{d.message}</Caption1>
      ) : null}
    </div>
  );
}
