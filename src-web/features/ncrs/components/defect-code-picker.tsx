import { Caption1, Checkbox, Field, makeStyles, tokens } from '@fluentui/react-components';
import { useController, useFormContext } from 'react-hook-form';
import { useDefectCodes } from '../api/ncrs';

const useStyles = makeStyles({
  grid: { display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(210px, 1fr))', gap: '2px 8px', border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusMedium, padding: '6px 8px' },
  label: { display: 'inline-flex', alignItems: 'baseline', gap: '6px' },
  code: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 700, fontSize: tokens.fontSizeBase200, minWidth: '5ch' },
  legend: { fontWeight: 600, padding: 0, marginBottom: '4px' },
  fieldset: { border: 'none', margin: 0, padding: 0, minWidth: 0 },
});

/** The plant's defect codes as checkboxes, bound to a string[] field of the surrounding Form. */
export function DefectCodePicker({ name, label = 'Defect codes' }: { name: string; label?: string }) {
  const s = useStyles();
  const { control } = useFormContext();
  const { field, fieldState } = useController({ name, control });
  const codes = useDefectCodes();
  const value = (field.value as string[] | undefined) ?? [];
  const toggle = (code: string, on: boolean) => field.onChange(on ? [...value, code] : value.filter((c) => c !== code));
  return (
    <fieldset className={s.fieldset} aria-describedby={fieldState.error ? `${name}-error` : undefined}>
      <legend className={s.legend}>{label} <span aria-hidden>*</span></legend>
      {codes.isPending ? <Caption1>Loading the list…</Caption1> : null}
      <div className={s.grid}>
        {codes.data?.items.map((c) => (
          <Checkbox
            key={c.id}
            checked={value.includes(c.code)}
            onChange={(_, d) => toggle(c.code, !!d.checked)}
            label={<span className={s.label} title={c.description ?? undefined}><span className={s.code}>{c.code}</span><span>{c.name}</span></span>}
          />
        ))}
      </div>
      {fieldState.error ? <Field validationState="error" validationMessage={<span id={`${name}-error`}>{fieldState.error.message}</span>} /> : null}
    </fieldset>
  );
}
