import { lazy, Suspense, useEffect, useRef, useState } from 'react';
import type { DriverDay as DriverDayData, DriverDrop } from '../../../../shared/schemas/run.schema';
import { DELIVERY_METHOD_LABELS } from '../../../../shared/schemas/order.schema';
import { RUN_STATUS_LABELS } from '../../../../shared/schemas/run.schema';
import { Button } from '../../../components/ui/button';
import { formatDate } from '../../../lib/format';
import { useOutbox } from '../lib/phone-outbox';
import { kg } from '../lib/words';
import { AccessNotes, LandingPlan, PalletList, ShortFaces, SiteBlock } from './drop-parts';
import type { RenderFaceDrawing } from './drop-parts';
import type { RecordOutcome } from './proof-form';
import { RunCautions } from './run-cautions';

// The proof form (its signature pad and form code) loads when a delivery is being recorded, not with the
// day's list; the service worker keeps it on the phone for drops without signal.
const ProofForm = lazy(() => import('./proof-form').then((m) => ({ default: m.ProofForm })));

type Run = DriverDayData['runs'][number];
type DropState = 'delivered' | 'waiting' | 'to_deliver' | 'not_sent_out';

const dropKey = (run: Run, drop: DriverDrop) => `${run.id}:${drop.order_id}`;

const STATE_WORDS: Record<DropState, string> = {
  delivered: 'Delivered',
  waiting: 'Recorded, waiting to send',
  to_deliver: 'To deliver',
  not_sent_out: 'Not sent out yet',
};
const STATE_CLASSES: Record<DropState, string> = {
  delivered: 'bg-moss-100 text-moss-800',
  waiting: 'bg-ochre-100 text-ochre-800',
  to_deliver: 'bg-clay-100 text-clay-800',
  not_sent_out: 'bg-ink-100 text-ink-700',
};

/** Brings a drop's header to the top of the screen, moving focus there without a second jump. */
function bringToTop(element: HTMLElement | null) {
  if (!element) return;
  element.focus({ preventScroll: true });
  if (typeof element.scrollIntoView === 'function') element.scrollIntoView({ block: 'start' });
}

interface DropCardProps {
  drop: DriverDrop;
  total: number;
  state: DropState;
  open: boolean;
  onToggle: () => void;
  onRecorded: (outcome: RecordOutcome) => void;
  headerRef: (el: HTMLButtonElement | null) => void;
  renderFaceDrawing?: RenderFaceDrawing;
}

/** One drop: a one-line header when closed; the site, notes, pallets, landing plan and proof form when open. */
function DropCard({ drop, total, state, open, onToggle, onRecorded, headerRef, renderFaceDrawing }: DropCardProps) {
  const [recording, setRecording] = useState(false);
  const bodyId = `drop-${drop.order_id}-body`;
  return (
    <article aria-labelledby={`drop-${drop.order_id}-title`} className={`rounded-lg border-2 bg-white ${open ? 'border-ink-700' : 'border-ink-200'}`}>
      <h3 id={`drop-${drop.order_id}-title`} className="m-0">
        <button ref={headerRef} type="button" aria-expanded={open} aria-controls={bodyId} onClick={onToggle} className="flex min-h-tap-lg w-full scroll-mt-20 items-center gap-3 rounded-lg p-4 text-left">
          <span className="flex h-12 w-12 shrink-0 items-center justify-center rounded-full bg-ink-900 text-xl font-bold text-white" aria-hidden="true">
            {drop.position}
          </span>
          <span className="min-w-0 flex-1">
            <span className="sr-only">
              Drop {drop.position} of {total}:{' '}
            </span>
            <span className="block truncate text-xl font-bold">{drop.site.name}</span>
            <span className="block text-base text-ink-700">
              {drop.reference} · {drop.pallets.length} {drop.pallets.length === 1 ? 'pallet' : 'pallets'} · {kg(drop.weight_kg)}
            </span>
            <span className={`mt-1 inline-block rounded px-2 py-0.5 text-base font-semibold ${STATE_CLASSES[state]}`}>{STATE_WORDS[state]}</span>
          </span>
          <span className="text-2xl" aria-hidden="true">
            {open ? '▴' : '▾'}
          </span>
        </button>
      </h3>
      {open ? (
        <div id={bodyId} className="space-y-5 border-t-2 border-ink-100 p-4">
          <p className="text-ink-700">
            {drop.contractor.name} · {DELIVERY_METHOD_LABELS[drop.delivery_method]}
          </p>
          <SiteBlock drop={drop} />
          <AccessNotes drop={drop} />
          <ShortFaces drop={drop} />
          <PalletList drop={drop} />
          <LandingPlan drop={drop} renderFaceDrawing={renderFaceDrawing} />
          {state === 'delivered' ? (
            <p className="text-xl font-semibold text-moss-800">Delivered</p>
          ) : state === 'waiting' ? (
            <p className="text-xl font-semibold text-ochre-800">Recorded on this phone: it is sent as soon as there is signal.</p>
          ) : state === 'not_sent_out' ? (
            <p>Not sent out yet: the yard sends the lorry out when it is loaded.</p>
          ) : recording ? (
            <section aria-label="Record the delivery" className="rounded-md border-2 border-clay-600 p-3">
              <Suspense fallback={<p role="status">Opening the delivery record…</p>}>
                <ProofForm drop={drop} onRecorded={onRecorded} />
              </Suspense>
            </section>
          ) : (
            <Button size="lg" className="w-full text-xl" onClick={() => setRecording(true)}>
              Record the delivery
            </Button>
          )}
        </div>
      ) : null}
    </article>
  );
}

