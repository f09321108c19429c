import {
  Body1, Button, Caption1, MessageBar, MessageBarActions, MessageBarBody, MessageBarTitle, Subtitle2, Tab, TabList, Toast, ToastTitle, Toaster, useId, makeStyles, tokens, useToastController,
  Dialog, DialogSurface, DialogBody, DialogTitle, DialogContent, DialogActions,
} from '@fluentui/react-components';
import { useEffect, useMemo, useRef, useState } from 'react';
import { Link, useBlocker, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import type { Plan } from '@shared/schemas/master-data';
import { Page } from '../../components/page';
import { Loading } from '../../components/data-table';
import { paths } from '../../config/paths';
import { ApiError } from '../../lib/api-client';
import { usePlan, usePlans, useRevisePlan, useUpdatePlan } from '../../features/plans/api/plans';
import { PlanStatusPill, FIELD_LABELS } from '../../features/plans/components/plan-labels';
import { CharacteristicsTable, cellId, COLUMNS, DETAIL_FIELDS } from '../../features/plans/components/characteristics-table';
import { DetailsDialog } from '../../features/plans/components/details-dialog';
import { SamplingFields } from '../../features/plans/components/sampling-fields';
import { PlanChanges } from '../../features/plans/components/plan-changes';
import { ActivateDialog } from '../../features/plans/components/activate-dialog';
import { draftFrom, toUpdateInput, validateDraft, type PlanDraft, type RowDraft } from '../../features/plans/components/plan-draft';
import { useCanManageMasterData } from '../../features/auth/hooks/use-can';
import { formatDay } from '../../lib/format';

const useStyles = makeStyles({
  back: { color: tokens.colorBrandForeground1, textDecoration: 'none', display: 'inline-flex', minHeight: '32px', alignItems: 'center', marginBottom: '4px' },
  meta: { display: 'flex', gap: '16px', alignItems: 'center', flexWrap: 'wrap', marginTop: '-8px', marginBottom: '16px', color: tokens.colorNeutralForeground3 },
  actions: { display: 'flex', gap: '8px', flexWrap: 'wrap' },
  touch: { minHeight: '44px', minWidth: '96px' },
  banner: { marginBottom: '16px' },
  tabs: { marginBottom: '16px', borderBottom: `1px solid ${tokens.colorNeutralStroke2}` },
  tab: { minHeight: '44px' },
  section: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '14px 16px', marginBottom: '18px' },
  sectionTitle: { display: 'block', marginBottom: '10px' },
  charsHead: { display: 'flex', justifyContent: 'space-between', alignItems: 'baseline', gap: '12px', marginBottom: '8px', flexWrap: 'wrap' },
  errors: { margin: '6px 0 0', paddingLeft: '18px' },
  errLink: { border: 'none', background: 'none', padding: '2px 0', font: 'inherit', color: tokens.colorPaletteRedForeground1, textDecoration: 'underline', cursor: 'pointer', textAlign: 'left' },
  dirty: { color: tokens.colorPaletteDarkOrangeForeground1, fontWeight: 600 },
});

const COL_LABEL = Object.fromEntries(COLUMNS.map((c) => [c.field, c.label]));

/** "characteristics.3.lsl" → "Row 4 (BORE-D) · Lower limit". */
function describeKey(key: string, rows: RowDraft[]): string {
  const m = /^characteristics\.(\d+)(?:\.(\w+))?/.exec(key);
  if (m) {
    const i = Number(m[1]);
    const code = rows[i]?.code ? ` (${rows[i].code.toUpperCase()})` : '';
    const f = m[2];
    return `Row ${i + 1}${code}${f ? ` · ${COL_LABEL[f] ?? FIELD_LABELS[f] ?? f}` : ''}`;
  }
  if (key === '_') return 'Plan';
  return FIELD_LABELS[key] ?? key;
}

