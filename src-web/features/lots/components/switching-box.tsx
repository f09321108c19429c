import { Button, Caption1, MessageBar, MessageBarBody, Spinner, makeStyles, tokens } from '@fluentui/react-components';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { StatusPill } from '../../../components/status-pill';
import { paths } from '../../../config/paths';
import { useSwitching } from '../api/lots';
import { SEVERITY_LABELS } from './sampling-box';
import { formatWhen } from '../../../lib/format';

const useStyles = makeStyles({
  row: { display: 'flex', gap: '8px', flexWrap: 'wrap', alignItems: 'center' },
  facts: { display: 'flex', gap: '14px', flexWrap: 'wrap', color: tokens.colorNeutralForeground2, fontSize: tokens.fontSizeBase200, margin: '8px 0 0' },
  list: { listStyle: 'none', margin: '10px 0 0', padding: 0, display: 'flex', flexDirection: 'column', gap: '6px' },
  item: { borderLeft: `2px solid ${tokens.colorNeutralStroke2}`, paddingLeft: '10px', fontSize: tokens.fontSizeBase200 },
  when: { color: tokens.colorNeutralForeground3 },
  link: { color: tokens.colorBrandForeground1 },
  more: { minHeight: '36px', marginTop: '4px' },
});

const TONE = { normal: 'info', tightened: 'pending', reduced: 'ok' } as const;

/** ISO 2859-1 switching state for the lot's supplier × part, with what moved it. */
export function SwitchingBox({ supplierId, partId, currentLotId }: { supplierId: string; partId: string; currentLotId?: string }) {
  const s = useStyles();
  const q = useSwitching(supplierId, partId);
  const [all, setAll] = useState(false);
  if (q.isPending) return <Spinner size="tiny" label="Loading switching state" />;
  if (q.error) return <Caption1>Switching state not available: {q.error.message}</Caption1>;
  const { state, history } = q.data;
  const shown = all ? history : history.slice(0, 4);
  return (
    <div>
      <div className={s.row}>
        <StatusPill tone={TONE[state.severity]}>{SEVERITY_LABELS[state.severity]} inspection</StatusPill>
        {state.discontinued ? <StatusPill tone="bad">Acceptance stopped</StatusPill> : null}
        {state.reducedEligible && state.severity === 'normal' ? <StatusPill tone="ok">Reduced inspection may be approved</StatusPill> : null}
      </div>
      <p className={s.facts}>
        <span>{state.consecutiveAccepted} accepted in a row</span>
        <span>switching score {state.switchingScore}</span>
        {state.severity === 'tightened' ? <span>{state.notAcceptedOnTightened} of 5 not accepted on tightened</span> : null}
      </p>
      {state.discontinued ? (
        <MessageBar intent="error">
          <MessageBarBody>No new lots may be received from this supplier for this part until an engineer records the supplier&apos;s corrective action.</MessageBarBody>
        </MessageBar>
      ) : null}
      {history.length ? (
        <>
          <ul className={s.list} aria-label="Switching history">
            {shown.map((h) => (
              <li key={h.id} className={s.item}>
                <span className={s.when}>{formatWhen(h.at)}</span>{' '}
                {h.severityBefore !== h.severityAfter ? <strong>{h.severityBefore} → {h.severityAfter}. </strong> : null}
                {h.reason}
                {h.lotId && h.lotId !== currentLotId ? <> · <Link className={s.link} to={paths.lot(h.lotId)}>that lot</Link></> : h.lotId === currentLotId ? ' · this lot' : null}
              </li>
            ))}
          </ul>
          {history.length > 4 ? (
            <Button className={`${s.more} no-print`} appearance="subtle" onClick={() => setAll(!all)}>{all ? 'Show fewer' : `Show all ${history.length}`}</Button>
          ) : null}
        </>
      ) : (
        <Caption1 className={s.when}>No decisions recorded yet for this supplier and part.</Caption1>
      )}
    </div>
  );
}
