import { makeStyles, Title2, tokens, Body1 } from '@fluentui/react-components';
import { useEffect, type ReactNode } from 'react';

const useStyles = makeStyles({
  head: { display: 'flex', alignItems: 'flex-end', justifyContent: 'space-between', gap: '16px', marginBottom: '20px', flexWrap: 'wrap' },
  title: { display: 'block', margin: 0 },
  lead: { display: 'block', color: tokens.colorNeutralForeground3, margin: '4px 0 0', maxWidth: '72ch' },
});

/** Page title, one lead line, actions on the right; sets the document title. */
export function Page({ title, lead, actions, children }: { title: string; lead?: string; actions?: ReactNode; children: ReactNode }) {
  const s = useStyles();
  useEffect(() => {
    document.title = `${title} · Yokeline`;
  }, [title]);
  return (
    <>
      <header className={s.head}>
        <div>
          <Title2 as="h1" className={s.title}>{title}</Title2>
          {lead ? <Body1 as="p" className={s.lead}>{lead}</Body1> : null}
        </div>
        {actions}
      </header>
      {children}
    </>
  );
}
