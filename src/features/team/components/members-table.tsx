import { useMemo, useState } from 'react';
import type { ChangeEvent } from 'react';
import { ROLE_LABELS } from '../../../../shared/domain/roles';
import type { Role } from '../../../../shared/domain/roles';
import { updateMemberBodySchema } from '../../../../shared/schemas/members.schema';
import type { Member } from '../../../../shared/schemas/members.schema';
import { Form } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { useToast } from '../../../components/ui/toast';
import { formatDate } from '../../../lib/format';
import { useRemoveMember } from '../api/remove-member';
import { useUpdateMemberRole } from '../api/update-member-role';
import { focusOnShow } from '../../../lib/focus-on-show';

interface MembersTableProps {
  members: readonly Member[];
  currentUserId: number;
  /** Owners change roles and remove people; everyone else only reads. */
  canManage: boolean;
  /** The roles this organisation's kind allows. */
  assignableRoles: readonly Role[];
}

function RoleEditor({ member, assignableRoles }: { member: Member; assignableRoles: readonly Role[] }) {
  const [role, setRole] = useState<Role>(member.role);
  const update = useUpdateMemberRole();
  const toast = useToast();
  const form = useSchemaForm({
    schema: updateMemberBodySchema,
    onSubmit: async (body) => {
      try {
        const saved = await update.mutateAsync({ id: member.id, role: body.role });
        toast.show(`${saved.name} is now ${ROLE_LABELS[saved.role]}.`, 'success');
      } catch (error) {
        setRole(member.role);
        form.methods.setValue('role', member.role);
        toast.show(errorMessage(error), 'danger');
      }
    },
  });
  const selectId = `member-${member.id}-role`;

  return (
    <Form form={form} label={`Change the role of ${member.name}`} className="flex flex-wrap items-center gap-2">
      <label htmlFor={selectId} className="sr-only">
        Role of {member.name}
      </label>
      <select
        id={selectId}
        {...form.register('role', { onChange: (event: ChangeEvent<HTMLSelectElement>) => setRole(event.target.value as Role) })}
        value={role}
        className="min-h-tap rounded-md border border-ink-300 bg-white px-2"
      >
        {assignableRoles.map((option) => (
          <option key={option} value={option}>
            {ROLE_LABELS[option]}
          </option>
        ))}
      </select>
      {role !== member.role ? (
        <Button type="submit" variant="secondary" busy={update.isPending} aria-label={`Save role of ${member.name}`}>
          Save
        </Button>
      ) : null}
    </Form>
  );
}

function RemoveMember({ member }: { member: Member }) {
  const [confirming, setConfirming] = useState(false);
  const remove = useRemoveMember();
  const toast = useToast();

  if (!confirming) {
    return (
      <Button variant="ghost" onClick={() => setConfirming(true)} aria-label={`Remove ${member.name}`}>
        Remove
      </Button>
    );
  }
  return (
    <div role="group" aria-label={`Remove ${member.name}?`} className="flex flex-wrap items-center gap-2">
      <span className="text-sm font-medium">Remove {member.name}?</span>
      <Button
        variant="danger"
        busy={remove.isPending}
        ref={focusOnShow}
        onClick={() =>
          remove.mutate(member.id, {
            onSuccess: () => toast.show(`${member.name} no longer belongs to the organisation.`, 'success'),
            onError: (error) => {
              setConfirming(false);
              toast.show(errorMessage(error), 'danger');
            },
          })
        }
      >
        Yes, remove
      </Button>
      <Button variant="secondary" onClick={() => setConfirming(false)}>
        Keep
      </Button>
    </div>
  );
}

const helper = dataTableColumns<Member>();

/** Everyone in the organisation, sortable by any column; owners manage roles from here. */
export function MembersTable({ members, currentUserId, canManage, assignableRoles }: MembersTableProps) {
  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor('name', {
          header: 'Name',
          sortFn: 'text',
          cell: (info) => (
            <span className="font-medium">
              {info.getValue()}
              {info.row.original.id === currentUserId ? <span className="ml-1 text-sm font-normal text-ink-600">(you)</span> : null}
            </span>
          ),
        }),
        helper.accessor('email', {
          header: 'E-mail',
          sortFn: 'text',
          cell: (info) => <span className="whitespace-nowrap">{info.getValue()}</span>,
        }),
        helper.accessor((row) => ROLE_LABELS[row.role], {
          id: 'role',
          header: 'Role',
          sortFn: 'text',
          cell: (info) => (canManage ? <RoleEditor member={info.row.original} assignableRoles={assignableRoles} /> : info.getValue()),
        }),
        helper.accessor('created_at', {
          header: 'Member since',
          sortFn: 'alphanumeric',
          cell: (info) => <span className="whitespace-nowrap">{formatDate(info.getValue())}</span>,
        }),
        ...(canManage
          ? [
              helper.display({
                id: 'actions',
                header: () => <span className="sr-only">Actions</span>,
                cell: (info) => (info.row.original.id === currentUserId ? null : <RemoveMember member={info.row.original} />),
              }),
            ]
          : []),
      ]),
    [canManage, currentUserId, assignableRoles],
  );

  return <DataTable caption="Members" captionHidden columns={columns} data={members} getRowId={(member) => String(member.id)} initialSorting={[{ id: 'name', desc: false }]} />;
}
