import { Body1, makeStyles, Subtitle2, tokens } from '@fluentui/react-components';
import type { ReactNode } from 'react';

const useStyles = makeStyles({
  box: {
    border: `1px dashed ${tokens.colorNeutralStroke1}`,
    borderRadius: tokens.borderRadiusLarge,
    padding: '40px 24px',
    textAlign: 'center',
    color: tokens.colorNeutralForeground2,
    display: 'flex',
    flexDirection: 'column',
    gap: '8px',
    alignItems: 'center',
  },
});

export function EmptyState({ title, children, action }: { title: string; children?: ReactNode; action?: ReactNode }) {
  const s = useStyles();
  return (
    <div className={s.box} role="status">
      <Subtitle2 as="h2">{title}</Subtitle2>
      {children ? <Body1>{children}</Body1> : null}
      {action}
    </div>
  );
}
