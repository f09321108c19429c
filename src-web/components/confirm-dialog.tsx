import { Button, Dialog, DialogActions, DialogBody, DialogContent, DialogSurface, DialogTitle, MessageBar, MessageBarBody, makeStyles } from '@fluentui/react-components';
import { useState, type ReactNode } from 'react';

const useStyles = makeStyles({ touch: { minHeight: '44px' }, body: { display: 'flex', flexDirection: 'column', gap: '12px' } });

/** Asks before a step that cannot be undone; shows the server's refusal inside the dialog. */
export function ConfirmDialog({
  open, title, children, confirmLabel, onConfirm, onClose,
}: { open: boolean; title: string; children: ReactNode; confirmLabel: string; onConfirm: () => Promise<unknown>; onClose: () => void }) {
  const s = useStyles();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const close = () => {
    setError(null);
    onClose();
  };
  return (
    <Dialog open={open} modalType="alert" onOpenChange={(_, d) => !d.open && close()}>
      <DialogSurface aria-label={title}>
        <DialogBody>
          <DialogTitle>{title}</DialogTitle>
          <DialogContent className={s.body}>
            {error ? (
              <MessageBar intent="error" role="alert">
                <MessageBarBody>{error}</MessageBarBody>
              </MessageBar>
            ) : null}
            {children}
          </DialogContent>
          <DialogActions>
            <Button className={s.touch} onClick={close} disabled={busy}>Cancel</Button>
            <Button
              className={s.touch}
              appearance="primary"
              disabled={busy}
              onClick={async () => {
                setBusy(true);
                setError(null);
                try {
                  await onConfirm();
                  close();
                } catch (err) {
                  setError(err instanceof Error ? err.message : 'Something went wrong');
                } finally {
                  setBusy(false);
                }
              }}
            >
              {busy ? 'Working…' : confirmLabel}
            </Button>
          </DialogActions>
        </DialogBody>
      </DialogSurface>
    </Dialog>
  );
}
