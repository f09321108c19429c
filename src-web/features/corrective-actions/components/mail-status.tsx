import { Caption1, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import type { OutboxMessage } from '@shared/schemas/corrective-action';
import { HeadCell, TableFrame } from '../../../components/data-table';
import { StatusPill } from '../../../components/status-pill';
import { formatClock, formatWhen } from '../../../lib/format';

const useStyles = makeStyles({ muted: { color: tokens.colorNeutralForeground3 }, err: { color: tokens.colorPaletteRedForeground1, maxWidth: '40ch', display: 'block', overflow: 'hidden', textOverflow: 'ellipsis', whiteSpace: 'nowrap' } });

const KIND: Record<string, string> = { 'scar-issued': 'Request issued', 'step-returned': 'Step returned', 'due-reminder': 'Reminder', overdue: 'Overdue notice', 'die-service-due': 'Die service due' };

/** The mails a request caused and whether they went out: delivery retries on its own when the mail server is away. */
export function MailStatus({ mail }: { mail: OutboxMessage[] }) {
  const s = useStyles();
  if (!mail.length) return <Caption1 className={s.muted}>No mail yet.</Caption1>;
  return (
    <TableFrame>
      <Table aria-label="Mail" size="small">
        <TableHeader>
          <TableRow>
            <HeadCell>Mail</HeadCell>
            <HeadCell>To</HeadCell>
            <HeadCell>Delivery</HeadCell>
            <HeadCell>Attempts</HeadCell>
            <HeadCell>When</HeadCell>
          </TableRow>
        </TableHeader>
        <TableBody>
          {mail.map((m) => (
            <TableRow key={m.id}>
              <TableCell>
                <strong>{KIND[m.kind] ?? m.kind}</strong>
                <Caption1 className={s.muted} as="span" style={{ display: 'block' }}>{m.subject}</Caption1>
              </TableCell>
              <TableCell>{m.to.join(', ')}</TableCell>
              <TableCell>
                {m.status === 'sent' ? <StatusPill tone="ok">Sent</StatusPill> : m.status === 'failed' ? <StatusPill tone="bad">Failed</StatusPill> : <StatusPill tone="pending">Waiting to send</StatusPill>}
                {m.lastError && m.status !== 'sent' ? <Caption1 className={s.err} title={m.lastError}>{m.lastError}</Caption1> : null}
              </TableCell>
              <TableCell>{m.attempts}</TableCell>
              <TableCell className={s.muted}>{formatWhen(m.sentAt ?? m.createdAt)}{m.status === 'pending' && m.nextAttemptAt && m.attempts > 0 ? ` · next try ${formatClock(m.nextAttemptAt)}` : ''}</TableCell>
            </TableRow>
          ))}
        </TableBody>
      </Table>
    </TableFrame>
  );
}
