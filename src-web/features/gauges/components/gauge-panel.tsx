import { makeStyles, tokens, Body1 } from '@fluentui/react-components';
import {
  createGaugeSchema, GAUGE_KIND_LABELS, GAUGE_KINDS, GAUGE_STATUSES, UNITS, updateGaugeSchema,
  type CreateGaugeInput, type Gauge, type UpdateGaugeInput,
} from '@shared/schemas/master-data';
import { Form, TextField } from '../../../components/form';
import { formSchema, NumberField, SelectField } from '../../../components/form-fields';
import { SidePanel } from '../../../components/side-panel';
import { useCreateGauge, useUpdateGauge } from '../api/gauges';

const useStyles = makeStyles({
  fields: { display: 'flex', flexDirection: 'column', gap: '14px', '& .fui-Input': { minWidth: 0, width: '100%' } },
  pair: { display: 'grid', gridTemplateColumns: 'repeat(2, minmax(0, 1fr))', gap: '12px', alignItems: 'start' },
  tag: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 600 },
});

export const kindOptions = GAUGE_KINDS.map((k) => ({ value: k, label: GAUGE_KIND_LABELS[k] }));
const unitOptions = UNITS.map((u) => ({ value: u, label: u }));
export const GAUGE_STATUS_LABELS: Record<(typeof GAUGE_STATUSES)[number], string> = { 'in-service': 'In service', 'out-of-service': 'Out of service' };
const statusOptions = GAUGE_STATUSES.map((v) => ({ value: v, label: GAUGE_STATUS_LABELS[v] }));
const FORM_ID = 'gauge-form';

function CommonFields() {
  const s = useStyles();
  return (
    <>
      <SelectField name="kind" label="Kind" options={kindOptions} required />
      <TextField name="description" label="Description" required hint="Make, model, what it measures" />
      <div className={s.pair}>
        <NumberField name="resolution" label="Resolution" required />
        <SelectField name="unit" label="Unit" options={unitOptions} required />
      </div>
      <div className={s.pair}>
        <NumberField name="rangeMin" label="Range from" empty={null} />
        <NumberField name="rangeMax" label="Range to" empty={null} />
      </div>
      <TextField name="calibrationDueOn" label="Calibration due on" type="date" required />
      <SelectField name="status" label="Status" options={statusOptions} required />
    </>
  );
}

export function GaugePanel({ mode, gauge, onClose }: { mode: 'create' | 'edit' | null; gauge?: Gauge; onClose: () => void }) {
  const s = useStyles();
  const create = useCreateGauge();
  const update = useUpdateGauge();
  return (
    <SidePanel
      open={mode !== null}
      title={mode === 'create' ? 'New gauge' : `Gauge ${gauge?.assetTag ?? ''}`}
      onClose={onClose}
      formId={FORM_ID}
      submitLabel={mode === 'create' ? 'Add gauge' : 'Save changes'}
      submitting={create.isPending || update.isPending}
    >
      {mode === 'create' ? (
        <Form<CreateGaugeInput>
          id={FORM_ID}
          schema={formSchema<CreateGaugeInput>(createGaugeSchema)}
          defaultValues={{ assetTag: '', kind: 'micrometer', description: '', unit: 'mm', rangeMin: null, rangeMax: null, calibrationDueOn: '', status: 'in-service' }}
          className={s.fields}
          aria-label="New gauge"
          onSubmit={async (v) => {
            await create.mutateAsync(v);
            onClose();
          }}
        >
          {() => (
            <>
              <TextField name="assetTag" label="Asset tag" required hint="As on the label, e.g. MIC-0142" autoComplete="off" />
              <CommonFields />
            </>
          )}
        </Form>
      ) : mode === 'edit' && gauge ? (
        <Form<UpdateGaugeInput>
          key={`${gauge.id}:${gauge.version}`}
          id={FORM_ID}
          schema={formSchema<UpdateGaugeInput>(updateGaugeSchema)}
          defaultValues={{ kind: gauge.kind, description: gauge.description, resolution: gauge.resolution, unit: gauge.unit, rangeMin: gauge.rangeMin, rangeMax: gauge.rangeMax, calibrationDueOn: gauge.calibrationDueOn, status: gauge.status, version: gauge.version }}
          className={s.fields}
          aria-label={`Edit gauge ${gauge.assetTag}`}
          onSubmit={async (v) => {
            await update.mutateAsync({ id: gauge.id, ...v });
            onClose();
          }}
        >
          {() => (
            <>
              <Body1>Asset tag <span className={s.tag}>{gauge.assetTag}</span></Body1>
              <CommonFields />
            </>
          )}
        </Form>
      ) : null}
    </SidePanel>
  );
}
