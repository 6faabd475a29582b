import { PageHeader } from '../../components/ui/page-header';
import { OrderBook } from '../../features/desk/components/order-book';
import { usePageTitle } from '../../lib/use-page-title';

export function DeskOrdersRoute() {
  usePageTitle('Order book');
  return (
    <>
      <PageHeader title="Order book" lead="Every order sent to your branches: answer the waiting ones, book the confirmed ones." />
      <OrderBook />
    </>
  );
}
