import { Body1, Button, MessageBar, MessageBarBody, MessageBarTitle, Subtitle1, makeStyles, tokens } from '@fluentui/react-components';
import { Link, useParams } from 'react-router-dom';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { Loading } from '../../components/data-table';
import { paths } from '../../config/paths';
import { ApiError } from '../../lib/api-client';
import { useScar, useScarTransition } from '../../features/corrective-actions/api/scars';
import { ScarStatusPill } from '../../features/corrective-actions/components/scar-status';
import { StepCard } from '../../features/corrective-actions/components/step-card';
import { ScarSummary } from '../../features/corrective-actions/components/scar-summary';

const useStyles = makeStyles({
  head: { display: 'flex', gap: '8px', alignItems: 'center', flexWrap: 'wrap' },
  touch: { minHeight: '44px' },
  steps: { display: 'flex', flexDirection: 'column', gap: '12px' },
  h2: { display: 'block', margin: '0 0 10px' },
  link: { color: tokens.colorBrandForeground1, fontWeight: 600 },
  banner: { marginBottom: '16px' },
});

/** A supplier answers a corrective action request here, step by step, with drafts and evidence. */
export function DeskScarPage() {
  const s = useStyles();
  const { id = '' } = useParams();
  const scar = useScar(id);
  const move = useScarTransition();
  if (scar.isPending) return <Loading label="Opening the request" />;
  if (scar.error) {
    const missing = scar.error instanceof ApiError && (scar.error.status === 404 || scar.error.status === 400);
    return (
      <Page title="Corrective action">
        <EmptyState title={missing ? 'There is no such request here' : 'The request cannot be opened'} action={<Link className={s.link} to={paths.supplierDesk}>Back to the Supplier desk</Link>}>
          {missing ? 'It may have been mistyped, or it was sent to another company.' : scar.error.message}
        </EmptyState>
      </Page>
    );
  }
  const c = scar.data;
  const returned = c.steps.filter((x) => x.status === 'returned');
  return (
    <Page
      title={c.number}
      lead={c.title}
      actions={
        <div className={s.head}>
          <ScarStatusPill status={c.status} />
          {c.status === 'issued' ? <Button className={s.touch} appearance="primary" disabled={move.isPending} onClick={() => move.mutate({ id: c.id, to: 'acknowledged', version: c.version })}>Acknowledge the request</Button> : null}
        </div>
      }
    >
      {returned.length ? (
        <MessageBar className={s.banner} intent="warning">
          <MessageBarBody><MessageBarTitle>Please revise {returned.map((x) => x.step).join(', ')}</MessageBarTitle>The engineer’s comments are on each step below.</MessageBarBody>
        </MessageBar>
      ) : c.status === 'issued' ? (
        <MessageBar className={s.banner} intent="info">
          <MessageBarBody>Start with the containment (D3): it protects Harrowgate while you look for the cause. Save drafts as you go; submit each step when it is complete.</MessageBarBody>
        </MessageBar>
      ) : null}
      {move.error ? <MessageBar className={s.banner} intent="error" role="alert"><MessageBarBody>{move.error.message}</MessageBarBody></MessageBar> : null}
      <ScarSummary scar={c} ncrLink={<Link className={s.link} to={paths.deskNcr(c.ncrId)}>{c.ncrNumber}</Link>} />
      <Subtitle1 as="h2" className={s.h2}>Your answers</Subtitle1>
      <div className={s.steps}>
        {c.steps.map((st) => <StepCard key={st.step} scar={c} step={st} role="supplier" />)}
      </div>
      <Body1 as="p" style={{ marginTop: 16 }}><Link className={s.link} to={paths.supplierDesk}>Back to the Supplier desk</Link></Body1>
    </Page>
  );
}
