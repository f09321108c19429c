import { useState } from 'react';
import { useWatch, type UseFormReturn } from 'react-hook-form';
import { eccentricity, type EccentricityResult as LocalEccentricity } from '@shared/compute/geometry';
import { ComputeError } from '@shared/compute/errors';
import { eccentricityInputSchema } from '@shared/schemas/calc';
import { Form } from '../../../components/form';
import { formSchema } from '../../../components/form-fields';
import { useCheckEccentricity, type EccentricityInput, type EccentricityResult } from '../api/calc';
import { CalcCard, LiveResult, PointsField, ServerCheck, fmt, useCalcStyles, type Compared, type ServerCheckState } from './calc-parts';

const mm = (v: number | null) => (v == null ? '—' : `${fmt(v, 4)} mm`);

function liveEccentricity(values: unknown): { key: string | null; result: LocalEccentricity | null; error: string | null } {
  const parsed = eccentricityInputSchema.safeParse(values);
  if (!parsed.success) return { key: null, result: null, error: null };
  try {
    return { key: JSON.stringify(parsed.data), result: eccentricity(parsed.data.bore, parsed.data.od), error: null };
  } catch (err) {
    if (err instanceof ComputeError) return { key: null, result: null, error: `${err.field === 'od' ? 'OD' : err.field === 'bore' ? 'Bore' : ''}${err.field ? ': ' : ''}${err.message}` };
    throw err;
  }
}

function EccentricityBody({ form, server }: { form: UseFormReturn<EccentricityInput>; server: ServerCheckState<EccentricityResult> | null }) {
  const s = useCalcStyles();
  const values = useWatch({ control: form.control });
  const { key, result, error } = liveEccentricity(values);
  const compared: Compared[] | null =
    result && server && server.key === key
      ? [
          { label: 'Eccentricity', local: result.eccentricity, server: server.result.eccentricity, text: mm },
          { label: 'Coaxiality', local: result.coaxiality, server: server.result.coaxiality, text: mm },
        ]
      : null;
  return (
    <div className={s.form}>
      <div className={s.twoCols}>
        <PointsField name="bore" label="Bore points" unit="mm" />
        <PointsField name="od" label="OD points" unit="mm" />
      </div>
      <LiveResult
        label="Eccentricity result"
        error={error}
        empty="Enter at least 3 points on the bore and 3 on the OD, probed in one setup (the same x, y frame)."
        rows={
          result
            ? [
                { label: 'Eccentricity e', value: mm(result.eccentricity), big: true },
                { label: 'Coaxiality ⌀ (2e)', value: mm(result.coaxiality), big: true },
                { label: 'Bore centre, ⌀', value: `(${fmt(result.bore.centerX, 4)}, ${fmt(result.bore.centerY, 4)}) mm, ⌀ ${mm(result.bore.diameter)}` },
                { label: 'OD centre, ⌀', value: `(${fmt(result.od.centerX, 4)}, ${fmt(result.od.centerY, 4)}) mm, ⌀ ${mm(result.od.diameter)}` },
              ]
            : null
        }
      />
      <ServerCheck label="Eccentricity" checked={!!server} currentKey={key} compared={compared} submitting={form.formState.isSubmitting} />
    </div>
  );
}

/** Bore-to-OD eccentricity and coaxiality from points probed on both circles in one setup. */
export function EccentricityCalculator() {
  const check = useCheckEccentricity();
  const [server, setServer] = useState<ServerCheckState<EccentricityResult> | null>(null);
  return (
    <CalcCard
      title="Bore-to-OD eccentricity"
      formula={<>e = √((x_bore − x_OD)² + (y_bore − y_OD)²) between the least-squares centres; coaxiality ⌀ = 2e</>}
      source="ISO 1101 (coaxiality zone = 2 × centre offset); centres by the least-squares circle (ISO 4291)"
    >
      <Form<EccentricityInput>
        schema={formSchema<EccentricityInput>(eccentricityInputSchema)}
        defaultValues={{ bore: [], od: [] }}
        aria-label="Bore-to-OD eccentricity"
        onSubmit={async (v) => setServer({ key: JSON.stringify(v), result: await check.mutateAsync(v) })}
      >
        {(form) => <EccentricityBody form={form} server={server} />}
      </Form>
    </CalcCard>
  );
}
