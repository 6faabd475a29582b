import { commentBodySchema } from '../../../../shared/schemas/order.schema';
import { Form, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { useAddComment } from '../api/add-comment';

/** Writing a comment on an order: loaded with the form library when the comments show, after the page. */
export function OrderCommentForm({ orderId }: { orderId: number }) {
  const add = useAddComment(orderId);
  const form = useSchemaForm({
    schema: commentBodySchema,
    onSubmit: async ({ body }, { reset }) => {
      await add.mutateAsync(body);
      reset();
    },
  });
  return (
    <Form form={form} label="Add a comment" className="space-y-3">
      <TextField name="body" label="Comment" maxLength={2000} />
      <SubmitButton>Add the comment</SubmitButton>
    </Form>
  );
}
