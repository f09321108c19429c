import { Button, Field, Input, Select, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { Fragment, useEffect, useState } from 'react';
import { Link } from 'react-router-dom';
import type { AuditEvent } from '@shared/schemas/audit';
import { HeadCell, ListToolbar, Loading, Pager, SortHeader, TableFrame } from '../../../components/data-table';
import { EmptyState } from '../../../components/empty-state';
import { useListParams } from '../../../lib/use-list-params';
import { paths } from '../../../config/paths';
import { exportUrls, useAuditEvents } from '../api/ledger';
import { ExportButton } from './export-button';
import { formatWhen } from '../../../lib/format';

const useStyles = makeStyles({
  filter: { minWidth: '150px', '& select': { height: '44px' } },
  touch: { minHeight: '44px' },
  text: { minHeight: '44px', width: '170px' },
  when: { minHeight: '44px', width: '200px' },
  range: { display: 'flex', flexDirection: 'column', gap: '2px' },
  rangeLabel: { fontSize: tokens.fontSizeBase300, lineHeight: tokens.lineHeightBase300, paddingBottom: '2px' },
  rangeInputs: { display: 'flex', alignItems: 'center', gap: '6px' },
  table: { tableLayout: 'auto' },
  nowrap: { whiteSpace: 'nowrap' },
  entityBtn: { background: 'none', border: 'none', padding: 0, cursor: 'pointer', font: 'inherit', textAlign: 'left', color: tokens.colorBrandForeground1, whiteSpace: 'nowrap' },
  mono: { fontFamily: tokens.fontFamilyMonospace, fontSize: tokens.fontSizeBase200, whiteSpace: 'nowrap' },
  num: { fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap' },
  muted: { color: tokens.colorNeutralForeground3 },
  link: { color: tokens.colorBrandForeground1 },
  pre: { margin: 0, padding: '8px 10px', backgroundColor: tokens.colorNeutralBackground3, borderRadius: tokens.borderRadiusMedium, fontSize: '12px', maxHeight: '320px', overflow: 'auto', whiteSpace: 'pre-wrap', overflowWrap: 'anywhere' },
  bar: { display: 'flex', justifyContent: 'flex-end', marginBottom: '12px' },
  rowBtn: { minHeight: '36px' },
  bad: { color: tokens.colorPaletteRedForeground1, fontSize: tokens.fontSizeBase200 },
});

/** Tables whose changes are recorded; any other name can still be typed as an entity id filter. */
const ENTITIES = ['lot', 'inspection_plan', 'part', 'supplier', 'gauge', 'switching_state', 'ncr', 'disposition', 'corrective_action', 'defect_code', 'app_user'];
const FILTERS = ['tab', 'entity', 'entityId', 'actor', 'action', 'from', 'to'] as const;

/** ISO instant ↔ the value of a datetime-local input (the reader's own clock). */
const toLocalInput = (iso?: string) => {
  if (!iso) return '';
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? '' : new Date(d.getTime() - d.getTimezoneOffset() * 60_000).toISOString().slice(0, 16);
};
const fromLocalInput = (v: string) => (v ? new Date(v).toISOString() : undefined);
const when = (iso: string) => formatWhen(iso, true);

function Details({ e }: { e: AuditEvent }) {
  const s = useStyles();
  return (
    <pre className={s.pre}>
      {e.reason ? `reason: ${e.reason}\n` : ''}
      {e.before != null ? `before: ${JSON.stringify(e.before, null, 2)}\n` : ''}
      {e.after != null ? `after: ${JSON.stringify(e.after, null, 2)}\n` : ''}
      {`previous hash: ${e.prevHash ?? '(first record)'}\nhash:          ${e.hash}`}
    </pre>
  );
}

/** A labelled text filter that asks the server once typing pauses. */
function TextFilter({ label, placeholder, value, onChange }: { label: string; placeholder?: string; value: string; onChange: (v: string | undefined) => void }) {
  const s = useStyles();
  const [text, setText] = useState(value);
  useEffect(() => setText(value), [value]);
  useEffect(() => {
    if (text.trim() === value) return;
    const t = setTimeout(() => onChange(text.trim() || undefined), 300);
    return () => clearTimeout(t);
  }, [text, value, onChange]);
  return (
    <Field label={label}>
      <Input className={s.text} type="search" placeholder={placeholder} value={text} onChange={(_, d) => setText(d.value)} />
    </Field>
  );
}

/** Every audit record, newest first, with the filters of GET /api/audit-events and paging. */
export function AuditBrowser() {
  const s = useStyles();
  const [lp, setLp] = useListParams(FILTERS, { pageSize: 50, sort: '-at' });
  const f = lp.filters;
  const sort = lp.sort === 'at' ? 'at' : '-at';
  const filters = { entity: f.entity, entityId: f.entityId, actor: f.actor, action: f.action, from: f.from, to: f.to };
  const badRange = !!(f.from && f.to && f.from > f.to);
  const list = useAuditEvents({ page: lp.page, pageSize: lp.pageSize, sort, ...filters, ...(badRange ? { to: undefined } : {}) });
  const [open, setOpen] = useState<number | null>(null);
  const items = list.data?.items ?? [];

  return (
    <section aria-label="Audit records">
      <ListToolbar>
        <Field label="Entity">
          <Select className={s.filter} value={f.entity ?? ''} onChange={(_, d) => setLp({ filters: { entity: d.value || undefined } })}>
            <option value="">Any entity</option>
            {ENTITIES.map((x) => <option key={x} value={x}>{x}</option>)}
          </Select>
        </Field>
        <TextFilter label="Entity id" value={f.entityId ?? ''} onChange={(v) => setLp({ filters: { entityId: v } })} />
        <TextFilter label="Actor" placeholder="e-mail contains" value={f.actor ?? ''} onChange={(v) => setLp({ filters: { actor: v } })} />
        <TextFilter label="Action" placeholder="e.g. lot.rejected" value={f.action ?? ''} onChange={(v) => setLp({ filters: { action: v } })} />
        <div role="group" aria-labelledby="audit-between" className={s.range}>
          <span id="audit-between" className={s.rangeLabel}>Between</span>
          <span className={s.rangeInputs}>
            <Input className={s.when} type="datetime-local" aria-label="From" value={toLocalInput(f.from)} onChange={(_, d) => setLp({ filters: { from: fromLocalInput(d.value) } })} />
            <span aria-hidden>and</span>
            <Input className={s.when} type="datetime-local" aria-label="To" aria-invalid={badRange} value={toLocalInput(f.to)} onChange={(_, d) => setLp({ filters: { to: fromLocalInput(d.value) } })} />
          </span>
          {badRange ? <span className={s.bad} role="alert">The end is before the start</span> : null}
        </div>
      </ListToolbar>
      <div className={s.bar}>
        <ExportButton url={exportUrls.auditEvents({ ...filters, sort })} label="Export audit records (CSV)" disabled={badRange} />
      </div>
      {list.error ? (
        <EmptyState title="The audit records could not be listed">{list.error.message}</EmptyState>
      ) : list.isPending ? (
        <Loading />
      ) : (
        <TableFrame footer={<Pager page={lp.page} pageSize={lp.pageSize} total={list.data?.total ?? 0} fetching={list.isFetching} onPage={(page) => setLp({ page })} />}>
          <Table aria-label="Audit records" size="small" className={s.table}>
            <TableHeader>
              <TableRow>
                <HeadCell>Record</HeadCell>
                <SortHeader field="at" sort={sort} onSort={(v) => setLp({ sort: v === 'at' ? 'at' : undefined })}>Time</SortHeader>
                <HeadCell>By</HeadCell>
                <HeadCell>Action</HeadCell>
                <HeadCell>Entity</HeadCell>
                <HeadCell>Reason</HeadCell>
                <HeadCell />
              </TableRow>
            </TableHeader>
            <TableBody>
              {items.length === 0 ? <TableRow><TableCell colSpan={7}>No audit record matches these filters.</TableCell></TableRow> : null}
              {items.map((e) => (
                <Fragment key={e.id}>
                  <TableRow>
                    <TableCell className={s.num}>#{e.id}</TableCell>
                    <TableCell className={s.num}>{when(e.at)}</TableCell>
                    <TableCell className={s.nowrap}>{e.actorEmail ?? <span className={s.muted}>system</span>}</TableCell>
                    <TableCell className={s.mono}>{e.action}</TableCell>
                    <TableCell className={s.mono}>
                      {e.entity === 'lot' ? (
                        <Link className={s.link} to={paths.ledgerLot(e.entityId)}>lot {e.entityId.slice(0, 8)}…</Link>
                      ) : (
                        <button type="button" className={s.entityBtn} title="Show only this entity’s records" onClick={() => setLp({ filters: { entity: e.entity, entityId: e.entityId } })}>
                          {e.entity} {e.entityId.length > 12 ? `${e.entityId.slice(0, 8)}…` : e.entityId}
                        </button>
                      )}
                    </TableCell>
                    <TableCell>{e.reason ?? ''}</TableCell>
                    <TableCell>
                      <Button className={s.rowBtn} size="small" appearance="subtle" aria-expanded={open === e.id} onClick={() => setOpen(open === e.id ? null : e.id)} aria-label={`Details of record ${e.id}`}>
                        {open === e.id ? 'Hide' : 'Details'}
                      </Button>
                    </TableCell>
                  </TableRow>
                  {open === e.id ? (
                    <TableRow>
                      <TableCell colSpan={7}><Details e={e} /></TableCell>
                    </TableRow>
                  ) : null}
                </Fragment>
              ))}
            </TableBody>
          </Table>
        </TableFrame>
      )}
    </section>
  );
}
