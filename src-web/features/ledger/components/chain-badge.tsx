import { Button, Spinner, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { useQueryClient } from '@tanstack/react-query';
import { statusColours } from '../../../theme/theme';
import { useThemeMode } from '../../../theme/theme-mode';
import { getChainStatusQueryOptions, useChainStatus } from '../api/ledger';
import { formatClock } from '../../../lib/format';

const useStyles = makeStyles({
  box: {
    display: 'flex',
    alignItems: 'center',
    gap: '14px',
    padding: '12px 16px',
    borderRadius: tokens.borderRadiusLarge,
    border: '2px solid',
    marginBottom: '20px',
    flexWrap: 'wrap',
  },
  glyph: { fontSize: '22px', lineHeight: '1', fontWeight: 700 },
  text: { display: 'flex', flexDirection: 'column', gap: '2px', flexGrow: 1, minWidth: '240px' },
  head: { fontWeight: 700, fontSize: tokens.fontSizeBase400 },
  sub: { color: tokens.colorNeutralForeground2, fontSize: tokens.fontSizeBase200 },
  touch: { minHeight: '44px' },
  neutral: { border: `2px solid ${tokens.colorNeutralStroke1}` },
});

const time = (iso: string) => formatClock(iso, true);

/**
 * The hash chain's verification, in plain sight: green with the record count and when it was
 * checked, or red naming the first record that no longer matches.
 */
export function ChainBadge() {
  const s = useStyles();
  const { mode } = useThemeMode();
  const c = statusColours[mode];
  const q = useChainStatus();
  const qc = useQueryClient();
  const recheck = () => void qc.fetchQuery({ ...getChainStatusQueryOptions(), staleTime: 0 });
  if (q.isPending) {
    return (
      <div className={mergeClasses(s.box, s.neutral)} role="status" aria-label="Audit chain">
        <Spinner size="tiny" /> <span>Checking the audit chain…</span>
      </div>
    );
  }
  if (q.error) {
    return (
      <div className={mergeClasses(s.box, s.neutral)} role="status" aria-label="Audit chain">
        <span className={s.text}><span className={s.head}>The audit chain could not be checked</span><span className={s.sub}>{q.error.message}</span></span>
        <Button className={s.touch} onClick={recheck}>Check again</Button>
      </div>
    );
  }
  const v = q.data;
  const colour = v.ok ? c.ok : c.bad;
  return (
    <div className={s.box} role="status" aria-label="Audit chain" style={{ borderColor: colour, backgroundColor: `${colour}${mode === 'dark' ? '22' : '10'}` }}>
      <span className={s.glyph} aria-hidden style={{ color: colour }}>{v.ok ? '✓' : '✕'}</span>
      <span className={s.text}>
        {v.ok ? (
          <span className={s.head} style={{ color: colour }}>Chain intact · {v.count.toLocaleString()} records · checked {time(v.checkedAt)}</span>
        ) : (
          <span className={s.head} style={{ color: colour }}>Broken at record #{v.firstBrokenId}</span>
        )}
        <span className={s.sub}>
          {v.ok
            ? 'Every audit record still matches its SHA-256 hash and its link to the record before it.'
            : `Record #${v.firstBrokenId} no longer matches its hash or its link to the record before it: it was changed outside the application. ${v.count.toLocaleString()} records before it are intact. Checked ${time(v.checkedAt)}.`}
        </span>
      </span>
      <Button className={s.touch} onClick={recheck} disabled={q.isFetching}>{q.isFetching ? 'Checking…' : 'Check again'}</Button>
    </div>
  );
}
