import {
  Button, Dialog, DialogActions, DialogBody, DialogContent, DialogSurface, DialogTitle, Field, Input, Select, Textarea, makeStyles, tokens, Body1,
} from '@fluentui/react-components';
import { DERIVED_FORMULAS, RULE_SETS } from '@shared/schemas/master-data';
import type { RowDraft } from './plan-draft';

const useStyles = makeStyles({
  body: { display: 'flex', flexDirection: 'column', gap: '14px' },
  pair: { display: 'grid', gridTemplateColumns: '1fr 1fr', gap: '12px' },
  touch: { minHeight: '44px' },
  dl: { display: 'grid', gridTemplateColumns: '160px minmax(0,1fr)', gap: '8px 12px', margin: 0 },
  dt: { color: tokens.colorNeutralForeground3 },
  dd: { margin: 0, whiteSpace: 'pre-wrap' },
});

const FORMULA_LABELS: Record<(typeof DERIVED_FORMULAS)[number], string> = {
  'circle-fit-diameter': 'Circle fit: diameter',
  'circle-fit-roundness': 'Circle fit: roundness',
  eccentricity: 'Bore-to-OD eccentricity',
  'runout-eccentricity': 'Eccentricity from runout (TIR / 2)',
  'mean-diameter': 'Mean of two-point diameters',
  ovality: 'Ovality',
  'stack-length': 'Stack length (plane fit)',
  parallelism: 'End-face parallelism',
  squareness: 'End-face squareness',
  'stacking-factor-mass': 'Stacking factor from mass',
  'stacking-factor-count': 'Stacking factor from lamination count',
  'insulation-resistance': 'Interlaminar insulation resistance',
  'flux-penalty': 'Flux penalty',
};
const RULE_LABELS: Record<(typeof RULE_SETS)[number], string> = { 'western-electric': 'Western Electric', nelson: 'Nelson' };

/** The per-characteristic fields that do not fit the dense table: method text and formula details. */
export function DetailsDialog({ row, index, readOnly, errors, onChange, onClose }: {
  row: RowDraft | null;
  index: number;
  readOnly: boolean;
  errors: Record<string, string>;
  onChange: (patch: Partial<RowDraft>, field: keyof RowDraft) => void;
  onClose: () => void;
}) {
  const s = useStyles();
  const err = (f: string) => errors[`characteristics.${index}.${f}`];
  const state = (f: string) => (err(f) ? 'error' : 'none') as 'error' | 'none';
  const title = row ? `${row.code || `Row ${index + 1}`} · ${row.name || 'unnamed'}` : '';
  return (
    <Dialog open={!!row} onOpenChange={(_, d) => !d.open && onClose()}>
      <DialogSurface aria-label="Method and details">
        {row ? (
          <DialogBody>
            <DialogTitle>{title}</DialogTitle>
            <DialogContent className={s.body}>
              {readOnly ? (
                <dl className={s.dl}>
                  <dt className={s.dt}>Method</dt><dd className={s.dd}>{row.method || '—'}</dd>
                  <dt className={s.dt}>Derived formula</dt><dd className={s.dd}>{row.derivedFormula ? FORMULA_LABELS[row.derivedFormula as keyof typeof FORMULA_LABELS] ?? row.derivedFormula : '—'}</dd>
                  <dt className={s.dt}>Formula inputs</dt><dd className={s.dd}>{row.inputs || '—'}</dd>
                  <dt className={s.dt}>Subgroup size</dt><dd className={s.dd}>{row.subgroupSize || '—'}</dd>
                  <dt className={s.dt}>Run rules</dt><dd className={s.dd}>{RULE_LABELS[row.ruleSet]}</dd>
                </dl>
              ) : (
                <>
                  {errors[`characteristics.${index}`] ? <Body1 role="alert">{errors[`characteristics.${index}`]}</Body1> : null}
                  <Field label="Method" hint="How the inspector measures it: fixture, where, how many times" validationState={state('method')} validationMessage={err('method')}>
                    <Textarea rows={5} resize="vertical" value={row.method} onChange={(_, d) => onChange({ method: d.value }, 'method')} />
                  </Field>
                  <div className={s.pair}>
                    <Field label="Derived formula" hint={row.kind === 'derived' ? 'Required for a derived value' : 'For derived values'} validationState={state('derivedFormula')} validationMessage={err('derivedFormula')}>
                      <Select value={row.derivedFormula} onChange={(_, d) => onChange({ derivedFormula: d.value }, 'derivedFormula')}>
                        <option value="">—</option>
                        {DERIVED_FORMULAS.map((f) => <option key={f} value={f}>{FORMULA_LABELS[f]}</option>)}
                      </Select>
                    </Field>
                    <Field label="Formula inputs" hint="Codes of other characteristics, comma separated" validationState={state('inputs')} validationMessage={err('inputs')}>
                      <Input value={row.inputs} onChange={(_, d) => onChange({ inputs: d.value }, 'inputs')} />
                    </Field>
                  </div>
                  <div className={s.pair}>
                    <Field label="Subgroup size" hint="Cores per chart point" validationState={state('subgroupSize')} validationMessage={err('subgroupSize')}>
                      <Input inputMode="numeric" value={row.subgroupSize} onChange={(_, d) => onChange({ subgroupSize: d.value }, 'subgroupSize')} />
                    </Field>
                    <Field label="Run rules" validationState={state('ruleSet')} validationMessage={err('ruleSet')}>
                      <Select value={row.ruleSet} onChange={(_, d) => onChange({ ruleSet: d.value as RowDraft['ruleSet'] }, 'ruleSet')}>
                        {RULE_SETS.map((r) => <option key={r} value={r}>{RULE_LABELS[r]}</option>)}
                      </Select>
                    </Field>
                  </div>
                </>
              )}
            </DialogContent>
            <DialogActions>
              <Button className={s.touch} appearance="primary" onClick={onClose}>{readOnly ? 'Close' : 'Done'}</Button>
            </DialogActions>
          </DialogBody>
        ) : null}
      </DialogSurface>
    </Dialog>
  );
}
