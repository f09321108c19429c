import { Caption1 } from '@fluentui/react-components';
import { useState } from 'react';
import { useWatch, type UseFormReturn } from 'react-hook-form';
import { stackingFactorByCount, stackingFactorByMass, typicalMinimumStackingFactor } from '@shared/compute/steel';
import { ComputeError } from '@shared/compute/errors';
import { stackingFactorByCountInputSchema, stackingFactorInputSchema } from '@shared/schemas/calc';
import { Form } from '../../../components/form';
import { NumberField, formSchema } from '../../../components/form-fields';
import { useCheckStackingFactor, useCheckStackingFactorByCount, type StackingFactorByCountInput, type StackingFactorInput, type StackingFactorResult } from '../api/calc';
import { CalcCard, Formula, LiveResult, ServerCheck, fmt, useCalcStyles, type Compared, type ServerCheckState } from './calc-parts';

const sfText = (v: number | null) => (v == null ? '—' : `${fmt(v, 3)} (${fmt(v * 100, 1)} %)`);

function compute<T>(fn: () => T): { value: T | null; error: string | null } {
  try {
    return { value: fn(), error: null };
  } catch (err) {
    if (err instanceof ComputeError) return { value: null, error: err.message };
    throw err;
  }
}

function ByMassBody({ form, server }: { form: UseFormReturn<StackingFactorInput>; server: ServerCheckState<StackingFactorResult> | null }) {
  const s = useCalcStyles();
  const values = useWatch({ control: form.control });
  const parsed = stackingFactorInputSchema.safeParse(values);
  const key = parsed.success ? JSON.stringify(parsed.data) : null;
  const { value: sf, error } = parsed.success ? compute(() => stackingFactorByMass(parsed.data)) : { value: null, error: null };
  const mass = typeof values.massG === 'number' ? values.massG : null;
  const compared: Compared[] | null = sf != null && server && server.key === key ? [{ label: 'Stacking factor', local: sf, server: server.result.stackingFactor, text: sfText }] : null;
  return (
    <div className={s.form}>
      <div className={s.fields}>
        <NumberField name="massG" label="Core mass" unit="g" required className={s.touch} hint={mass != null && mass > 0 ? `= ${fmt(mass / 1000, 3)} kg. Steel only, weighed before winding.` : 'Steel only, weighed before winding (5.90 kg = 5900 g).'} />
        <NumberField name="densityGcm3" label="Steel density" unit="g/cm³" required className={s.touch} hint="From the certificate; 7.60–7.85 by grade (IEC 60404-8-4, memory)." />
        <NumberField name="areaCm2" label="Lamination net area" unit="cm²" required className={s.touch} hint="One lamination: outline minus slots and holes." />
        <NumberField name="stackLengthMm" label="Stack length" unit="mm" required className={s.touch} />
      </div>
      <LiveResult
        label="Stacking factor by mass result"
        error={error}
        empty="Enter the mass, density, area and stack length."
        rows={
          sf != null && parsed.success
            ? [
                { label: 'Stacking factor S', value: sfText(sf), big: true },
                { label: 'Steel volume m / ρ', value: `${fmt(parsed.data.massG / parsed.data.densityGcm3, 1)} cm³` },
                { label: 'Stack volume A · L', value: `${fmt(parsed.data.areaCm2 * (parsed.data.stackLengthMm / 10), 1)} cm³` },
              ]
            : null
        }
        note={sf != null && sf > 1 ? <Caption1 className={s.warn}>Above 1 is impossible for a real stack: the density, area or length entered is wrong.</Caption1> : null}
      />
      <ServerCheck label="Stacking factor" checked={!!server} currentKey={key} compared={compared} submitting={form.formState.isSubmitting} />
    </div>
  );
}

