import {
  Body1,
  Button,
  Caption1,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  Field,
  Input,
  Select,
  makeStyles,
  tokens,
} from '@fluentui/react-components';
import { useQuery } from '@tanstack/react-query';
import { useRef, useState } from 'react';
import { useController, useFormContext, useWatch } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { samplingPlan, zeroAcceptancePlan } from '@shared/compute/sampling';
import type { Part, Plan, Supplier } from '@shared/schemas/master-data';
import { PACKAGING, createLotSchema, type CreateLotInput } from '@shared/schemas/receiving';
import { Form, TextField } from '../../../components/form';
import { NumberField, TextAreaField, formSchema } from '../../../components/form-fields';
import { StatusPill } from '../../../components/status-pill';
import { paths } from '../../../config/paths';
import { ApiError } from '../../../lib/api-client';
import { useParts } from '../../parts/api/parts';
import { getPlanQueryOptions } from '../../plans/api/plans';
import { useSuppliers } from '../../suppliers/api/suppliers';
import { useAttachCertificate, useReceiveLot, useSwitching } from '../api/lots';
import { SEVERITY_LABELS } from './sampling-box';

const useStyles = makeStyles({
  surface: { maxWidth: '880px', width: '96vw' },
  grid: { display: 'grid', gridTemplateColumns: 'repeat(2, minmax(0, 1fr))', gap: '14px 18px', alignItems: 'start', '@media (max-width: 700px)': { gridTemplateColumns: 'minmax(0, 1fr)' } },
  wide: { gridColumn: '1 / -1' },
  touch: { minHeight: '44px' },
  chips: { display: 'flex', flexWrap: 'wrap', gap: '6px', marginTop: '6px' },
  chip: {
    display: 'inline-flex',
    alignItems: 'center',
    gap: '4px',
    padding: '0 4px 0 10px',
    minHeight: '32px',
    borderRadius: '999px',
    backgroundColor: tokens.colorBrandBackground2,
    color: tokens.colorBrandForeground2,
    fontFamily: tokens.fontFamilyMonospace,
    fontWeight: 600,
  },
  chipX: { minWidth: '32px', minHeight: '32px', borderRadius: '999px', border: 'none', background: 'transparent', color: 'inherit', cursor: 'pointer', fontSize: '16px', ':focus-visible': { outline: `2px solid ${tokens.colorBrandStroke1}` } },
  chipRow: { display: 'flex', gap: '8px' },
  preview: {
    gridColumn: '1 / -1',
    display: 'flex',
    gap: '12px',
    alignItems: 'center',
    flexWrap: 'wrap',
    padding: '10px 14px',
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground3,
    minHeight: '52px',
  },
  previewBig: { fontSize: tokens.fontSizeBase500, fontWeight: 700 },
  muted: { color: tokens.colorNeutralForeground3 },
  select: { minWidth: 0, width: '100%' },
  selectInner: { height: '44px', maxWidth: '100%', textOverflow: 'ellipsis' },
  hidden: { display: 'none' },
  file: { display: 'flex', gap: '10px', alignItems: 'center', flexWrap: 'wrap' },
  fileName: { fontWeight: 600, overflowWrap: 'anywhere' },
});

type ReceiveForm = CreateLotInput;
export const PACKAGING_LABELS: Record<(typeof PACKAGING)[number], string> = { good: 'Good', damaged: 'Damaged', wet: 'Wet or rusty', poor: 'Poor (loose, unprotected)' };
const MAX_CERT_MB = 20;

