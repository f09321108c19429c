import { Button, Caption1, MessageBar, MessageBarBody, Subtitle2, Table, TableBody, TableCell, TableHeader, TableRow, Tooltip, makeStyles, tokens } from '@fluentui/react-components';
import { useState, type ReactNode } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import type { Part, PlanSummary } from '@shared/schemas/master-data';
import { Page } from '../../components/page';
import { HeadCell, Loading, TableFrame } from '../../components/data-table';
import { paths } from '../../config/paths';
import { usePart } from '../../features/parts/api/parts';
import { usePlans, useRevisePlan } from '../../features/plans/api/plans';
import { CONSTRUCTION_LABELS } from '../../features/parts/components/construction';
import { DrawingCard } from '../../features/parts/components/drawing-card';
import { PlanStatusPill, samplingSummary } from '../../features/plans/components/plan-labels';
import { TemplateDialog } from '../../features/plans/components/template-dialog';
import { ActivateDialog } from '../../features/plans/components/activate-dialog';
import { useCanManageMasterData } from '../../features/auth/hooks/use-can';
import { formatDay } from '../../lib/format';

const useStyles = makeStyles({
  back: { color: tokens.colorBrandForeground1, textDecoration: 'none', display: 'inline-flex', minHeight: '32px', alignItems: 'center', marginBottom: '4px' },
  grid: { display: 'grid', gridTemplateColumns: 'minmax(0, 2fr) minmax(260px, 1fr)', gap: '20px', marginBottom: '28px', '@media (max-width: 1100px)': { gridTemplateColumns: '1fr' } },
  card: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '16px 18px', backgroundColor: tokens.colorNeutralBackground1 },
  cardTitle: { display: 'block', marginBottom: '12px' },
  dl: { display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(190px, 1fr))', gap: '14px 20px', margin: 0 },
  dt: { color: tokens.colorNeutralForeground3, fontSize: tokens.fontSizeBase200 },
  dd: { margin: 0, fontWeight: 600, fontVariantNumeric: 'tabular-nums' },
  sub: { display: 'block', fontWeight: 400, color: tokens.colorNeutralForeground3, fontSize: tokens.fontSizeBase200 },
  actions: { display: 'flex', gap: '8px', flexWrap: 'wrap' },
  touch: { minHeight: '44px' },
  rowBtn: { minHeight: '36px' },
  rowActions: { display: 'flex', gap: '6px', justifyContent: 'flex-end' },
  head: { display: 'flex', justifyContent: 'space-between', alignItems: 'center', gap: '12px', marginBottom: '10px', flexWrap: 'wrap' },
  link: { color: tokens.colorBrandForeground1, fontWeight: 600 },
});

function Datum({ label, children, sub }: { label: string; children: ReactNode; sub?: string }) {
  const s = useStyles();
  return (
    <div>
      <dt className={s.dt}>{label}</dt>
      <dd className={s.dd}>{children}{sub ? <span className={s.sub}>{sub}</span> : null}</dd>
    </div>
  );
}

/** The API stores how the density was found; say it in words. */
function densityBasis(source: string): string {
  switch (source) {
    case 'table': return 'conventional value for this grade';
    case 'interpolated': return 'estimated from the grade (interpolated)';
    case 'extrapolated': return 'estimated from the grade (extended)';
    case 'set by engineer': return 'set by the engineer';
    default: return source;
  }
}

function PartData({ part }: { part: Part }) {
  const s = useStyles();
  const opt = (v: number | null, unit = '') => (v == null ? '—' : `${v}${unit}`);
  return (
    <dl className={s.dl}>
      <Datum label="Construction">{CONSTRUCTION_LABELS[part.construction]}</Datum>
      <Datum label="Steel grade" sub={`${part.lossWPerKg} W/kg at 1.5 T, 50 Hz · ${part.gradeThicknessMm} mm`}>{part.steelGrade}</Datum>
      <Datum label="Density" sub={densityBasis(part.densitySource)}>{part.densityGcm3} g/cm³</Datum>
      <Datum label="Lamination thickness">{part.laminationThicknessMm} mm</Datum>
      <Datum label="Lamination net area">{part.laminationAreaCm2} cm²</Datum>
      <Datum label="Bore">{part.nominalBoreMm} mm</Datum>
      <Datum label="OD">{part.nominalOdMm} mm</Datum>
      <Datum label="Stack length">{part.nominalStackLengthMm} mm</Datum>
      <Datum label="Slots">{part.slotCount}</Datum>
      <Datum label="Core mass">{part.nominalMassKg} kg</Datum>
      <Datum label="Design stacking factor">{opt(part.designStackingFactor)}</Datum>
      <Datum label="Design flux, tooth / yoke">{opt(part.designToothT, ' T')} / {opt(part.designYokeT, ' T')}</Datum>
    </dl>
  );
}

