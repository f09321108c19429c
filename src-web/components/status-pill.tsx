import { makeStyles, tokens } from '@fluentui/react-components';
import type { ReactNode } from 'react';
import { statusColours, verdigris } from '../theme/theme';
import { useThemeMode } from '../theme/theme-mode';

export type Tone = 'ok' | 'pending' | 'bad' | 'info' | 'neutral';

// A glyph as well as a colour, so the state reads without colour vision and in print.
const GLYPH: Record<Tone, string> = { ok: '✓', pending: '◷', bad: '✕', info: '●', neutral: '○' };

const useStyles = makeStyles({
  pill: {
    display: 'inline-flex',
    alignItems: 'center',
    gap: '6px',
    padding: '2px 10px 2px 8px',
    borderRadius: '999px',
    fontSize: tokens.fontSizeBase200,
    fontWeight: 600,
    lineHeight: '20px',
    whiteSpace: 'nowrap',
    border: '1px solid transparent',
  },
  glyph: { fontSize: '11px', lineHeight: '1' },
});

/** A labelled state: text first, colour and glyph as a second signal (never colour alone). */
export function StatusPill({ tone, children, title }: { tone: Tone; children: ReactNode; title?: string }) {
  const s = useStyles();
  const { mode } = useThemeMode();
  const c = statusColours[mode];
  const colour = tone === 'neutral' ? (mode === 'dark' ? '#b9c4c2' : '#56625f') : tone === 'info' ? (mode === 'dark' ? verdigris[130] : verdigris[70]) : c[tone];
  return (
    <span className={s.pill} title={title} style={{ color: colour, borderColor: `${colour}66`, backgroundColor: `${colour}${mode === 'dark' ? '22' : '14'}` }}>
      <span className={s.glyph} aria-hidden>{GLYPH[tone]}</span>
      <span>{children}</span>
    </span>
  );
}
