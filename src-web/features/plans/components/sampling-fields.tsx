import { Field, Input, Select, Textarea, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { AQL_VALUES, INSPECTION_LEVELS } from '@shared/compute/sampling';
import type { PlanDraft } from './plan-draft';

const useStyles = makeStyles({
  row: { display: 'flex', flexWrap: 'wrap', gap: '12px 16px', alignItems: 'flex-start' },
  kind: { flex: '0 1 250px', minWidth: '200px' },
  small: { flex: '0 1 150px', minWidth: '120px' },
  notes: { flex: '1 1 260px', minWidth: '220px' },
  dl: { display: 'flex', flexWrap: 'wrap', gap: '8px 32px', margin: 0 },
  dt: { color: tokens.colorNeutralForeground3, fontSize: tokens.fontSizeBase200 },
  dd: { margin: 0, fontWeight: 600 },
  note: { margin: 0, whiteSpace: 'pre-wrap', fontWeight: 400 },
});

const KIND_LABELS = { aql: 'AQL sampling (ISO 2859-1)', 'zero-acceptance': 'Zero acceptance (c = 0)' } as const;

type SamplingPatch = Partial<Omit<PlanDraft, 'rows'>>;

export function SamplingFields({ draft, readOnly, errors, onChange }: { draft: PlanDraft; readOnly: boolean; errors: Record<string, string>; onChange: (p: SamplingPatch, field: string) => void }) {
  const s = useStyles();
  const st = (f: string) => ({ validationState: (errors[f] ? 'error' : 'none') as 'error' | 'none', validationMessage: errors[f] });
  if (readOnly) {
    return (
      <dl className={s.dl}>
        <div><dt className={s.dt}>Sampling</dt><dd className={s.dd}>{KIND_LABELS[draft.samplingKind]}</dd></div>
        {draft.samplingKind === 'aql' ? (
          <>
            <div><dt className={s.dt}>Inspection level</dt><dd className={s.dd}>{draft.inspectionLevel || '—'}</dd></div>
            <div><dt className={s.dt}>AQL</dt><dd className={s.dd}>{draft.aql || '—'}</dd></div>
          </>
        ) : (
          <div><dt className={s.dt}>Fixed sample size</dt><dd className={s.dd}>{draft.zeroSampleSize || '—'} cores</dd></div>
        )}
        <div><dt className={s.dt}>Notes</dt><dd className={mergeClasses(s.dd, s.note)}>{draft.notes || '—'}</dd></div>
      </dl>
    );
  }
  return (
    <div className={s.row}>
      <Field className={s.kind} label="Sampling" {...st('samplingKind')}>
        <Select value={draft.samplingKind} onChange={(_, d) => onChange({ samplingKind: d.value as PlanDraft['samplingKind'] }, 'samplingKind')}>
          <option value="aql">{KIND_LABELS.aql}</option>
          <option value="zero-acceptance">{KIND_LABELS['zero-acceptance']}</option>
        </Select>
      </Field>
      {draft.samplingKind === 'aql' ? (
        <>
          <Field className={s.small} label="Inspection level" {...st('inspectionLevel')}>
            <Select value={draft.inspectionLevel} onChange={(_, d) => onChange({ inspectionLevel: d.value }, 'inspectionLevel')}>
              <option value="">Choose…</option>
              {INSPECTION_LEVELS.map((l) => <option key={l} value={l}>{l}</option>)}
            </Select>
          </Field>
          <Field className={s.small} label="AQL" {...st('aql')}>
            <Select value={draft.aql} onChange={(_, d) => onChange({ aql: d.value }, 'aql')}>
              <option value="">Choose…</option>
              {AQL_VALUES.map((a) => <option key={a} value={String(a)}>{a}</option>)}
            </Select>
          </Field>
        </>
      ) : (
        <Field className={s.kind} label="Fixed sample size (cores)" hint="Accept on zero nonconforming" {...st('zeroSampleSize')}>
          <Input inputMode="numeric" value={draft.zeroSampleSize} onChange={(_, d) => onChange({ zeroSampleSize: d.value }, 'zeroSampleSize')} />
        </Field>
      )}
      <Field className={s.notes} label="Notes" {...st('notes')}>
        <Textarea rows={1} resize="vertical" value={draft.notes} onChange={(_, d) => onChange({ notes: d.value }, 'notes')} />
      </Field>
    </div>
  );
}