export function PartPage() {
  const s = useStyles();
  const { id = '' } = useParams();
  const navigate = useNavigate();
  const canWrite = useCanManageMasterData();
  const part = usePart(id);
  const plans = usePlans({ partId: id, pageSize: 200, sort: '-revision' }, !!id);
  const revise = useRevisePlan();
  const [templateOpen, setTemplateOpen] = useState(false);
  const [activating, setActivating] = useState<PlanSummary | null>(null);

  if (part.isPending) return <Loading />;
  if (part.error) {
    return (
      <Page title="Part">
        <MessageBar intent="error" role="alert"><MessageBarBody>{part.error.message}</MessageBarBody></MessageBar>
      </Page>
    );
  }
  const p = part.data;
  const list = plans.data?.items ?? [];
  const activePlan = list.find((x) => x.status === 'active');
  const draft = list.find((x) => x.status === 'draft');
  const doRevise = async (planId: string) => {
    // The refusal (if any) shows from revise.error; nothing else to do here.
    const next = await revise.mutateAsync({ id: planId }).catch(() => null);
    if (next) await navigate(paths.plan(next.id));
  };

  return (
    <>
      <Link to={paths.plans} className={s.back}>← Plans & parts</Link>
      <Page
        title={`${p.partNumber} rev ${p.revision}`}
        lead={p.description}
        actions={
          canWrite ? (
            <div className={s.actions}>
              <Button className={s.touch} appearance="primary" onClick={() => setTemplateOpen(true)}>New plan from template</Button>
            </div>
          ) : undefined
        }
      >
        <div className={s.grid}>
          <section className={s.card} aria-label="Part data">
            <Subtitle2 as="h2" className={s.cardTitle}>Part data</Subtitle2>
            <PartData part={p} />
          </section>
          <section className={s.card} aria-label="Drawing">
            <Subtitle2 as="h2" className={s.cardTitle}>Drawing</Subtitle2>
            <DrawingCard part={p} canWrite={canWrite} />
          </section>
        </div>

        <section aria-label="Inspection plan revisions">
          <div className={s.head}>
            <Subtitle2 as="h2">Inspection plan revisions</Subtitle2>
            {revise.error ? <MessageBar intent="error" role="alert"><MessageBarBody>{revise.error.message}</MessageBarBody></MessageBar> : null}
          </div>
          {plans.isPending ? <Loading /> : list.length === 0 ? (
            <MessageBar intent="warning">
              <MessageBarBody>No plan yet: lots of this part cannot be inspected. {canWrite ? 'Start one with “New plan from template”.' : 'An engineer sets one up.'}</MessageBarBody>
            </MessageBar>
          ) : (
            <TableFrame>
              <Table aria-label="Plan revisions" size="small">
                <TableHeader>
                  <TableRow>
                    <HeadCell>Revision</HeadCell>
                    <HeadCell>Status</HeadCell>
                    <HeadCell>Characteristics</HeadCell>
                    <HeadCell>Sampling</HeadCell>
                    <HeadCell>Created</HeadCell>
                    <HeadCell>Activated</HeadCell>
                    <HeadCell>Superseded</HeadCell>
                    <HeadCell><span aria-hidden /></HeadCell>
                  </TableRow>
                </TableHeader>
                <TableBody>
                  {list.map((x) => (
                    <TableRow key={x.id} aria-label={`Plan revision ${x.revision}`}>
                      <TableCell><Link className={s.link} to={paths.plan(x.id)}>Rev {x.revision}</Link></TableCell>
                      <TableCell><PlanStatusPill status={x.status} /></TableCell>
                      <TableCell>{x.characteristicCount}</TableCell>
                      <TableCell>{samplingSummary(x)}</TableCell>
                      <TableCell>{formatDay(x.createdAt)}</TableCell>
                      <TableCell>{x.activatedAt ? formatDay(x.activatedAt) : '—'}</TableCell>
                      <TableCell>{x.supersededAt ? formatDay(x.supersededAt) : '—'}</TableCell>
                      <TableCell>
                        <div className={s.rowActions}>
                          <Button className={s.rowBtn} size="small" appearance="subtle" onClick={() => navigate(paths.plan(x.id))}>{x.status === 'draft' && canWrite ? 'Edit' : 'Open'}</Button>
                          {canWrite && x.status === 'draft' ? (
                            <Button className={s.rowBtn} size="small" onClick={() => setActivating(x)}>Activate</Button>
                          ) : null}
                          {canWrite && x.status === 'active' ? (
                            <Tooltip content={draft ? `Draft rev ${draft.revision} already exists; a second draft is made anyway` : 'Copy into a new draft revision'} relationship="description">
                              <Button className={s.rowBtn} size="small" disabled={revise.isPending} onClick={() => void doRevise(x.id)}>Revise</Button>
                            </Tooltip>
                          ) : null}
                        </div>
                      </TableCell>
                    </TableRow>
                  ))}
                </TableBody>
              </Table>
            </TableFrame>
          )}
          {!activePlan && list.length > 0 ? <Caption1>No revision is active yet: activate a draft before lots of this part arrive.</Caption1> : null}
        </section>
      </Page>
      <TemplateDialog part={p} open={templateOpen} onClose={() => setTemplateOpen(false)} onCreated={(plan) => navigate(paths.plan(plan.id))} />
      <ActivateDialog plan={activating} currentActiveRevision={activePlan?.revision} onClose={() => setActivating(null)} />
    </>
  );
}
