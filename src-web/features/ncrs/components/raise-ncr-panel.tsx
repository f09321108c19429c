import { Body1, Caption1, makeStyles, tokens } from '@fluentui/react-components';
import { useMemo } from 'react';
import { z } from 'zod';
import { text } from '@shared/schemas/common';
import { defectCodeValue, type HeldLot, type Ncr } from '@shared/schemas/ncr';
import type { ChartResponse, DriftSignal } from '@shared/schemas/drift';
import { Form, TextField } from '../../../components/form';
import { NumberField, SelectField, TextAreaField, formSchema } from '../../../components/form-fields';
import { SidePanel } from '../../../components/side-panel';
import { useSuppliers } from '../../suppliers/api/suppliers';
import { useParts } from '../../parts/api/parts';
import { useCreateNcr, useDefectCodes } from '../api/ncrs';
import { DefectCodePicker } from './defect-code-picker';
import { formatValue } from './ncr-status';

const useStyles = makeStyles({
  fields: { display: 'flex', flexDirection: 'column', gap: '14px' },
  lot: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderLeft: `4px solid ${tokens.colorPaletteRedBorder2}`, borderRadius: tokens.borderRadiusMedium, padding: '10px 12px', display: 'flex', flexDirection: 'column', gap: '4px' },
  fail: { margin: 0, paddingLeft: '18px' },
  muted: { color: tokens.colorNeutralForeground3 },
});

const FORM_ID = 'raise-ncr-form';

const baseSchema = z.object({
  title: text(160, 'title'),
  requirement: text(2000, 'the requirement'),
  found: text(2000, 'what was found'),
  defectCodes: z.array(defectCodeValue).min(1, 'Choose at least one defect code').max(10, 'At most 10 defect codes'),
  suspectQuantity: z.number({ message: 'Enter the number of suspect cores' }).int('a whole number of cores').min(1, 'at least one core').max(1_000_000),
  supplierId: z.uuid().nullable().optional(),
  partId: z.uuid().nullable().optional(),
});
type RaiseValues = z.infer<typeof baseSchema>;


/** What a held lot's failed readings say, as the NCR's first draft (the inspector edits it). */
export function draftFromLot(l: HeldLot, knownCodes: string[]): RaiseValues {
  const byChar = new Map<string, HeldLot['failures']>();
  for (const f of l.failures) byChar.set(f.characteristicCode, [...(byChar.get(f.characteristicCode) ?? []), f]);
  const chars = [...byChar.entries()];
  const limits = chars.map(([, fs]) => {
    const f = fs[0];
    const range = f.lsl != null && f.usl != null ? `${f.lsl}–${f.usl}` : f.usl != null ? `at most ${f.usl}` : f.lsl != null ? `at least ${f.lsl}` : 'pass';
    return `${f.name}: ${range}${f.unit && f.unit !== 'count' ? ` ${f.unit}` : ''}`;
  });
  const found = chars.map(([, fs]) => `${fs[0].name}: ${fs.map((f) => `core ${f.serial} ${f.value != null ? `${formatValue(f.value)}${fs[0].unit ? ` ${fs[0].unit}` : ''}` : f.pass === false ? `failed${f.note ? ` (${f.note})` : ''}` : ''}`).join(', ')}`);
  return {
    title: chars.length ? `${chars.map(([, fs]) => fs[0].name).join(', ')} out of tolerance` : 'Lot rejected at receiving',
    requirement: limits.join('\n') || 'As the drawing and inspection plan require',
    found: found.join('\n') || l.decisionComment || 'Rejected at receiving inspection',
    defectCodes: chars.map(([code]) => code).filter((c) => knownCodes.includes(c)),
    suspectQuantity: l.quantity,
    supplierId: null,
    partId: null,
  };
}

/** A drift signal and the chart it was raised on, for an NCR opened from Drift watch. */
export interface SignalSource {
  signal: DriftSignal;
  chart: Pick<ChartResponse, 'supplier' | 'part' | 'characteristic'>;
}

const num = (x: number | null | undefined) => (x == null ? '—' : formatValue(x));

/** What a drift signal says, as the NCR's first draft (the engineer edits it). */
export function draftFromSignal({ signal: g, chart }: SignalSource, knownCodes: string[]): RaiseValues {
  const c = chart.characteristic;
  const unit = c.unit && c.unit !== 'count' ? ` ${c.unit}` : '';
  const spec = c.lsl != null && c.usl != null ? `${c.lsl}–${c.usl}${unit}` : c.usl != null ? `at most ${c.usl}${unit}` : c.lsl != null ? `at least ${c.lsl}${unit}` : null;
  const limits = g.ucl != null || g.lcl != null ? ` (centre ${num(g.center)}, limits ${num(g.lcl)} – ${num(g.ucl)}${unit}, ${g.limitVersion === null ? 'trial limits' : `limits version ${g.limitVersion}`})` : '';
  return {
    title: `${c.name}: ${g.description}`.slice(0, 160),
    requirement: [spec ? `${c.name}: ${spec}` : null, `A stable ${g.chart === 'dispersion' ? 'spread' : 'level'} of ${c.name.toLowerCase()}, inside its control limits${limits}`].filter(Boolean).join('\n'),
    // The message names the lot (and core): "lot 245 core 1 is above the upper 3σ limit (we1)".
    found: `${g.message.charAt(0).toUpperCase()}${g.message.slice(1)}. Plotted value ${num(g.value)}${unit}.`,
    defectCodes: knownCodes.includes(c.code) ? [c.code] : [],
    suspectQuantity: undefined as unknown as number,
    supplierId: null,
    partId: null,
  };
}

