import { useState } from 'react';
import { loginBodySchema } from '../../../../shared/schemas/auth.schema';
import type { SessionBody } from '../../../../shared/schemas/auth.schema';
import { Form, ShowPasswordToggle, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { useSignIn } from '../api/sign-in';

interface SignInFormProps {
  onSignedIn: (session: SessionBody) => void;
  defaultEmail?: string;
}

export function SignInForm({ onSignedIn, defaultEmail }: SignInFormProps) {
  const signIn = useSignIn();
  const [showPassword, setShowPassword] = useState(false);
  const form = useSchemaForm({
    schema: loginBodySchema,
    onSubmit: async (values) => onSignedIn(await signIn.mutateAsync(values)),
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
