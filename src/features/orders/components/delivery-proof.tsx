import type { DeliveryProof as DeliveryProofData } from '../../../../shared/schemas/run.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatDateTime } from '../../../lib/format';
import { useDeliveryProof } from '../api/get-delivery-proof';

/** What the driver recorded at the drop, as the contractor sees it on the order. */
export function DeliveryProofDetails({ proof }: { proof: DeliveryProofData }) {
  const problems = proof.lines.filter((l) => l.short > 0 || l.damaged > 0);
  return (
    <div className="space-y-4">
      <dl className="grid grid-cols-[minmax(7rem,auto)_1fr] gap-x-6 gap-y-2">
        <dt className="text-sm text-ink-600">Taken by</dt>
        <dd className="font-semibold">{proof.receiver_name}</dd>
        <dt className="text-sm text-ink-600">Delivered</dt>
        <dd>
          <time dateTime={proof.delivered_at}>{formatDateTime(proof.delivered_at)}</time>, recorded by {proof.recorded_by.name}
        </dd>
        {proof.position ? (
          <>
            <dt className="text-sm text-ink-600">Where</dt>
            <dd>
              {proof.position.lat.toFixed(5)}, {proof.position.lng.toFixed(5)}
              {proof.position.accuracy_m !== undefined ? ` (within ${Math.round(proof.position.accuracy_m)} m)` : ''}
            </dd>
          </>
        ) : null}
        {proof.note ? (
          <>
            <dt className="text-sm text-ink-600">Driver&rsquo;s note</dt>
            <dd className="whitespace-pre-line">{proof.note}</dd>
          </>
        ) : null}
      </dl>

      {proof.signature_url ? (
        <figure>
          <img src={proof.signature_url} alt={`Signature of ${proof.receiver_name}`} className="h-28 w-auto max-w-full rounded-md border border-ink-200 bg-white" />
          <figcaption className="mt-1 text-sm text-ink-600">Signed on the driver&rsquo;s phone</figcaption>
        </figure>
      ) : (
        <p className="text-sm text-ink-600">No signature: the receiver confirmed by typing their name.</p>
      )}

      {proof.photos.length > 0 ? (
        <ul className="flex flex-wrap gap-2" aria-label="Delivery photos">
          {proof.photos.map((photo, i) => (
            <li key={photo.id}>
              <a href={photo.url} target="_blank" rel="noopener" className="block rounded-md focus:outline-2 focus:outline-clay-600">
                <img src={photo.thumbnail_url} alt={`${i + 1} of ${proof.photos.length} taken at the drop, opens full size`} className="h-24 w-24 rounded-md border border-ink-200 object-cover" loading="lazy" />
              </a>
            </li>
          ))}
        </ul>
      ) : null}

      <table className="w-full text-left text-sm">
        <caption className="sr-only">What each line came to at the drop</caption>
        <thead>
          <tr className="border-b border-ink-200 text-ink-600">
            <th scope="col" className="py-1 pr-2 font-medium">
              Product
            </th>
            <th scope="col" className="px-2 py-1 text-right font-medium">
              Sent
            </th>
            <th scope="col" className="px-2 py-1 text-right font-medium">
              Handed over
            </th>
            <th scope="col" className="px-2 py-1 text-right font-medium">
              Short
            </th>
            <th scope="col" className="py-1 pl-2 text-right font-medium">
              Damaged
            </th>
          </tr>
        </thead>
        <tbody>
          {proof.lines.map((line) => (
            <tr key={line.line_id} className={`border-b border-ink-100 ${line.short > 0 || line.damaged > 0 ? 'bg-ochre-50' : ''}`}>
              <th scope="row" className="py-1 pr-2 font-normal">
                {line.description} <span className="text-ink-600">({line.unit})</span>
              </th>
              <td className="px-2 py-1 text-right tabular-nums">{line.sent}</td>
              <td className="px-2 py-1 text-right tabular-nums">{line.handed_over}</td>
              <td className={`px-2 py-1 text-right tabular-nums ${line.short > 0 ? 'font-semibold text-brick-700' : ''}`}>{line.short}</td>
              <td className={`py-1 pl-2 text-right tabular-nums ${line.damaged > 0 ? 'font-semibold text-brick-700' : ''}`}>{line.damaged}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {problems.length > 0 ? (
        <p className="text-sm">
          {problems.length === 1 ? 'One line was' : `${problems.length} lines were`} short or damaged
          {proof.credit_note_id !== null ? ': the merchant has a credit note drafted for them.' : '.'}
        </p>
      ) : null}
    </div>
  );
}

/** The proof of delivery on an order page, once the order is delivered. */
export function DeliveryProofCard({ orderId, status }: { orderId: number; status: string }) {
  const delivered = status === 'delivered';
  const proof = useDeliveryProof(orderId, delivered);
  if (!delivered) return null;
  return (
    <Card title="Proof of delivery" className="mt-6">
      {proof.isPending ? (
        <SkeletonBlock label="Loading the proof of delivery" lines={3} />
      ) : proof.isError ? (
        <ErrorAlert error={proof.error} title="The proof of delivery could not be loaded" onRetry={() => void proof.refetch()} />
      ) : (
        <DeliveryProofDetails proof={proof.data} />
      )}
    </Card>
  );
}
