import { Caption1, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { memo, useRef, type KeyboardEvent } from 'react';
import { withinLimits, type Evaluation } from '@shared/compute/evaluate';
import type { Characteristic } from '@shared/schemas/master-data';
import { statusColours } from '../../../theme/theme';
import { useThemeMode } from '../../../theme/theme-mode';
import { cellCount, cellLabels, draftState, formatValue, hasResultCell, judgedPerReading, verdictOf, type CellDraft, type Verdict } from './sheet-model';

/** Moves focus through the sheet: Enter and Tab go along the row, then to the next core. */
export interface SheetNav {
  ref: (id: string) => (el: HTMLElement | null) => void;
  /** Focus the stop `delta` away; false when there is none (leave Tab to the browser). */
  step: (id: string, delta: 1 | -1) => boolean;
  /** Same cell on the core above or below. */
  vertical: (id: string, dir: 1 | -1) => void;
  /** Focus a stop once it exists (the note box appears after Fail). */
  focusSoon: (id: string) => void;
  /** Step once the sheet has re-rendered (choosing Pass removes the note box after it). */
  stepSoon: (id: string, delta: 1 | -1) => void;
}

export const stopId = (sampleId: string, code: string, part: number | 'pf' | 'note') => `${sampleId}|${code}|${part}`;

export const useSheetStyles = makeStyles({
  td: {
    padding: '4px',
    borderBottom: `1px solid ${tokens.colorNeutralStroke2}`,
    verticalAlign: 'top',
    backgroundColor: tokens.colorNeutralBackground1,
  },
  groupStart: { borderLeft: `2px solid ${tokens.colorNeutralStroke1}` },
  cell: {
    display: 'flex',
    alignItems: 'center',
    height: '44px',
    minWidth: '94px',
    borderRadius: tokens.borderRadiusMedium,
    border: `1px solid ${tokens.colorNeutralStroke1}`,
    backgroundColor: tokens.colorNeutralBackground1,
    ':focus-within': { outline: `3px solid ${tokens.colorBrandStroke1}`, outlineOffset: '1px' },
  },
  input: {
    width: '60px',
    flexGrow: 1,
    height: '100%',
    border: 'none',
    outline: 'none',
    background: 'transparent',
    color: tokens.colorNeutralForeground1,
    fontFamily: 'inherit',
    fontSize: '17px',
    fontVariantNumeric: 'tabular-nums',
    textAlign: 'right',
    padding: '0 8px',
    // Keep a focused cell clear of the sticky core column when the sheet scrolls sideways.
    scrollMarginLeft: '188px',
    scrollMarginTop: '96px',
  },
  tag: { width: '30px', flexShrink: 0, textAlign: 'center', fontSize: tokens.fontSizeBase200, fontWeight: 700, textTransform: 'lowercase' },
  computed: { justifyContent: 'flex-end', paddingLeft: '8px', backgroundColor: tokens.colorNeutralBackground3, border: `1px dashed ${tokens.colorNeutralStroke1}` },
  computedValue: { fontSize: '16px', fontVariantNumeric: 'tabular-nums', fontWeight: 600 },
  invalid: { border: `2px solid ${tokens.colorPaletteRedBorder2}` },
  refused: { border: `2px dashed ${tokens.colorPaletteRedBorder2}` },
  pf: { display: 'flex', gap: '6px' },
  noteText: { display: 'block', maxWidth: '150px', marginTop: '4px', fontSize: tokens.fontSizeBase200, color: tokens.colorNeutralForeground2, overflowWrap: 'anywhere' },
  pfBtn: {
    minWidth: '66px',
    height: '44px',
    borderRadius: tokens.borderRadiusMedium,
    border: `1px solid ${tokens.colorNeutralStroke1}`,
    backgroundColor: tokens.colorNeutralBackground1,
    color: tokens.colorNeutralForeground1,
    fontFamily: 'inherit',
    fontSize: tokens.fontSizeBase300,
    fontWeight: 600,
    cursor: 'pointer',
    scrollMarginLeft: '188px',
    ':focus-visible': { outline: `3px solid ${tokens.colorBrandStroke1}`, outlineOffset: '1px' },
    ':disabled': { cursor: 'default', opacity: 0.8 },
  },
  note: {
    marginTop: '4px',
    width: '138px',
    height: '44px',
    fontFamily: 'inherit',
    fontSize: tokens.fontSizeBase300,
    padding: '0 8px',
    borderRadius: tokens.borderRadiusMedium,
    border: `2px solid ${tokens.colorNeutralStroke1}`,
    backgroundColor: tokens.colorNeutralBackground1,
    color: tokens.colorNeutralForeground1,
    scrollMarginLeft: '188px',
    ':focus-visible': { outline: `3px solid ${tokens.colorBrandStroke1}`, outlineOffset: '1px' },
  },
  core: {
    position: 'sticky',
    left: 0,
    zIndex: 1,
    backgroundColor: tokens.colorNeutralBackground2,
    borderRight: `2px solid ${tokens.colorNeutralStroke1}`,
    borderBottom: `1px solid ${tokens.colorNeutralStroke2}`,
    padding: '6px 10px',
    textAlign: 'left',
    verticalAlign: 'top',
    minWidth: '170px',
    width: '170px',
  },
  coreName: { fontSize: tokens.fontSizeBase400, fontWeight: 700, marginRight: '8px', lineHeight: '36px' },
  standing: { fontSize: tokens.fontSizeBase200, fontWeight: 600, display: 'block' },
  photoBtn: {
    minHeight: '36px',
    verticalAlign: 'top',
    padding: '0 10px',
    borderRadius: tokens.borderRadiusMedium,
    border: `1px solid ${tokens.colorNeutralStroke1}`,
    backgroundColor: tokens.colorNeutralBackground1,
    color: tokens.colorBrandForeground1,
    fontFamily: 'inherit',
    fontSize: tokens.fontSizeBase200,
    fontWeight: 600,
    cursor: 'pointer',
    ':focus-visible': { outline: `3px solid ${tokens.colorBrandStroke1}` },
  },
  hidden: { display: 'none' },
  errRow: { backgroundColor: tokens.colorPaletteRedBackground1 },
  errCell: { padding: '6px 12px', color: tokens.colorPaletteRedForeground1, fontSize: tokens.fontSizeBase200, borderBottom: `1px solid ${tokens.colorNeutralStroke2}` },
  // Sticky so the words stay in view when the sheet is scrolled sideways.
  errList: { margin: 0, paddingLeft: '18px', position: 'sticky', left: '12px', maxWidth: '900px' },
  muted: { color: tokens.colorNeutralForeground3 },
});

function useVerdictColours() {
  const { mode } = useThemeMode();
  const c = statusColours[mode];
  return (v: Verdict) => (v === 'in' ? { color: c.ok, borderColor: `${c.ok}99` } : v === 'out' ? { color: c.bad, borderColor: c.bad, backgroundColor: `${c.bad}${mode === 'dark' ? '26' : '12'}` } : undefined);
}

/** Which keys move where, shared by every kind of stop. */
function handleMoveKeys(e: KeyboardEvent, id: string, nav: SheetNav, commit: () => void): boolean {
  if (e.key === 'Enter') {
    e.preventDefault();
    commit();
    nav.step(id, 1);
    return true;
  }
  if (e.key === 'Tab') {
    commit();
    if (nav.step(id, e.shiftKey ? -1 : 1)) e.preventDefault();
    return true;
  }
  if (e.key === 'ArrowDown' || e.key === 'ArrowUp') {
    e.preventDefault();
    commit();
    nav.vertical(id, e.key === 'ArrowDown' ? 1 : -1);
    return true;
  }
  return false;
}

const FIELD_WORDS: Record<string, string> = { gaugeId: 'gauge', values: 'readings', note: 'note', pass: 'result', sampleId: 'core', characteristicCode: 'characteristic', _: '' };

export interface BenchRowProps {
  sample: { id: string; serial: number };
  chars: Characteristic[];
  drafts: Record<string, CellDraft> | undefined;
  ev: Record<string, Evaluation>;
  /** Server refusals for this core: code → field → message. */
  refused: Record<string, Record<string, string>> | undefined;
  /** Characteristics of this core not judged yet, and those out, over the whole plan. */
  left: number;
  out: number;
  editable: boolean;
  nav: SheetNav;
  onText: (sampleId: string, code: string, index: number, text: string) => void;
  onPass: (sampleId: string, code: string, pass: boolean) => void;
  onNote: (sampleId: string, code: string, note: string) => void;
  onCommit: (sampleId: string, code: string) => void;
  /** Photos of this core so far; undefined hides the photo buttons. */
  photoCount?: number;
  photoProgress?: number;
  onAddPhotos?: (files: File[], sampleId: string) => void;
  columns: number;
}

/** One sampled core: its cells for every characteristic shown, and what was refused, in words. */
export const BenchRow = memo(function BenchRow(p: BenchRowProps) {
  const s = useSheetStyles();
  const colours = useVerdictColours();
  const { mode } = useThemeMode();
  const sc = statusColours[mode];
  const camera = useRef<HTMLInputElement>(null);
  const sid = p.sample.id;
  const core = `Core ${p.sample.serial}`;
  const messages: string[] = [];

  const cells = p.chars.flatMap((c) => {
    const d = p.drafts?.[c.code];
    const st = draftState(c, d);
    const e = p.ev[c.code];
    const refused = p.refused?.[c.code];
    const commit = () => p.onCommit(sid, c.code);
    if (refused) for (const [f, m] of Object.entries(refused)) messages.push(`${c.code}${FIELD_WORDS[f] ? ` (${FIELD_WORDS[f]})` : ''}: ${m}`);

    if (c.kind === 'derived') {
      const v = verdictOf(e?.conforming);
      return [
        <td key={c.code} className={mergeClasses(s.td, s.groupStart)}>
          <div className={mergeClasses(s.cell, s.computed)} style={colours(v)} role="group" aria-label={`${core} ${c.code} computed`}>
            <output className={s.computedValue}>{formatValue(e?.value, c) || '—'}</output>
            <span className={s.tag} data-verdict={v ?? undefined}>{v ?? ''}</span>
          </div>
          {e?.error ? <Caption1 className={s.muted}>{e.error}</Caption1> : null}
        </td>,
      ];
    }

    if (c.kind === 'attribute') {
      const id = stopId(sid, c.code, 'pf');
      const noteId = stopId(sid, c.code, 'note');
      const nav = p.nav;
      const choose = (pass: boolean) => {
        p.onPass(sid, c.code, pass);
        if (pass) nav.stepSoon(id, 1);
        else nav.focusSoon(noteId);
      };
      const key = (which: 'pass' | 'fail') => (ev: KeyboardEvent) => {
        if (!p.editable) {
          handleMoveKeys(ev, id, nav, () => undefined);
          return;
        }
        if (ev.key === 'Enter' || ev.key === ' ') {
          ev.preventDefault();
          choose(which === 'pass');
          return;
        }
        if (ev.key === 'p' || ev.key === 'P') {
          ev.preventDefault();
          choose(true);
          return;
        }
        if (ev.key === 'f' || ev.key === 'F') {
          ev.preventDefault();
          choose(false);
          return;
        }
        if (ev.key === 'ArrowRight' || ev.key === 'ArrowLeft') {
          ev.preventDefault();
          const group = (ev.currentTarget as HTMLElement).parentElement;
          (group?.querySelectorAll('button')[ev.key === 'ArrowRight' ? 1 : 0] as HTMLButtonElement | undefined)?.focus();
          return;
        }
        handleMoveKeys(ev, id, nav, () => undefined);
      };
      const on = (pass: boolean) => d?.pass === pass;
      const style = (pass: boolean) => (on(pass) ? { backgroundColor: pass ? sc.ok : sc.bad, borderColor: pass ? sc.ok : sc.bad, color: '#fff' } : undefined);
      return [
        <td key={c.code} className={mergeClasses(s.td, s.groupStart)}>
          <div className={s.pf} role="group" aria-label={`${core} ${c.code}: pass or fail`}>
            <button type="button" ref={nav.ref(id)} className={s.pfBtn} style={style(true)} aria-pressed={on(true)} disabled={!p.editable} onClick={() => choose(true)} onKeyDown={key('pass')}>
              {on(true) ? '✓ ' : ''}Pass
            </button>
            <button type="button" tabIndex={-1} className={s.pfBtn} style={style(false)} aria-pressed={on(false)} disabled={!p.editable} onClick={() => choose(false)} onKeyDown={key('fail')}>
              {on(false) ? '✕ ' : ''}Fail
            </button>
          </div>
          {d?.pass === false && !p.editable ? (
            <span className={s.noteText}>{d.note}</span>
          ) : d?.pass === false ? (
            <input
              ref={nav.ref(noteId)}
              className={mergeClasses(s.note, st.needsNote || refused?.note ? s.invalid : undefined)}
              aria-label={`${core} ${c.code}: what failed (required)`}
              placeholder="What failed? (required)"
              value={d.note}
              readOnly={!p.editable}
              aria-invalid={st.needsNote || undefined}
              onChange={(ev) => p.onNote(sid, c.code, ev.target.value)}
              onBlur={commit}
              onKeyDown={(ev) => handleMoveKeys(ev, noteId, nav, commit)}
            />
          ) : null}
        </td>,
      ];
    }

    const n = cellCount(c);
    const labels = cellLabels(c);
    const perReading = judgedPerReading(c);
    const out = cells_of(n).map((i) => {
      const id = stopId(sid, c.code, i);
      const parsed = st.parsed[i];
      const v: Verdict = perReading && typeof parsed === 'number' ? (withinLimits(parsed, c.lsl, c.usl) ? 'in' : 'out') : null;
      const bad = parsed === 'invalid';
      if (bad) messages.push(`${c.code} ${labels[i]}: “${d?.texts[i] ?? ''}” is not a number`);
      return (
        <td key={`${c.code}-${i}`} className={mergeClasses(s.td, i === 0 ? s.groupStart : undefined)}>
          <div className={mergeClasses(s.cell, bad ? s.invalid : refused ? s.refused : undefined)} style={bad || refused ? undefined : colours(v)}>
            <input
              ref={p.nav.ref(id)}
              className={s.input}
              inputMode="decimal"
              autoComplete="off"
              enterKeyHint="next"
              aria-label={`${core} ${c.code} ${labels[i]}${c.unit ? ` (${c.unit})` : ''}`}
              aria-invalid={bad || !!refused || undefined}
              value={d?.texts[i] ?? ''}
              readOnly={!p.editable}
              onChange={(ev) => p.onText(sid, c.code, i, ev.target.value)}
              onBlur={commit}
              onFocus={(ev) => ev.target.select()}
              onKeyDown={(ev) => handleMoveKeys(ev, id, p.nav, commit)}
            />
            {/* Radii and heights are judged by their fit, in the result cell, not one by one. */}
            {perReading || bad ? <span className={s.tag} data-verdict={v ?? undefined}>{bad ? '?' : (v ?? '')}</span> : null}
          </div>
        </td>
      );
    });
    if (hasResultCell(c)) {
      const v = verdictOf(e?.conforming);
      out.push(
        <td key={`${c.code}-result`} className={s.td}>
          <div className={mergeClasses(s.cell, s.computed)} style={colours(v)} role="group" aria-label={`${core} ${c.code} result`}>
            <output className={s.computedValue}>{formatValue(e?.value, c) || '—'}</output>
            <span className={s.tag} data-verdict={v ?? undefined}>{v ?? ''}</span>
          </div>
        </td>,
      );
    }
    return out;
  });

  const { left, out } = p;
  const standing = out ? { text: `✕ ${out} out`, colour: sc.bad } : left ? { text: `${left} to do`, colour: undefined } : { text: '✓ all in', colour: sc.ok };
  const pick = (list: FileList | null) => {
    if (list?.length && p.onAddPhotos) p.onAddPhotos([...list], sid);
  };
  return (
    <>
      <tr aria-label={core}>
        <th scope="row" className={s.core}>
          <span className={s.coreName}>{core}</span>
          {p.onAddPhotos ? (
            <>
              {/* capture opens the camera on a tablet; a desktop browser shows its file chooser instead. */}
              <button type="button" className={mergeClasses(s.photoBtn, 'no-print')} tabIndex={-1} onClick={() => camera.current?.click()} aria-label={`Add photos of ${core.toLowerCase()}`}>
                Photo{p.photoCount ? ` (${p.photoCount})` : ''}
              </button>
              <input ref={camera} className={s.hidden} type="file" accept="image/*" capture="environment" multiple aria-label={`Photos of ${core.toLowerCase()}`} onChange={(e) => { pick(e.target.files); e.target.value = ''; }} />
            </>
          ) : null}
          <span className={s.standing} style={{ color: standing.colour }}>{standing.text}</span>
          {p.photoProgress != null ? <Caption1 className={s.standing}>Uploading {Math.round(p.photoProgress * 100)} %</Caption1> : null}
        </th>
        {cells}
      </tr>
      {messages.length ? (
        <tr className={s.errRow}>
          <td colSpan={p.columns + 1} className={s.errCell} role="alert">
            <ul className={s.errList}>
              {messages.map((m) => <li key={m}>{core}: {m}</li>)}
            </ul>
          </td>
        </tr>
      ) : null}
    </>
  );
});

const cells_of = (n: number) => Array.from({ length: n }, (_, i) => i);