function ByCountBody({ form, server }: { form: UseFormReturn<StackingFactorByCountInput>; server: ServerCheckState<StackingFactorResult> | null }) {
  const s = useCalcStyles();
  const values = useWatch({ control: form.control });
  const parsed = stackingFactorByCountInputSchema.safeParse(values);
  const key = parsed.success ? JSON.stringify(parsed.data) : null;
  const { value: sf, error } = parsed.success ? compute(() => stackingFactorByCount(parsed.data)) : { value: null, error: null };
  const compared: Compared[] | null = sf != null && server && server.key === key ? [{ label: 'Stacking factor', local: sf, server: server.result.stackingFactor, text: sfText }] : null;
  const typical = parsed.success ? compute(() => typicalMinimumStackingFactor(parsed.data.thicknessMm)).value : null;
  return (
    <div className={s.form}>
      <div className={s.fields}>
        <NumberField name="laminationCount" label="Laminations" unit="count" required className={s.touch} />
        <NumberField name="thicknessMm" label="Nominal thickness" unit="mm" required className={s.touch} hint="The grade's nominal, e.g. 0.35 or 0.50." />
        <NumberField name="stackLengthMm" label="Stack length" unit="mm" required className={s.touch} />
      </div>
      <LiveResult
        label="Stacking factor by count result"
        error={error}
        empty="Enter the lamination count, the nominal thickness and the stack length."
        rows={sf != null && parsed.success ? [{ label: 'Stacking factor S', value: sfText(sf), big: true }, { label: 'Steel n · t', value: `${fmt(parsed.data.laminationCount * parsed.data.thicknessMm, 2)} mm of ${fmt(parsed.data.stackLengthMm, 2)} mm` }] : null}
        note={
          sf != null ? (
            <Caption1 className={s.muted}>
              {typical ? `Typical minimum for ${parsed.data?.thicknessMm} mm strip: ${typical.minimum}, per ${typical.source}; the plan's limit governs.` : 'No typical minimum on record for this thickness; the plan’s limit comes from the drawing.'}
            </Caption1>
          ) : null
        }
      />
      <ServerCheck label="Stacking factor by count" checked={!!server} currentKey={key} compared={compared} submitting={form.formState.isSubmitting} />
    </div>
  );
}

/** Stacking factor by mass and by lamination count, each with its server check. */
export function StackingFactorCalculator() {
  const s = useCalcStyles();
  const check = useCheckStackingFactor();
  const [server, setServer] = useState<ServerCheckState<StackingFactorResult> | null>(null);
  const checkByCount = useCheckStackingFactorByCount();
  const [serverByCount, setServerByCount] = useState<ServerCheckState<StackingFactorResult> | null>(null);
  return (
    <CalcCard title="Stacking factor" formula={<>S = m / (ρ · A · L), with L in cm</>} source="ASTM A719 / IEC 60404-13 (the pack test's S = m / (ρ·l·w·h), in core form)">
      <h3 className={s.sub}>By mass</h3>
      <Form<StackingFactorInput>
        schema={formSchema<StackingFactorInput>(stackingFactorInputSchema)}
        aria-label="Stacking factor by mass"
        onSubmit={async (v) => setServer({ key: JSON.stringify(v), result: await check.mutateAsync(v) })}
      >
        {(form) => <ByMassBody form={form} server={server} />}
      </Form>
      <h3 className={s.sub}>By lamination count</h3>
      <Formula label="Stacking factor by count: formula" formula={<>S = n · t / L</>} source="common practice; uses the nominal thickness, so a coil running thick or thin shifts it (the mass method does not)" />
      <Form<StackingFactorByCountInput>
        schema={formSchema<StackingFactorByCountInput>(stackingFactorByCountInputSchema)}
        aria-label="Stacking factor by count"
        onSubmit={async (v) => setServerByCount({ key: JSON.stringify(v), result: await checkByCount.mutateAsync(v) })}
      >
        {(form) => <ByCountBody form={form} server={serverByCount} />}
      </Form>
    </CalcCard>
  );
}
