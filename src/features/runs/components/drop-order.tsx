import { closestCenter, DndContext, KeyboardSensor, PointerSensor, useSensor, useSensors } from '@dnd-kit/core';
import type { Announcements, DragEndEvent } from '@dnd-kit/core';
import { arrayMove, SortableContext, sortableKeyboardCoordinates, useSortable, verticalListSortingStrategy } from '@dnd-kit/sortable';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { Run } from '../../../../shared/schemas/run.schema';
import { Alert, errorMessage } from '../../../components/ui/alert';
import { useSetDropOrder } from '../api/set-drop-order';
import { runDocuments } from '../api/documents';
import { kg, plural } from '../lib/run-format';
import { DropSwatch } from './drop-patterns';

type Drop = Run['drops'][number];

interface DropOrderProps {
  run: Run;
  /** The yard may change the order while the lorry is still in the yard. */
  canReorder: boolean;
  /** Where a drop's order opens for this person (the desk's page or the yard's read-only one). */
  orderHref: (orderId: number) => string;
}

const arrowButton = 'inline-flex min-h-tap min-w-tap items-center justify-center rounded-md border border-ink-300 bg-white text-ink-900 hover:bg-ink-50 aria-disabled:cursor-not-allowed aria-disabled:opacity-40';

function Arrow({ up }: { up: boolean }) {
  return (
    <svg viewBox="0 0 24 24" className="h-5 w-5" aria-hidden="true" focusable="false">
      <path d={up ? 'M12 19V5m-6 6 6-6 6 6' : 'M12 5v14m-6-6 6 6 6-6'} fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}

interface DropRowProps {
  drop: Drop;
  place: number;
  count: number;
  editable: boolean;
  orderHref: (orderId: number) => string;
  onMove: (from: number, to: number) => void;
}

function DropRow({ drop, place, count, editable, orderHref, onMove }: DropRowProps) {
  const { attributes, listeners, setNodeRef, transform, transition, isDragging } = useSortable({ id: drop.order_id, disabled: !editable });
  const style = {
    transform: transform ? `translate3d(${Math.round(transform.x)}px, ${Math.round(transform.y)}px, 0)` : undefined,
    transition,
  };
  const first = place === 0;
  const last = place === count - 1;
  return (
    <li ref={setNodeRef} style={style} className={`flex flex-wrap items-center gap-x-3 gap-y-2 bg-white px-3 py-2 ${isDragging ? 'relative z-10 shadow-raised' : ''}`} data-testid="drop-row">
      {editable ? (
        <button
          type="button"
          className="inline-flex min-h-tap min-w-8 cursor-grab touch-none items-center justify-center rounded-md text-ink-600 hover:bg-ink-50 active:cursor-grabbing"
          aria-label={`Drag ${drop.reference} to another place`}
          {...attributes}
          {...listeners}
        >
          <svg viewBox="0 0 24 24" className="h-5 w-5" aria-hidden="true" focusable="false">
            <path d="M9 6h.01M15 6h.01M9 12h.01M15 12h.01M9 18h.01M15 18h.01" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
          </svg>
        </button>
      ) : null}
      <span className="flex items-center gap-1.5 font-bold tabular-nums">
        <DropSwatch drop={place + 1} />
        <span>
          <span className="sr-only">Drop </span>
          {place + 1}
        </span>
      </span>
      <span className="min-w-0 flex-1 basis-48">
        <Link to={orderHref(drop.order_id)} className="font-semibold text-clay-700 underline underline-offset-2 hover:text-clay-800">
          {drop.reference}
        </Link>{' '}
        · {drop.contractor.name}
        <span className="block text-sm text-ink-700">
          {drop.site_name}
          {drop.site_postcode ? `, ${drop.site_postcode}` : ''} · {plural(drop.pallets, 'pallet')}, {kg(drop.weight_kg)}
          {drop.delivery_method === 'roof' ? ' · crane onto the roof' : ' · set down on the ground'}
        </span>
        {drop.short ? <span className="mt-0.5 inline-block rounded bg-ochre-100 px-1.5 text-sm font-medium text-ochre-800">A face will be short: lines to follow</span> : null}
      </span>
      <a
        href={runDocuments.deliveryNote(drop.order_id)}
        target="_blank"
        rel="noopener"
        className="inline-flex min-h-tap items-center text-sm font-medium text-clay-700 underline underline-offset-2"
        aria-label={`Delivery note of ${drop.reference} (PDF)`}
      >
        Delivery note
      </a>
      {editable ? (
        <span className="flex gap-1">
          <button type="button" className={arrowButton} aria-label={`Move ${drop.reference} up`} aria-disabled={first || undefined} onClick={() => !first && onMove(place, place - 1)}>
            <Arrow up />
          </button>
          <button type="button" className={arrowButton} aria-label={`Move ${drop.reference} down`} aria-disabled={last || undefined} onClick={() => !last && onMove(place, place + 1)}>
            <Arrow up={false} />
          </button>
        </span>
      ) : null}
    </li>
  );
}

/**
 * A run's drops in the order they come off the lorry. The yard changes the order by dragging a drop
 * or with its up and down buttons; each change is saved at once and the server plans the deck again.
 */
export function DropOrder({ run, canReorder, orderHref }: DropOrderProps) {
  const save = useSetDropOrder(run.id);
  const serverKey = run.drops.map((d) => d.order_id).join(',');
  // The order just chosen, shown until the server's own (refetched) order replaces it.
  const [local, setLocal] = useState<{ key: string; ids: number[] } | null>(null);
  const [said, setSaid] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const sensors = useSensors(useSensor(PointerSensor, { activationConstraint: { distance: 6 } }), useSensor(KeyboardSensor, { coordinateGetter: sortableKeyboardCoordinates }));
  const byId = new Map(run.drops.map((d) => [d.order_id, d]));
  const ids = local && local.key === serverKey ? local.ids : run.drops.map((d) => d.order_id);
  const drops = ids.map((id) => byId.get(id)).filter((d): d is Drop => Boolean(d));
  const gone = run.status === 'on_the_road' || run.status === 'done';
  const editable = canReorder && !gone && drops.length > 1;
  const refOf = (id: unknown) => byId.get(Number(id))?.reference ?? 'The drop';

  const move = (from: number, to: number) => {
    if (from === to || to < 0 || to >= ids.length) return;
    const next = arrayMove(ids, from, to);
    const moved = refOf(ids[from]);
    setLocal({ key: serverKey, ids: next });
    setProblem(null);
    setSaid(`${moved} is now drop ${to + 1} of ${next.length}.`);
    save.mutate(next, {
      onError: (error) => {
        setLocal(null);
        setSaid('');
        setProblem(`The new order was not saved, so the drops are back as they were: ${errorMessage(error)}`);
      },
    });
  };

  const onDragEnd = ({ active, over }: DragEndEvent) => {
    if (!over || active.id === over.id) return;
    move(ids.indexOf(Number(active.id)), ids.indexOf(Number(over.id)));
  };

  const announcements: Announcements = {
    onDragStart: ({ active }) => `Picked up ${refOf(active.id)}. Use the arrow keys to move it, space to drop it, escape to cancel.`,
    onDragOver: ({ active, over }) => (over ? `${refOf(active.id)} is over drop ${ids.indexOf(Number(over.id)) + 1}.` : `${refOf(active.id)} is not over a drop.`),
    onDragEnd: ({ active, over }) => (over ? `${refOf(active.id)} dropped at drop ${ids.indexOf(Number(over.id)) + 1}.` : `${refOf(active.id)} put back.`),
    onDragCancel: ({ active }) => `Moving ${refOf(active.id)} was cancelled; it is back in its place.`,
  };

  if (drops.length === 0) return <p className="text-ink-700">Nothing is booked on this run yet.</p>;
  return (
    <div className="space-y-2">
      {problem ? (
        <Alert tone="danger" title="The drop order was not saved">
          {problem}
        </Alert>
      ) : null}
      <p className="sr-only" aria-live="polite">
        {said}
      </p>
      <DndContext
        sensors={sensors}
        collisionDetection={closestCenter}
        onDragEnd={onDragEnd}
        accessibility={{ announcements, screenReaderInstructions: { draggable: 'To move a drop, press space, then the up and down arrow keys, then space again to put it down, or escape to cancel.' } }}
      >
        <SortableContext items={ids} strategy={verticalListSortingStrategy}>
          <ol
            className="divide-y divide-mortar-200 overflow-hidden rounded-md border border-mortar-300"
            aria-label={`Drops of ${run.lorry.registration} in order, the first off first`}
            aria-busy={save.isPending || undefined}
          >
            {drops.map((drop, place) => (
              <DropRow key={drop.order_id} drop={drop} place={place} count={drops.length} editable={editable} orderHref={orderHref} onMove={move} />
            ))}
          </ol>
        </SortableContext>
      </DndContext>
      {editable ? <p className="text-sm text-ink-600">Drag a drop, or use its arrows, to change the order; the first drop off is loaded last, at the rear.</p> : null}
    </div>
  );
}
