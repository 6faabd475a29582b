import { useState } from 'react';
import type { Lorry } from '../../../../shared/schemas/fleet.schema';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { useToast } from '../../../components/ui/toast';
import { useArchiveLorry } from '../api/archive-lorry';
import { ActionError } from './action-error';
import { focusOnShow } from '../../../lib/focus-on-show';

/**
 * Archiving one lorry, in two steps: the button asks, the second press archives. A refusal stays
 * beside the lorry in words until the next try.
 */
export function ArchiveLorry({ lorry }: { lorry: Lorry }) {
  const archive = useArchiveLorry(lorry.branch_id);
  const toast = useToast();
  const [asking, setAsking] = useState(false);
  if (!asking) {
    return (
      <Button variant="secondary" onClick={() => setAsking(true)} aria-label={`Archive ${lorry.registration}`}>
        Archive
      </Button>
    );
  }
  return (
    <div className="w-full max-w-xl space-y-3">
      <Alert tone="caution" title={`Archive ${lorry.registration}?`} live={false}>
        An archived lorry gets no new slots, and its coming empty slots are removed with it. If a coming run still has orders to deliver, the lorry is kept until those orders are moved to another lorry. An archived lorry
        can be restored from the archived list.
      </Alert>
      {archive.isError ? <ActionError error={archive.error} title={`${lorry.registration} was not archived`} /> : null}
      <div className="flex flex-wrap gap-2">
        <Button
          variant="danger"
          busy={archive.isPending}
          onClick={() =>
            // The promise, not mutate's callbacks: the row is gone from the refetched list (and unmounted) before they would run.
            archive.mutateAsync(lorry.id).then(
              (saved) => {
                toast.show(`${saved.registration} is archived.`, 'success');
                setAsking(false);
              },
              () => undefined, // shown beside the lorry from the mutation's state
            )
          }
        >
          Archive {lorry.registration}
        </Button>
        <Button
          variant="ghost"
          ref={focusOnShow}
          onClick={() => {
            archive.reset();
            setAsking(false);
          }}
        >
          Keep it
        </Button>
      </div>
    </div>
  );
}
