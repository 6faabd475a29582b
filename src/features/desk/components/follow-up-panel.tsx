import { businessCalendar } from '../../../lib/business-calendar';
import { useMemo, useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import * as z from 'zod/mini';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import { followUpBodySchema } from '../../../../shared/schemas/order.schema';
import type { FollowUpBody, OrderDetail } from '../../../../shared/schemas/order.schema';
import { Form, SubmitButton, TextField } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import { Alert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { useToast } from '../../../components/ui/toast';
import { isApiError } from '../../../lib/api-client';
import { formatCount, formatDate } from '../../../lib/format';
import { useStartFollowUp } from '../api/start-follow-up';

/** A day as YYYY-MM-DD in the firm's calendar, `days` after today. */
export function localIsoDate(days = 0): string {
  return businessCalendar().fromToday(days);
}

/** A week gives the merchant time to get the packs in; the desk changes it when it knows better. */
const DEFAULT_DAYS_AHEAD = 7;

/**
 * The follow-up form read into the API body: the window as two times (both or neither, as on the
 * order form), blank window and note left out, and no day before today.
 */
export function followUpFormSchema(today: string) {
  return z.pipe(
    z.pipe(
      z.record(z.string(), z.string()),
      transformWithIssues((values, ctx): FollowUpBody => {
        const requested_date = (values.requested_date ?? '').trim();
        const from = (values.time_window ?? '').trim();
        const to = (values.time_window_to ?? '').trim();
        const note = (values.note ?? '').trim();
        if (Boolean(from) !== Boolean(to)) {
          ctx.addIssue({ code: 'custom', path: ['time_window'], message: 'give the start and the end of the window, or neither' });
        }
        if (/^\d{4}-\d{2}-\d{2}$/.test(requested_date) && requested_date < today) {
          ctx.addIssue({ code: 'custom', path: ['requested_date'], message: `is already past: choose ${formatDate(today)} or later` });
        }
        return {
          requested_date,
          ...(from && to ? { time_window: `${from}-${to}` } : {}),
          ...(note ? { note } : {}),
        };
      }),
    ),
    followUpBodySchema,
  );
}

/** Lines with packs still owed to the contractor. */
export function owedLines(order: Pick<OrderDetail, 'lines'>) {
  return order.lines.filter((l) => l.back_order_quantity > 0);
}

/** The server's sentence, ending once with a full stop. */
const sentence = (message: string) => (message.endsWith('.') ? message : `${message}.`);

const existingFollowUpSchema = z.object({ order_id: z.number().check(z.int()), reference: z.string() });

/** A refusal worded for the desk; follow_up_exists links to the order that already carries the packs. */
function FollowUpRefusal({ error }: { error: unknown }) {
  if (!isApiError(error)) return null;
  if (error.code === 'follow_up_exists') {
    const existing = existingFollowUpSchema.safeParse(error.details[0]);
    return (
      <Alert tone="danger" title={existing.success ? `These packs already follow as ${existing.data.reference}` : 'These packs already follow on another order'}>
        <p>{sentence(error.message)}</p>
        {existing.success ? (
          <p className="mt-1">
            <Link to={`/desk/orders/${existing.data.order_id}`} className="font-semibold underline underline-offset-2">
              Open {existing.data.reference}
            </Link>
          </p>
        ) : null}
      </Alert>
    );
  }
  const title = error.code === 'nothing_back_ordered' ? 'Nothing is back-ordered on this order any more' : 'This order cannot start a follow-up in its stage';
  return (
    <Alert tone="danger" title={title}>
      {sentence(error.message)} Reload the page to see the order as it stands.
    </Alert>
  );
}

const REFUSALS = ['follow_up_exists', 'nothing_back_ordered', 'order_not_confirmed'];

/** Splits a stored window "07:30-12:00" into the two times the form shows. */
function splitWindow(window: string | null): [string, string] {
  return window ? [window.slice(0, 5), window.slice(6, 11)] : ['', ''];
}

/**
 * The packs the desk confirmed as "to follow", and the form that sends them as an order of their
 * own: same branch, site and PO, the agreed pack prices, on the day now wanted.
 */
export function FollowUpPanel({ order }: { order: OrderDetail }) {
  const lines = useMemo(() => owedLines(order), [order]);
  const packs = lines.reduce((sum, l) => sum + l.back_order_quantity, 0);
  const today = localIsoDate();
  const schema = useMemo(() => followUpFormSchema(today), [today]);
  const start = useStartFollowUp(order.id);
  const toast = useToast();
  const navigate = useNavigate();
  const [refusal, setRefusal] = useState<unknown>(null);
  const form = useSchemaForm({
    schema,
    onSubmit: async (body) => {
      setRefusal(null);
      try {
        const followUp = await start.mutateAsync(body);
        toast.show(`${order.reference}'s back-ordered packs follow as ${followUp.reference}: confirm it against stock when the packs are in.`, 'success');
        void navigate(`/desk/orders/${followUp.id}`);
      } catch (error) {
        if (isApiError(error) && error.status === 409 && REFUSALS.includes(error.code)) {
          setRefusal(error);
          return;
        }
        throw error;
      }
    },
  });
  const [from, to] = splitWindow(order.time_window);
  return (
    <Card title="Back-ordered packs">
      <p className="mb-3 text-ink-700">
        {packs} {packs === 1 ? 'pack' : 'packs'} on {lines.length} {lines.length === 1 ? 'line' : 'lines'} still to follow. Start them as a new order to the same site; it waits for you to confirm it against stock like
        any order.
      </p>
      <div className="mb-4 overflow-x-auto rounded-md border border-mortar-300" role="region" aria-label="Packs to follow" tabIndex={0}>
        <table className="w-full min-w-[28rem] border-collapse text-left text-sm">
          <caption className="sr-only">Packs still to follow, per line</caption>
          <thead className="bg-mortar-100">
            <tr>
              <th scope="col" className="px-3 py-2">
                SKU
              </th>
              <th scope="col" className="px-3 py-2">
                Item
              </th>
              <th scope="col" className="px-3 py-2 text-right">
                Packs to follow
              </th>
            </tr>
          </thead>
          <tbody>
            {lines.map((line) => (
              <tr key={line.id} className="border-t border-mortar-200">
                <td className="px-3 py-2 font-mono">{line.sku}</td>
                <td className="px-3 py-2">{line.description}</td>
                <td className="px-3 py-2 text-right tabular-nums">{formatCount(line.back_order_quantity)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <Form form={form} label="Start the follow-up order">
        {refusal ? <FollowUpRefusal error={refusal} /> : null}
        <div className="grid gap-4 sm:grid-cols-3">
          <TextField name="requested_date" label="Day wanted" type="date" min={today} defaultValue={localIsoDate(DEFAULT_DAYS_AHEAD)} />
          <TextField name="time_window" label="Window from" type="time" defaultValue={from} />
          <TextField name="time_window_to" label="Window to" type="time" defaultValue={to} />
        </div>
        <p className="-mt-2 text-sm text-ink-600">Leave both window times blank to keep this order&rsquo;s window ({order.time_window ?? 'any time'}).</p>
        <TextField name="note" label="Note to the contractor (optional)" maxLength={500} autoComplete="off" hint="Goes on the new order and in the e-mail to the contractor." />
        <SubmitButton>Start the follow-up order</SubmitButton>
      </Form>
    </Card>
  );
}
