import { Button, Caption1, Field, Input, Textarea, makeStyles, tokens } from '@fluentui/react-components';
import { type ReactNode } from 'react';
import { useController, useFieldArray, useFormContext } from 'react-hook-form';
import type { EightDStep } from '@shared/schemas/corrective-action';
import { NumberField } from '../../../components/form-fields';
import { formatCalendarDay } from '../../../lib/format';

const useStyles = makeStyles({
  group: { display: 'flex', flexDirection: 'column', gap: '12px', '& .fui-Input': { minWidth: 0, width: '100%' } },
  pair: { display: 'grid', gridTemplateColumns: 'repeat(2, minmax(0, 1fr))', gap: '12px', '@media (max-width: 700px)': { gridTemplateColumns: '1fr' } },
  rows: { display: 'flex', flexDirection: 'column', gap: '8px', '& .fui-Input': { minWidth: 0, width: '100%' } },
  row: { display: 'grid', gridTemplateColumns: 'minmax(0, 2fr) minmax(0, 1fr) 160px auto', gap: '8px', alignItems: 'end', '@media (max-width: 800px)': { gridTemplateColumns: '1fr 1fr' } },
  row2: { display: 'grid', gridTemplateColumns: 'minmax(0, 1fr) minmax(0, 1fr) auto', gap: '8px', alignItems: 'end' },
  legend: { fontWeight: 600, padding: 0, marginBottom: '6px' },
  fieldset: { border: 'none', margin: 0, padding: 0, minWidth: 0 },
  touch: { minHeight: '44px' },
  dl: { display: 'grid', gridTemplateColumns: 'max-content minmax(0, 1fr)', gap: '6px 14px', margin: 0 },
  dt: { color: tokens.colorNeutralForeground3 },
  dd: { margin: 0, whiteSpace: 'pre-wrap', overflowWrap: 'anywhere' },
  list: { margin: 0, paddingLeft: '18px' },
});

/** Text bound to the form that stays '' when empty (so "required" reads as required, not as a type error). */
function TextInput({ name, label, required, hint, multiline, type, rows = 3 }: { name: string; label: string; required?: boolean; hint?: string; multiline?: boolean; type?: 'date' | 'text'; rows?: number }) {
  const { control } = useFormContext();
  const { field, fieldState } = useController({ name, control });
  const common = { name: field.name, value: (field.value as string | null | undefined) ?? '', onBlur: field.onBlur, ref: field.ref };
  return (
    <Field label={label} hint={hint} required={required} validationState={fieldState.error ? 'error' : 'none'} validationMessage={fieldState.error?.message}>
      {multiline ? <Textarea {...common} rows={rows} resize="vertical" onChange={(_, d) => field.onChange(d.value)} /> : <Input {...common} type={type ?? 'text'} onChange={(_, d) => field.onChange(d.value)} />}
    </Field>
  );
}

function ListField({ name, label, addLabel, columns, empty }: { name: string; label: string; addLabel: string; columns: { key: string; label: string; type?: 'date' }[]; empty: Record<string, string> }) {
  const s = useStyles();
  const { control, formState } = useFormContext();
  const { fields, append, remove } = useFieldArray({ control, name });
  const rootError = (name.split('.').reduce<unknown>((o, k) => (o as Record<string, unknown> | undefined)?.[k], formState.errors) as { message?: string; root?: { message?: string } } | undefined);
  const message = rootError?.message ?? rootError?.root?.message;
  return (
    <fieldset className={s.fieldset}>
      <legend className={s.legend}>{label} <span aria-hidden>*</span></legend>
      <div className={s.rows}>
        {fields.map((f, i) => (
          <div key={f.id} className={columns.length > 2 ? s.row : s.row2}>
            {columns.map((c) => (
              <TextInput key={c.key} name={`${name}.${i}.${c.key}`} label={`${c.label} ${i + 1}`} type={c.type} required />
            ))}
            <Button className={s.touch} appearance="subtle" onClick={() => remove(i)} aria-label={`Remove ${label.toLowerCase()} ${i + 1}`}>Remove</Button>
          </div>
        ))}
        {message ? <Field validationState="error" validationMessage={message} /> : null}
        <Button className={s.touch} style={{ alignSelf: 'flex-start' }} onClick={() => append(empty)}>{addLabel}</Button>
      </div>
    </fieldset>
  );
}

