import { useId, useState } from 'react';
import { ErrorAlert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatDate } from '../../../lib/format';
import { useRestoreLorry } from '../api/archive-lorry';
import { useLorriesWithArchived } from '../api/get-lorries';
import { useToast } from '../../../components/ui/toast';
import { ActionError } from './action-error';

/**
 * The branch's archived lorries, behind a toggle so the working list stays short; those who manage
 * the fleet can put one back in service (its slots are made again from the calendar).
 */
export function ArchivedLorries({ branchId, canManage = false }: { branchId: number; canManage?: boolean }) {
  const [open, setOpen] = useState(false);
  const restore = useRestoreLorry(branchId);
  const toast = useToast();
  const listId = useId();
  const all = useLorriesWithArchived(branchId, open);
  const archived = (all.data?.lorries ?? []).filter((l) => l.archived_at !== null);
  return (
    <div className="space-y-3">
      <Button variant="ghost" onClick={() => setOpen((v) => !v)} aria-expanded={open} aria-controls={listId}>
        {open ? 'Hide archived lorries' : 'Show archived lorries'}
      </Button>
      {open ? (
        <div id={listId}>
          {all.isPending ? (
            <SkeletonBlock label="Loading the archived lorries" lines={2} />
          ) : all.isError ? (
            <ErrorAlert error={all.error} title="The archived lorries could not be loaded" onRetry={() => void all.refetch()} />
          ) : archived.length === 0 ? (
            <p className="text-sm text-ink-600">No archived lorries at this branch.</p>
          ) : (
            <>
              {restore.isError ? <ActionError error={restore.error} title="The lorry was not restored" /> : null}
              <ul className="divide-y divide-mortar-200" aria-label="Archived lorries">
                {archived.map((l) => (
                  <li key={l.id} className="flex flex-wrap items-center justify-between gap-3 py-2 text-ink-700">
                    <span>
                      <span className="font-mono font-semibold">{l.registration}</span>
                      {l.name ? ` · ${l.name}` : ''}
                      <span className="block text-sm tabular-nums">
                        {l.payload_kg.toLocaleString('en-GB')} kg · {l.pallet_slots} pallet slots · archived {formatDate(l.archived_at ?? '')}
                      </span>
                    </span>
                    {canManage ? (
                      <Button
                        variant="secondary"
                        aria-label={`Restore ${l.registration}`}
                        busy={restore.isPending && restore.variables === l.id}
                        onClick={() =>
                          restore.mutateAsync(l.id).then(
                            (back) => toast.show(`${back.registration} is back in service; make its slots in the calendar.`, 'success'),
                            () => {},
                          )
                        }
                      >
                        Restore
                      </Button>
                    ) : null}
                  </li>
                ))}
              </ul>
            </>
          )}
        </div>
      ) : null}
    </div>
  );
}
