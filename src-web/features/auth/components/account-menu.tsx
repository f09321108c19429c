import { Avatar, Button, Menu, MenuDivider, MenuItem, MenuList, MenuPopover, MenuTrigger, makeStyles, tokens } from '@fluentui/react-components';
import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { ROLE_LABELS, type SessionUser } from '@shared/schemas/auth';
import { useLogout } from '../api/logout';
import { PasswordDialog } from './password-dialog';
import { useThemeMode } from '../../../theme/theme-mode';
import { paths } from '../../../config/paths';

const useStyles = makeStyles({
  trigger: { color: 'inherit', minHeight: '44px', gap: '10px' },
  who: { display: 'flex', flexDirection: 'column', alignItems: 'flex-start', lineHeight: '1.2' },
  role: { fontSize: tokens.fontSizeBase200, opacity: 0.8 },
});

export function AccountMenu({ user }: { user: SessionUser }) {
  const s = useStyles();
  const logout = useLogout();
  const navigate = useNavigate();
  const { mode, setMode } = useThemeMode();
  const [pw, setPw] = useState(false);
  return (
    <>
      <Menu>
        <MenuTrigger disableButtonEnhancement>
          <Button appearance="transparent" className={s.trigger} aria-label={`Account: ${user.name}`}>
            <Avatar name={user.name} size={32} color="brand" />
            <span className={s.who}>
              <span>{user.name}</span>
              <span className={s.role}>{ROLE_LABELS[user.role]}</span>
            </span>
          </Button>
        </MenuTrigger>
        <MenuPopover>
          <MenuList>
            <MenuItem disabled>{user.email}</MenuItem>
            <MenuDivider />
            <MenuItem onClick={() => setMode(mode === 'dark' ? 'light' : 'dark')}>
              {mode === 'dark' ? 'Use light theme' : 'Use dark theme'}
            </MenuItem>
            <MenuItem onClick={() => setPw(true)}>Change password</MenuItem>
            <MenuDivider />
            <MenuItem
              onClick={() =>
                logout.mutate(undefined, { onSettled: () => navigate(paths.signIn, { replace: true }) })
              }
            >
              Sign out
            </MenuItem>
          </MenuList>
        </MenuPopover>
      </Menu>
      <PasswordDialog open={pw} onClose={() => setPw(false)} />
    </>
  );
}
