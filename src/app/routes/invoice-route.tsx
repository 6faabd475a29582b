import { useParams, useSearchParams } from 'react-router-dom';
import { can } from '../../../shared/domain/policy';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useInvoice } from '../../features/invoices/api/get-invoice';
import { InvoiceDetail } from '../../features/invoices/components/invoice-detail';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

/** One invoice, for both sides: the desk credits it, the contractor pays it (and comes back here from the card page). */
export function InvoiceRoute() {
  const invoiceId = idParam(useParams(), 'invoiceId');
  const [search] = useSearchParams();
  const { user } = useCurrentSession();
  const invoice = useInvoice(invoiceId);
  usePageTitle(invoice.data?.number ?? 'Invoice');
  const payment = search.get('payment');
  const merchant = can(user.role, 'invoices:issue');
  return (
    <>
      <TextLink to="/invoices">← Invoices</TextLink>
      <PageQuery query={invoice} what="the invoice">
        {(found) => (
          <>
            <PageHeader title={`Invoice ${found.number}`} lead={`${found.contractor.name} · ${found.branch.name}`} />
            <InvoiceDetail
              invoice={found}
              canCredit={merchant}
              canPay={can(user.role, 'payments:make')}
              returned={payment === 'done' || payment === 'cancelled' ? payment : null}
              orderPath={merchant ? `/desk/orders/${found.order.id}` : `/orders/${found.order.id}`}
            />
          </>
        )}
      </PageQuery>
    </>
  );
}