/** The input fields of one 8D step, named `answer.…` as the API names them. */
export function StepFields({ step }: { step: EightDStep }) {
  const s = useStyles();
  switch (step) {
    case 'D1':
      return <ListField name="answer.members" label="Team members" addLabel="Add a member" columns={[{ key: 'name', label: 'Name' }, { key: 'role', label: 'Role' }]} empty={{ name: '', role: '' }} />;
    case 'D2':
      return <TextInput name="answer.description" label="The problem as you see it" required multiline rows={4} hint="What, where, when, how many" />;
    case 'D3':
      return (
        <div className={s.group}>
          <TextInput name="answer.actions" label="Containment actions" required multiline hint="What you did to protect Harrowgate now" />
          <div className={s.pair}>
            <NumberField name="answer.atSupplier.checked" label="Checked at your plant" unit="cores" required />
            <NumberField name="answer.atSupplier.nonconforming" label="Nonconforming at your plant" unit="cores" required />
            <NumberField name="answer.inTransit.checked" label="Checked in transit" unit="cores" required />
            <NumberField name="answer.inTransit.nonconforming" label="Nonconforming in transit" unit="cores" required />
          </div>
          <div className={s.pair}>
            <TextInput name="answer.cleanMark" label="How clean shipments are marked" />
            <TextInput name="answer.effectiveFrom" label="Clean shipments from" type="date" />
          </div>
        </div>
      );
    case 'D4':
      return (
        <div className={s.group}>
          <TextInput name="answer.rootCause" label="Root cause (why it happened)" required multiline />
          <TextInput name="answer.escapePoint" label="Escape point (why it was not caught)" required multiline />
          <TextInput name="answer.method" label="Method used" hint="5 why, fishbone, fault tree…" />
        </div>
      );
    case 'D5':
      return <ListField name="answer.actions" label="Chosen actions" addLabel="Add an action" columns={[{ key: 'action', label: 'Action' }, { key: 'owner', label: 'Owner' }, { key: 'dueOn', label: 'Due', type: 'date' }]} empty={{ action: '', owner: '', dueOn: '' }} />;
    case 'D6':
      return (
        <div className={s.group}>
          <ListField name="answer.actions" label="Implemented actions" addLabel="Add an action" columns={[{ key: 'action', label: 'Action' }, { key: 'owner', label: 'Owner' }, { key: 'doneOn', label: 'Done on', type: 'date' }]} empty={{ action: '', owner: '', doneOn: '' }} />
          <TextInput name="answer.validation" label="Validation: the evidence that it works" required multiline />
        </div>
      );
    case 'D7':
      return <TextInput name="answer.prevention" label="Prevention of recurrence" required multiline hint="Procedures, FMEA, control plan, similar dies and processes" />;
    case 'D8':
      return <TextInput name="answer.summary" label="Closure summary" required multiline />;
  }
}

/** An answer as first shown in the form (the draft, else the last submission, else empty rows). */
export function initialAnswer(step: EightDStep, from: Record<string, unknown> | null): Record<string, unknown> {
  if (from) return from;
  switch (step) {
    case 'D1':
      return { members: [{ name: '', role: '' }] };
    case 'D3':
      return { actions: '', atSupplier: { checked: undefined, nonconforming: undefined }, inTransit: { checked: undefined, nonconforming: undefined }, cleanMark: '', effectiveFrom: '' };
    case 'D5':
      return { actions: [{ action: '', owner: '', dueOn: '' }] };
    case 'D6':
      return { actions: [{ action: '', owner: '', doneOn: '' }], validation: '' };
    default:
      return {};
  }
}

/** Empty optional texts go to the API as null (the schemas accept null, not ''). */
export function cleanAnswer(step: EightDStep, a: Record<string, unknown>): Record<string, unknown> {
  const out = { ...a };
  for (const k of step === 'D3' ? ['cleanMark', 'effectiveFrom'] : step === 'D4' ? ['method'] : []) if (out[k] === '') out[k] = null;
  return out;
}

const str = (v: unknown) => (v == null || v === '' ? '—' : String(v));

/** A submitted answer, read-only. */
export function AnswerView({ step, answer }: { step: EightDStep; answer: Record<string, unknown> }) {
  const s = useStyles();
  const a = answer as Record<string, any>;
  const dl = (rows: [string, ReactNode][]) => (
    <dl className={s.dl}>
      {rows.map(([k, v]) => (
        <div key={k} style={{ display: 'contents' }}>
          <dt className={s.dt}>{k}</dt>
          <dd className={s.dd}>{v}</dd>
        </div>
      ))}
    </dl>
  );
  switch (step) {
    case 'D1':
      return <ul className={s.list}>{(a.members ?? []).map((m: { name: string; role: string }, i: number) => <li key={i}>{m.name} — {m.role}</li>)}</ul>;
    case 'D2':
      return dl([['Problem', str(a.description)]]);
    case 'D3':
      return dl([
        ['Actions', str(a.actions)],
        ['At the supplier', `${str(a.atSupplier?.checked)} checked, ${str(a.atSupplier?.nonconforming)} nonconforming`],
        ['In transit', `${str(a.inTransit?.checked)} checked, ${str(a.inTransit?.nonconforming)} nonconforming`],
        ['Clean mark', str(a.cleanMark)],
        ['Clean from', typeof a.effectiveFrom === 'string' && a.effectiveFrom ? formatCalendarDay(a.effectiveFrom) : '—'],
      ]);
    case 'D4':
      return dl([['Root cause', str(a.rootCause)], ['Escape point', str(a.escapePoint)], ['Method', str(a.method)]]);
    case 'D5':
    case 'D6':
      return (
        <>
          <ul className={s.list}>
            {(a.actions ?? []).map((x: { action: string; owner: string; dueOn?: string; doneOn?: string }, i: number) => (
              <li key={i}>{x.action} — {x.owner}, {step === 'D5' ? `due ${str(x.dueOn)}` : `done ${str(x.doneOn)}`}</li>
            ))}
          </ul>
          {step === 'D6' ? dl([['Validation', str(a.validation)]]) : null}
        </>
      );
    case 'D7':
      return dl([['Prevention', str(a.prevention)]]);
    case 'D8':
      return dl([['Summary', str(a.summary)]]);
  }
}

export function NoAnswer() {
  return <Caption1 style={{ color: tokens.colorNeutralForeground3 }}>No answer submitted yet.</Caption1>;
}
