import { useState } from 'react';
import { loginBodySchema } from '../../../../shared/schemas/auth.schema';
import type { SessionBody } from '../../../../shared/schemas/auth.schema';
import { Form, ShowPasswordToggle, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { signIn } from '../api/sign-in';

interface SignInFormProps {
  /** Takes the new session on to the next page; the button stays busy until it settles. */
  onSignedIn: (session: SessionBody) => Promise<unknown> | unknown;
  defaultEmail?: string;
}

export function SignInForm({ onSignedIn, defaultEmail }: SignInFormProps) {
  const [showPassword, setShowPassword] = useState(false);
  const form = useSchemaForm({
    schema: loginBodySchema,
    onSubmit: async (values) => onSignedIn(await signIn(values)),
  });

  return (
    <Form form={form} label="Sign in">
      <TextField name="email" label="E-mail" type="email" autoComplete="username" inputMode="email" defaultValue={defaultEmail} />
      <div>
        <TextField name="password" label="Password" type={showPassword ? 'text' : 'password'} autoComplete="current-password" />
        <ShowPasswordToggle shown={showPassword} onChange={setShowPassword} />
      </div>
      <SubmitButton size="lg" className="w-full">
        Sign in
      </SubmitButton>
    </Form>
  );
}
