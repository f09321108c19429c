import { Button, DrawerBody, DrawerFooter, DrawerHeader, DrawerHeaderTitle, OverlayDrawer, makeStyles, tokens } from '@fluentui/react-components';
import type { ReactNode } from 'react';

const useStyles = makeStyles({
  drawer: { width: '520px', maxWidth: '100vw' },
  body: { display: 'flex', flexDirection: 'column', gap: '14px', paddingBottom: '16px' },
  footer: { display: 'flex', gap: '8px', justifyContent: 'flex-end', borderTop: `1px solid ${tokens.colorNeutralStroke2}`, paddingTop: '12px' },
  touch: { minHeight: '44px', minWidth: '44px' },
});

/**
 * A panel from the right for create and edit forms: the list stays in view behind it.
 * `formId` ties the footer's submit button to a form rendered in the body.
 */
export function SidePanel({ open, title, onClose, children, formId, submitLabel, submitting, readOnly }: {
  open: boolean;
  title: string;
  onClose: () => void;
  children: ReactNode;
  formId?: string;
  submitLabel?: string;
  submitting?: boolean;
  readOnly?: boolean;
}) {
  const s = useStyles();
  return (
    <OverlayDrawer open={open} position="end" className={s.drawer} onOpenChange={(_, d) => !d.open && onClose()} aria-label={title}>
      <DrawerHeader>
        <DrawerHeaderTitle action={<Button className={s.touch} appearance="subtle" aria-label="Close" onClick={onClose}>✕</Button>}>{title}</DrawerHeaderTitle>
      </DrawerHeader>
      <DrawerBody className={s.body}>{children}</DrawerBody>
      <DrawerFooter className={s.footer}>
        <Button className={s.touch} onClick={onClose}>{readOnly ? 'Close' : 'Cancel'}</Button>
        {!readOnly && formId ? (
          <Button className={s.touch} appearance="primary" type="submit" form={formId} disabled={submitting}>
            {submitting ? 'Saving…' : (submitLabel ?? 'Save')}
          </Button>
        ) : null}
      </DrawerFooter>
    </OverlayDrawer>
  );
}
