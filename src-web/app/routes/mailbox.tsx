import { Body1, Caption1, makeStyles, Subtitle2, tokens } from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import { api } from '../../lib/api-client';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { formatWhen } from '../../lib/format';

interface Mail { id: number; receivedAt: string; from: string; to: string[]; subject: string; text: string }

const useStyles = makeStyles({
  item: { borderBottom: `1px solid ${tokens.colorNeutralStroke2}`, padding: '12px 0' },
  body: { whiteSpace: 'pre-wrap', fontFamily: 'inherit', margin: '8px 0 0' },
});

/** Demo and test only: what the local SMTP capture server caught. */
export function MailboxPage() {
  const s = useStyles();
  const q = useQuery({ queryKey: ['dev', 'mailbox'], queryFn: () => api<{ items: Mail[] }>('/dev/mailbox'), refetchInterval: 5000 });
  return (
    <Page title="Captured mail" lead="Messages the demo sent to the local capture server. In production, mail goes to real inboxes and this page does not exist.">
      {q.error ? <EmptyState title="No mailbox here">This server does not capture mail.</EmptyState> : null}
      {q.data && q.data.items.length === 0 ? <EmptyState title="No mail yet" /> : null}
      {q.data?.items.map((m) => (
        <article key={m.id} className={s.item}>
          <Subtitle2 as="h2">{m.subject}</Subtitle2>
          <Caption1 as="p">To {m.to.join(', ')} · {formatWhen(m.receivedAt, true)}</Caption1>
          <Body1 as="pre" className={s.body}>{m.text}</Body1>
        </article>
      ))}
    </Page>
  );
}
