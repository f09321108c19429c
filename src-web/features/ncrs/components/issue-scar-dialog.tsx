import { Body1, Button, Dialog, DialogActions, DialogBody, DialogContent, DialogSurface, DialogTitle, makeStyles, tokens } from '@fluentui/react-components';
import { z } from 'zod';
import { text } from '@shared/schemas/common';
import type { Ncr } from '@shared/schemas/ncr';
import type { Scar } from '@shared/schemas/corrective-action';
import { Form, TextField } from '../../../components/form';
import { TextAreaField, formSchema } from '../../../components/form-fields';
import { useCreateScar } from '../../corrective-actions/api/scars';

const useStyles = makeStyles({ body: { display: 'flex', flexDirection: 'column', gap: '12px' }, muted: { color: tokens.colorNeutralForeground3 }, touch: { minHeight: '44px' }, surface: { maxWidth: '620px', width: 'calc(100vw - 32px)' } });

const schema = z.object({ title: text(160, 'title'), problem: text(4000, 'the problem statement') });
type Values = z.infer<typeof schema>;

/** Issue a supplier corrective action request from this NCR; the supplier is mailed a link to it. */
export function IssueScarDialog({ ncr, open, onClose, onIssued }: { ncr: Ncr; open: boolean; onClose: () => void; onIssued: (s: Scar) => void }) {
  const s = useStyles();
  const create = useCreateScar();
  return (
    <Dialog open={open} onOpenChange={(_, d) => !d.open && onClose()}>
      <DialogSurface className={s.surface} aria-label="Issue a corrective action request">
        <Form<Values>
          schema={formSchema<Values>(schema)}
          defaultValues={{ title: ncr.title, problem: `Required: ${ncr.requirement}\nFound: ${ncr.found}` }}
          onSubmit={async (v) => onIssued(await create.mutateAsync({ ncrId: ncr.id, title: v.title, problem: v.problem }))}
        >
          {(form) => (
            <DialogBody>
              <DialogTitle>Issue a corrective action to {ncr.supplierName}</DialogTitle>
              <DialogContent className={s.body}>
                <Body1>
                  {ncr.supplierName} answers it in the 8D steps on their Supplier desk. The mail goes to the supplier’s contacts and users, with a link straight to the request.
                  Each step gets its due date from the plant’s response times (containment first), shown on the request.
                </Body1>
                <TextField name="title" label="Title" required />
                <TextAreaField name="problem" label="Problem statement for the supplier" required rows={5} hint="The supplier sees this; no internal notes" />
              </DialogContent>
              <DialogActions>
                <Button className={s.touch} onClick={onClose}>Cancel</Button>
                <Button className={s.touch} appearance="primary" type="submit" disabled={form.formState.isSubmitting}>{form.formState.isSubmitting ? 'Issuing…' : 'Issue and mail'}</Button>
              </DialogActions>
            </DialogBody>
          )}
        </Form>
      </DialogSurface>
    </Dialog>
  );
}