function dropState(drop: DriverDrop, waiting: ReadonlySet<number>, sentHere: ReadonlySet<number> = new Set()): DropState {
  if (drop.delivered || drop.status === 'delivered' || sentHere.has(drop.order_id)) return 'delivered';
  if (waiting.has(drop.order_id)) return 'waiting';
  if (drop.status === 'on_the_road') return 'to_deliver';
  return 'not_sent_out';
}

interface DriverDayProps {
  day: DriverDayData;
  renderFaceDrawing?: RenderFaceDrawing;
}

/**
 * The driver's day on a phone: each run with its cautions once, then its drops in order. One drop is
 * open at a time and finished ones fold to a line, so the day stays short; after "Delivered" the next
 * drop opens with its header at the top of the screen.
 */
export function DriverDay({ day, renderFaceDrawing }: DriverDayProps) {
  const { entries } = useOutbox();
  const waiting = new Set(entries.flatMap((e) => (e.kind === 'delivery' ? [e.order_id] : [])));
  const readPending = new Set(entries.flatMap((e) => (e.kind === 'cautions_read' ? [e.run_id] : [])));
  const runs = day.runs.filter((r) => r.drops.length > 0);
  const ordered = runs.flatMap((run) => [...run.drops].sort((a, b) => a.position - b.position).map((drop) => ({ run, drop })));
  const firstOpen = ordered.find(({ drop }) => {
    const s = dropState(drop, waiting);
    return s === 'to_deliver' || s === 'not_sent_out';
  });
  const [openKey, setOpenKey] = useState<string | null>(firstOpen ? dropKey(firstOpen.run, firstOpen.drop) : null);
  const headers = useRef(new Map<string, HTMLButtonElement>());
  // The drop whose header comes to the top once the render that folds or opens it is on the page.
  const scrollAfterRender = useRef<string | null>(null);
  // Sent from this page: delivered, before the day is read again from the server.
  const [sentHere, setSentHere] = useState<ReadonlySet<number>>(new Set());
  const stateOf = (drop: DriverDrop) => dropState(drop, waiting, sentHere);

  useEffect(() => {
    const key = scrollAfterRender.current;
    if (!key) return;
    scrollAfterRender.current = null;
    bringToTop(headers.current.get(key) ?? null);
  });

  const recorded = (key: string, orderId: number, outcome: RecordOutcome) => {
    if (outcome !== 'queued') setSentHere((prev) => new Set([...prev, orderId]));
    const at = ordered.findIndex(({ run, drop }) => dropKey(run, drop) === key);
    const next = ordered.slice(at + 1).find(({ drop }) => stateOf(drop) === 'to_deliver');
    const nextKey = next ? dropKey(next.run, next.drop) : null;
    // Never left at the bottom of a closed form: the next drop (or this one, folded) comes to the top.
    scrollAfterRender.current = nextKey ?? key;
    setOpenKey(nextKey);
  };

  if (runs.length === 0) {
    return <p className="text-xl">No drops for you on {formatDate(day.date)}.</p>;
  }

  return (
    <div className="space-y-8">
      {runs.map((run) => {
        const drops = [...run.drops].sort((a, b) => a.position - b.position);
        const done = drops.filter((d) => stateOf(d) === 'delivered').length;
        return (
          <section key={run.id} aria-label={`Run ${run.time_window} on ${run.lorry.registration}`} className="space-y-3">
            <header className="rounded-lg bg-ink-900 p-4 text-white">
              <h2 className="text-2xl font-bold">
                {run.time_window} · {run.lorry.registration}
              </h2>
              <p className="text-lg">
                {RUN_STATUS_LABELS[run.status]} · {drops.length} {drops.length === 1 ? 'drop' : 'drops'}, {done} delivered · {run.lorry.has_crane ? `crane lifts up to ${kg(run.lorry.crane_max_kg ?? 0)}` : 'no crane'}
              </p>
            </header>
            <RunCautions run={run} pending={readPending.has(run.id)} />
            <ol className="space-y-3" aria-label={`Drops of the ${run.time_window} run, in order`}>
              {drops.map((drop) => {
                const key = dropKey(run, drop);
                return (
                  <li key={key}>
                    <DropCard
                      drop={drop}
                      total={drops.length}
                      state={stateOf(drop)}
                      open={openKey === key}
                      onToggle={() => setOpenKey(openKey === key ? null : key)}
                      onRecorded={(outcome) => recorded(key, drop.order_id, outcome)}
                      headerRef={(el) => {
                        if (el) headers.current.set(key, el);
                        else headers.current.delete(key);
                      }}
                      renderFaceDrawing={renderFaceDrawing}
                    />
                  </li>
                );
              })}
            </ol>
          </section>
        );
      })}
    </div>
  );
}