/** A select whose options may be disabled with the reason, bound to the surrounding Form. */
function ChoiceField({ name, label, hint, options, placeholder, required }: { name: string; label: string; hint?: string; placeholder?: string; required?: boolean; options: { value: string; label: string; disabled?: boolean }[] }) {
  const s = useStyles();
  const { control } = useFormContext();
  const { field, fieldState } = useController({ name, control });
  return (
    <Field label={label} required={required} hint={hint} validationState={fieldState.error ? 'error' : 'none'} validationMessage={fieldState.error?.message}>
      <Select className={s.select} select={{ className: s.selectInner }} name={field.name} value={(field.value as string | undefined) ?? ''} onChange={(_, d) => field.onChange(d.value || undefined)} onBlur={field.onBlur} ref={field.ref}>
        {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
        {options.map((o) => (
          <option key={o.value} value={o.value} disabled={o.disabled}>{o.label}</option>
        ))}
      </Select>
    </Field>
  );
}

const pad = (n: number) => String(n).padStart(2, '0');
/** A Date as the value of a datetime-local input (local time, to the minute). */
const toLocalInput = (d: Date) => `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;

/** When the lot arrived: local time on screen, an ISO instant in the form (what the schema takes). */
function ReceivedAtField() {
  const { control } = useFormContext();
  const { field, fieldState } = useController({ name: 'receivedAt', control });
  const value = typeof field.value === 'string' && !Number.isNaN(Date.parse(field.value)) ? toLocalInput(new Date(field.value)) : '';
  return (
    <Field label="Received" hint="Leave as is for now; change it for a lot that arrived earlier." validationState={fieldState.error ? 'error' : 'none'} validationMessage={fieldState.error?.message}>
      <Input
        type="datetime-local"
        className={useStyles().touch}
        value={value}
        max={toLocalInput(new Date())}
        onChange={(_, d) => field.onChange(d.value ? new Date(d.value).toISOString() : undefined)}
        onBlur={field.onBlur}
      />
    </Field>
  );
}

/** Heat or coil numbers as chips: type one, Enter (or comma) adds it. */
function HeatNumbersField() {
  const s = useStyles();
  const { control } = useFormContext();
  const { field, fieldState } = useController({ name: 'heatNumbers', control });
  const list = (field.value as string[] | undefined) ?? [];
  const [text, setText] = useState('');
  const add = () => {
    const parts = text.split(/[,;\s]+/).map((x) => x.trim()).filter(Boolean);
    const next = [...list, ...parts.filter((x) => !list.includes(x))].slice(0, 20);
    if (parts.length) field.onChange(next);
    setText('');
  };
  return (
    <Field
      className={s.wide}
      label="Heat / coil numbers"
      hint="From the mill certificate; Enter adds each one."
      validationState={fieldState.error ? 'error' : 'none'}
      validationMessage={fieldState.error?.message ?? (Array.isArray(fieldState.error) ? 'Each heat number is 1–40 characters' : undefined)}
    >
      <div>
        <div className={s.chipRow}>
          <Input
            className={s.touch}
            style={{ flexGrow: 1 }}
            value={text}
            aria-label="Heat or coil number"
            placeholder="e.g. H24-0817"
            maxLength={40}
            onChange={(_, d) => setText(d.value)}
            onKeyDown={(e) => {
              if (e.key === 'Enter' || e.key === ',') {
                e.preventDefault();
                add();
              } else if (e.key === 'Backspace' && !text && list.length) field.onChange(list.slice(0, -1));
            }}
            onBlur={() => {
              if (text.trim()) add();
              field.onBlur();
            }}
          />
          <Button className={s.touch} onClick={add} disabled={!text.trim()}>Add</Button>
        </div>
        {list.length ? (
          <ul className={s.chips} aria-label="Heat numbers" style={{ listStyle: 'none', padding: 0, margin: '6px 0 0' }}>
            {list.map((h) => (
              <li key={h} className={s.chip}>
                {h}
                <button type="button" className={s.chipX} aria-label={`Remove ${h}`} onClick={() => field.onChange(list.filter((x) => x !== h))}>×</button>
              </li>
            ))}
          </ul>
        ) : null}
      </div>
    </Field>
  );
}

/** What the pallet will be sampled at, before receiving: the same ISO 2859-1 functions the server uses. */
function SamplingPreview({ parts, suppliers }: { parts: Part[]; suppliers: Supplier[] }) {
  const s = useStyles();
  const [partId, supplierId, quantity] = useWatch({ name: ['partId', 'supplierId', 'quantity'] }) as [string | undefined, string | undefined, unknown];
  const part = parts.find((p) => p.id === partId);
  const supplier = suppliers.find((x) => x.id === supplierId);
  const plan = useQuery({ ...getPlanQueryOptions(part?.activePlanId ?? ''), enabled: !!part?.activePlanId });
  const sw = useSwitching(supplier?.id, part?.id);
  const qty = typeof quantity === 'number' && Number.isInteger(quantity) && quantity >= 1 ? quantity : null;
  if (!part || !qty) return <div className={s.preview}><Caption1 className={s.muted}>Choose the part and enter the quantity to see how many cores to pull.</Caption1></div>;
  if (plan.isPending || (supplier && sw.isPending)) return <div className={s.preview}><Caption1>Working out the sample…</Caption1></div>;
  if (sw.data?.state.discontinued) {
    return (
      <div className={s.preview}>
        <StatusPill tone="bad">Acceptance stopped</StatusPill>
        <Body1>Five lots were not accepted on tightened inspection. An engineer must record {supplier?.name}&apos;s corrective action before this part is received from them.</Body1>
      </div>
    );
  }
  const p = plan.data as Plan | undefined;
  if (!p) return null;
  const severity = sw.data?.state.severity ?? 'normal';
  let text: string;
  let detail: string;
  try {
    if (p.samplingKind === 'zero-acceptance') {
      const z = zeroAcceptancePlan({ lotSize: qty, sampleSize: p.zeroSampleSize ?? 1 });
      text = `${z.sampleSize} core${z.sampleSize === 1 ? '' : 's'}${z.inspectAll ? ' (100 %)' : ''}`;
      detail = 'Zero acceptance: Ac 0 / Re 1';
    } else if (qty < 2) {
      text = '1 core (100 %)';
      detail = 'A lot of one core is simply inspected';
    } else {
      const sp = samplingPlan({ lotSize: qty, level: p.inspectionLevel as never, aql: p.aql as never, severity });
      text = `${sp.sampleSize} core${sp.sampleSize === 1 ? '' : 's'}${sp.inspectAll ? ' (100 %)' : ''}`;
      detail = `Code letter ${sp.codeLetter}, plan ${sp.planLetter} · Ac ${sp.accept} / Re ${sp.reject} · ${SEVERITY_LABELS[severity].toLowerCase()} inspection · level ${p.inspectionLevel}, AQL ${p.aql}`;
    }
  } catch (err) {
    return <div className={s.preview}><Caption1>{(err as Error).message}</Caption1></div>;
  }
  return (
    <div className={s.preview} aria-label="Expected sampling">
      <span className={s.previewBig}>Sample {text}</span>
      <Body1>{detail}</Body1>
      <Caption1 className={s.muted}>Plan revision {p.revision}. Stored with the lot when it is received.</Caption1>
    </div>
  );
}

/**
 * Receiving a lot at the dock: who shipped it, which part revision, the paperwork and the
 * pallet's condition. The sample is computed and the sampled cores created on receipt.
 */
export function ReceiveLotDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  const s = useStyles();
  const navigate = useNavigate();
  const suppliers = useSuppliers({ page: 1, pageSize: 200, sort: 'code' });
  const parts = useParts({ page: 1, pageSize: 200, sort: 'partNumber' });
  const receive = useReceiveLot();
  const attach = useAttachCertificate();
  const certInput = useRef<HTMLInputElement>(null);
  const [certFile, setCertFile] = useState<File | null>(null);
  const [certError, setCertError] = useState<string | null>(null);

  const supplierList = suppliers.data?.items ?? [];
  const partList = parts.data?.items ?? [];
  const noPlan = partList.filter((p) => !p.activePlanId).length;
  const barred = supplierList.filter((x) => x.approvalStatus === 'disapproved').length;

  const close = () => {
    setCertFile(null);
    setCertError(null);
    onClose();
  };

  return (
    <Dialog open={open} onOpenChange={(_, d) => !d.open && close()}>
      <DialogSurface className={s.surface} aria-label="Receive a lot">
        {open ? (
          <Form<ReceiveForm>
            schema={formSchema<ReceiveForm>(createLotSchema)}
            defaultValues={{ supplierLotNumber: '', poNumber: '', packagingCondition: 'good', heatNumbers: [], receivedAt: new Date().toISOString() }}
            aria-label="Receive a lot"
            onSubmit={async (v) => {
              const lot = await receive.mutateAsync({ ...v, poNumber: v.poNumber?.trim() || null, packagingNote: v.packagingNote?.trim() || null });
              let refused: string | null = null;
              if (certFile) {
                try {
                  await attach.mutateAsync({ id: lot.id, file: certFile });
                } catch (err) {
                  refused = err instanceof ApiError ? err.message : 'The certificate could not be attached.';
                }
              }
              close();
              void navigate(paths.lot(lot.id), { state: { received: true, certError: refused } });
            }}
          >
            {(form) => (
              <DialogBody>
                <DialogTitle>Receive a lot</DialogTitle>
                <DialogContent className={s.grid}>
                  <ChoiceField
                    required
                    name="supplierId"
                    label="Supplier"
                    placeholder={suppliers.isPending ? 'Loading suppliers…' : 'Choose the supplier…'}
                    hint={(() => {
                      const sel = supplierList.find((x) => x.id === form.watch('supplierId'));
                      if (sel?.approvalStatus === 'conditional') return `Conditionally approved${sel.approvalReason ? `: ${sel.approvalReason}` : ''}.`;
                      return barred ? `${barred} disapproved supplier${barred === 1 ? ' is' : 's are'} listed but cannot ship lots.` : undefined;
                    })()}
                    options={supplierList.map((x) => ({
                      value: x.id,
                      disabled: x.approvalStatus === 'disapproved',
                      label: `${x.code} — ${x.name}${x.approvalStatus === 'conditional' ? ' (conditional)' : x.approvalStatus === 'disapproved' ? ` · disapproved${x.approvalReason ? `: ${x.approvalReason}` : ''}` : ''}`,
                    }))}
                  />
                  <ChoiceField
                    required
                    name="partId"
                    label="Part revision"
                    placeholder={parts.isPending ? 'Loading parts…' : 'Choose the part revision…'}
                    hint={noPlan ? `${noPlan} part revision${noPlan === 1 ? ' has' : 's have'} no active inspection plan and cannot be received yet; an engineer activates one in Plans & parts.` : undefined}
                    options={partList.map((p) => ({
                      value: p.id,
                      disabled: !p.activePlanId,
                      label: `${p.partNumber} rev ${p.revision} — ${p.description}${p.activePlanId ? '' : ' · no active plan'}`,
                    }))}
                  />
                  <TextField name="supplierLotNumber" label="Supplier lot number" required className={s.touch} autoComplete="off" />
                  <TextField name="poNumber" label="PO number" className={s.touch} autoComplete="off" />
                  <NumberField name="quantity" label="Quantity" unit="cores" required className={s.touch} />
                  <ReceivedAtField />
                  <HeatNumbersField />
                  <ChoiceField name="packagingCondition" label="Packaging condition" options={PACKAGING.map((p) => ({ value: p, label: PACKAGING_LABELS[p] }))} />
                  <TextAreaField name="packagingNote" label="Packaging note" rows={2} hint={form.watch('packagingCondition') !== 'good' ? 'Describe what you see; add photos on the Lot file.' : undefined} />
                  <Field
                    className={s.wide}
                    label="Certificate of conformance"
                    hint="PDF or photo of the certificate, up to 20 MB. It can also be attached later on the Lot file."
                    validationState={certError ? 'error' : 'none'}
                    validationMessage={certError ?? undefined}
                  >
                    <div className={s.file}>
                      <Button className={s.touch} onClick={() => certInput.current?.click()}>{certFile ? 'Choose another…' : 'Choose file…'}</Button>
                      {certFile ? (
                        <>
                          <span className={s.fileName}>{certFile.name}</span>
                          <Button className={s.touch} appearance="subtle" onClick={() => setCertFile(null)} aria-label={`Remove ${certFile.name}`}>Remove</Button>
                        </>
                      ) : (
                        <Caption1 className={s.muted}>None chosen</Caption1>
                      )}
                      <input
                        ref={certInput}
                        className={s.hidden}
                        aria-label="Certificate of conformance"
                        type="file"
                        accept="application/pdf,image/jpeg,image/png,image/webp"
                        onChange={(e) => {
                          const f = e.target.files?.[0] ?? null;
                          e.target.value = '';
                          if (f && f.size > MAX_CERT_MB * 1024 * 1024) {
                            setCertError(`${f.name} is ${(f.size / 1048576).toFixed(1)} MB; a certificate may be at most ${MAX_CERT_MB} MB.`);
                            setCertFile(null);
                            return;
                          }
                          setCertError(null);
                          setCertFile(f);
                        }}
                      />
                    </div>
                  </Field>
                  <SamplingPreview parts={partList} suppliers={supplierList} />
                </DialogContent>
                <DialogActions>
                  <Button className={s.touch} onClick={close}>Cancel</Button>
                  <Button className={s.touch} appearance="primary" type="submit" disabled={form.formState.isSubmitting}>
                    {form.formState.isSubmitting ? 'Receiving…' : 'Receive lot'}
                  </Button>
                </DialogActions>
              </DialogBody>
            )}
          </Form>
        ) : null}
      </DialogSurface>
    </Dialog>
  );
}
