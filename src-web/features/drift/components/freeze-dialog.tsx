import { Body1, Button, Dialog, DialogActions, DialogBody, DialogContent, DialogSurface, DialogTitle, makeStyles } from '@fluentui/react-components';
import { freezeLimitsSchema, type ChartResponse, type FreezeLimitsInput } from '@shared/schemas/drift';
import { Form } from '../../../components/form';
import { NumberField, TextAreaField, formSchema } from '../../../components/form-fields';
import { useFreezeLimits } from '../api/drift';

const useStyles = makeStyles({ fields: { display: 'flex', flexDirection: 'column', gap: '12px' }, touch: { minHeight: '44px' } });

/** Subgroups for a dependable baseline (AIAG SPC manual: 20–25 subgroups), or all there are. */
const defaultBaseline = (total: number) => Math.max(2, Math.min(25, total));

/**
 * Freezing runs phase I on the first k subgroups (out-of-control ones are excluded until the
 * limits are stable) and stores the result as the next limit version; the reason goes on record.
 */
export function FreezeDialog({ chart, open, onClose }: { chart: ChartResponse; open: boolean; onClose: () => void }) {
  const s = useStyles();
  const freeze = useFreezeLimits();
  const next = (chart.versions.at(-1)?.version ?? 0) + 1;
  return (
    <Dialog open={open} onOpenChange={(_, d) => !d.open && onClose()}>
      <DialogSurface aria-label="Freeze control limits">
        {open ? (
          <Form<FreezeLimitsInput>
            schema={formSchema<FreezeLimitsInput>(freezeLimitsSchema)}
            defaultValues={{
              supplierId: chart.supplier.id,
              partId: chart.part.id,
              characteristicCode: chart.characteristic.code,
              baseline: { kind: 'first', count: defaultBaseline(chart.totalPoints) },
              serviceLots: chart.characteristic.wearDriven ? (chart.limits?.serviceLots ?? 5) : undefined,
            }}
            onSubmit={async (v) => {
              await freeze.mutateAsync(v);
              onClose();
            }}
          >
            {(form) => (
              <DialogBody>
                <DialogTitle>Freeze limits for {chart.characteristic.code} (version {next})</DialogTitle>
                <DialogContent className={s.fields}>
                  <Body1>
                    The limits are computed from the first subgroups of this chart; subgroups beyond them are left out and the limits recomputed until none is. Lots decided from now on are judged against
                    version {next}. Points already judged keep their limits.
                  </Body1>
                  <NumberField name="baseline.count" label={`Baseline: first subgroups (of ${chart.totalPoints})`} required hint="20 to 25 subgroups give a dependable baseline." />
                  {chart.characteristic.wearDriven ? (
                    <NumberField name="serviceLots" label="Die service notice when fewer lots than this remain" hint="Counted on the conservative forecast." empty={undefined} />
                  ) : null}
                  <TextAreaField name="reason" label="Reason (goes on record)" required rows={3} />
                </DialogContent>
                <DialogActions>
                  <Button className={s.touch} onClick={onClose}>Cancel</Button>
                  <Button className={s.touch} appearance="primary" type="submit" disabled={form.formState.isSubmitting}>
                    {form.formState.isSubmitting ? 'Freezing…' : 'Freeze limits'}
                  </Button>
                </DialogActions>
              </DialogBody>
            )}
          </Form>
        ) : null}
      </DialogSurface>
    </Dialog>
  );
}
