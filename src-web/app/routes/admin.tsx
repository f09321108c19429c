import {
  Badge, Button, Dropdown, Field, Option, Switch, Table, TableBody, TableCell, TableHeader, TableHeaderCell, TableRow,
  makeStyles, tokens, Subtitle2,
} from '@fluentui/react-components';
import { Controller } from 'react-hook-form';
import { createUserSchema, ROLE_LABELS, ROLES, type CreateUserInput, type Role } from '@shared/schemas/auth';
import { Page } from '../../components/page';
import { Form, TextField } from '../../components/form';
import { useCreateUser, useSupplierOptions, useUpdateUser, useUsers } from '../../features/users/api/users';

const useStyles = makeStyles({
  layout: { display: 'grid', gridTemplateColumns: 'minmax(0, 2fr) minmax(280px, 1fr)', gap: '28px', '@media (max-width: 1000px)': { gridTemplateColumns: '1fr' } },
  form: { display: 'flex', flexDirection: 'column', gap: '12px', padding: '16px', border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge },
});

export function AdminPage() {
  const s = useStyles();
  const users = useUsers();
  const suppliers = useSupplierOptions();
  const update = useUpdateUser();
  const create = useCreateUser();
  const supplierName = (id: string | null) => suppliers.data?.items.find((x) => x.id === id)?.name ?? '';
  return (
    <Page title="Admin" lead="Who may sign in, and in which role. Administrators manage access; they do not disposition lots.">
      <div className={s.layout}>
        <Table aria-label="Users" size="medium">
          <TableHeader>
            <TableRow>
              <TableHeaderCell>Name</TableHeaderCell>
              <TableHeaderCell>E-mail</TableHeaderCell>
              <TableHeaderCell>Role</TableHeaderCell>
              <TableHeaderCell>Active</TableHeaderCell>
            </TableRow>
          </TableHeader>
          <TableBody>
            {users.data?.items.map((u) => (
              <TableRow key={u.id}>
                <TableCell>{u.name}{u.lockedUntil ? <Badge color="warning" style={{ marginLeft: 8 }}>locked</Badge> : null}</TableCell>
                <TableCell>{u.email}</TableCell>
                <TableCell>
                  <Dropdown
                    aria-label={`Role of ${u.name}`}
                    value={ROLE_LABELS[u.role]}
                    selectedOptions={[u.role]}
                    disabled={u.role === 'supplier'}
                    onOptionSelect={(_, d) => d.optionValue && d.optionValue !== u.role && update.mutate({ id: u.id, role: d.optionValue as Role })}
                  >
                    {ROLES.filter((r) => r !== 'supplier').map((r) => <Option key={r} value={r}>{ROLE_LABELS[r]}</Option>)}
                  </Dropdown>
                  {u.role === 'supplier' ? <div style={{ fontSize: 12 }}>{supplierName(u.supplierId)}</div> : null}
                </TableCell>
                <TableCell>
                  <Switch aria-label={`${u.name} active`} checked={u.active} onChange={(_, d) => update.mutate({ id: u.id, active: d.checked })} />
                </TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
        <Form<CreateUserInput>
          schema={createUserSchema}
          defaultValues={{ email: '', name: '', role: 'inspector', password: '', supplierId: null }}
          className={s.form}
          aria-label="New user"
          onSubmit={async (v, form) => {
            await create.mutateAsync(v);
            form.reset();
          }}
        >
          {(form) => (
            <>
              <Subtitle2 as="h2">New user</Subtitle2>
              <TextField name="name" label="Name" required />
              <TextField name="email" label="E-mail" type="email" required />
              <Controller
                control={form.control}
                name="role"
                render={({ field, fieldState }) => (
                  <Field label="Role" required validationMessage={fieldState.error?.message}>
                    <Dropdown value={ROLE_LABELS[field.value]} selectedOptions={[field.value]} onOptionSelect={(_, d) => field.onChange(d.optionValue)}>
                      {ROLES.map((r) => <Option key={r} value={r}>{ROLE_LABELS[r]}</Option>)}
                    </Dropdown>
                  </Field>
                )}
              />
              {form.watch('role') === 'supplier' ? (
                <Controller
                  control={form.control}
                  name="supplierId"
                  render={({ field, fieldState }) => (
                    <Field label="Supplier" required validationState={fieldState.error ? 'error' : 'none'} validationMessage={fieldState.error?.message}>
                      <Dropdown value={supplierName(field.value ?? null)} selectedOptions={field.value ? [field.value] : []} onOptionSelect={(_, d) => field.onChange(d.optionValue)}>
                        {suppliers.data?.items.map((x) => <Option key={x.id} value={x.id}>{x.name}</Option>)}
                      </Dropdown>
                    </Field>
                  )}
                />
              ) : null}
              <TextField name="password" label="First password" type="password" hint="At least 12 characters; they change it after signing in" required />
              <Button appearance="primary" type="submit" disabled={form.formState.isSubmitting}>Create user</Button>
            </>
          )}
        </Form>
      </div>
    </Page>
  );
}
