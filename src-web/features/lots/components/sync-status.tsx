import { Button, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { useEffect, useState } from 'react';
import { statusColours } from '../../../theme/theme';
import { useThemeMode } from '../../../theme/theme-mode';
import type { ReadingQueue } from '../api/use-reading-queue';

const useStyles = makeStyles({
  ok: { display: 'flex', alignItems: 'center', minHeight: '28px', fontSize: tokens.fontSizeBase300, fontWeight: 600 },
  box: {
    display: 'flex',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: '16px',
    flexWrap: 'wrap',
    padding: '8px 8px 8px 14px',
    borderRadius: tokens.borderRadiusMedium,
    borderLeft: '4px solid',
  },
  lines: { display: 'flex', flexDirection: 'column', gap: '4px' },
  line: { fontSize: tokens.fontSizeBase300, fontWeight: 700 },
  detail: { fontWeight: 400, color: tokens.colorNeutralForeground2, marginLeft: '6px' },
  touch: { minHeight: '44px' },
});

const readings = (n: number) => `${n} reading${n === 1 ? '' : 's'}`;

/** Where the readings are: all saved, being sent, waiting to retry, refused, or held for a gauge. */
export function SyncStatus({ queue, waitingForGauge }: { queue: ReadingQueue; waitingForGauge: { n: number; codes: string[] } }) {
  const s = useStyles();
  const { mode } = useThemeMode();
  const c = statusColours[mode];
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (queue.phase !== 'waiting') return;
    const t = setInterval(() => setNow(Date.now()), 1000);
    return () => clearInterval(t);
  }, [queue.phase]);

  const pending = queue.unsent - queue.refused.length;
  const problems: { text: string; tone: string; detail?: string }[] = [];
  if (queue.phase === 'waiting' && pending > 0) {
    const secs = queue.retryAt ? Math.max(0, Math.ceil((queue.retryAt - now) / 1000)) : 0;
    problems.push({ text: `${readings(pending)} not sent yet — retrying${secs ? ` in ${secs} s` : ''}`, tone: c.pending, detail: 'Kept in this browser until the server has them; nothing is lost.' });
  }
  if (queue.refused.length) problems.push({ text: `${readings(queue.refused.length)} refused — see the marked cores`, tone: c.bad, detail: 'Correct the entry, or choose another gauge, and it is sent again.' });
  if (waitingForGauge.n) problems.push({ text: `${readings(waitingForGauge.n)} wait for a gauge`, tone: c.pending, detail: `Choose the gauge for ${waitingForGauge.codes.join(', ')} above.` });
  if (queue.storageFailed) problems.push({ text: 'This browser did not keep a copy', tone: c.bad, detail: 'Keep this page open until every reading is sent.' });
  const worst = problems.find((p) => p.tone === c.bad)?.tone ?? problems[0]?.tone;

  return (
    <div role="status" aria-live="polite" aria-label="Readings sent" className="no-print">
      {problems.length ? (
        <div className={s.box} style={{ borderLeftColor: worst, backgroundColor: `${worst}14` }}>
          <div className={s.lines}>
            {problems.map((p) => (
              <span key={p.text.replace(/ in \d+ s$/, '')} className={s.line} style={{ color: p.tone }}>
                {p.text}
                {p.detail ? <span className={s.detail}>{p.detail}</span> : null}
              </span>
            ))}
            {queue.phase === 'waiting' && queue.lastError ? <span className={s.detail} style={{ marginLeft: 0 }}>{queue.lastError}</span> : null}
          </div>
          {queue.phase === 'waiting' ? <Button className={s.touch} onClick={queue.retryNow}>Retry now</Button> : null}
        </div>
      ) : (
        <span className={mergeClasses(s.ok)} style={{ color: pending > 0 ? c.info : c.ok }}>{pending > 0 ? `Saving ${readings(pending)}…` : '✓ All readings saved'}</span>
      )}
    </div>
  );
}
