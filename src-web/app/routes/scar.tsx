import { Body1, Button, Caption1, Field, MessageBar, MessageBarBody, Textarea, makeStyles, tokens } from '@fluentui/react-components';
import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { Scar } from '@shared/schemas/corrective-action';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { Loading } from '../../components/data-table';
import { ConfirmDialog } from '../../components/confirm-dialog';
import { paths } from '../../config/paths';
import { ApiError } from '../../lib/api-client';
import { useMe } from '../../features/auth/api/get-me';
import { useScar, useScarTransition } from '../../features/corrective-actions/api/scars';
import { ScarStatusPill } from '../../features/corrective-actions/components/scar-status';
import { StepCard } from '../../features/corrective-actions/components/step-card';
import { ScarSummary } from '../../features/corrective-actions/components/scar-summary';
import { MailStatus } from '../../features/corrective-actions/components/mail-status';
import { HistoryList } from '../../features/ncrs/components/record-sections';
import { Section } from '../../components/section';

const useStyles = makeStyles({
  head: { display: 'flex', gap: '8px', alignItems: 'center', flexWrap: 'wrap' },
  touch: { minHeight: '44px' },
  steps: { display: 'flex', flexDirection: 'column', gap: '12px' },
  link: { color: tokens.colorBrandForeground1, fontWeight: 600 },
  muted: { color: tokens.colorNeutralForeground3 },
  banner: { marginBottom: '16px' },
});

function Moves({ scar }: { scar: Scar }) {
  const s = useStyles();
  const move = useScarTransition();
  const [dialog, setDialog] = useState<'close' | 'reopen' | null>(null);
  const [note, setNote] = useState('');
  const v = scar.verification;
  return (
    <>
      {scar.status === 'accepted' ? <Button className={s.touch} appearance="primary" disabled={move.isPending} onClick={() => move.mutate({ id: scar.id, to: 'verifying', version: scar.version })}>Start the effectiveness check</Button> : null}
      {scar.status === 'verifying' ? (
        <>
          <Button className={s.touch} appearance="primary" disabled={v.passed < v.required || !!v.recurrence} title={v.passed < v.required ? `${v.passed} of ${v.required} lots have passed` : undefined} onClick={() => setDialog('close')}>Close</Button>
          <Button className={s.touch} onClick={() => setDialog('reopen')}>Reopen: the defect returned</Button>
        </>
      ) : null}
      {move.error ? <Caption1 role="alert" style={{ color: tokens.colorPaletteRedForeground1 }}>{move.error.message}</Caption1> : null}
      <ConfirmDialog
        open={dialog !== null}
        title={dialog === 'close' ? `Close ${scar.number}` : `Reopen ${scar.number}`}
        confirmLabel={dialog === 'close' ? 'Close the request' : 'Reopen and tell the supplier'}
        onClose={() => (setDialog(null), setNote(''))}
        onConfirm={() => move.mutateAsync({ id: scar.id, to: dialog === 'close' ? 'closed' : 'returned', version: scar.version, note: note.trim() || null })}
      >
        <Body1>{dialog === 'close' ? `${v.passed} lots have passed without the defect. Closing ends the request; the record stays.` : 'The supplier must answer containment, root cause and actions (D3–D7) again, with new due dates. They are mailed.'}</Body1>
        <Field label={dialog === 'close' ? 'Note for the record' : 'Why it is reopened (the supplier reads this)'} required={dialog === 'reopen'}>
          <Textarea value={note} onChange={(_, d) => setNote(d.value)} rows={3} />
        </Field>
      </ConfirmDialog>
    </>
  );
}

/** A corrective action request for the engineer: review each step, watch the mail, verify, close. */
export function ScarPage() {
  const s = useStyles();
  const { id = '' } = useParams();
  const { data: me } = useMe();
  const scar = useScar(id, 10_000);
  if (scar.isPending) return <Loading label="Opening the request" />;
  if (scar.error) {
    const missing = scar.error instanceof ApiError && (scar.error.status === 404 || scar.error.status === 400);
    return (
      <Page title="Corrective action">
        <EmptyState title={missing ? 'There is no such request' : 'The request cannot be opened'} action={<Link className={s.link} to={paths.scars}>All requests</Link>}>{missing ? 'It may have been mistyped.' : scar.error.message}</EmptyState>
      </Page>
    );
  }
  const c = scar.data;
  const engineer = me?.role === 'engineer';
  // The exports' own roles (auditor, engineer, admin); others would get a 403 file.
  const exporter = me?.role === 'auditor' || engineer || me?.role === 'admin';
  return (
    <Page
      title={c.number}
      lead={c.title}
      actions={<div className={s.head}><ScarStatusPill status={c.status} />{exporter ? <Button as="a" className={s.touch} href={`/api/exports/corrective-actions/${c.id}/report.pdf`} download>8D report (PDF)</Button> : null}{engineer ? <Moves scar={c} /> : null}</div>}
    >
      {c.verification.recurrence ? (
        <MessageBar className={s.banner} intent="error"><MessageBarBody>The defect returned{c.verification.recurrence.ncrNumber ? ` in ${c.verification.recurrence.ncrNumber}` : ''}: reopen the request so the supplier looks at the cause again.</MessageBarBody></MessageBar>
      ) : null}
      <ScarSummary scar={c} ncrLink={<Link className={s.link} to={paths.ncr(c.ncrId)}>{c.ncrNumber}</Link>} />
      <Section title="8D steps">
        <div className={s.steps}>
          {c.steps.map((st) => <StepCard key={st.step} scar={c} step={st} role={engineer ? 'engineer' : 'reader'} />)}
        </div>
      </Section>
      {c.mail ? (
        <Section title="Mail to the supplier">
          <Caption1 as="p" className={s.muted}>Sent to {c.recipients.join(', ')}. Mail waits in the outbox and is retried when the mail server is away; nothing is lost or sent twice.</Caption1>
          <MailStatus mail={c.mail} />
        </Section>
      ) : null}
      {c.history ? (
        <Section title="History">
          <HistoryList entries={c.history} />
        </Section>
      ) : null}
    </Page>
  );
}
