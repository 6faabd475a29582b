import * as z from 'zod/mini';
import { putAccountBodySchema } from '../../../../shared/schemas/invoice.schema';
import type { accountSchema } from '../../../../shared/schemas/invoice.schema';
import { Form, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Button } from '../../../components/ui/button';
import { useToast } from '../../../components/ui/toast';
import { useSetAccountTerms } from '../api/set-account-terms';

type Account = z.infer<typeof accountSchema>;

const termsFormSchema = z.pipe(
  z.pipe(
    z.record(z.string(), z.string()),
    z.transform((values): unknown => {
      const t = (values.terms_days ?? '').trim();
      return { terms_days: /^-?\d+$/.test(t) ? Number(t) : t === '' ? undefined : t, card_payments: values.card_payments === 'on' };
    }),
  ),
  putAccountBodySchema,
);

/** Setting a contractor's payment terms (days to the due date), or removing the account so it pays by card. */
export function AccountTermsForm({ account }: { account: Account }) {
  const setTerms = useSetAccountTerms(account.contractor.id);
  const toast = useToast();
  const form = useSchemaForm({
    schema: termsFormSchema,
    onSubmit: async (terms) => {
      await setTerms.mutateAsync(terms);
      toast.show(`${account.contractor.name} now has ${terms.terms_days} days to pay${terms.card_payments ? ', or may pay by card' : ', on account only'}.`, 'success');
    },
  });
  return (
    <Form form={form} label={`Terms for ${account.contractor.name}`} className="flex flex-wrap items-end gap-2">
      <TextField name="terms_days" label={`Days to pay, ${account.contractor.name}`} inputMode="numeric" defaultValue={account.terms_days === null ? '' : String(account.terms_days)} className="w-40 [&_label]:sr-only" />
      <label className="flex min-h-tap items-center gap-2">
        <input type="checkbox" {...form.register('card_payments')} defaultChecked={account.card_payments} className="h-5 w-5 accent-clay-600" />
        May also pay by card
      </label>
      <SubmitButton>Set terms</SubmitButton>
      {account.terms_days !== null ? (
        <Button
          variant="secondary"
          busy={setTerms.isPending}
          onClick={() =>
            setTerms.mutate(null, {
              onSuccess: () => toast.show(`${account.contractor.name} pays by card from now on.`, 'success'),
              onError: () => toast.show(`The account of ${account.contractor.name} could not be removed. Try again.`, 'danger'),
            })
          }
        >
          Remove account
        </Button>
      ) : null}
    </Form>
  );
}
