import { Button, Field, Input, Select, Textarea, makeStyles, tokens, type InputProps } from '@fluentui/react-components';
import { useEffect, useRef, useState } from 'react';
import { get, useController, useFormContext, type FieldValues } from 'react-hook-form';
import type { z } from 'zod';

/**
 * The shared schemas transform (defaults, trimming), so their input and output types differ;
 * a form is typed on one of them. This says which, without changing the schema.
 */
export const formSchema = <T extends FieldValues>(schema: z.ZodType) => schema as unknown as z.ZodType<T, FieldValues>;

/** Text typed into a number box → the value the schema sees. A comma decimal is accepted. */
export function parseNumberText(text: string, empty: null | undefined): number | string | null | undefined {
  const t = text.trim().replace(',', '.');
  if (t === '') return empty;
  const n = Number(t);
  // Anything that is not a number goes to the schema as text, so the user gets its message.
  return Number.isFinite(n) ? n : text;
}
export const formatNumber = (v: unknown): string => (typeof v === 'number' ? String(v) : typeof v === 'string' ? v : '');

interface NumberFieldProps extends Omit<InputProps, 'name' | 'value' | 'onChange' | 'defaultValue' | 'type'> {
  name: string;
  label: string;
  hint?: string;
  required?: boolean;
  /** What an empty box means: `undefined` (required → "must be a number") or `null` (optional). */
  empty?: null | undefined;
  unit?: string;
}

/** A labelled number input bound to the surrounding Form; keeps what was typed (e.g. "0.") while typing. */
export function NumberField({ name, label, hint, required, empty, unit, ...input }: NumberFieldProps) {
  const { control } = useFormContext();
  const { field, fieldState } = useController({ name, control });
  const [text, setText] = useState(formatNumber(field.value));
  const last = useRef<unknown>(field.value);
  useEffect(() => {
    // Only take the value from outside when it changed there (reset, server data), not from typing.
    if (field.value !== last.current) {
      last.current = field.value;
      setText(formatNumber(field.value));
    }
  }, [field.value]);
  return (
    <Field label={unit ? `${label} (${unit})` : label} hint={hint} required={required} validationState={fieldState.error ? 'error' : 'none'} validationMessage={fieldState.error?.message}>
      <Input
        {...input}
        inputMode="decimal"
        name={field.name}
        value={text}
        onChange={(_, d) => {
          setText(d.value);
          const v = parseNumberText(d.value, empty);
          last.current = v;
          field.onChange(v);
        }}
        onBlur={field.onBlur}
        ref={field.ref}
      />
    </Field>
  );
}

interface SelectFieldProps {
  name: string;
  label: string;
  options: readonly { value: string; label: string }[];
  hint?: string;
  required?: boolean;
  disabled?: boolean;
  /** Shown as the first, empty choice; picking it sets the value to null. */
  placeholder?: string;
  /** Values are numbers (e.g. AQL): convert back on change. */
  numeric?: boolean;
}

/** A native select (quick on tablets and by keyboard) bound to the surrounding Form. */
export function SelectField({ name, label, options, hint, required, disabled, placeholder, numeric }: SelectFieldProps) {
  const { control } = useFormContext();
  const { field, fieldState } = useController({ name, control });
  return (
    <Field label={label} hint={hint} required={required} validationState={fieldState.error ? 'error' : 'none'} validationMessage={fieldState.error?.message}>
      <Select
        name={field.name}
        disabled={disabled}
        value={field.value == null ? '' : String(field.value)}
        onChange={(_, d) => field.onChange(d.value === '' ? null : numeric ? Number(d.value) : d.value)}
        onBlur={field.onBlur}
        ref={field.ref}
      >
        {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
        {options.map((o) => (
          <option key={o.value} value={o.value}>{o.label}</option>
        ))}
      </Select>
    </Field>
  );
}

export function TextAreaField({ name, label, hint, required, rows = 3 }: { name: string; label: string; hint?: string; required?: boolean; rows?: number }) {
  const { control } = useFormContext();
  const { field, fieldState } = useController({ name, control });
  return (
    <Field label={label} hint={hint} required={required} validationState={fieldState.error ? 'error' : 'none'} validationMessage={fieldState.error?.message}>
      <Textarea
        name={field.name}
        rows={rows}
        resize="vertical"
        value={(field.value as string | null | undefined) ?? ''}
        onChange={(_, d) => field.onChange(d.value === '' ? null : d.value)}
        onBlur={field.onBlur}
        ref={field.ref}
      />
    </Field>
  );
}

const useListStyles = makeStyles({
  list: { display: 'flex', flexDirection: 'column', gap: '8px', margin: 0, padding: 0, listStyle: 'none' },
  row: { display: 'grid', gridTemplateColumns: 'minmax(0, 1fr) auto', gap: '8px', alignItems: 'start' },
  touch: { minHeight: '44px' },
  add: { alignSelf: 'flex-start', minHeight: '44px' },
  group: { display: 'flex', flexDirection: 'column', gap: '8px' },
  legend: { fontWeight: 600, fontSize: tokens.fontSizeBase300, marginBottom: '4px', padding: 0 },
  fieldset: { border: 'none', margin: 0, padding: 0, minWidth: 0 },
});

/** A list of short texts (contact e-mails): one input a line, add and remove, an error per line. */
export function StringListField({ name, label, itemLabel, addLabel, type = 'text', max = 10, required }: { name: string; label: string; itemLabel: string; addLabel: string; type?: 'text' | 'email'; max?: number; required?: boolean }) {
  const s = useListStyles();
  const { control, formState } = useFormContext();
  const { field, fieldState } = useController({ name, control });
  const items = (field.value as string[] | undefined) ?? [];
  const set = (next: string[]) => field.onChange(next);
  const listError = fieldState.error?.message ?? (get(formState.errors, `${name}.root`) as { message?: string } | undefined)?.message;
  return (
    <fieldset className={s.fieldset}>
      <legend className={s.legend}>{label}{required ? <span aria-hidden> *</span> : null}</legend>
      <div className={s.group}>
        <ul className={s.list}>
          {items.map((v, i) => {
            const err = (get(formState.errors, `${name}.${i}`) as { message?: string } | undefined)?.message;
            return (
              <li key={i} className={s.row}>
                <Field validationState={err ? 'error' : 'none'} validationMessage={err}>
                  <Input
                    className={s.touch}
                    type={type}
                    aria-label={`${itemLabel} ${i + 1}`}
                    value={v}
                    onChange={(_, d) => set(items.map((x, j) => (j === i ? d.value : x)))}
                    onBlur={field.onBlur}
                  />
                </Field>
                <Button className={s.touch} appearance="subtle" aria-label={`Remove ${itemLabel.toLowerCase()} ${i + 1}`} onClick={() => set(items.filter((_, j) => j !== i))}>
                  Remove
                </Button>
              </li>
            );
          })}
        </ul>
        {listError ? <Field validationState="error" validationMessage={listError} /> : null}
        <Button className={s.add} disabled={items.length >= max} onClick={() => set([...items, ''])}>{addLabel}</Button>
      </div>
    </fieldset>
  );
}
