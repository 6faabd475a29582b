import { createInvitationBodySchema } from '../../../../shared/schemas/members.schema';
import { OWNER_ROLE, ROLE_LABELS, kindOfRole } from '../../../../shared/domain/roles';
import type { Role } from '../../../../shared/domain/roles';
import { Form, SelectField, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Card } from '../../../components/ui/card';
import { useToast } from '../../../components/ui/toast';
import { useCreateInvitation } from '../api/create-invitation';

interface InviteMemberFormProps {
  /** Only the roles of this organisation's kind can be offered. */
  assignableRoles: readonly Role[];
}

/** Most invitations are for staff, so the owner role is never the preselected one. */
function defaultRole(roles: readonly Role[]): Role | undefined {
  return roles.find((role) => role !== OWNER_ROLE[kindOfRole(role)]) ?? roles[0];
}

export function InviteMemberForm({ assignableRoles }: InviteMemberFormProps) {
  const create = useCreateInvitation();
  const toast = useToast();
  const form = useSchemaForm({
    schema: createInvitationBodySchema,
    onSubmit: async (values, { reset }) => {
      const invitation = await create.mutateAsync(values);
      reset();
      toast.show(`Invitation sent to ${invitation.email}.`, 'success');
    },
  });

  return (
    <Card title="Invite someone">
      <Form form={form} label="Invite someone" className="space-y-4">
        <TextField name="email" label="E-mail" type="email" autoComplete="off" inputMode="email" />
        <div className="flex flex-wrap items-end gap-3">
          <SelectField name="role" label="Role" className="min-w-48 flex-1" defaultValue={defaultRole(assignableRoles)} options={assignableRoles.map((role) => ({ value: role, label: ROLE_LABELS[role] }))} />
          <SubmitButton>Send invitation</SubmitButton>
        </div>
      </Form>
      <p className="mt-3 text-sm text-ink-600">They get an e-mail with a link that works once. Until they accept, the invitation is listed under pending invitations and can be withdrawn.</p>
    </Card>
  );
}
