import { Body1, Button, Dialog, DialogActions, DialogBody, DialogContent, DialogSurface, DialogTitle, makeStyles } from '@fluentui/react-components';
import { ackSignalSchema, type AckSignalInput, type DriftSignal } from '@shared/schemas/drift';
import { Form } from '../../../components/form';
import { TextAreaField, formSchema } from '../../../components/form-fields';
import { useAckSignal } from '../api/drift';

const useStyles = makeStyles({ fields: { display: 'flex', flexDirection: 'column', gap: '12px' }, touch: { minHeight: '44px' }, rule: { fontFamily: 'monospace', fontWeight: 700 } });

/** Acknowledging says the signal was looked at and what was found or done; it goes on record. */
export function AckDialog({ signal, onClose }: { signal: DriftSignal | null; onClose: () => void }) {
  const s = useStyles();
  const ack = useAckSignal();
  return (
    <Dialog open={!!signal} onOpenChange={(_, d) => !d.open && onClose()}>
      <DialogSurface aria-label="Acknowledge signal">
        {signal ? (
          <Form<AckSignalInput>
            key={signal.id}
            schema={formSchema<AckSignalInput>(ackSignalSchema)}
            onSubmit={async (v) => {
              await ack.mutateAsync({ id: signal.id, ...v });
              onClose();
            }}
          >
            {(form) => (
              <DialogBody>
                <DialogTitle>Acknowledge signal on lot {signal.lotRef}</DialogTitle>
                <DialogContent className={s.fields}>
                  <Body1>
                    <span className={s.rule}>{signal.rule}</span> {signal.description}. {signal.message}.
                  </Body1>
                  <TextAreaField name="note" label="What was found or done" required rows={3} />
                </DialogContent>
                <DialogActions>
                  <Button className={s.touch} onClick={onClose}>Cancel</Button>
                  <Button className={s.touch} appearance="primary" type="submit" disabled={form.formState.isSubmitting}>Acknowledge</Button>
                </DialogActions>
              </DialogBody>
            )}
          </Form>
        ) : null}
      </DialogSurface>
    </Dialog>
  );
}
