import { Alert, errorMessage } from '../../../components/ui/alert';
import { isApiError } from '../../../lib/api-client';

/**
 * A refused change, said in words where it was asked for: the server's message, then any
 * details it gave (which figure or field stood in the way) that the message does not already say.
 */
export function ActionError({ error, title }: { error: unknown; title: string }) {
  const message = errorMessage(error);
  const details = isApiError(error) ? error.details.map((d) => d.message).filter((m) => m && !message.includes(m)) : [];
  return (
    <Alert tone="danger" title={title}>
      <p>{message}</p>
      {details.length ? (
        <ul className="mt-1 list-disc pl-5">
          {details.map((d) => (
            <li key={d}>{d}</li>
          ))}
        </ul>
      ) : null}
    </Alert>
  );
}
