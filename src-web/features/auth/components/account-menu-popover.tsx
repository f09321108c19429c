import { Menu, MenuDivider, MenuItem, MenuList, MenuPopover } from '@fluentui/react-components';
import { useState, type RefObject } from 'react';
import { useNavigate } from 'react-router-dom';
import type { SessionUser } from '@shared/schemas/auth';
import { useLogout } from '../api/logout';
import { PasswordDialog } from './password-dialog';
import { useThemeMode } from '../../../theme/theme-mode';
import { paths } from '../../../config/paths';

/** The account menu, anchored to the account button in the top bar (which loads this on demand). */
export function AccountMenuPopover({
  user,
  open,
  target,
  onOpenChange,
}: {
  user: SessionUser;
  open: boolean;
  target: RefObject<HTMLButtonElement | null>;
  onOpenChange: (open: boolean) => void;
}) {
  const logout = useLogout();
  const navigate = useNavigate();
  const { mode, setMode } = useThemeMode();
  const [pw, setPw] = useState(false);
  return (
    <>
      <Menu
        open={open}
        onOpenChange={(e, d) => {
          // A click on the account button itself is the button's toggle, not an outside click.
          if (!d.open && e.target instanceof Node && target.current?.contains(e.target)) return;
          onOpenChange(d.open);
        }}
        positioning={{ target: target.current, position: 'below', align: 'end' }}
      >
        <MenuPopover>
          <MenuList>
            <MenuItem disabled>{user.email}</MenuItem>
            <MenuDivider />
            <MenuItem onClick={() => setMode(mode === 'dark' ? 'light' : 'dark')}>
              {mode === 'dark' ? 'Use light theme' : 'Use dark theme'}
            </MenuItem>
            <MenuItem onClick={() => setPw(true)}>Change password</MenuItem>
            <MenuDivider />
            <MenuItem onClick={() => logout.mutate(undefined, { onSettled: () => navigate(paths.signIn, { replace: true }) })}>
              Sign out
            </MenuItem>
          </MenuList>
        </MenuPopover>
      </Menu>
      <PasswordDialog open={pw} onClose={() => setPw(false)} />
    </>
  );
}
