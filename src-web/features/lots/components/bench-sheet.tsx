import { Button, Caption1, Tab, TabList, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { useQueries } from '@tanstack/react-query';
import { useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { flushSync } from 'react-dom';
import { evaluateSample, type EvalPart, type Evaluation, type RawReading } from '@shared/compute/evaluate';
import { cautionsFor } from '@shared/compute/plan-templates';
import type { Characteristic, Gauge, GaugeKind, Part, Plan } from '@shared/schemas/master-data';
import type { Lot } from '@shared/schemas/receiving';
import { StatusPill } from '../../../components/status-pill';
import { statusColours } from '../../../theme/theme';
import { useThemeMode } from '../../../theme/theme-mode';
import { getGaugesQueryOptions } from '../../gauges/api/gauges';
import { readingKey } from '../api/reading-queue';
import type { ReadingQueue } from '../api/use-reading-queue';
import { BenchRow, stopId, type SheetNav } from './bench-row';
import { CautionBox, CautionTags } from './cautions';
import { GaugePicker, usableGauge } from './gauge-picker';
import { SyncStatus } from './sync-status';
import {
  cellCount,
  cellLabels,
  coreStanding,
  draftSignature,
  draftState,
  draftValues,
  emptyDraft,
  hasResultCell,
  initialDrafts,
  leadingValues,
  limitsText,
  needsGauge,
  readingSignature,
  resultLabel,
  type CellDraft,
} from './sheet-model';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', gap: '12px' },
  bar: { display: 'flex', alignItems: 'center', justifyContent: 'space-between', gap: '12px', flexWrap: 'wrap' },
  tabs: { overflowX: 'auto', maxWidth: '100%' },
  grow: { flexGrow: 1, minWidth: 0 },
  tabCount: { marginLeft: '6px', color: tokens.colorNeutralForeground3, fontVariantNumeric: 'tabular-nums' },
  setup: { display: 'grid', gridTemplateColumns: 'minmax(0, 1fr) minmax(260px, 360px)', gap: '16px', alignItems: 'start', '@media (max-width: 1100px)': { gridTemplateColumns: 'minmax(0, 1fr)' } },
  gaugeBox: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '8px 12px 12px' },
  gaugeHead: { display: 'flex', alignItems: 'center', gap: '12px', justifyContent: 'space-between', minHeight: '44px' },
  gaugeTitle: { fontWeight: 700 },
  gaugeGrid: { listStyle: 'none', margin: '4px 0 0', padding: 0, display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(260px, 1fr))', gap: '10px 16px' },
  gaugeItem: { display: 'flex', flexDirection: 'column', gap: '2px', minWidth: 0 },
  gaugeLabel: { display: 'flex', gap: '6px', alignItems: 'baseline', minWidth: 0, whiteSpace: 'nowrap', overflow: 'hidden', textOverflow: 'ellipsis' },
  focusCard: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '12px 14px', display: 'flex', flexDirection: 'column', gap: '6px' },
  code: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 700 },
  method: { color: tokens.colorNeutralForeground2, margin: 0 },
  touch: { minHeight: '44px' },
  scroller: {
    overflow: 'auto',
    maxHeight: 'calc(100vh - 120px)',
    border: `1px solid ${tokens.colorNeutralStroke2}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    '@media print': { maxHeight: 'none', overflow: 'visible' },
  },
  table: { borderCollapse: 'separate', borderSpacing: 0, minWidth: '100%' },
  thead: { position: 'sticky', top: 0, zIndex: 2 },
  corner: {
    position: 'sticky',
    left: 0,
    zIndex: 3,
    backgroundColor: tokens.colorNeutralBackground3,
    borderRight: `2px solid ${tokens.colorNeutralStroke1}`,
    borderBottom: `2px solid ${tokens.colorNeutralStroke1}`,
    textAlign: 'left',
    padding: '8px 10px',
    verticalAlign: 'bottom',
  },
  groupHead: {
    backgroundColor: tokens.colorNeutralBackground3,
    borderLeft: `2px solid ${tokens.colorNeutralStroke1}`,
    padding: '6px 8px 4px',
    textAlign: 'left',
    verticalAlign: 'top',
    fontWeight: 400,
  },
  // Sticky inside its header cell: a wide group (16 probed points) keeps its name in view when scrolled.
  groupInner: { display: 'flex', flexDirection: 'column', gap: '2px', width: 'fit-content', maxWidth: '300px', position: 'sticky', left: '180px' },
  // One line, so every group head has the same height (the column widens instead).
  groupTop: { display: 'flex', gap: '6px', alignItems: 'center', flexWrap: 'nowrap', whiteSpace: 'nowrap' },
  name: { fontSize: tokens.fontSizeBase200, color: tokens.colorNeutralForeground2, whiteSpace: 'nowrap', overflow: 'hidden', textOverflow: 'ellipsis' },
  limits: { fontSize: tokens.fontSizeBase200, fontWeight: 600, fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap' },
  miniCaution: { fontSize: tokens.fontSizeBase100, fontWeight: 700, whiteSpace: 'nowrap' },
  sub: {
    backgroundColor: tokens.colorNeutralBackground3,
    borderBottom: `2px solid ${tokens.colorNeutralStroke1}`,
    padding: '2px 8px 6px',
    fontSize: tokens.fontSizeBase200,
    fontWeight: 600,
    textAlign: 'right',
    whiteSpace: 'nowrap',
    color: tokens.colorNeutralForeground2,
  },
  subStart: { borderLeft: `2px solid ${tokens.colorNeutralStroke1}` },
  unit: { display: 'block', fontWeight: 400, color: tokens.colorNeutralForeground3 },
  hint: { color: tokens.colorNeutralForeground3 },
});

const evalPartOf = (p: Part): EvalPart => ({
  nominalOdMm: p.nominalOdMm,
  nominalStackLengthMm: p.nominalStackLengthMm,
  laminationAreaCm2: p.laminationAreaCm2,
  densityGcm3: p.densityGcm3,
  laminationThicknessMm: p.laminationThicknessMm,
  designStackingFactor: p.designStackingFactor,
  designToothT: p.designToothT,
  designYokeT: p.designYokeT,
});

const standingOf = (chars: Characteristic[], ev: Record<string, Evaluation>) => {
  const { left, out } = coreStanding(chars, ev);
  return { left, out };
};

const draftsKey = (lotId: string) => `yokeline.drafts.${lotId}`;
const gaugesKey = (lotId: string) => `yokeline.gauges.${lotId}`;
function readJson<T>(key: string, fallback: T): T {
  try {
    const raw = localStorage.getItem(key);
    return raw ? (JSON.parse(raw) as T) : fallback;
  } catch {
    return fallback;
  }
}
function writeJson(key: string, value: unknown, empty: boolean) {
  try {
    if (empty) localStorage.removeItem(key);
    else localStorage.setItem(key, JSON.stringify(value));
  } catch {
    /* storage full or blocked: the sync status already warns when the outbox cannot be kept */
  }
}

export interface BenchPhotos {
  counts: Record<string, number>;
  progress: Record<string, number>;
  onAdd: (files: File[], sampleId: string) => void;
}

/**
 * The bench sheet: one row per sampled core, the plan's reading layout per characteristic,
 * judged as you type with the server's own functions, saved core × characteristic as each is
 * complete through an outbox that survives reloads and lost connections.
 */
export function BenchSheet({ lot, plan, part, editable, queue, photos, importAction }: {
  lot: Lot;
  plan: Plan;
  part: Part;
  editable: boolean;
  queue: ReadingQueue;
  photos?: BenchPhotos;
  /** Where the gauge CSV import plugs in; a disabled placeholder until it exists. */
  importAction?: ReactNode;
}) {
  const s = useStyles();
  const { mode } = useThemeMode();
  const sc = statusColours[mode];
  const chars = useMemo(() => [...plan.characteristics].sort((a, b) => a.seq - b.seq), [plan.characteristics]);
  const byCode = useMemo(() => new Map(chars.map((c) => [c.code, c])), [chars]);
  const evalPart = useMemo(() => evalPartOf(part), [part]);
  const samples = lot.samples;

  // ── What was typed, and what the server already holds ──
  const [drafts, setDrafts] = useState(() => initialDrafts(chars, lot.readings, queue.items, readJson<Record<string, CellDraft>>(draftsKey(lot.id), {})));
  const draftsRef = useRef(drafts);
  draftsRef.current = drafts;
  const [committed] = useState(() => {
    const m = new Map<string, string>();
    for (const r of lot.readings) if (byCode.get(r.characteristicCode)?.kind !== 'derived') m.set(readingKey(r.sampleId, r.characteristicCode), readingSignature(r));
    for (const q of queue.items) m.set(q.key, readingSignature(q));
    return m;
  });

  // Entries typed but not yet sent survive a reload too (the outbox holds the complete ones).
  useEffect(() => {
    if (!editable) return;
    const keep: Record<string, CellDraft> = {};
    for (const [sid, row] of Object.entries(drafts)) {
      for (const [code, d] of Object.entries(row)) {
        const c = byCode.get(code);
        if (!c) continue;
        const key = readingKey(sid, code);
        const sig = draftSignature(c, d);
        if (committed.get(key) === sig) continue;
        if (!committed.has(key) && !draftState(c, d).touched && d.pass == null) continue;
        keep[key] = d;
      }
    }
    writeJson(draftsKey(lot.id), keep, Object.keys(keep).length === 0);
  }, [drafts, editable, byCode, committed, lot.id]);

  // ── Gauges: per characteristic, remembered per lot; the only qualifying one is picked for you ──
  const kinds = useMemo(() => [...new Set(chars.filter((c) => c.gaugeKind && c.kind !== 'derived').map((c) => c.gaugeKind as GaugeKind))], [chars]);
  const gaugeQs = useQueries({ queries: kinds.map((kind) => ({ ...getGaugesQueryOptions({ page: 1, pageSize: 200, kind, sort: 'assetTag' }), enabled: editable })) });
  const gaugesByKind = useMemo(() => {
    const m = new Map<GaugeKind, { list: Gauge[]; loading: boolean }>();
    kinds.forEach((k, i) => m.set(k, { list: gaugeQs[i]?.data?.items ?? [], loading: !!gaugeQs[i]?.isPending }));
    return m;
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [kinds, ...gaugeQs.map((q) => q.data)]);
  const [gaugeBy, setGaugeBy] = useState<Record<string, string | null>>(() => {
    const stored = readJson<Record<string, string | null>>(gaugesKey(lot.id), {});
    const fromReadings: Record<string, string | null> = {};
    const latest = [...lot.readings].filter((r) => r.gaugeId).sort((a, b) => a.enteredAt.localeCompare(b.enteredAt));
    for (const r of latest) fromReadings[r.characteristicCode] = r.gaugeId;
    return { ...fromReadings, ...stored };
  });
  const gaugeRef = useRef(gaugeBy);
  gaugeRef.current = gaugeBy;
  useEffect(() => {
    if (!editable) return;
    const auto: Record<string, string> = {};
    for (const c of chars) {
      if (!c.gaugeKind || c.kind === 'derived' || gaugeBy[c.code]) continue;
      const usable = (gaugesByKind.get(c.gaugeKind)?.list ?? []).filter(usableGauge);
      if (usable.length === 1) auto[c.code] = usable[0].id;
    }
    if (Object.keys(auto).length) setGaugeBy((g) => ({ ...g, ...auto }));
  }, [chars, gaugesByKind, gaugeBy, editable]);
  useEffect(() => writeJson(gaugesKey(lot.id), gaugeBy, false), [gaugeBy, lot.id]);

  // ── Sending ──
  const queueRef = useRef(queue);
  queueRef.current = queue;
  const refusedKeys = useMemo(() => new Set(queue.refused.map((r) => r.key)), [queue.refused]);
  const commit = useCallback(
    (sid: string, code: string, opts: { draft?: CellDraft; force?: boolean } = {}) => {
      if (!editable) return;
      const c = byCode.get(code);
      const d = opts.draft ?? draftsRef.current[sid]?.[code];
      if (!c || !d || c.kind === 'derived') return;
      const st = draftState(c, d);
      if (!st.complete) return;
      const key = readingKey(sid, code);
      const sig = draftSignature(c, d);
      if (!opts.force && committed.get(key) === sig) return;
      const gaugeId = gaugeRef.current[code] ?? null;
      // Held back (and counted in the status line) until its gauge is chosen.
      if (needsGauge(c) && !gaugeId) return;
      committed.set(key, sig);
      const pass = c.kind === 'attribute' ? d.pass : null;
      queueRef.current.enqueue({ sampleId: sid, characteristicCode: code, values: draftValues(st), gaugeId, pass, note: pass === false ? d.note.trim() : null, stamp: Date.now() });
    },
    [editable, byCode, committed],
  );

  const onGauge = (code: string, id: string | null) => {
    setGaugeBy((g) => ({ ...g, [code]: id }));
    gaugeRef.current = { ...gaugeRef.current, [code]: id };
    if (!id) return;
    // Readings waiting for a gauge, or refused for their gauge, go now with this one.
    for (const smp of samples) {
      const key = readingKey(smp.id, code);
      if (!committed.has(key)) commit(smp.id, code);
      else if (refusedKeys.has(key)) commit(smp.id, code, { force: true });
    }
  };

  const setDraft = useCallback((sid: string, code: string, fn: (d: CellDraft) => CellDraft): CellDraft => {
    const next = fn(draftsRef.current[sid]?.[code] ?? emptyDraft());
    const all = { ...draftsRef.current, [sid]: { ...(draftsRef.current[sid] ?? {}), [code]: next } };
    draftsRef.current = all;
    setDrafts(all);
    return next;
  }, []);
  const onText = useCallback(
    (sid: string, code: string, i: number, text: string) => {
      setDraft(sid, code, (d) => {
        const texts = [...d.texts];
        while (texts.length <= i) texts.push('');
        texts[i] = text;
        return { ...d, texts };
      });
    },
    [setDraft],
  );
  const onPass = useCallback(
    (sid: string, code: string, pass: boolean) => {
      const d = setDraft(sid, code, (x) => ({ ...x, pass }));
      commit(sid, code, { draft: d });
    },
    [setDraft, commit],
  );
  const onNote = useCallback((sid: string, code: string, note: string) => void setDraft(sid, code, (d) => ({ ...d, note })), [setDraft]);
  const onCommit = useCallback((sid: string, code: string) => commit(sid, code), [commit]);

  // ── Judging as you type: evaluateSample is the server's own function ──
  const cache = useRef(new Map<string, { row: Record<string, CellDraft> | undefined; ev: Record<string, Evaluation> }>());
  const evs = useMemo(() => {
    const out: Record<string, Record<string, Evaluation>> = {};
    for (const smp of samples) {
      const row = drafts[smp.id];
      const hit = cache.current.get(smp.id);
      if (hit && hit.row === row) {
        out[smp.id] = hit.ev;
        continue;
      }
      const raw: Record<string, RawReading> = {};
      for (const c of chars) {
        const d = row?.[c.code];
        if (!d || c.kind === 'derived') continue;
        raw[c.code] = c.kind === 'attribute' ? { values: [], pass: d.pass } : { values: leadingValues(draftState(c, d)) };
      }
      const ev = evaluateSample(chars, evalPart, raw);
      cache.current.set(smp.id, { row, ev });
      out[smp.id] = ev;
    }
    return out;
  }, [drafts, samples, chars, evalPart]);

  // ── Which characteristics are on screen ──
  const [view, setView] = useState<string>('all');
  // A printed sheet shows every characteristic, whichever one is in focus on screen.
  useEffect(() => {
    const all = () => flushSync(() => setView('all'));
    window.addEventListener('beforeprint', all);
    return () => window.removeEventListener('beforeprint', all);
  }, []);
  const shown = useMemo(() => (view === 'all' ? chars : chars.filter((c) => c.code === view)), [view, chars]);
  const columns = shown.reduce((n, c) => n + (c.kind === 'variable' ? cellCount(c) + (hasResultCell(c) ? 1 : 0) : 1), 0);

  // ── Keyboard: the stops in reading order (row by row), and moving between them ──
  const stops = useMemo(() => {
    const list: string[] = [];
    for (const smp of samples) {
      for (const c of shown) {
        if (c.kind === 'derived') continue;
        if (c.kind === 'attribute') {
          list.push(stopId(smp.id, c.code, 'pf'));
          if (drafts[smp.id]?.[c.code]?.pass === false) list.push(stopId(smp.id, c.code, 'note'));
        } else for (let i = 0; i < cellCount(c); i++) list.push(stopId(smp.id, c.code, i));
      }
    }
    return list;
  }, [samples, shown, drafts]);
  const stopsRef = useRef(stops);
  stopsRef.current = stops;
  const els = useRef(new Map<string, HTMLElement>());
  const refFns = useRef(new Map<string, (el: HTMLElement | null) => void>());
  const nav: SheetNav = useMemo(() => {
    const focus = (id: string) => {
      const el = els.current.get(id);
      if (!el) return false;
      el.focus();
      return true;
    };
    const step = (id: string, delta: 1 | -1) => {
      const i = stopsRef.current.indexOf(id);
      const next = i < 0 ? undefined : stopsRef.current[i + delta];
      return next ? focus(next) : false;
    };
    return {
      ref: (id) => {
        let fn = refFns.current.get(id);
        if (!fn) {
          fn = (el) => (el ? els.current.set(id, el) : els.current.delete(id));
          refFns.current.set(id, fn);
        }
        return fn;
      },
      step,
      vertical: (id, dir) => {
        const [sid, code, part] = id.split('|');
        const i = samples.findIndex((x) => x.id === sid);
        const other = samples[i + dir];
        if (!other) return;
        if (!focus(`${other.id}|${code}|${part}`) && part === 'note') focus(`${other.id}|${code}|pf`);
      },
      focusSoon: (id) => {
        let tries = 0;
        const attempt = () => {
          if (!focus(id) && tries++ < 10) requestAnimationFrame(attempt);
        };
        requestAnimationFrame(attempt);
      },
      stepSoon: (id, delta) => setTimeout(() => step(id, delta), 0),
    };
  }, [samples]);

  // ── Per core: refusals, standing ──
  const refusedBySample = useMemo(() => {
    const m: Record<string, Record<string, Record<string, string>>> = {};
    for (const r of queue.refused) m[r.sampleId] = { ...(m[r.sampleId] ?? {}), [r.characteristicCode]: r.refused ?? {} };
    return m;
  }, [queue.refused]);

  const waitingForGauge = useMemo(() => {
    const codes = new Set<string>();
    let n = 0;
    for (const [sid, row] of Object.entries(drafts)) {
      for (const [code, d] of Object.entries(row)) {
        const c = byCode.get(code);
        if (!c || !needsGauge(c) || gaugeBy[code]) continue;
        if (draftState(c, d).complete && committed.get(readingKey(sid, code)) !== draftSignature(c, d)) {
          n++;
          codes.add(code);
        }
      }
    }
    return { n, codes: [...codes] };
  }, [drafts, byCode, gaugeBy, committed]);

  const progress = (c: Characteristic) => {
    let done = 0;
    let out = 0;
    for (const smp of samples) {
      const e = evs[smp.id]?.[c.code];
      if (e?.conforming != null) done++;
      if (e?.conforming === false) out++;
    }
    return { done, out };
  };

  const cautionsByCode = useMemo(() => new Map(chars.map((c) => [c.code, cautionsFor(c, { coreMassKg: part.nominalMassKg })])), [chars, part.nominalMassKg]);
  const withGauge = shown.filter((c) => c.kind !== 'derived' && c.gaugeKind);
  const required = withGauge.filter(needsGauge);
  const chosen = required.filter((c) => gaugeBy[c.code]).length;
  const [gaugesOpen, setGaugesOpen] = useState(true);
  const focus = view === 'all' ? null : (byCode.get(view) ?? null);
  const picker = (c: Characteristic) => (
    <GaugePicker
      code={c.code}
      kind={c.gaugeKind as GaugeKind}
      optional={!needsGauge(c)}
      gauges={gaugesByKind.get(c.gaugeKind as GaugeKind)?.list ?? []}
      loading={gaugesByKind.get(c.gaugeKind as GaugeKind)?.loading}
      value={gaugeBy[c.code] ?? null}
      onChange={(id) => onGauge(c.code, id)}
    />
  );
  const cautionList = useMemo(() => {
    const m = new Map<string, string[]>();
    for (const c of shown) for (const t of cautionsByCode.get(c.code) ?? []) m.set(t, [...(m.get(t) ?? []), c.code]);
    return [...m].map(([text, codes]) => ({ text, codes }));
  }, [shown, cautionsByCode]);

  return (
    <div className={s.root}>
      <div className={s.bar}>
        <div className={mergeClasses(s.tabs, 'no-print')}>
          <TabList selectedValue={view} onTabSelect={(_, d) => setView(String(d.value))} aria-label="Characteristics shown">
            <Tab value="all">All characteristics</Tab>
            {chars.map((c) => {
              const p = progress(c);
              return (
                <Tab key={c.code} value={c.code} aria-label={`${c.code}: ${p.done} of ${samples.length} done${p.out ? `, ${p.out} out` : ''}`}>
                  <span className={s.code}>{c.code}</span>
                  <span className={s.tabCount}>{p.done}/{samples.length}</span>
                  {p.out ? <span style={{ color: sc.bad, fontWeight: 700, marginLeft: 6 }}>{p.out} out</span> : null}
                </Tab>
              );
            })}
          </TabList>
        </div>
      </div>
      {editable || importAction ? (
        <div className={s.bar}>
          <div className={s.grow}>{editable ? <SyncStatus queue={queue} waitingForGauge={waitingForGauge} /> : null}</div>
          {importAction ? <div className="no-print">{importAction}</div> : null}
        </div>
      ) : null}

      {editable && (withGauge.length || cautionList.length || focus) ? (
        <div className={s.setup}>
          {focus ? (
            <div className={s.focusCard} aria-label={`${focus.code} details`}>
              <span><span className={s.code}>{focus.code}</span> {focus.name} · <strong>{focus.kind === 'attribute' ? 'pass / fail' : limitsText(focus)}</strong></span>
              {focus.method ? <p className={s.method}>{focus.method}</p> : null}
              <CautionTags cautions={cautionsByCode.get(focus.code) ?? []} />
              {focus.gaugeKind && focus.kind !== 'derived' ? picker(focus) : null}
            </div>
          ) : withGauge.length ? (
            <section className={s.gaugeBox} aria-label="Gauges">
              <div className={s.gaugeHead}>
                <span>
                  <span className={s.gaugeTitle}>Gauges</span>{' '}
                  <Caption1 className={s.hint}>{chosen} of {required.length} required chosen{withGauge.length > required.length ? ' · optional for visual checks' : ''}</Caption1>
                </span>
                {withGauge.length > 2 ? <Button className={s.touch} appearance="subtle" aria-expanded={gaugesOpen} onClick={() => setGaugesOpen(!gaugesOpen)}>{gaugesOpen ? 'Hide' : 'Show'}</Button> : null}
              </div>
              {gaugesOpen ? (
                <ul className={s.gaugeGrid}>
                  {withGauge.map((c) => (
                    <li key={c.code} className={s.gaugeItem}>
                      <span className={s.gaugeLabel} title={c.name}><span className={s.code}>{c.code}</span><Caption1>{c.name}</Caption1></span>
                      {picker(c)}
                    </li>
                  ))}
                </ul>
              ) : null}
            </section>
          ) : <div />}
          <CautionBox cautions={cautionList} />
        </div>
      ) : null}

      <div className={s.scroller}>
        <table className={s.table} aria-label="Bench sheet">
          <thead className={s.thead}>
            <tr>
              <th rowSpan={2} scope="col" className={s.corner}>
                Core
                <span className={s.unit}>{samples.length} sampled</span>
              </th>
              {shown.map((c) => {
                const span = c.kind === 'variable' ? cellCount(c) + (hasResultCell(c) ? 1 : 0) : 1;
                const cautions = cautionsByCode.get(c.code) ?? [];
                return (
                  <th key={c.code} colSpan={span} scope="colgroup" className={s.groupHead}>
                    <div className={s.groupInner}>
                      <span className={s.groupTop}>
                        <span className={s.code}>{c.code}</span>
                        {c.severity === 'critical' ? <StatusPill tone="bad">critical</StatusPill> : null}
                        {cautions.length ? <span className={s.miniCaution} style={{ color: mode === 'dark' ? '#d98c55' : '#b4652e' }} title={cautions.join('\n\n')}>⚠ Caution</span> : null}
                      </span>
                      <span className={s.name} title={c.name}>{c.name}</span>
                      <span className={s.limits}>{c.kind === 'attribute' ? 'Pass / fail' : limitsText(c)}{c.kind === 'derived' ? ' · computed' : ''}</span>
                    </div>
                  </th>
                );
              })}
            </tr>
            <tr>
              {shown.flatMap((c) => {
                if (c.kind === 'attribute') return [<th key={c.code} scope="col" className={mergeClasses(s.sub, s.subStart)} style={{ textAlign: 'left' }}>Check</th>];
                if (c.kind === 'derived') return [<th key={c.code} scope="col" className={mergeClasses(s.sub, s.subStart)}>Computed<span className={s.unit}>{c.unit}</span></th>];
                const heads = cellLabels(c).map((l, i) => (
                  <th key={`${c.code}-${i}`} scope="col" className={mergeClasses(s.sub, i === 0 ? s.subStart : undefined)}>
                    {l}
                    <span className={s.unit}>{c.unit}</span>
                  </th>
                ));
                if (hasResultCell(c)) heads.push(<th key={`${c.code}-r`} scope="col" className={s.sub}>{resultLabel(c)}<span className={s.unit}>{c.unit}</span></th>);
                return heads;
              })}
            </tr>
          </thead>
          <tbody>
            {samples.map((smp) => (
              <BenchRow
                key={smp.id}
                sample={smp}
                chars={shown}
                drafts={drafts[smp.id]}
                ev={evs[smp.id]}
                refused={refusedBySample[smp.id]}
                {...standingOf(chars, evs[smp.id])}
                editable={editable}
                nav={nav}
                onText={onText}
                onPass={onPass}
                onNote={onNote}
                onCommit={onCommit}
                photoCount={photos ? (photos.counts[smp.id] ?? 0) : undefined}
                photoProgress={photos?.progress[smp.id]}
                onAddPhotos={photos?.onAdd}
                columns={columns}
              />
            ))}
          </tbody>
        </table>
      </div>
      {editable ? <Caption1 className={mergeClasses(s.hint, 'no-print')}>
        Enter or Tab moves to the next cell, along the core and then to the next core; ↑ ↓ move between cores. On a pass/fail check, Enter or P passes, F fails and asks what failed.
      </Caption1> : null}
    </div>
  );
}
