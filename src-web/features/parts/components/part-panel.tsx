import { Caption1, makeStyles, tokens } from '@fluentui/react-components';
import { CONSTRUCTIONS, createPartSchema, type CreatePartInput, type Part } from '@shared/schemas/master-data';
import { Form, TextField } from '../../../components/form';
import { formSchema, NumberField, SelectField } from '../../../components/form-fields';
import { SidePanel } from '../../../components/side-panel';
import { useCreatePart } from '../api/parts';
import { CONSTRUCTION_LABELS } from './construction';

const useStyles = makeStyles({
  // Fluent inputs keep an intrinsic minimum width; in a grid cell they must shrink to fit.
  fields: { display: 'flex', flexDirection: 'column', gap: '14px', '& .fui-Input': { minWidth: 0, width: '100%' } },
  pair: { display: 'grid', gridTemplateColumns: 'repeat(2, minmax(0, 1fr))', gap: '12px', alignItems: 'start' },
  triple: { display: 'grid', gridTemplateColumns: 'repeat(3, minmax(0, 1fr))', gap: '12px', alignItems: 'start' },
  section: { fontWeight: 600, marginTop: '6px', paddingBottom: '4px', borderBottom: `1px solid ${tokens.colorNeutralStroke2}` },
});

const constructionOptions = CONSTRUCTIONS.map((c) => ({ value: c, label: CONSTRUCTION_LABELS[c] }));
const FORM_ID = 'part-form';

/** A new part revision. The grade name is checked by the server (IEC 60404-8-4 shapes); its answer shows on the field. */
export function PartPanel({ open, onClose, onCreated }: { open: boolean; onClose: () => void; onCreated: (p: Part) => void }) {
  const s = useStyles();
  const create = useCreatePart();
  return (
    <SidePanel open={open} title="New part" onClose={onClose} formId={FORM_ID} submitLabel="Add part" submitting={create.isPending}>
      {open ? (
        <Form<CreatePartInput>
          id={FORM_ID}
          schema={formSchema<CreatePartInput>(createPartSchema)}
          defaultValues={{ partNumber: '', revision: '', description: '', construction: 'welded', steelGrade: '', densityGcm3: null, designStackingFactor: null, designToothT: null, designYokeT: null }}
          className={s.fields}
          aria-label="New part"
          onSubmit={async (v) => {
            const p = await create.mutateAsync(v);
            onCreated(p);
          }}
        >
          {() => (
            <>
              <div className={s.pair}>
                <TextField name="partNumber" label="Part number" required autoComplete="off" />
                <TextField name="revision" label="Revision" required hint="Drawing revision, e.g. C" autoComplete="off" />
              </div>
              <TextField name="description" label="Description" required />
              <SelectField name="construction" label="Core construction" options={constructionOptions} required />
              <Caption1 className={s.section}>Steel and laminations</Caption1>
              <div className={s.pair}>
                <TextField name="steelGrade" label="Steel grade" required hint="IEC 60404-8-4 name, e.g. M400-50A" autoComplete="off" />
                <NumberField name="densityGcm3" label="Density" unit="g/cm³" empty={null} hint="Empty: the grade’s usual density" />
              </div>
              <div className={s.pair}>
                <NumberField name="laminationThicknessMm" label="Lamination thickness" unit="mm" required />
                <NumberField name="laminationAreaCm2" label="Lamination net area" unit="cm²" required />
              </div>
              <Caption1 className={s.section}>Nominal core</Caption1>
              <div className={s.triple}>
                <NumberField name="nominalBoreMm" label="Bore" unit="mm" required />
                <NumberField name="nominalOdMm" label="OD" unit="mm" required />
                <NumberField name="nominalStackLengthMm" label="Stack length" unit="mm" required />
              </div>
              <div className={s.pair}>
                <NumberField name="slotCount" label="Slots" required />
                <NumberField name="nominalMassKg" label="Core mass" unit="kg" required />
              </div>
              <Caption1 className={s.section}>Design values (optional)</Caption1>
              <div className={s.triple}>
                <NumberField name="designStackingFactor" label="Stacking factor" empty={null} />
                <NumberField name="designToothT" label="Tooth flux" unit="T" empty={null} />
                <NumberField name="designYokeT" label="Yoke flux" unit="T" empty={null} />
              </div>
            </>
          )}
        </Form>
      ) : null}
    </SidePanel>
  );
}
