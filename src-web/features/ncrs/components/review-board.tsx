import { Body1, Button, Caption1, MessageBar, MessageBarBody, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { useMemo, useState } from 'react';
import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import { checkSplit, lineCost } from '@shared/compute/disposition';
import { DISPOSITION_KINDS, DISPOSITION_LABELS, dispositionLinesFor, type DispositionLineInput, type Ncr } from '@shared/schemas/ncr';
import type { SessionUser } from '@shared/schemas/auth';
import { Form, TextField } from '../../../components/form';
import { NumberField, SelectField, TextAreaField, formSchema } from '../../../components/form-fields';
import { ESignDialog } from './e-sign-dialog';
import { formatMoney } from './ncr-status';

const useStyles = makeStyles({
  form: { display: 'flex', flexDirection: 'column', gap: '12px' },
  line: {
    display: 'grid',
    gridTemplateColumns: 'minmax(190px, 1.2fr) 110px minmax(220px, 2fr)',
    gap: '10px 14px',
    alignItems: 'start',
    padding: '12px 14px',
    border: `1px solid ${tokens.colorNeutralStroke2}`,
    borderLeft: `4px solid ${tokens.colorBrandStroke1}`,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground1,
    '@media (max-width: 1100px)': { gridTemplateColumns: 'minmax(0, 1fr) 110px' },
    // Fluent inputs keep an intrinsic width; let them shrink to their grid cell.
    '& .fui-Input': { minWidth: 0, width: '100%' },
    '& .fui-Field': { minWidth: 0 },
  },
  wide: { '@media (max-width: 1100px)': { gridColumn: '1 / -1' } },
  costs: { gridColumn: '1 / -1', display: 'grid', gridTemplateColumns: 'repeat(4, minmax(0, 1fr)) minmax(130px, auto) auto', gap: '10px', alignItems: 'end', '@media (max-width: 900px)': { gridTemplateColumns: 'repeat(2, minmax(0, 1fr))' } },
  cost: { fontVariantNumeric: 'tabular-nums', fontWeight: 700, padding: '0 0 8px', whiteSpace: 'nowrap' },
  bar: { position: 'sticky', bottom: 0, display: 'flex', alignItems: 'center', justifyContent: 'space-between', gap: '12px', flexWrap: 'wrap', padding: '10px 0', backgroundColor: tokens.colorNeutralBackground1 },
  sum: { flex: 1, minWidth: '260px' },
  touch: { minHeight: '44px' },
  muted: { color: tokens.colorNeutralForeground3 },
});

const kindOptions = DISPOSITION_KINDS.map((k) => ({ value: k, label: DISPOSITION_LABELS[k] }));
const emptyLine = (kind: DispositionLineInput['kind'] = 'scrap', quantity?: number): DispositionLineInput => ({ kind, quantity: quantity as number, rationale: '', concessionRef: null, hours: null, rate: null, scrapValue: null, freight: null });

interface LinesValues {
  lines: DispositionLineInput[];
}

const costOf = (l: DispositionLineInput) => {
  try {
    return lineCost(l);
  } catch {
    return 0;
  }
};

/** The running check: every suspect core needs exactly one fate before anything can be signed. */
function SplitStatus({ suspect }: { suspect: number }) {
  const s = useStyles();
  const lines = (useWatch({ name: 'lines' }) as DispositionLineInput[] | undefined) ?? [];
  const c = checkSplit(lines.map((l) => ({ ...l, quantity: typeof l.quantity === 'number' ? l.quantity : NaN })), suspect);
  return (
    <MessageBar className={s.sum} intent={c.ok ? 'success' : c.remaining < 0 ? 'error' : 'warning'} aria-live="polite" role="status">
      <MessageBarBody>
        <strong>{c.assigned} of {suspect} cores assigned</strong>
        {c.ok ? ' — every suspect core has a disposition.' : c.message ? ` — ${c.message.replace(/^.*?: /, '')}` : ''} Total cost {formatMoney(c.totalCost)}.
      </MessageBarBody>
    </MessageBar>
  );
}

function Line({ index, onRemove, canRemove }: { index: number; onRemove: () => void; canRemove: boolean }) {
  const s = useStyles();
  const line = useWatch({ name: `lines.${index}` }) as DispositionLineInput;
  const p = `lines.${index}`;
  return (
    <fieldset className={s.line} aria-label={`Disposition line ${index + 1}`} style={{ margin: 0 }}>
      <SelectField name={`${p}.kind`} label="Disposition" options={kindOptions} required />
      <NumberField name={`${p}.quantity`} label="Cores" required />
      <div className={s.wide}>
        <TextAreaField name={`${p}.rationale`} label="Rationale" required rows={2} />
      </div>
      {line?.kind === 'use-as-is' ? <TextField name={`${p}.concessionRef`} label="Concession reference" required hint="The written concession this relies on" /> : null}
      <div className={s.costs}>
        <NumberField name={`${p}.hours`} label="Hours" empty={null} />
        <NumberField name={`${p}.rate`} label="Rate per hour" empty={null} />
        <NumberField name={`${p}.scrapValue`} label="Scrap value" empty={null} />
        <NumberField name={`${p}.freight`} label="Freight" empty={null} />
        <div className={s.cost} aria-label={`Cost of line ${index + 1}`}>Cost {formatMoney(costOf(line ?? emptyLine()))}</div>
        <Button className={s.touch} appearance="subtle" disabled={!canRemove} onClick={onRemove} aria-label={`Remove line ${index + 1}`}>Remove</Button>
      </div>
    </fieldset>
  );
}

function Lines({ suspect }: { suspect: number }) {
  const s = useStyles();
  const { control, getValues } = useFormContext<LinesValues>();
  const { fields, append, remove } = useFieldArray({ control, name: 'lines' });
  const remaining = () => suspect - (getValues('lines') ?? []).reduce((t, l) => t + (Number(l.quantity) || 0), 0);
  return (
    <>
      {fields.map((f, i) => (
        <Line key={f.id} index={i} canRemove={fields.length > 1} onRemove={() => remove(i)} />
      ))}
      <div className={s.bar}>
        <SplitStatus suspect={suspect} />
        <Button className={s.touch} onClick={() => append(emptyLine('sort', Math.max(1, remaining())))}>Add a line</Button>
        <Button className={s.touch} appearance="primary" type="submit">Sign the disposition…</Button>
      </div>
    </>
  );
}

/**
 * The review board: split the suspect quantity across dispositions with rationale and cost,
 * watch the sum live, then e-sign. The server checks everything again.
 */
export function ReviewBoard({ ncr, me, onSigned }: { ncr: Ncr; me: SessionUser; onSigned: () => void }) {
  const s = useStyles();
  const [pending, setPending] = useState<DispositionLineInput[] | null>(null);
  const schema = useMemo(() => dispositionLinesFor(ncr.suspectQuantity), [ncr.suspectQuantity]);
  return (
    <>
      <Body1 className={s.muted} as="p">
        Give every one of the {ncr.suspectQuantity} suspect cores one disposition. Use as is needs a written concession{ncr.reviewBoard.countersignUseAsIs ? ' and a second engineer’s signature' : ''}. Costs feed the cost of poor quality.
      </Body1>
      <Form<LinesValues>
        key={`${ncr.id}:${ncr.version}`}
        schema={formSchema<LinesValues>(schema)}
        defaultValues={{ lines: [emptyLine('scrap', ncr.suspectQuantity)] }}
        className={mergeClasses(s.form)}
        aria-label="Dispositions"
        onSubmit={(v) => setPending(v.lines)}
      >
        {() => <Lines suspect={ncr.suspectQuantity} />}
      </Form>
      <Caption1 className={s.muted}>Only quality engineers sign dispositions; administrators cannot (separation of duties).</Caption1>
      {pending ? (
        <ESignDialog
          ncr={ncr}
          me={me}
          lines={pending}
          open
          onClose={() => setPending(null)}
          onSigned={() => {
            setPending(null);
            onSigned();
          }}
        />
      ) : null}
    </>
  );
}
