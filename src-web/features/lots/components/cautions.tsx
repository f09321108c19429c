import { Caption1, makeStyles, tokens } from '@fluentui/react-components';
import { HANDLING_CAUTIONS } from '@shared/compute/plan-templates';
import { copper } from '../../../theme/theme';
import { useThemeMode } from '../../../theme/theme-mode';

const SHORT: Record<keyof typeof HANDLING_CAUTIONS, string> = { sharpEdges: 'Sharp edges', heavyCore: 'Heavy core', energized: 'Energized test' };

/** A caution's short name (for a tag beside a characteristic), from its full text. */
export function cautionName(text: string): string {
  const key = (Object.keys(HANDLING_CAUTIONS) as (keyof typeof HANDLING_CAUTIONS)[]).find((k) => HANDLING_CAUTIONS[k] === text);
  return key ? SHORT[key] : 'Handling';
}

const useStyles = makeStyles({
  tags: { display: 'flex', flexWrap: 'wrap', gap: '4px' },
  tag: {
    display: 'inline-flex',
    alignItems: 'center',
    gap: '4px',
    padding: '1px 8px',
    borderRadius: '4px',
    fontSize: tokens.fontSizeBase200,
    fontWeight: 600,
    lineHeight: '20px',
    border: '1px solid',
    whiteSpace: 'nowrap',
  },
  box: {
    borderLeft: '4px solid',
    borderRadius: tokens.borderRadiusMedium,
    padding: '10px 14px',
    display: 'flex',
    flexDirection: 'column',
    gap: '8px',
  },
  head: { fontWeight: 700, letterSpacing: '0.02em', display: 'flex', gap: '6px', alignItems: 'center' },
  list: { margin: 0, paddingLeft: '18px', display: 'flex', flexDirection: 'column', gap: '6px', fontSize: tokens.fontSizeBase300, lineHeight: tokens.lineHeightBase300 },
  who: { fontWeight: 600 },
  defer: { color: tokens.colorNeutralForeground3 },
});

function useCautionColour() {
  const { mode } = useThemeMode();
  return mode === 'dark' ? copper.dark : copper.light;
}

/** "Caution: Sharp edges" tags beside a characteristic; the full words are in the CautionBox. */
export function CautionTags({ cautions }: { cautions: string[] }) {
  const s = useStyles();
  const colour = useCautionColour();
  if (!cautions.length) return null;
  return (
    <span className={s.tags}>
      {cautions.map((c) => (
        <span key={c} className={s.tag} style={{ color: colour, borderColor: `${colour}88` }} title={c}>
          <span aria-hidden>⚠</span> Caution: {cautionName(c)}
        </span>
      ))}
    </span>
  );
}

/** The cautions in full, each with the characteristics it concerns; they defer to the site's procedures. */
export function CautionBox({ cautions }: { cautions: { text: string; codes: string[] }[] }) {
  const s = useStyles();
  const colour = useCautionColour();
  if (!cautions.length) return null;
  return (
    <aside className={s.box} style={{ borderLeftColor: colour, backgroundColor: `${colour}12` }} aria-label="Handling cautions">
      <span className={s.head} style={{ color: colour }}><span aria-hidden>⚠</span> Caution</span>
      <ul className={s.list}>
        {cautions.map((c) => (
          <li key={c.text}>
            <span className={s.who}>{cautionName(c.text)} ({c.codes.join(', ')}):</span> {c.text}
          </li>
        ))}
      </ul>
      <Caption1 className={s.defer}>These are reminders only. The site&apos;s procedures, local codes and licensed practice govern the work.</Caption1>
    </aside>
  );
}
