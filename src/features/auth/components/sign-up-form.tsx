import { useState } from 'react';
import { signupBodySchema } from '../../../../shared/schemas/auth.schema';
import type { SessionBody } from '../../../../shared/schemas/auth.schema';
import { Form, RadioGroupField, ShowPasswordToggle, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { useSignUp } from '../api/sign-up';

const kindOptions = [
  { value: 'contractor', label: 'Roofing contractor', description: 'We measure roofs, estimate and order materials.' },
  { value: 'merchant', label: 'Tile merchant', description: 'We sell from branches and deliver to site.' },
] as const;

interface SignUpFormProps {
  onSignedUp: (session: SessionBody) => void;
}

export function SignUpForm({ onSignedUp }: SignUpFormProps) {
  const signUp = useSignUp();
  const [showPassword, setShowPassword] = useState(false);
  const form = useSchemaForm({
    schema: signupBodySchema,
    onSubmit: async (values) => onSignedUp(await signUp.mutateAsync(values)),
  });

  return (
    <Form form={form} label="Create an account">
      <TextField name="organisation_name" label="Firm name" autoComplete="organization" />
      <RadioGroupField name="kind" legend="Your firm is a" options={kindOptions} />
      <TextField name="name" label="Your name" autoComplete="name" />
      <TextField name="email" label="E-mail" type="email" autoComplete="email" inputMode="email" />
      <div>
        <TextField name="password" label="Password" type={showPassword ? 'text' : 'password'} autoComplete="new-password" hint="At least 10 characters. A few unrelated words make a strong one." />
        <ShowPasswordToggle shown={showPassword} onChange={setShowPassword} />
      </div>
      <SubmitButton size="lg" className="w-full">
        Create the account
      </SubmitButton>
    </Form>
  );
}
