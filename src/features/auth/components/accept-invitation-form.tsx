import { useState } from 'react';
import { acceptInvitationBodySchema } from '../../../../shared/schemas/auth.schema';
import type { SessionBody } from '../../../../shared/schemas/auth.schema';
import { ROLE_LABELS } from '../../../../shared/domain/roles';
import { Form, ShowPasswordToggle, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Alert, ErrorAlert } from '../../../components/ui/alert';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { isApiError } from '../../../lib/api-client';
import { useAcceptInvitation } from '../api/accept-invitation';
import { useInvitationPreview } from '../api/get-invitation-preview';

interface AcceptInvitationProps {
  token: string;
  onAccepted: (session: SessionBody) => void;
}

const kindWords = { contractor: 'roofing contractor', merchant: 'tile merchant' } as const;

/** Shows who is inviting whom, then asks the invited person for a name and a password. */
export function AcceptInvitation({ token, onAccepted }: AcceptInvitationProps) {
  const preview = useInvitationPreview(token);
  const accept = useAcceptInvitation(token);
  const [showPassword, setShowPassword] = useState(false);
  const form = useSchemaForm({
    schema: acceptInvitationBodySchema,
    onSubmit: async (values) => onAccepted(await accept.mutateAsync(values)),
  });

  if (preview.isPending) return <SkeletonBlock label="Loading the invitation" lines={4} />;
  if (preview.isError) {
    if (isApiError(preview.error) && (preview.error.status === 404 || preview.error.code === 'token_invalid')) {
      return (
        <Alert tone="danger" title="This invitation cannot be used">
          The link is unknown, has been used already or has expired. Ask the person who invited you to send a new one.
        </Alert>
      );
    }
    return <ErrorAlert error={preview.error} title="The invitation could not be loaded" onRetry={() => void preview.refetch()} />;
  }

  const { email, role, organisation } = preview.data;
  return (
    <div className="space-y-6">
      <dl className="grid gap-3 rounded-md border border-mortar-300 bg-mortar-50 p-4 sm:grid-cols-[auto_1fr] sm:gap-x-6">
        <dt className="text-sm font-medium text-ink-600">Firm</dt>
        <dd className="font-semibold text-ink-900">
          {organisation.name} <span className="font-normal text-ink-600">({kindWords[organisation.kind]})</span>
        </dd>
        <dt className="text-sm font-medium text-ink-600">Your role</dt>
        <dd className="font-semibold text-ink-900">{ROLE_LABELS[role]}</dd>
        <dt className="text-sm font-medium text-ink-600">E-mail</dt>
        <dd className="font-semibold break-all text-ink-900">{email}</dd>
      </dl>
      <Form form={form} label="Accept the invitation">
        <TextField name="name" label="Your name" autoComplete="name" />
        <div>
          <TextField name="password" label="Choose a password" type={showPassword ? 'text' : 'password'} autoComplete="new-password" hint="At least 10 characters." />
          <ShowPasswordToggle shown={showPassword} onChange={setShowPassword} />
        </div>
        <SubmitButton size="lg" className="w-full">
          Join {organisation.name}
        </SubmitButton>
      </Form>
    </div>
  );
}
