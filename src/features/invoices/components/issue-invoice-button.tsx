import { useNavigate } from 'react-router-dom';
import { Link } from 'react-router-dom';
import { Alert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { useIssueInvoice } from '../api/issue-invoice';

interface IssueInvoiceProps {
  orderId: number;
  status: string;
  invoice: { id: number; number: string } | null;
  onIssued?: () => void;
}

/** The desk's invoice step on an order: issue it once confirmed or delivered, then link to it. */
export function IssueInvoiceButton({ orderId, status, invoice, onIssued }: IssueInvoiceProps) {
  const issue = useIssueInvoice();
  const navigate = useNavigate();
  if (invoice) {
    return (
      <p>
        Invoiced:{' '}
        <Link to={`/invoices/${invoice.id}`} className="font-semibold text-clay-700 underline underline-offset-2">
          {invoice.number}
        </Link>
      </p>
    );
  }
  if (!['confirmed', 'on_the_road', 'delivered'].includes(status)) return null;
  return (
    <div className="space-y-2">
      {issue.isError ? (
        <Alert tone="danger" title="The invoice could not be issued">
          {errorMessage(issue.error)}
        </Alert>
      ) : null}
      <Button
        variant={status === 'delivered' ? 'primary' : 'secondary'}
        busy={issue.isPending}
        onClick={() =>
          issue.mutate(orderId, {
            onSuccess: (issued) => {
              onIssued?.();
              void navigate(`/invoices/${issued.id}`);
            },
          })
        }
      >
        {status === 'delivered' ? 'Issue the invoice for what was delivered' : 'Issue the invoice for what is confirmed'}
      </Button>
    </div>
  );
}
