import { Body1, Caption1, ProgressBar, makeStyles, tokens } from '@fluentui/react-components';
import type { ReactNode } from 'react';
import type { Scar } from '@shared/schemas/corrective-action';
import { formatDay } from '../../../lib/format';

const useStyles = makeStyles({
  grid: { display: 'grid', gridTemplateColumns: 'repeat(3, minmax(0, 1fr))', gap: '16px', marginBottom: '20px', '@media (max-width: 1000px)': { gridTemplateColumns: '1fr' } },
  card: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '12px 14px', minWidth: 0 },
  h3: { display: 'block', fontSize: tokens.fontSizeBase300, fontWeight: 700, textTransform: 'uppercase', letterSpacing: '0.05em', color: tokens.colorNeutralForeground3, margin: '0 0 8px' },
  problem: { whiteSpace: 'pre-wrap', margin: 0 },
  dl: { display: 'grid', gridTemplateColumns: 'max-content minmax(0, 1fr)', gap: '4px 12px', margin: 0 },
  dt: { color: tokens.colorNeutralForeground3 },
  dd: { margin: 0, overflowWrap: 'anywhere' },
  bad: { color: tokens.colorPaletteRedForeground1, fontWeight: 700 },
});

export function Card({ title, children }: { title: string; children: ReactNode }) {
  const s = useStyles();
  return (
    <div className={s.card}>
      <h3 className={s.h3}>{title}</h3>
      {children}
    </div>
  );
}

/** Problem, facts and the effectiveness check, the same for the engineer and the supplier. */
export function ScarSummary({ scar, ncrLink }: { scar: Scar; ncrLink: ReactNode }) {
  const s = useStyles();
  const v = scar.verification;
  const verifying = scar.status === 'verifying' || scar.status === 'closed' || v.startedAt;
  return (
    <div className={s.grid}>
      <Card title="Problem">
        <Body1 as="p" className={s.problem}>{scar.problem}</Body1>
      </Card>
      <Card title="Request">
        <dl className={s.dl}>
          <dt className={s.dt}>Supplier</dt><dd className={s.dd}>{scar.supplierCode} · {scar.supplierName}</dd>
          <dt className={s.dt}>Part</dt><dd className={s.dd}>{scar.partNumber ? `${scar.partNumber} rev ${scar.partRevision}` : '—'}</dd>
          <dt className={s.dt}>Nonconformance</dt><dd className={s.dd}>{ncrLink}</dd>
          <dt className={s.dt}>Defect</dt><dd className={s.dd}>{scar.defectCodes.join(', ')}</dd>
          <dt className={s.dt}>Issued</dt><dd className={s.dd}>{formatDay(scar.issuedAt)}</dd>
          {scar.acknowledgedAt ? (<><dt className={s.dt}>Acknowledged</dt><dd className={s.dd}>{formatDay(scar.acknowledgedAt)}</dd></>) : null}
          {scar.closedAt ? (<><dt className={s.dt}>Closed</dt><dd className={s.dd}>{formatDay(scar.closedAt)}</dd></>) : null}
        </dl>
      </Card>
      <Card title="Effectiveness">
        {verifying ? (
          <>
            <Body1 as="p" style={{ margin: '0 0 6px' }}>{v.passed} of {v.required} lots passed without the defect since the actions were accepted.</Body1>
            <ProgressBar value={Math.min(1, v.passed / v.required)} thickness="large" aria-label="Lots passed" />
            {v.lots.length ? <Caption1 as="p">Lots: {v.lots.map((l) => `#${l.ref ?? '?'}`).join(', ')}</Caption1> : null}
            {v.recurrence ? <Body1 as="p" className={s.bad}>The defect returned{v.recurrence.ncrNumber ? ` in ${v.recurrence.ncrNumber}` : ''}. The request must be reopened.</Body1> : null}
          </>
        ) : (
          <Body1 as="p" style={{ margin: 0 }}>Once the actions are accepted, the next {v.required} lots of this part must pass without the defect before the request closes.</Body1>
        )}
      </Card>
    </div>
  );
}
