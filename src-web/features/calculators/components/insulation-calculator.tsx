import { Caption1 } from '@fluentui/react-components';
import { useState } from 'react';
import { useWatch, type UseFormReturn } from 'react-hook-form';
import { insulationFromCurrents, type InsulationResult as LocalInsulation } from '@shared/compute/steel';
import { ComputeError } from '@shared/compute/errors';
import { HANDLING_CAUTIONS } from '@shared/compute/plan-templates';
import { insulationInputSchema } from '@shared/schemas/calc';
import { Form } from '../../../components/form';
import { CautionBox } from '../../lots/components/cautions';
import { useCheckInsulation, type InsulationInput, type InsulationResult } from '../api/calc';
import { CalcCard, LiveResult, NumberListField, ServerCheck, fmt, useCalcStyles, type Compared, type ServerCheckState } from './calc-parts';
import { formSchema } from '../../../components/form-fields';

const amps = (v: number | null) => (v == null ? '—' : `${fmt(v, 4)} A`);
/** Three significant figures or so: 58.1, 316, 3.92 Ω·cm². No current at all reads as ∞. */
const ohmCm2 = (v: number | null) => (v == null || !Number.isFinite(v) ? '∞ Ω·cm² (no current: a perfect insulator)' : `${fmt(v, v >= 100 ? 0 : v >= 10 ? 1 : 2)} Ω·cm²`);

function liveInsulation(values: unknown): { key: string | null; result: LocalInsulation | null; error: string | null } {
  const parsed = insulationInputSchema.safeParse(values);
  if (!parsed.success) return { key: null, result: null, error: null };
  try {
    return { key: JSON.stringify(parsed.data), result: insulationFromCurrents(parsed.data.currentsA), error: null };
  } catch (err) {
    if (err instanceof ComputeError) return { key: null, result: null, error: err.message };
    throw err;
  }
}

function InsulationBody({ form, server }: { form: UseFormReturn<InsulationInput>; server: ServerCheckState<InsulationResult> | null }) {
  const s = useCalcStyles();
  const values = useWatch({ control: form.control });
  const { key, result, error } = liveInsulation(values);
  // JSON has no Infinity: the API sends null for a perfect insulator, so compare it as null.
  const localR = result && Number.isFinite(result.resistanceOhmCm2) ? result.resistanceOhmCm2 : null;
  const compared: Compared[] | null =
    result && server && server.key === key
      ? [
          { label: 'Mean current', local: result.meanCurrentA, server: server.result.meanCurrentA, text: amps },
          { label: 'Rᵢ', local: localR, server: server.result.resistanceOhmCm2, text: ohmCm2 },
        ]
      : null;
  return (
    <div className={s.form}>
      <NumberListField name="currentsA" label="Franklin currents" unit="A" hint="The ammeter reading at each position and face, 0 to 1 A; separate them with spaces, new lines or semicolons." />
      <LiveResult
        label="Insulation result"
        error={error}
        empty="Enter one or more Franklin test currents."
        rows={
          result
            ? [
                { label: 'Surface insulation resistance Rᵢ', value: ohmCm2(result.resistanceOhmCm2), big: true },
                { label: 'Mean current I', value: amps(result.meanCurrentA) },
                { label: 'Readings', value: String((values.currentsA ?? []).length) },
              ]
            : null
        }
        note={<Caption1 className={s.muted}>0 A means a perfect insulator, 1 A a short. The currents are averaged before converting, as the standard does.</Caption1>}
      />
      <ServerCheck label="Insulation" checked={!!server} currentKey={key} compared={compared} submitting={form.formState.isSubmitting} />
    </div>
  );
}

/** Surface insulation resistance per lamination from Franklin-type test currents. */
export function InsulationCalculator() {
  const check = useCheckInsulation();
  const [server, setServer] = useState<ServerCheckState<InsulationResult> | null>(null);
  return (
    <CalcCard
      title="Surface insulation resistance"
      formula={<>Rᵢ = 6.45 (1/I − 1) Ω·cm², I = mean Franklin current in A</>}
      source="ASTM A717 / IEC 60404-11 (Franklin-type test: 10 contacts, 6.45 cm² in all)"
      aside={<CautionBox cautions={[{ text: HANDLING_CAUTIONS.energized, codes: ['Franklin test'] }]} />}
    >
      <Form<InsulationInput>
        schema={formSchema<InsulationInput>(insulationInputSchema)}
        defaultValues={{ currentsA: [] }}
        aria-label="Surface insulation resistance"
        onSubmit={async (v) => setServer({ key: JSON.stringify(v), result: await check.mutateAsync(v) })}
      >
        {(form) => <InsulationBody form={form} server={server} />}
      </Form>
    </CalcCard>
  );
}
