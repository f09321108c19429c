import { useState } from 'react';
import { useWatch, type UseFormReturn } from 'react-hook-form';
import { circleFit, type CircleFit } from '@shared/compute/geometry';
import { ComputeError } from '@shared/compute/errors';
import { circleFitInputSchema } from '@shared/schemas/calc';
import { Form } from '../../../components/form';
import { formSchema } from '../../../components/form-fields';
import { useCheckCircleFit, type CircleFitInput, type CircleFitResult } from '../api/calc';
import { CalcCard, LiveResult, PointsField, ServerCheck, fmt, useCalcStyles, type Compared, type ServerCheckState } from './calc-parts';

const mm = (v: number | null) => (v == null ? '—' : `${fmt(v, 4)} mm`);

/** The browser's fit, or the reason there is none (too few points, points on a line). */
export function liveCircle(values: unknown): { key: string | null; fit: CircleFit | null; error: string | null } {
  const parsed = circleFitInputSchema.safeParse(values);
  if (!parsed.success) return { key: null, fit: null, error: null };
  try {
    return { key: JSON.stringify(parsed.data), fit: circleFit(parsed.data.points), error: null };
  } catch (err) {
    if (err instanceof ComputeError) return { key: null, fit: null, error: err.message };
    throw err;
  }
}

function CircleBody({ form, server }: { form: UseFormReturn<CircleFitInput>; server: ServerCheckState<CircleFitResult> | null }) {
  const s = useCalcStyles();
  const values = useWatch({ control: form.control });
  const { key, fit, error } = liveCircle(values);
  const compared: Compared[] | null =
    fit && server && server.key === key
      ? [
          { label: 'Centre x', local: fit.centerX, server: server.result.centerX, text: mm },
          { label: 'Centre y', local: fit.centerY, server: server.result.centerY, text: mm },
          { label: 'Diameter', local: fit.diameter, server: server.result.diameter, text: mm },
          { label: 'Roundness', local: fit.roundness, server: server.result.roundness, text: mm },
        ]
      : null;
  return (
    <div className={s.form}>
      <PointsField name="points" label="Probed points" unit="mm" />
      <LiveResult
        label="Circle fit result"
        error={error}
        empty="Enter at least 3 points around the circle."
        rows={
          fit
            ? [
                { label: 'Diameter', value: mm(fit.diameter), big: true },
                { label: 'Centre (x, y)', value: `(${fmt(fit.centerX, 4)}, ${fmt(fit.centerY, 4)}) mm` },
                { label: 'Radius', value: mm(fit.radius) },
                { label: 'Roundness (RONt)', value: `${fmt(fit.roundness, 4)} mm = ${fmt(fit.roundness * 1000, 1)} µm` },
                { label: 'Points', value: String(fit.residuals.length) },
              ]
            : null
        }
      />
      <ServerCheck label="Circle fit" checked={!!server} currentKey={key} compared={compared} submitting={form.formState.isSubmitting} />
    </div>
  );
}

/** Least-squares circle from probed points: what the bench sheet does with a probed bore or OD. */
export function CircleFitCalculator() {
  const check = useCheckCircleFit();
  const [server, setServer] = useState<ServerCheckState<CircleFitResult> | null>(null);
  return (
    <CalcCard
      title="Least-squares circle"
      formula={<>minimise Σ(x² + y² + Dx + Ey + F)² → centre (−D/2, −E/2), r = √(D²/4 + E²/4 − F); roundness RONt = max − min radial residual</>}
      source="algebraic (Kåsa) fit on mean-centred points; ISO 4291 / ISO 12181 least-squares reference circle"
    >
      <Form<CircleFitInput>
        schema={formSchema<CircleFitInput>(circleFitInputSchema)}
        defaultValues={{ points: [] }}
        aria-label="Least-squares circle"
        onSubmit={async (v) => setServer({ key: JSON.stringify(v), result: await check.mutateAsync(v) })}
      >
        {(form) => <CircleBody form={form} server={server} />}
      </Form>
    </CalcCard>
  );
}