function PlanEditor({ plan, tab, toasterId }: { plan: Plan; tab: 'characteristics' | 'changes'; toasterId: string }) {
  const s = useStyles();
  const navigate = useNavigate();
  const canWrite = useCanManageMasterData();
  const editable = canWrite && plan.status === 'draft';
  const initial = useMemo(() => draftFrom(plan), [plan]);
  const [draft, setDraft] = useState<PlanDraft>(initial);
  // Server errors stay until their field is edited; the schema's own are re-checked live once a save was tried.
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [attempted, setAttempted] = useState(false);
  const [message, setMessage] = useState<{ text: string; stale?: boolean } | null>(null);
  const [detailsOf, setDetailsOf] = useState<number | null>(null);
  const [activating, setActivating] = useState(false);
  const [sp, setSp] = useSearchParams();
  const against = sp.get('against') ?? undefined;
  const update = useUpdatePlan();
  const revise = useRevisePlan();
  const siblings = usePlans({ partId: plan.partId, pageSize: 200, sort: '-revision' });
  const { dispatchToast } = useToastController(toasterId);

  const baseline = useMemo(() => JSON.stringify(toUpdateInput(initial, 0)), [initial]);
  const dirty = editable && JSON.stringify(toUpdateInput(draft, 0)) !== baseline;
  const blocker = useBlocker(({ currentLocation, nextLocation }) => dirty && !nextLocation.pathname.startsWith(paths.plan(plan.id)) && currentLocation.pathname !== nextLocation.pathname);
  useEffect(() => {
    if (!dirty) return;
    const warn = (e: BeforeUnloadEvent) => e.preventDefault();
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [dirty]);

  const clientErrors = useMemo(() => (attempted ? validateDraft(toUpdateInput(draft, plan.version)) : {}), [attempted, draft, plan.version]);
  const errors = useMemo(() => ({ ...serverErrors, ...clientErrors }), [serverErrors, clientErrors]);

  const clear = (key?: string) =>
    setServerErrors((e) => {
      if (key === undefined) return Object.fromEntries(Object.entries(e).filter(([k]) => !k.startsWith('characteristics')));
      if (!(key in e)) return e;
      const { [key]: _gone, ...rest } = e;
      return rest;
    });
  const setRows = (rows: RowDraft[], touched?: string) => {
    setDraft((d) => ({ ...d, rows }));
    // A structural change (add, move, remove) shifts row numbers: old row errors no longer point right.
    clear(touched);
  };

  const save = async () => {
    if (!dirty || update.isPending) return;
    setMessage(null);
    setServerErrors({});
    setAttempted(true);
    const body = toUpdateInput(draft, plan.version);
    if (Object.keys(validateDraft(body)).length) return;
    try {
      await update.mutateAsync({ id: plan.id, ...body });
      dispatchToast(<Toast><ToastTitle>Draft rev {plan.revision} saved</ToastTitle></Toast>, { intent: 'success' });
    } catch (err) {
      if (err instanceof ApiError) {
        setServerErrors(err.fields ?? {});
        setMessage({ text: err.message, stale: err.code === 'stale' });
      } else setMessage({ text: err instanceof Error ? err.message : 'Something went wrong' });
    }
  };

  // Ctrl+S / ⌘S saves the draft, as in any editor an engineer already uses.
  const saveRef = useRef(save);
  saveRef.current = save;
  useEffect(() => {
    if (!editable) return;
    const onKey = (e: KeyboardEvent) => {
      if ((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === 's') {
        e.preventDefault();
        void saveRef.current();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [editable]);

  const doRevise = async () => {
    setMessage(null);
    try {
      const next = await revise.mutateAsync({ id: plan.id });
      await navigate(paths.plan(next.id));
    } catch (err) {
      setMessage({ text: err instanceof Error ? err.message : 'Something went wrong' });
    }
  };

  const focusError = (key: string) => {
    const m = /^characteristics\.(\d+)\.(\w+)/.exec(key);
    if (m && DETAIL_FIELDS.includes(m[2] as never)) return setDetailsOf(Number(m[1]));
    if (m) document.getElementById(cellId(Number(m[1]), m[2]))?.focus();
  };

  const names = useMemo(() => Object.fromEntries(plan.characteristics.map((c) => [c.code, c.name])), [plan.characteristics]);
  const errorKeys = Object.keys(errors);
  const activeRev = siblings.data?.items.find((p) => p.status === 'active' && p.id !== plan.id)?.revision;

  return (
    <>
      <Link to={paths.part(plan.partId)} className={s.back}>← {plan.partNumber} rev {plan.partRevision}</Link>
      <Page
        title={`Inspection plan rev ${plan.revision}`}
        lead={`Part ${plan.partNumber} rev ${plan.partRevision}`}
        actions={
          <div className={s.actions}>
            {editable ? (
              <>
                <Button className={s.touch} appearance="primary" disabled={update.isPending || !dirty} onClick={() => void save()}>
                  {update.isPending ? 'Saving…' : 'Save'}
                </Button>
                <Button className={s.touch} disabled={dirty || update.isPending} title={dirty ? 'Save the draft first' : undefined} onClick={() => setActivating(true)}>
                  Activate…
                </Button>
              </>
            ) : null}
            {canWrite && plan.status !== 'draft' ? (
              <Button className={s.touch} appearance="primary" disabled={revise.isPending} onClick={() => void doRevise()}>
                {revise.isPending ? 'Revising…' : 'Revise'}
              </Button>
            ) : null}
          </div>
        }
      >
        <div className={s.meta}>
          <PlanStatusPill status={plan.status} />
          <Caption1>{plan.characteristics.length} characteristics</Caption1>
          <Caption1>Created {formatDay(plan.createdAt)}</Caption1>
          {plan.activatedAt ? <Caption1>Activated {formatDay(plan.activatedAt)}</Caption1> : null}
          {plan.supersededAt ? <Caption1>Superseded {formatDay(plan.supersededAt)}</Caption1> : null}
          {dirty ? <Caption1 className={s.dirty} role="status">Unsaved changes</Caption1> : null}
        </div>

        {plan.status !== 'draft' ? (
          <MessageBar className={s.banner} intent={plan.status === 'active' ? 'info' : 'warning'} layout="multiline">
            <MessageBarBody>
              <MessageBarTitle>{plan.status === 'active' ? 'Active plans are never edited — Revise to make a new draft.' : 'Superseded plans are never edited — Revise to make a new draft.'}</MessageBarTitle>
              {canWrite ? ' Revise copies this revision into a new draft you can change and then activate.' : ' Engineers revise plans; you can read every revision.'}
            </MessageBarBody>
          </MessageBar>
        ) : !canWrite ? (
          <MessageBar className={s.banner} intent="info">
            <MessageBarBody>This draft is being prepared by an engineer. You can read it; it applies to lots only once activated.</MessageBarBody>
          </MessageBar>
        ) : null}

        {message || Object.keys(clientErrors).length ? (
          <MessageBar className={s.banner} intent="error" role="alert" layout="multiline">
            <MessageBarBody>
              {message?.text ?? 'Nothing was saved: some fields need attention.'}
              {errorKeys.length ? (
                <ul className={s.errors}>
                  {errorKeys.slice(0, 12).map((k) => (
                    <li key={k}>
                      <button type="button" className={s.errLink} onClick={() => focusError(k)}>{describeKey(k, draft.rows)}</button>: {errors[k]}
                    </li>
                  ))}
                  {errorKeys.length > 12 ? <li>and {errorKeys.length - 12} more</li> : null}
                </ul>
              ) : null}
            </MessageBarBody>
            {message?.stale ? (
              <MessageBarActions>
                <Button onClick={() => window.location.reload()}>Reload</Button>
              </MessageBarActions>
            ) : null}
          </MessageBar>
        ) : null}

        <TabList
          className={s.tabs}
          selectedValue={tab}
          onTabSelect={(_, d) => navigate({ pathname: d.value === 'changes' ? paths.planChanges(plan.id) : paths.plan(plan.id), search: '' })}
        >
          <Tab className={s.tab} value="characteristics">Plan</Tab>
          <Tab className={s.tab} value="changes">Changes</Tab>
        </TabList>

        {tab === 'changes' ? (
          <PlanChanges
            planId={plan.id}
            against={against}
            others={siblings.data?.items ?? []}
            names={names}
            onAgainst={(a) => setSp(a ? { against: a } : {}, { replace: true })}
          />
        ) : (
          <>
            <section className={s.section} aria-label="Sampling rule">
              <Subtitle2 as="h2" className={s.sectionTitle}>Sampling rule</Subtitle2>
              <SamplingFields
                draft={draft}
                readOnly={!editable}
                errors={errors}
                onChange={(p, f) => {
                  setDraft((d) => ({ ...d, ...p }));
                  clear(f);
                }}
              />
            </section>
            <section aria-label="Characteristics">
              <div className={s.charsHead}>
                <Subtitle2 as="h2">Characteristics</Subtitle2>
                {editable ? <Caption1>Enter, ↑ and ↓ move along a column; Ctrl+S saves. Method text and formula details open from each row.</Caption1> : null}
              </div>
              {errors.characteristics ? <Body1 role="alert">{errors.characteristics}</Body1> : null}
              <CharacteristicsTable rows={draft.rows} readOnly={!editable} errors={errors} onRows={setRows} onDetails={setDetailsOf} />
            </section>
          </>
        )}
      </Page>

      <DetailsDialog
        row={detailsOf !== null ? (draft.rows[detailsOf] ?? null) : null}
        index={detailsOf ?? 0}
        readOnly={!editable}
        errors={errors}
        onChange={(patch, field) => {
          if (detailsOf === null) return;
          setDraft((d) => ({ ...d, rows: d.rows.map((r, j) => (j === detailsOf ? { ...r, ...patch } : r)) }));
          clear(`characteristics.${detailsOf}.${field}`);
        }}
        onClose={() => setDetailsOf(null)}
      />
      <ActivateDialog plan={activating ? plan : null} currentActiveRevision={activeRev} onClose={() => setActivating(false)} />
      <Dialog open={blocker.state === 'blocked'} modalType="alert">
        <DialogSurface aria-label="Unsaved changes">
          <DialogBody>
            <DialogTitle>Leave without saving?</DialogTitle>
            <DialogContent>Your changes to draft rev {plan.revision} are not saved yet.</DialogContent>
            <DialogActions>
              <Button className={s.touch} appearance="primary" onClick={() => blocker.reset?.()}>Stay here</Button>
              <Button className={s.touch} onClick={() => blocker.proceed?.()}>Leave without saving</Button>
            </DialogActions>
          </DialogBody>
        </DialogSurface>
      </Dialog>
    </>
  );
}

export function PlanPage() {
  const { id = '', tab } = useParams();
  const plan = usePlan(id);
  const toasterId = useId('plan-toaster');
  if (plan.isPending) return <Loading label="Loading the plan" />;
  if (plan.error) {
    return (
      <Page title="Inspection plan">
        <MessageBar intent="error" role="alert"><MessageBarBody>{plan.error.message}</MessageBarBody></MessageBar>
      </Page>
    );
  }
  // A new version (saved, activated) starts a fresh working copy; the toaster outlives it.
  return (
    <>
      <PlanEditor key={`${plan.data.id}:${plan.data.version}`} plan={plan.data} tab={tab === 'changes' ? 'changes' : 'characteristics'} toasterId={toasterId} />
      <Toaster toasterId={toasterId} position="top-end" />
    </>
  );
}
