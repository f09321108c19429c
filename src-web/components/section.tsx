import { Subtitle1, makeStyles } from '@fluentui/react-components';
import type { ReactNode } from 'react';

const useStyles = makeStyles({
  section: { marginBottom: '28px' },
  h2: { display: 'block', margin: '0 0 10px' },
});

/** A titled region of a page (its title names the region for assistive technology). */
export function Section({ title, children }: { title: string; children: ReactNode }) {
  const s = useStyles();
  return (
    <section className={s.section} aria-label={title}>
      <Subtitle1 as="h2" className={s.h2}>{title}</Subtitle1>
      {children}
    </section>
  );
}