/** Raise an NCR: from a held lot (prefilled from its failed readings), from a drift signal, or by hand. */
export function RaiseNcrPanel({ open, lot, signal = null, onClose, onCreated }: { open: boolean; lot: HeldLot | null; signal?: SignalSource | null; onClose: () => void; onCreated: (n: Ncr) => void }) {
  const s = useStyles();
  const create = useCreateNcr();
  const codes = useDefectCodes();
  const manual = !lot && !signal;
  const suppliers = useSuppliers({ page: 1, pageSize: 200, sort: 'code' });
  const parts = useParts({ page: 1, pageSize: 200, sort: 'partNumber' });
  const schema = useMemo(
    () =>
      lot
        ? baseSchema.superRefine((v, ctx) => {
            if (v.suspectQuantity > lot.quantity) ctx.addIssue({ code: 'custom', path: ['suspectQuantity'], message: `The lot has ${lot.quantity} cores` });
          })
        : baseSchema,
    [lot],
  );
  const defaults = useMemo<RaiseValues>(() => {
    const known = codes.data?.items.map((c) => c.code) ?? [];
    if (lot) return draftFromLot(lot, known);
    if (signal) return draftFromSignal(signal, known);
    return { title: '', requirement: '', found: '', defectCodes: [], suspectQuantity: undefined as unknown as number, supplierId: null, partId: null };
  }, [lot, signal, codes.data]);
  const title = lot ? `Raise an NCR for lot #${lot.ref}` : signal ? `Raise an NCR from the ${signal.signal.rule} signal on lot #${signal.signal.lotRef}` : 'Raise an NCR by hand';
  return (
    <SidePanel open={open} title={title} onClose={onClose} formId={FORM_ID} submitLabel="Raise NCR" submitting={create.isPending}>
      {lot ? (
        <div className={s.lot}>
          <Body1><strong>Lot #{lot.ref}</strong> · {lot.supplierCode} · {lot.partNumber} rev {lot.partRevision} · {lot.quantity} cores</Body1>
          <Caption1 className={s.muted}>
            Supplier lot {lot.supplierLotNumber}. The lot stays on hold; the failed readings below{lot.photoIds.length ? ` and the lot’s ${lot.photoIds.length} photo${lot.photoIds.length === 1 ? '' : 's'}` : ''} are linked to the report.
          </Caption1>
          {lot.failures.length ? (
            <ul className={s.fail}>
              {lot.failures.slice(0, 8).map((f) => (
                <li key={f.readingId}><Caption1>Core {f.serial}: {f.name} {f.value != null ? formatValue(f.value) : f.pass === false ? 'failed' : ''} {f.unit ?? ''}</Caption1></li>
              ))}
            </ul>
          ) : null}
        </div>
      ) : null}
      {signal ? (
        <div className={s.lot}>
          <Body1>
            <strong>{signal.chart.characteristic.code}</strong> · {signal.chart.supplier.code} · {signal.chart.part.partNumber} rev {signal.chart.part.revision} · rule {signal.signal.rule}{signal.signal.chart === 'dispersion' ? ' (spread)' : ''}
          </Body1>
          <Caption1 className={s.muted}>
            {signal.signal.message}. The report names this supplier, part and characteristic and links the signal, which is then marked as taken into it. No lot is put on hold: hold the suspect stock by hand if it is still on site.
          </Caption1>
        </div>
      ) : null}
      <Form<RaiseValues>
        key={lot?.id ?? signal?.signal.id ?? 'manual'}
        id={FORM_ID}
        schema={formSchema<RaiseValues>(schema)}
        defaultValues={defaults}
        className={s.fields}
        aria-label={lot ? `Raise an NCR for lot ${lot.ref}` : signal ? `Raise an NCR from a drift signal` : 'Raise an NCR by hand'}
        onSubmit={async (v) => {
          const n = await create.mutateAsync({
            title: v.title,
            requirement: v.requirement,
            found: v.found,
            defectCodes: v.defectCodes,
            suspectQuantity: v.suspectQuantity,
            ...(lot ? { lotId: lot.id, readingIds: lot.failures.map((f) => f.readingId), ...(lot.photoIds.length ? { photoIds: lot.photoIds } : {}) } : {}),
            ...(signal ? { signalId: signal.signal.id } : {}),
            ...(manual && v.supplierId ? { supplierId: v.supplierId } : {}),
            ...(manual && v.partId ? { partId: v.partId } : {}),
          });
          onCreated(n);
        }}
      >
        {() => (
          <>
            <TextField name="title" label="Title" required hint="One line: what is wrong" />
            <TextAreaField name="requirement" label="Requirement" required hint="What the drawing, plan or order requires" />
            <TextAreaField name="found" label="Found" required hint="What was found, with values and cores" rows={4} />
            <DefectCodePicker name="defectCodes" />
            <NumberField name="suspectQuantity" label="Suspect quantity" unit="cores" required hint={lot ? `Usually the whole lot (${lot.quantity})` : signal ? 'Cores made since the drift began, as far as known (lots on site and in transit)' : undefined} />
            {manual ? (
              <>
                <SelectField name="supplierId" label="Supplier" placeholder="No supplier (internal)" options={(suppliers.data?.items ?? []).map((x) => ({ value: x.id, label: `${x.code} · ${x.name}` }))} hint="Needed for a corrective action request" />
                <SelectField name="partId" label="Part" placeholder="No part" options={(parts.data?.items ?? []).map((x) => ({ value: x.id, label: `${x.partNumber} rev ${x.revision}` }))} />
              </>
            ) : null}
          </>
        )}
      </Form>
    </SidePanel>
  );
}
