import { Button, Caption1, Input, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { useState } from 'react';
import { createDefectCodeSchema, type CreateDefectCodeInput, type DefectCode } from '@shared/schemas/ncr';
import { Form, TextField } from '../../../components/form';
import { formSchema } from '../../../components/form-fields';
import { HeadCell, Loading, TableFrame } from '../../../components/data-table';
import { StatusPill } from '../../../components/status-pill';
import { useCreateDefectCode, useDefectCodes, useUpdateDefectCode } from '../api/ncrs';

const useStyles = makeStyles({
  add: { display: 'grid', gridTemplateColumns: '160px minmax(200px, 1fr) minmax(200px, 1.4fr) auto', gap: '10px', alignItems: 'end', marginBottom: '16px', '& .fui-Input': { minWidth: 0, width: '100%' }, '@media (max-width: 1000px)': { gridTemplateColumns: '1fr 1fr' } },
  code: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 700 },
  touch: { minHeight: '44px' },
  muted: { color: tokens.colorNeutralForeground3 },
  error: { color: tokens.colorPaletteRedForeground1 },
  actions: { display: 'flex', gap: '6px' },
});

function Row({ c, canEdit }: { c: DefectCode; canEdit: boolean }) {
  const s = useStyles();
  const update = useUpdateDefectCode();
  const [editing, setEditing] = useState(false);
  const [name, setName] = useState(c.name);
  const [error, setError] = useState<string | null>(null);
  const save = (patch: { name?: string; active?: boolean }) =>
    update.mutate({ id: c.id, version: c.version, ...patch }, { onSuccess: () => (setEditing(false), setError(null)), onError: (e) => setError(e.message) });
  return (
    <TableRow>
      <TableCell><span className={s.code}>{c.code}</span></TableCell>
      <TableCell>
        {editing ? <Input aria-label={`Name of ${c.code}`} value={name} onChange={(_, d) => setName(d.value)} /> : c.name}
        {error ? <Caption1 role="alert" className={s.error}> {error}</Caption1> : null}
      </TableCell>
      <TableCell className={s.muted}>{c.description ?? '—'}</TableCell>
      <TableCell>{c.active ? <StatusPill tone="ok">In use</StatusPill> : <StatusPill tone="neutral">Retired</StatusPill>}</TableCell>
      {canEdit ? (
        <TableCell>
          <div className={s.actions}>
            {editing ? (
              <>
                <Button size="small" appearance="primary" disabled={update.isPending || !name.trim()} onClick={() => save({ name: name.trim() })}>Save</Button>
                <Button size="small" onClick={() => (setEditing(false), setName(c.name))}>Cancel</Button>
              </>
            ) : (
              <>
                <Button size="small" onClick={() => setEditing(true)} aria-label={`Rename ${c.code}`}>Rename</Button>
                <Button size="small" disabled={update.isPending} onClick={() => save({ active: !c.active })} aria-label={`${c.active ? 'Retire' : 'Restore'} ${c.code}`}>{c.active ? 'Retire' : 'Restore'}</Button>
              </>
            )}
          </div>
        </TableCell>
      ) : null}
    </TableRow>
  );
}

/** Our own defect code list. Engineers add, rename and retire codes; codes are never deleted (NCRs cite them). */
export function DefectCodesSection({ canEdit }: { canEdit: boolean }) {
  const s = useStyles();
  const codes = useDefectCodes(true);
  const create = useCreateDefectCode();
  return (
    <>
      {canEdit ? (
        <Form<CreateDefectCodeInput>
          schema={formSchema<CreateDefectCodeInput>(createDefectCodeSchema)}
          defaultValues={{ code: '', name: '', description: null }}
          className={s.add}
          aria-label="Add a defect code"
          onSubmit={async (v, form) => {
            await create.mutateAsync({ ...v, description: v.description || null });
            form.reset({ code: '', name: '', description: null });
          }}
        >
          {(form) => (
            <>
              <TextField name="code" label="Code" required autoComplete="off" placeholder="2–16 letters, digits" />
              <TextField name="name" label="Name" required />
              <TextField name="description" label="Description" />
              <Button className={s.touch} appearance="primary" type="submit" disabled={form.formState.isSubmitting}>Add code</Button>
            </>
          )}
        </Form>
      ) : null}
      {codes.isPending ? (
        <Loading />
      ) : (
        <TableFrame>
          <Table aria-label="Defect codes" size="small">
            <TableHeader>
              <TableRow>
                <HeadCell>Code</HeadCell>
                <HeadCell>Name</HeadCell>
                <HeadCell>Description</HeadCell>
                <HeadCell>State</HeadCell>
                {canEdit ? <HeadCell>Change</HeadCell> : null}
              </TableRow>
            </TableHeader>
            <TableBody>
              {codes.data?.items.map((c) => <Row key={`${c.id}:${c.version}`} c={c} canEdit={canEdit} />)}
            </TableBody>
          </Table>
        </TableFrame>
      )}
    </>
  );
}
