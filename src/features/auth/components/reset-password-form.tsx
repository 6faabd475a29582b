import { useMemo, useState } from 'react';
import { resetPasswordBodySchema } from '../../../../shared/schemas/auth.schema';
import { Form, ShowPasswordToggle, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { useResetPassword } from '../api/reset-password';

interface ResetPasswordFormProps {
  token: string;
  onDone: () => void;
}

export function ResetPasswordForm({ token, onDone }: ResetPasswordFormProps) {
  const reset = useResetPassword();
  const [showPassword, setShowPassword] = useState(false);
  const extraValues = useMemo(() => ({ token }), [token]);
  const form = useSchemaForm({
    schema: resetPasswordBodySchema,
    extraValues,
    onSubmit: async (values) => {
      await reset.mutateAsync(values);
      onDone();
    },
  });

  return (
    <Form form={form} label="Choose a new password">
      <div>
        <TextField name="password" label="New password" type={showPassword ? 'text' : 'password'} autoComplete="new-password" hint="At least 10 characters." />
        <ShowPasswordToggle shown={showPassword} onChange={setShowPassword} />
      </div>
      <SubmitButton size="lg" className="w-full">
        Save the new password
      </SubmitButton>
    </Form>
  );
}
