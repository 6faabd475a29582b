import type { Lorry } from '../../../../shared/schemas/fleet.schema';
import { CheckboxField, Form, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Alert } from '../../../components/ui/alert';
import { useToast } from '../../../components/ui/toast';
import { useSaveLorry } from '../api/save-lorry';
import { lorryFormSchema } from '../lib/lorry-form';

/** Adding a lorry to a branch, or changing one (`lorry` given): what it carries decides which orders its slots take. */
export function LorryForm({ branchId, lorry, onDone }: { branchId: number; lorry?: Lorry; onDone?: () => void }) {
  const save = useSaveLorry(branchId, lorry?.id);
  const toast = useToast();
  const form = useSchemaForm({
    schema: lorryFormSchema,
    onSubmit: async (body, { reset }) => {
      const saved = await save.mutateAsync(body);
      toast.show(lorry ? `${saved.registration} is updated.` : `${saved.registration} is added.`, 'success');
      if (!lorry) reset();
      onDone?.();
    },
  });
  return (
    <Form form={form} label={lorry ? `Change ${lorry.registration}` : 'Add a lorry'}>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField name="registration" label="Registration" autoComplete="off" maxLength={20} defaultValue={lorry?.registration ?? ''} />
        <TextField name="name" label="Name on the board (optional)" maxLength={120} defaultValue={lorry?.name ?? ''} />
        <TextField name="payload_kg" label="Payload (kg)" hint="What it may carry, pallets included: 100 to 44,000 kg." inputMode="numeric" defaultValue={lorry ? String(lorry.payload_kg) : ''} />
        <TextField name="pallet_slots" label="Pallet slots on the bed" hint="1 to 60." inputMode="numeric" defaultValue={lorry ? String(lorry.pallet_slots) : ''} />
        <TextField name="deck_length_mm" label="Deck length (mm)" hint="Inside the sides; 7,300 mm for a rigid if left empty." inputMode="numeric" defaultValue={lorry ? String(lorry.deck_length_mm) : ''} />
        <TextField name="deck_width_mm" label="Deck width (mm)" hint="Inside the sides; 2,450 mm if left empty." inputMode="numeric" defaultValue={lorry ? String(lorry.deck_width_mm) : ''} />
      </div>
      <div className="grid items-start gap-4 sm:grid-cols-2">
        <CheckboxField name="has_crane" label="Has a crane (lorry-mounted)" defaultChecked={lorry?.has_crane ?? false} />
        <TextField
          name="crane_max_kg"
          label="Crane lifting limit (kg)"
          hint="The heaviest load it lifts at the reach a delivery needs, from the crane's rated load chart."
          inputMode="numeric"
          defaultValue={lorry?.crane_max_kg ? String(lorry.crane_max_kg) : ''}
        />
      </div>
      <Alert tone="caution" title="Lifting">
        Lifts are planned and run by a competent person to the crane maker&rsquo;s load chart and the lifting rules that apply on site; a pallet heavier than the limit at its reach is never lifted to a roof.
      </Alert>
      <SubmitButton>{lorry ? 'Save the lorry' : 'Add the lorry'}</SubmitButton>
    </Form>
  );
}
