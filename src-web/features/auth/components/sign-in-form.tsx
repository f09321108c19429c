import { Button, makeStyles, tokens } from '@fluentui/react-components';
import { loginSchema, type LoginInput } from '@shared/schemas/auth';
import { Form, TextField } from '../../../components/form';
import { useLogin } from '../api/login';

const useStyles = makeStyles({
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  submit: { minHeight: '44px', fontSize: tokens.fontSizeBase400 },
});

export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const s = useStyles();
  const login = useLogin();
  return (
    <Form<LoginInput>
      schema={loginSchema}
      defaultValues={{ email: '', password: '' }}
      aria-label="Sign in"
      className={s.form}
      onSubmit={async (values) => {
        await login.mutateAsync(values);
        onSignedIn();
      }}
    >
      {(form) => (
        <>
          <TextField name="email" label="E-mail" type="email" autoComplete="username" size="large" required autoFocus />
          <TextField name="password" label="Password" type="password" autoComplete="current-password" size="large" required />
          <Button appearance="primary" type="submit" className={s.submit} disabled={form.formState.isSubmitting}>
            {form.formState.isSubmitting ? 'Signing in…' : 'Sign in'}
          </Button>
        </>
      )}
    </Form>
  );
}
