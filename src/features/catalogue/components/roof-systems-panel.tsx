import { useState } from 'react';
import type { MerchantRoofSystem, Product } from '../../../../shared/schemas/price-list.schema';
import { Alert, ErrorAlert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { useToast } from '../../../components/ui/toast';
import { useDeleteRoofSystem } from '../api/delete-roof-system';
import { useProducts } from '../api/get-products';
import { useRoofSystems } from '../api/get-roof-systems';
import { ROLE_WORDS } from '../lib/roof-system-form';
import { RoofSystemForm } from './roof-system-form';

function SystemRow({ branchId, system, products, canManage }: { branchId: number; system: MerchantRoofSystem; products: readonly Product[]; canManage: boolean }) {
  const [mode, setMode] = useState<'view' | 'edit' | 'confirm'>('view');
  const remove = useDeleteRoofSystem();
  const toast = useToast();
  const onDelete = () =>
    remove.mutate(system.id, {
      onSuccess: () => toast.show(`${system.name} is taken off the branch.`, 'success'),
      onError: (error) => toast.show(`${system.name} could not be deleted: ${errorMessage(error)}`, 'danger'),
    });
  return (
    <li className="py-4">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0">
          <p className="font-semibold">{system.name}</p>
          {system.description ? <p className="text-sm text-ink-700">{system.description}</p> : null}
          <p className="mt-1 text-sm">
            {system.offerable ? (
              <span className="rounded bg-moss-50 px-2 py-0.5 font-semibold text-moss-800">Offered to contractors</span>
            ) : (
              <span className="rounded bg-ochre-100 px-2 py-0.5 font-semibold text-ochre-800">Not offered: {system.problems.join('; ')}</span>
            )}
          </p>
          <ul className="mt-2 text-sm text-ink-700">
            {system.components.map((c) => (
              <li key={c.role}>
                {ROLE_WORDS[c.role]}: <span className="font-mono">{c.sku}</span> · {c.name}
              </li>
            ))}
          </ul>
        </div>
        {canManage && mode === 'view' ? (
          <div className="flex gap-2">
            <Button variant="secondary" onClick={() => setMode('edit')} aria-label={`Edit ${system.name}`}>
              Edit
            </Button>
            <Button variant="ghost" onClick={() => setMode('confirm')} aria-label={`Delete ${system.name}`}>
              Delete
            </Button>
          </div>
        ) : null}
      </div>
      {mode === 'confirm' ? (
        <Alert
          tone="caution"
          title={`Delete ${system.name}?`}
          className="mt-3"
          action={
            <div className="flex gap-2">
              <Button variant="danger" busy={remove.isPending} onClick={onDelete}>
                Delete it
              </Button>
              <Button variant="secondary" onClick={() => setMode('view')}>
                Keep it
              </Button>
            </div>
          }
        >
          Contractors can no longer pick it for new estimates; estimates already made with it keep their figures.
        </Alert>
      ) : null}
      {mode === 'edit' ? (
        <div className="mt-4">
          <RoofSystemForm branchId={branchId} products={products} system={system} onDone={() => setMode('view')} />
        </div>
      ) : null}
    </li>
  );
}

/** The roof systems a branch offers: a tile and its accessories, built from the merchant's products. */
export function RoofSystemsPanel({ branchId, canManage }: { branchId: number; canManage: boolean }) {
  const systems = useRoofSystems(branchId);
  // Archived products stay listed so a system still holding one shows it by name.
  const products = useProducts({ archived: 'all' });
  const [adding, setAdding] = useState(false);
  if (systems.isPending || products.isPending) return <SkeletonBlock label="Loading the roof systems" lines={4} />;
  if (systems.isError) return <ErrorAlert error={systems.error} title="The roof systems could not be loaded" onRetry={() => void systems.refetch()} />;
  if (products.isError) return <ErrorAlert error={products.error} title="The products could not be loaded" onRetry={() => void products.refetch()} />;
  const live = systems.data.filter((s) => s.archived_at === null);
  return (
    <div className="space-y-6">
      <Card title="Roof systems" actions={canManage && !adding ? <Button onClick={() => setAdding(true)}>Add a roof system</Button> : null}>
        {live.length === 0 ? (
          <EmptyState title="No roof systems at this branch yet">A roof system is a tile with the ridge, battens, nails and underlay laid with it.</EmptyState>
        ) : (
          <ul className="divide-y divide-mortar-200">
            {live.map((s) => (
              <SystemRow key={s.id} branchId={branchId} system={s} products={products.data} canManage={canManage} />
            ))}
          </ul>
        )}
      </Card>
      {adding ? (
        <Card title="Add a roof system">
          <RoofSystemForm branchId={branchId} products={products.data} onDone={() => setAdding(false)} />
        </Card>
      ) : null}
    </div>
  );
}
