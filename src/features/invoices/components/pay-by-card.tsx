import { useEffect, useRef } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { Invoice } from '../../../../shared/schemas/invoice.schema';
import { Alert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { formatMoney } from '../../../lib/format';
import { invoiceKeys } from '../api/keys';
import { refreshPayment } from '../api/refresh-payment';
import { useStartCardPayment } from '../api/start-payment';

/** Where the provider's hosted page sends the browser back: `?payment=done` or `?payment=cancelled`. */
export type PaymentReturn = 'done' | 'cancelled' | null;

/**
 * Paying the balance by card on the provider's hosted page. Pressing twice opens the same checkout
 * (the server keeps one open payment per invoice), so the card is charged once.
 */
export function PayByCard({ invoice, returned }: { invoice: Invoice; returned: PaymentReturn }) {
  const start = useStartCardPayment(invoice.id);
  const queryClient = useQueryClient();
  const refreshed = useRef(false);
  const open = invoice.payments.find((p) => p.status === 'open');

  // Back from the hosted page before the provider's event arrived: ask the provider once, then re-read.
  useEffect(() => {
    if (returned !== 'done' || refreshed.current || !open) return;
    refreshed.current = true;
    void refreshPayment(open.id)
      .catch(() => undefined)
      .then(() => queryClient.invalidateQueries({ queryKey: invoiceKeys.detail(invoice.id) }));
  }, [returned, open, invoice.id, queryClient]);

  const paid = invoice.balance === 0;
  return (
    <div className="space-y-3">
      {returned === 'done' ? (
        paid ? (
          <Alert tone="success" title="Payment received">
            Thank you: {invoice.number} is paid.
          </Alert>
        ) : (
          <Alert tone="info" title="Checking the payment">
            The payment provider is confirming the payment; this page updates when it does.
          </Alert>
        )
      ) : returned === 'cancelled' ? (
        <Alert tone="info" title="Payment not made">
          The card page was left without paying. Nothing was charged.
        </Alert>
      ) : null}
      {open?.last_error ? (
        <Alert tone="danger" title="The last card attempt did not go through">
          {open.last_error} You can try again with another card.
        </Alert>
      ) : null}
      {start.isError ? (
        <Alert tone="danger" title="The card page could not be opened">
          {errorMessage(start.error)}
        </Alert>
      ) : null}
      {!paid ? (
        <Button
          size="lg"
          busy={start.isPending}
          onClick={() =>
            start.mutate(undefined, {
              onSuccess: (result) => {
                if (result.checkout_url) window.location.assign(result.checkout_url);
                else void queryClient.invalidateQueries({ queryKey: invoiceKeys.detail(invoice.id) });
              },
            })
          }
        >
          Pay {formatMoney(invoice.balance)} by card
        </Button>
      ) : null}
      <p className="text-sm text-ink-600">The card is typed on the payment provider&rsquo;s page; Ridgeload never sees the card number.</p>
    </div>
  );
}
