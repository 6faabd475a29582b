import { businessCalendar } from '../../../lib/business-calendar';
import { useMemo, useState } from 'react';
import type { ChangeEvent, ReactNode } from 'react';
import { DELIVERY_METHODS, DELIVERY_METHOD_LABELS, MAX_QUOTE_BRANCHES } from '../../../../shared/schemas/order.schema';
import type { QuoteRequest } from '../../../../shared/schemas/order.schema';
import { FieldMessage, Form, RadioGroupField, SubmitButton, TextField, useFieldGroup } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { ErrorAlert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useCreateQuoteRequest } from '../api/create-quote-request';
import { useMerchantBranches } from '../api/get-merchant-branches';
import { branchField, quoteFormSchema } from '../lib/quote-form';

/** The branches to ask: a rule across the ticks (at least one, at most three) is shown under them. */
function BranchesGroup({ children }: { children: ReactNode }) {
  const { error, errorId } = useFieldGroup('branch_ids');
  return (
    <fieldset aria-describedby={error ? errorId : undefined}>
      <legend className="sr-only">Branches to ask</legend>
      {children}
      {error ? <FieldMessage id={errorId}>{error}</FieldMessage> : null}
    </fieldset>
  );
}

interface QuoteRequestFormProps {
  estimateId: number;
  /** The branch whose system the estimate used, ticked to start with. */
  preferredBranchId: number | null;
  craneAllowed: boolean;
  onCreated: (request: QuoteRequest) => void;
}

/** Asks up to three merchant branches to price an estimate's materials for one delivery. */
export function QuoteRequestForm({ estimateId, preferredBranchId, craneAllowed, onCreated }: QuoteRequestFormProps) {
  const branches = useMerchantBranches();
  const create = useCreateQuoteRequest();
  const schema = useMemo(() => quoteFormSchema(estimateId), [estimateId]);
  const [ticked, setTicked] = useState<Set<number>>(() => new Set(preferredBranchId ? [preferredBranchId] : []));
  const form = useSchemaForm({ schema, onSubmit: async (body) => onCreated(await create.mutateAsync(body)) });

  return (
    <Form form={form} label="Ask for quotes" className="space-y-6">
      <Card title={`Merchant branches (up to ${MAX_QUOTE_BRANCHES})`}>
        {branches.isPending ? (
          <SkeletonBlock label="Loading the merchant branches" lines={3} />
        ) : branches.isError ? (
          <ErrorAlert error={branches.error} title="The merchant branches could not be loaded" onRetry={() => void branches.refetch()} />
        ) : (
          <BranchesGroup>
            <div className="grid gap-2 sm:grid-cols-2">
              {branches.data.map((branch) => {
                const checked = ticked.has(branch.id);
                return (
                  <label
                    key={branch.id}
                    className="flex min-h-tap cursor-pointer items-start gap-3 rounded-md border border-ink-300 bg-white p-3 has-[:checked]:border-clay-600 has-[:checked]:bg-clay-50 has-[:disabled]:cursor-not-allowed has-[:disabled]:opacity-60"
                  >
                    <input
                      type="checkbox"
                      {...form.register(branchField(branch.id), {
                        onChange: (event: ChangeEvent<HTMLInputElement>) =>
                          setTicked((set) => {
                            const next = new Set(set);
                            if (event.target.checked) next.add(branch.id);
                            else next.delete(branch.id);
                            return next;
                          }),
                      })}
                      checked={checked}
                      disabled={!checked && ticked.size >= MAX_QUOTE_BRANCHES}
                      className="mt-1 h-5 w-5 accent-clay-600"
                    />
                    <span>
                      <span className="block font-medium">{branch.merchant.name}</span>
                      <span className="block text-sm text-ink-600">
                        {branch.name}, {branch.town}
                      </span>
                    </span>
                  </label>
                );
              })}
            </div>
          </BranchesGroup>
        )}
      </Card>
      <Card title="Delivery wanted">
        <div className="space-y-4">
          <div className="grid gap-4 sm:grid-cols-3">
            <TextField name="requested_date" label="Day wanted" type="date" min={businessCalendar().today()} />
            <TextField name="time_window" label="Window from" type="time" />
            <TextField name="time_window_to" label="Window to" type="time" />
          </div>
          <p className="-mt-2 text-sm text-ink-600">Leave both window times blank for any time in the working day.</p>
          <RadioGroupField
            name="delivery_method"
            legend="How it comes off the lorry"
            defaultValue="ground"
            options={DELIVERY_METHODS.map((value) => ({
              value,
              label: DELIVERY_METHOD_LABELS[value],
              description: value === 'roof' && !craneAllowed ? 'The site does not allow a crane lift' : undefined,
            }))}
          />
          <div className="grid gap-4 sm:grid-cols-2">
            <TextField name="po_reference" label="Your PO reference" autoComplete="off" />
            <TextField name="notes" label="Notes for the merchants" autoComplete="off" />
          </div>
        </div>
      </Card>
      <SubmitButton size="lg">Send the quote request</SubmitButton>
    </Form>
  );
}
