import { useState } from 'react';
import type { Run } from '../../../../shared/schemas/run.schema';
import { Alert, errorMessage } from '../../../components/ui/alert';
import { useSetPositionLoaded } from '../api/set-position-loaded';
import { dropStyle } from '../lib/drop-style';
import { facesText, kg, metres } from '../lib/run-format';
import { DeckDrawing, positionName } from './deck-drawing';
import { DropSwatch } from './drop-patterns';

/** Which drop is which on the drawing: number, pattern and colour in words. */
export function DropLegend({ run }: { run: Run }) {
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm" aria-label="Drops on the drawing">
      {run.drops.map((d) => {
        const style = dropStyle(d.position);
        return (
          <li key={d.order_id} className="flex items-center gap-1.5">
            <DropSwatch drop={d.position} />
            <span>
              <span className="font-semibold">D{d.position}</span> {d.reference}{' '}
              <span className="text-ink-600">
                ({style.patternName}, {style.colourName})
              </span>
            </span>
          </li>
        );
      })}
    </ul>
  );
}

/** The balance figures the drawing shows, in words as well. */
export function DeckFigures({ run }: { run: Run }) {
  const { left_kg: left, right_kg: right, cog_from_front_mm: cog } = run.deck;
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-0.5 text-sm" aria-label="Balance of the load">
      <dt className="text-ink-600">Left / right</dt>
      <dd className="tabular-nums">
        {kg(left)} / {kg(right)} <span className="text-ink-600">(difference {kg(Math.abs(left - right))})</span>
      </dd>
      <dt className="text-ink-600">Centre of gravity</dt>
      <dd className="tabular-nums">
        {metres(cog)} from the front of a {metres(run.lorry.deck_length_mm)} deck
      </dd>
    </dl>
  );
}

export function DeckWarnings({ run }: { run: Run }) {
  if (run.deck.warnings.length === 0) return null;
  return (
    <Alert tone="caution" title={run.deck.warnings.length === 1 ? 'Check the load' : `Check the load: ${run.deck.warnings.length} warnings`} live={false}>
      <ul className="list-disc space-y-0.5 pl-5">
        {run.deck.warnings.map((w, i) => (
          <li key={`${w.code}-${i}`}>{w.message}</li>
        ))}
      </ul>
    </Alert>
  );
}

interface DeckPanelProps {
  run: Run;
  /** The yard may tick pallets loaded; others see the plan only. */
  canBuild: boolean;
}

/**
 * The deck plan of a run: the drawing (tap a pallet to tick it loaded) and beside it the same pallets
 * as a list in loading order, each with a checkbox — the drawing's text alternative too.
 */
export function DeckPanel({ run, canBuild }: DeckPanelProps) {
  const tick = useSetPositionLoaded(run.id);
  const [pending, setPending] = useState<ReadonlySet<number>>(new Set());
  const [problem, setProblem] = useState<string | null>(null);
  const gone = run.status === 'on_the_road' || run.status === 'done';
  const editable = canBuild && !gone;
  const toggle = (index: number, loaded: boolean) => {
    setProblem(null);
    setPending((s) => new Set(s).add(index));
    tick.mutate(
      { index, loaded },
      {
        onError: (error) => setProblem(`${positionName(run, index)} was not ${loaded ? 'ticked' : 'unticked'}: ${errorMessage(error)}`),
        onSettled: () =>
          setPending((s) => {
            const next = new Set(s);
            next.delete(index);
            return next;
          }),
      },
    );
  };
  const positions = run.deck.positions;
  const order = run.deck.loading_sequence.length === positions.length ? run.deck.loading_sequence : positions.map((_, i) => i);
  const loaded = positions.filter((p) => p.loaded).length;
  return (
    <section aria-label={`Deck plan of ${run.lorry.registration}`} className="space-y-4">
      <DeckWarnings run={run} />
      {problem ? (
        <Alert tone="danger" title="The tick was not saved">
          {problem}
        </Alert>
      ) : null}
      <p className="text-sm text-ink-700" aria-live="polite">
        <span className="font-semibold tabular-nums">
          {loaded} of {positions.length}
        </span>{' '}
        pallets loaded{editable ? ' · tap a pallet on the drawing or tick it in the list' : ''}
      </p>
      <div className="grid items-start gap-4 sm:grid-cols-[minmax(9rem,15rem)_minmax(0,1fr)]">
        <div className="space-y-3">
          <DeckDrawing run={run} onToggle={editable ? toggle : undefined} pending={pending} className="mx-auto block w-full max-w-[16rem] sm:max-w-none" />
          <DeckFigures run={run} />
        </div>
        <div className="space-y-3">
          <DropLegend run={run} />
          <h3 className="font-semibold">Pallets in loading order (first on, last off)</h3>
          <ol className="divide-y divide-mortar-200 rounded-md border border-mortar-300" aria-label="Pallets in loading order">
            {order.map((index, n) => {
              const p = positions[index]!;
              const name = positionName(run, index);
              return (
                <li key={index} className="flex items-start gap-3 px-3 py-2">
                  <span className="w-6 pt-2 text-right text-sm tabular-nums text-ink-600">{n + 1}.</span>
                  <DropSwatch drop={p.drop} className="mt-2 h-5 w-5" />
                  <label className={`flex min-h-tap flex-1 items-start gap-3 ${editable ? 'cursor-pointer' : ''}`}>
                    <input
                      type="checkbox"
                      className="mt-2.5 h-5 w-5 shrink-0 accent-moss-600"
                      checked={p.loaded}
                      disabled={!editable || pending.has(index)}
                      onChange={(e) => toggle(index, e.target.checked)}
                      aria-label={`Loaded: ${name}`}
                    />
                    <span className="min-w-0">
                      <span className="block font-medium">{name}</span>
                      <span className="block text-sm text-ink-600">{facesText(p.faces)}</span>
                    </span>
                  </label>
                </li>
              );
            })}
          </ol>
        </div>
      </div>
    </section>
  );
}
