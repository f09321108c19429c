import { Body1, Button, Dialog, DialogActions, DialogBody, DialogContent, DialogSurface, DialogTitle, makeStyles } from '@fluentui/react-components';
import { updateGaugeSchema, type Gauge, type UpdateGaugeInput } from '@shared/schemas/master-data';
import { Form, TextField } from '../../../components/form';
import { formSchema } from '../../../components/form-fields';
import { useUpdateGauge } from '../api/gauges';

const useStyles = makeStyles({ fields: { display: 'flex', flexDirection: 'column', gap: '12px' }, touch: { minHeight: '44px' } });

/** A year from today: the usual interval for shop-floor hand gauges (common practice). */
function aYearFromToday(): string {
  const d = new Date();
  d.setFullYear(d.getFullYear() + 1);
  return d.toISOString().slice(0, 10);
}

/** Recording a calibration moves the gauge's due date on; the ledger keeps the old one. */
export function CalibrationDialog({ gauge, onClose }: { gauge: Gauge | null; onClose: () => void }) {
  const s = useStyles();
  const update = useUpdateGauge();
  return (
    <Dialog open={!!gauge} onOpenChange={(_, d) => !d.open && onClose()}>
      <DialogSurface aria-label="Record calibration">
        {gauge ? (
          <Form<UpdateGaugeInput>
            key={gauge.id}
            schema={formSchema<UpdateGaugeInput>(updateGaugeSchema)}
            defaultValues={{ calibrationDueOn: aYearFromToday(), version: gauge.version }}
            onSubmit={async (v) => {
              await update.mutateAsync({ id: gauge.id, ...v });
              onClose();
            }}
          >
            {(form) => (
              <DialogBody>
                <DialogTitle>Record calibration of {gauge.assetTag}</DialogTitle>
                <DialogContent className={s.fields}>
                  <Body1>Due until now: {gauge.calibrationDueOn}. Enter the next due date from the calibration certificate.</Body1>
                  <TextField name="calibrationDueOn" label="Next calibration due on" type="date" required />
                </DialogContent>
                <DialogActions>
                  <Button className={s.touch} onClick={onClose}>Cancel</Button>
                  <Button className={s.touch} appearance="primary" type="submit" disabled={form.formState.isSubmitting}>Record calibration</Button>
                </DialogActions>
              </DialogBody>
            )}
          </Form>
        ) : null}
      </DialogSurface>
    </Dialog>
  );
}
