import { Button, makeStyles, tokens } from '@fluentui/react-components';
import { lazy, Suspense, useRef, useState } from 'react';
import type { SessionUser } from '@shared/schemas/auth';
import { ROLE_LABELS } from '@shared/schemas/vocabulary';

// The menu (Fluent's menu and its positioning engine) and the password dialog load the first
// time the account button is hovered, focused or pressed: they are not part of the first download.
const loadMenu = () => import('./account-menu-popover');
const AccountMenuPopover = lazy(async () => ({ default: (await loadMenu()).AccountMenuPopover }));

const useStyles = makeStyles({
  trigger: { color: 'inherit', minHeight: '44px', gap: '10px' },
  who: { display: 'flex', flexDirection: 'column', alignItems: 'flex-start', lineHeight: '1.2' },
  role: { fontSize: tokens.fontSizeBase200, opacity: 0.8 },
  initials: {
    display: 'inline-flex',
    alignItems: 'center',
    justifyContent: 'center',
    width: '32px',
    height: '32px',
    borderRadius: '50%',
    backgroundColor: tokens.colorBrandBackground2,
    color: tokens.colorBrandForeground2,
    fontWeight: 600,
    fontSize: tokens.fontSizeBase200,
    flexShrink: 0,
  },
});

/** Up to two initials: first and last word of the name. */
export function initialsOf(name: string): string {
  const words = name.trim().split(/\s+/).filter(Boolean);
  if (words.length === 0) return '?';
  const first = words[0][0] ?? '';
  const last = words.length > 1 ? (words[words.length - 1][0] ?? '') : '';
  return (first + last).toUpperCase();
}

export function AccountMenu({ user }: { user: SessionUser }) {
  const s = useStyles();
  const button = useRef<HTMLButtonElement>(null);
  const [open, setOpen] = useState(false);
  const [wanted, setWanted] = useState(false);
  const prefetch = () => void loadMenu();
  return (
    <>
      <Button
        ref={button}
        appearance="transparent"
        className={s.trigger}
        aria-label={`Account: ${user.name}`}
        aria-haspopup="menu"
        aria-expanded={open}
        onPointerEnter={prefetch}
        onFocus={prefetch}
        onClick={() => {
          setWanted(true);
          setOpen((o) => !o);
        }}
      >
        <span className={s.initials} aria-hidden="true">{initialsOf(user.name)}</span>
        <span className={s.who}>
          <span>{user.name}</span>
          <span className={s.role}>{ROLE_LABELS[user.role]}</span>
        </span>
      </Button>
      {wanted ? (
        <Suspense fallback={null}>
          <AccountMenuPopover
            user={user}
            open={open}
            target={button}
            onOpenChange={(next) => {
              setOpen(next);
              if (!next) button.current?.focus();
            }}
          />
        </Suspense>
      ) : null}
    </>
  );
}
