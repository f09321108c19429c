import { Body1, Button, Caption1, Checkbox, Dialog, DialogActions, DialogBody, DialogContent, DialogSurface, DialogTitle, Field, Table, TableBody, TableCell, TableHeader, TableHeaderCell, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { useMemo } from 'react';
import { useController, useFormContext } from 'react-hook-form';
import { z } from 'zod';
import { checkSplit, lineCost } from '@shared/compute/disposition';
import { DISPOSITION_LABELS, SIGNATURE_MEANINGS, countersignatureSchema, signatureSchema, type DispositionLineInput, type Ncr } from '@shared/schemas/ncr';
import type { SessionUser } from '@shared/schemas/auth';
import { Form, TextField } from '../../../components/form';
import { formSchema } from '../../../components/form-fields';
import { useDisposition } from '../api/ncrs';
import { formatMoney } from './ncr-status';

const useStyles = makeStyles({
  body: { display: 'flex', flexDirection: 'column', gap: '14px' },
  surface: { maxWidth: '640px', width: 'calc(100vw - 32px)' },
  statement: { border: `2px solid ${tokens.colorBrandStroke1}`, borderRadius: tokens.borderRadiusMedium, padding: '8px 10px', backgroundColor: tokens.colorBrandBackground2 },
  second: { borderTop: `1px solid ${tokens.colorNeutralStroke2}`, paddingTop: '12px', display: 'flex', flexDirection: 'column', gap: '10px' },
  muted: { color: tokens.colorNeutralForeground3 },
  num: { textAlign: 'right', fontVariantNumeric: 'tabular-nums' },
  touch: { minHeight: '44px' },
});

/** A checkbox that states the meaning of a signature in words; checked = the exact statement. */
function MeaningCheckbox({ name, meaning }: { name: string; meaning: string }) {
  const s = useStyles();
  const { control } = useFormContext();
  const { field, fieldState } = useController({ name, control });
  return (
    <Field validationState={fieldState.error ? 'error' : 'none'} validationMessage={fieldState.error?.message} className={s.statement}>
      <Checkbox checked={field.value === meaning} onChange={(_, d) => field.onChange(d.checked ? meaning : '')} label={<strong>{meaning}</strong>} ref={field.ref} />
    </Field>
  );
}

interface SignValues {
  signature: { password: string; meaning: string };
  countersignature?: { email: string; password: string; meaning: string };
}

/**
 * The e-signature: the signer sees exactly what is signed, states its meaning and re-enters the
 * password. A wrong password is shown here (401) and nothing is saved.
 */
export function ESignDialog({ ncr, lines, me, open, onClose, onSigned }: { ncr: Ncr; lines: DispositionLineInput[]; me: SessionUser; open: boolean; onClose: () => void; onSigned: () => void }) {
  const s = useStyles();
  const sign = useDisposition();
  const needSecond = ncr.reviewBoard.countersignUseAsIs && lines.some((l) => l.kind === 'use-as-is');
  const schema = useMemo(() => z.object({ signature: signatureSchema, ...(needSecond ? { countersignature: countersignatureSchema } : {}) }), [needSecond]);
  const split = checkSplit(lines.map((l) => ({ ...l, quantity: Number(l.quantity) })), ncr.suspectQuantity);
  return (
    <Dialog open={open} modalType="alert" onOpenChange={(_, d) => !d.open && onClose()}>
      <DialogSurface className={s.surface} aria-label="Sign the disposition">
        <Form<SignValues>
          schema={formSchema<SignValues>(schema)}
          defaultValues={{ signature: { password: '', meaning: '' }, ...(needSecond ? { countersignature: { email: '', password: '', meaning: '' } } : {}) }}
          aria-label="E-signature"
          onSubmit={async (v) => {
            await sign.mutateAsync({ id: ncr.id, version: ncr.version, lines, signature: v.signature as never, ...(v.countersignature ? { countersignature: v.countersignature as never } : {}) });
            onSigned();
          }}
        >
          {(form) => (
            <DialogBody>
              <DialogTitle>Sign the disposition of {ncr.number}</DialogTitle>
              <DialogContent className={s.body}>
                <Body1>You sign these lines as <strong>{me.name}</strong>. The record keeps your name, the time, the statement below and a SHA-256 fingerprint of exactly these lines.</Body1>
                <Table size="small" aria-label="What is signed">
                  <TableHeader>
                    <TableRow>
                      <TableHeaderCell>Disposition</TableHeaderCell>
                      <TableHeaderCell className={s.num}>Cores</TableHeaderCell>
                      <TableHeaderCell className={s.num}>Cost</TableHeaderCell>
                    </TableRow>
                  </TableHeader>
                  <TableBody>
                    {lines.map((l, i) => (
                      <TableRow key={i}>
                        <TableCell>{DISPOSITION_LABELS[l.kind]}{l.concessionRef ? ` · ${l.concessionRef}` : ''}</TableCell>
                        <TableCell className={s.num}>{l.quantity}</TableCell>
                        <TableCell className={s.num}>{formatMoney(safeCost(l))}</TableCell>
                      </TableRow>
                    ))}
                    <TableRow>
                      <TableCell><strong>Total</strong></TableCell>
                      <TableCell className={s.num}><strong>{split.assigned}</strong></TableCell>
                      <TableCell className={s.num}><strong>{formatMoney(split.totalCost)}</strong></TableCell>
                    </TableRow>
                  </TableBody>
                </Table>
                <MeaningCheckbox name="signature.meaning" meaning={SIGNATURE_MEANINGS.disposition} />
                <TextField name="signature.password" label="Your password" type="password" autoComplete="current-password" required />
                {needSecond ? (
                  <div className={s.second}>
                    <Body1><strong>Concession: a second engineer signs too.</strong> They enter their own e-mail and password here.</Body1>
                    <TextField name="countersignature.email" label="Second engineer’s e-mail" type="email" autoComplete="off" required />
                    <TextField name="countersignature.password" label="Second engineer’s password" type="password" autoComplete="off" required />
                    <MeaningCheckbox name="countersignature.meaning" meaning={SIGNATURE_MEANINGS.concession} />
                  </div>
                ) : null}
                <Caption1 className={s.muted}>Signed records cannot be changed afterwards. If someone else records a disposition first, you are told and nothing of yours is saved.</Caption1>
              </DialogContent>
              <DialogActions>
                <Button className={s.touch} onClick={onClose} disabled={form.formState.isSubmitting}>Cancel</Button>
                <Button className={s.touch} appearance="primary" type="submit" disabled={form.formState.isSubmitting}>{form.formState.isSubmitting ? 'Signing…' : 'Sign and record'}</Button>
              </DialogActions>
            </DialogBody>
          )}
        </Form>
      </DialogSurface>
    </Dialog>
  );
}

function safeCost(l: DispositionLineInput): number {
  try {
    return lineCost(l);
  } catch {
    return 0;
  }
}
