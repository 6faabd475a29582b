import { useState } from 'react';
import { forgotPasswordBodySchema } from '../../../../shared/schemas/auth.schema';
import { Form, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Alert } from '../../../components/ui/alert';
import { useRequestPasswordReset } from '../api/forgot-password';

/** Asks for a reset link. The answer is the same whether or not an account uses the address. */
export function ForgotPasswordForm() {
  const request = useRequestPasswordReset();
  const [sentTo, setSentTo] = useState<string | null>(null);
  const form = useSchemaForm({
    schema: forgotPasswordBodySchema,
    onSubmit: async (values) => {
      await request.mutateAsync(values);
      setSentTo(values.email);
    },
  });

  if (sentTo) {
    return (
      <Alert tone="success" title="Check your inbox">
        If an account uses {sentTo}, an e-mail with a link to choose a new password is on its way. The link works once and stops working after a while; ask for a new one if it has.
      </Alert>
    );
  }

  return (
    <Form form={form} label="Forgotten password">
      <TextField name="email" label="E-mail" type="email" autoComplete="email" inputMode="email" />
      <SubmitButton size="lg" className="w-full">
        Send the link
      </SubmitButton>
    </Form>
  );
}
