import { Body1, Caption1, MessageBar, MessageBarBody, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { useMemo, type ReactNode } from 'react';
import { useWatch } from 'react-hook-form';
import {
  APPROVAL_STATUSES, createSupplierSchema, updateSupplierSchema,
  type CreateSupplierInput, type Supplier, type UpdateSupplierInput,
} from '@shared/schemas/master-data';
import { Form, TextField } from '../../../components/form';
import { formSchema, SelectField, StringListField, TextAreaField } from '../../../components/form-fields';
import { SidePanel } from '../../../components/side-panel';
import { Loading } from '../../../components/data-table';
import { useCreateSupplier, useUpdateSupplier } from '../api/suppliers';
import { APPROVAL_LABELS, ApprovalPill } from './approval-pill';
import { formatWhen } from '../../../lib/format';

const useStyles = makeStyles({
  fields: { display: 'flex', flexDirection: 'column', gap: '14px' },
  dl: { display: 'grid', gridTemplateColumns: '140px minmax(0, 1fr)', gap: '10px 16px', margin: 0 },
  dt: { color: tokens.colorNeutralForeground3 },
  dd: { margin: 0, overflowWrap: 'anywhere' },
  code: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 600 },
});

const statusOptions = APPROVAL_STATUSES.map((v) => ({ value: v, label: APPROVAL_LABELS[v] }));
const FORM_ID = 'supplier-form';

// A status other than "approved" always carries its reason, on create as on change.
const createWithReason = createSupplierSchema.superRefine((v, ctx) => {
  if (v.approvalStatus !== 'approved' && !v.approvalReason) ctx.addIssue({ code: 'custom', path: ['approvalReason'], message: 'Give the reason for a conditional or disapproved status' });
});

function ReasonField({ original }: { original?: Supplier }) {
  const status = useWatch({ name: 'approvalStatus' }) as string;
  const changed = original ? status !== original.approvalStatus : status !== 'approved';
  if (!changed) return original?.approvalReason ? <Caption1>Reason on record: {original.approvalReason}</Caption1> : null;
  return <TextAreaField name="approvalReason" label={original ? 'Why the approval status changes' : 'Reason for this status'} required hint="Kept in the history ledger with your name" />;
}

export function SupplierPanel({ mode, supplier, loading, error, onClose, onSaved }: {
  mode: 'create' | 'edit' | 'view' | null;
  supplier?: Supplier;
  loading?: boolean;
  error?: string;
  onClose: () => void;
  onSaved?: (s: Supplier) => void;
}) {
  const s = useStyles();
  const create = useCreateSupplier();
  const update = useUpdateSupplier();
  const editSchema = useMemo(
    () =>
      updateSupplierSchema.superRefine((v, ctx) => {
        if (supplier && v.approvalStatus !== supplier.approvalStatus && !v.approvalReason) ctx.addIssue({ code: 'custom', path: ['approvalReason'], message: 'Say why the approval status changes' });
      }),
    [supplier],
  );
  const open = mode !== null;
  const title = mode === 'create' ? 'New supplier' : supplier ? `${supplier.code} · ${supplier.name}` : 'Supplier';

  let body: ReactNode = null;
  if (mode === 'create') {
    body = (
      <Form<CreateSupplierInput>
        id={FORM_ID}
        schema={formSchema<CreateSupplierInput>(createWithReason)}
        defaultValues={{ code: '', name: '', contactEmails: [''], approvalStatus: 'approved', approvalReason: null, notes: null }}
        className={s.fields}
        aria-label="New supplier"
        onSubmit={async (v) => {
          const saved = await create.mutateAsync(v);
          onSaved?.(saved);
        }}
      >
        {() => (
          <>
            <TextField name="code" label="Code" required hint="2–16 letters, digits or dashes; unique" autoComplete="off" />
            <TextField name="name" label="Name" required />
            <StringListField name="contactEmails" label="Contact e-mails" itemLabel="Contact e-mail" addLabel="Add an e-mail" type="email" required />
            <SelectField name="approvalStatus" label="Approval status" options={statusOptions} required />
            <ReasonField />
            <TextAreaField name="notes" label="Notes" />
          </>
        )}
      </Form>
    );
  } else if (error) {
    body = <MessageBar intent="error" role="alert"><MessageBarBody>{error}</MessageBarBody></MessageBar>;
  } else if (loading || !supplier) {
    body = <Loading />;
  } else if (mode === 'view') {
    body = (
      <dl className={s.dl}>
        <dt className={s.dt}>Code</dt><dd className={mergeClasses(s.dd, s.code)}>{supplier.code}</dd>
        <dt className={s.dt}>Name</dt><dd className={s.dd}>{supplier.name}</dd>
        <dt className={s.dt}>Contacts</dt><dd className={s.dd}>{supplier.contactEmails.map((e) => <div key={e}>{e}</div>)}</dd>
        <dt className={s.dt}>Approval</dt><dd className={s.dd}><ApprovalPill status={supplier.approvalStatus} /></dd>
        <dt className={s.dt}>Reason</dt><dd className={s.dd}>{supplier.approvalReason ?? '—'}</dd>
        <dt className={s.dt}>Notes</dt><dd className={s.dd}>{supplier.notes ?? '—'}</dd>
        <dt className={s.dt}>Last changed</dt><dd className={s.dd}>{formatWhen(supplier.updatedAt)}</dd>
      </dl>
    );
  } else {
    body = (
      <Form<UpdateSupplierInput>
        key={`${supplier.id}:${supplier.version}`}
        id={FORM_ID}
        schema={formSchema<UpdateSupplierInput>(editSchema)}
        defaultValues={{ name: supplier.name, contactEmails: supplier.contactEmails, approvalStatus: supplier.approvalStatus, approvalReason: null, notes: supplier.notes, version: supplier.version }}
        className={s.fields}
        aria-label={`Edit supplier ${supplier.code}`}
        onSubmit={async (v) => {
          const changed = v.approvalStatus !== supplier.approvalStatus;
          // An unchanged status keeps the reason on record; sending null would erase it.
          const { approvalReason, ...rest } = v;
          const saved = await update.mutateAsync({ id: supplier.id, ...rest, ...(changed ? { approvalReason } : {}) });
          onSaved?.(saved);
        }}
      >
        {() => (
          <>
            <Body1>Code <span className={s.code}>{supplier.code}</span> (codes do not change)</Body1>
            {supplier.approvalStatus === 'disapproved' ? (
              <MessageBar intent="error"><MessageBarBody>Disapproved: no new lots can be received from this supplier.</MessageBarBody></MessageBar>
            ) : null}
            <TextField name="name" label="Name" required />
            <StringListField name="contactEmails" label="Contact e-mails" itemLabel="Contact e-mail" addLabel="Add an e-mail" type="email" required />
            <SelectField name="approvalStatus" label="Approval status" options={statusOptions} required />
            <ReasonField original={supplier} />
            <TextAreaField name="notes" label="Notes" />
          </>
        )}
      </Form>
    );
  }

  return (
    <SidePanel
      open={open}
      title={title}
      onClose={onClose}
      formId={FORM_ID}
      readOnly={mode === 'view' || (mode === 'edit' && !supplier)}
      submitLabel={mode === 'create' ? 'Add supplier' : 'Save changes'}
      submitting={create.isPending || update.isPending}
    >
      {body}
    </SidePanel>
  );
}
