import { Button, Dialog, DialogActions, DialogBody, DialogContent, DialogSurface, DialogTitle, makeStyles } from '@fluentui/react-components';
import { useState } from 'react';
import { changePasswordSchema, PASSWORD_MIN, type ChangePasswordInput } from '@shared/schemas/auth';
import { Form, TextField } from '../../../components/form';
import { useChangePassword } from '../api/change-password';

const useStyles = makeStyles({ fields: { display: 'flex', flexDirection: 'column', gap: '12px' } });

export function PasswordDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  const s = useStyles();
  const change = useChangePassword();
  const [done, setDone] = useState(false);
  return (
    <Dialog open={open} onOpenChange={(_, d) => !d.open && (setDone(false), onClose())}>
      <DialogSurface aria-label="Change password">
        <Form<ChangePasswordInput>
          schema={changePasswordSchema}
          defaultValues={{ currentPassword: '', newPassword: '' }}
          onSubmit={async (v, form) => {
            await change.mutateAsync(v);
            form.reset();
            setDone(true);
          }}
        >
          {(form) => (
            <DialogBody>
              <DialogTitle>Change your password</DialogTitle>
              <DialogContent className={s.fields}>
                {done ? <p role="status">Your password was changed.</p> : null}
                <TextField name="currentPassword" label="Current password" type="password" autoComplete="current-password" required />
                <TextField name="newPassword" label="New password" type="password" autoComplete="new-password" hint={`At least ${PASSWORD_MIN} characters`} required />
              </DialogContent>
              <DialogActions>
                <Button appearance="secondary" onClick={onClose}>Close</Button>
                <Button appearance="primary" type="submit" disabled={form.formState.isSubmitting}>Change password</Button>
              </DialogActions>
            </DialogBody>
          )}
        </Form>
      </DialogSurface>
    </Dialog>
  );
}
