import { useMemo } from 'react';
import { CATEGORY_LABELS, REQUIRED_SYSTEM_ROLES, SYSTEM_ROLES } from '../../../../shared/schemas/catalogue.schema';
import type { MerchantRoofSystem, Product } from '../../../../shared/schemas/price-list.schema';
import { Form, SelectField, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { useToast } from '../../../components/ui/toast';
import { useCreateRoofSystem } from '../api/create-roof-system';
import { useUpdateRoofSystem } from '../api/update-roof-system';
import { showingFieldDetails } from '../lib/form-values';
import { SaveOrCancel } from './save-or-cancel';
import { ROLE_WORDS, componentField, createRoofSystemFormSchema, updateRoofSystemFormSchema } from '../lib/roof-system-form';

/**
 * A roof system at a branch: a tile and the accessories laid with it, each picked from the merchant's
 * products of the same category. A system missing a needed part can be saved; it is not offered until whole.
 */
export function RoofSystemForm({ branchId, products, system = null, onDone }: { branchId: number; products: readonly Product[]; system?: MerchantRoofSystem | null; onDone?: () => void }) {
  const create = useCreateRoofSystem();
  const update = useUpdateRoofSystem(system?.id ?? 0);
  const toast = useToast();
  const extraValues = useMemo(() => (system ? {} : { branch_id: branchId }), [branchId, system]);
  const chosen = useMemo(() => new Map(system?.components.map((c) => [c.role, c.product_id]) ?? []), [system]);
  const form = useSchemaForm({
    schema: system ? updateRoofSystemFormSchema : createRoofSystemFormSchema,
    extraValues,
    onSubmit: showingFieldDetails(async (body, { reset }) => {
      // Only the new-system schema reads branch_id, so its presence says which body this is.
      const saved = 'branch_id' in body ? await create.mutateAsync(body) : await update.mutateAsync(body);
      const state = saved.offerable ? 'contractors can estimate with it.' : `it is not offered yet: ${saved.problems.join('; ')}.`;
      toast.show(`${saved.name} is ${system ? 'saved' : 'added'}; ${state}`, saved.offerable ? 'success' : 'info');
      if (!system) reset();
      onDone?.();
    }),
  });
  return (
    <Form form={form} label={system ? `Change ${system.name}` : 'Add a roof system'}>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField name="name" label="Name" maxLength={160} defaultValue={system?.name ?? ''} />
        <TextField name="description" label="Description (optional)" maxLength={500} defaultValue={system?.description ?? ''} />
      </div>
      <fieldset className="space-y-3">
        <legend className="mb-1 font-medium text-ink-900">Products</legend>
        <p className="text-sm text-ink-600">
          Each part is one of your products of that category. {REQUIRED_SYSTEM_ROLES.map((r) => ROLE_WORDS[r].toLowerCase()).join(', ')} are needed before contractors can estimate with it.
        </p>
        <div className="grid gap-4 sm:grid-cols-2">
          {SYSTEM_ROLES.map((role) => {
            const own = chosen.get(role);
            const options = products.filter((p) => p.category === role && (p.archived_at === null || p.id === own));
            const required = REQUIRED_SYSTEM_ROLES.includes(role);
            return (
              <SelectField
                key={role}
                name={componentField(role)}
                label={`${ROLE_WORDS[role]}${required ? '' : ' (optional)'}`}
                hint={options.length === 0 ? `No ${CATEGORY_LABELS[role].toLowerCase()} products in the catalogue yet.` : undefined}
                options={[{ value: '', label: 'None' }, ...options.map((p) => ({ value: String(p.id), label: `${p.sku} · ${p.name}${p.archived_at ? ' (archived)' : ''}` }))]}
                defaultValue={own === undefined ? '' : String(own)}
              />
            );
          })}
        </div>
      </fieldset>
      <SaveOrCancel submitLabel={system ? 'Save the roof system' : 'Add the roof system'} onCancel={onDone} />
    </Form>
  );
}
