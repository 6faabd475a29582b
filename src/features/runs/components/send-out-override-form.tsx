import { sendOutOverrideBodySchema } from '../../../../shared/schemas/run.schema';
import type { Run } from '../../../../shared/schemas/run.schema';
import { Form, TextAreaField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Button } from '../../../components/ui/button';
import { useSendOut } from '../api/send-out';

/**
 * Sending a run out before its day or not fully ticked, with the reason recorded on each drop's order.
 * Apart from the panel and loaded when asked for: few runs need it, and the form library stays off the
 * run page's first load.
 */
export default function OverrideForm({ run, blocks, onSent, onCancel }: { run: Run; blocks: string[]; onSent: () => void; onCancel: () => void }) {
  const send = useSendOut(run.id);
  const form = useSchemaForm({
    schema: sendOutOverrideBodySchema,
    onSubmit: async (values) => {
      await send.mutateAsync(values);
      onSent();
    },
  });
  return (
    <Form form={form} label="Send out anyway" className="space-y-3 rounded-md border border-ochre-500 bg-ochre-50 p-3">
      <p className="text-sm text-ochre-800">Sending out anyway ({blocks.join(' and ')}) is recorded on each drop&apos;s order with your name and the reason.</p>
      <TextAreaField name="override_reason" label="Reason for sending out anyway" rows={2} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="danger" busy={form.submitting}>
          Send out with this reason
        </Button>
        <Button variant="ghost" onClick={onCancel}>
          Keep it in the yard
        </Button>
      </div>
    </Form>
  );
}
