import { Link } from 'react-router-dom';
import type { OutboxMessage } from '../../../../shared/schemas/members.schema';
import { Alert, ErrorAlert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { isApiError } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import { useOutbox } from '../api/get-outbox';

interface OutboxReaderProps {
  selectedId: number | null;
  hrefFor: (id: number) => string;
  listHref: string;
}

function MessageView({ message, listHref }: { message: OutboxMessage; listHref: string }) {
  return (
    <article aria-labelledby={`message-${message.id}-subject`} className="space-y-4">
      <Link to={listHref} className="inline-flex min-h-tap items-center font-medium text-clay-700 underline underline-offset-2 lg:hidden">
        Back to all messages
      </Link>
      <header>
        <h2 id={`message-${message.id}-subject`} className="text-xl font-semibold">
          {message.subject}
        </h2>
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 text-sm text-ink-700">
          <dt className="font-medium">From</dt>
          <dd className="break-all">{message.from}</dd>
          <dt className="font-medium">To</dt>
          <dd className="break-all">{message.to}</dd>
          <dt className="font-medium">Sent</dt>
          <dd>{formatDateTime(message.created_at)}</dd>
        </dl>
      </header>
      <section aria-labelledby={`message-${message.id}-text`}>
        <h3 id={`message-${message.id}-text`} className="mb-2 font-semibold">
          Text part
        </h3>
        <pre className="overflow-x-auto rounded-md border border-mortar-300 bg-mortar-50 p-3 font-sans text-sm whitespace-pre-wrap">{message.text}</pre>
      </section>
      <section aria-labelledby={`message-${message.id}-html`}>
        <h3 id={`message-${message.id}-html`} className="mb-2 font-semibold">
          HTML part
        </h3>
        {message.html ? (
          // An empty sandbox: no scripts, no forms, no navigation of this page from the e-mail.
          <iframe title={`HTML part of “${message.subject}”`} sandbox="" srcDoc={message.html} className="h-96 w-full rounded-md border border-mortar-300 bg-white" />
        ) : (
          <p className="text-ink-600">This message has no HTML part.</p>
        )}
      </section>
    </article>
  );
}

/** Reads the mail the app has sent (reset links, invitations) without a real mailbox. */
export function OutboxReader({ selectedId, hrefFor, listHref }: OutboxReaderProps) {
  const outbox = useOutbox();

  if (outbox.isPending) return <SkeletonBlock label="Loading the outbox" lines={5} />;
  if (outbox.isError) {
    if (isApiError(outbox.error) && outbox.error.status === 404) {
      return (
        <Alert tone="info" title="No outbox on this server">
          The outbox is only there while Ridgeload runs outside production; this server sends real e-mail. <span className="text-ink-600">({outbox.error.message})</span>
        </Alert>
      );
    }
    return <ErrorAlert error={outbox.error} title="The outbox could not be loaded" onRetry={() => void outbox.refetch()} />;
  }

  const messages = outbox.data;
  if (messages.length === 0) {
    return <EmptyState title="No e-mail sent yet">Invitations and password-reset links appear here as soon as the app sends them.</EmptyState>;
  }

  const selected = selectedId === null ? null : (messages.find((message) => message.id === selectedId) ?? null);

  return (
    <div className="grid items-start gap-6 lg:grid-cols-[minmax(16rem,22rem)_1fr]">
      <Card title={`Messages (${messages.length})`} className={selected ? 'hidden lg:block' : ''}>
        <ul className="-mx-2 divide-y divide-mortar-200">
          {messages.map((message) => (
            <li key={message.id}>
              <Link to={hrefFor(message.id)} aria-current={message.id === selectedId ? 'true' : undefined} className="block min-h-tap rounded px-2 py-2 hover:bg-mortar-100 aria-[current=true]:bg-clay-50">
                <span className="block font-medium">{message.subject}</span>
                <span className="block text-sm break-all text-ink-600">{message.to}</span>
                <span className="block text-sm text-ink-600">{formatDateTime(message.created_at)}</span>
              </Link>
            </li>
          ))}
        </ul>
      </Card>
      <div>
        {selected ? (
          <Card>
            <MessageView message={selected} listHref={listHref} />
          </Card>
        ) : selectedId !== null ? (
          <Alert tone="caution" title="Message not found">
            It may have been cleared when the server restarted. Pick one from the list.
          </Alert>
        ) : (
          <p className="hidden text-ink-600 lg:block">Pick a message to read it.</p>
        )}
      </div>
    </div>
  );
}
