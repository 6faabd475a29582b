import { useMemo } from 'react';
import type { RoofSystemOffer } from '../../../../shared/schemas/catalogue.schema';
import type { Opening } from '../../../../shared/schemas/openings.schema';
import type { Face } from '../../../../shared/schemas/schedule.schema';
import { Alert } from '../../../components/ui/alert';
import { EmptyState } from '../../../components/ui/empty-state';
import { estimateFormSchema } from '../lib/estimate-form';
import { previewEstimate } from '../lib/estimate-preview';
import type { PreviewOutcome } from '../lib/estimate-preview';
import { placeWarnings } from '../lib/warnings';
import { FaceBreakdownTable } from './face-breakdown-table';
import { TakeOffExtras, extraLines } from './ridges-and-fittings';

const n = (v: number, digits = 0) => v.toLocaleString('en-GB', { maximumFractionDigits: digits });

function Preview({ outcome }: { outcome: PreviewOutcome }) {
  const placed = useMemo(() => (outcome.state === 'ready' ? placeWarnings(outcome.result) : null), [outcome]);
  if (outcome.state === 'empty') return <EmptyState title="Choose a roof system">The figures appear here as soon as the system is complete.</EmptyState>;
  if (outcome.state === 'problems') {
    return (
      <Alert tone="danger" title="These faces and this system do not go together yet" live={false}>
        <ul className="list-disc space-y-1 pl-5">
          {outcome.problems.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
      </Alert>
    );
  }
  const { totals } = outcome.result;
  const figures: [string, string][] = [
    ['Tiles to order', n(totals.tiles_order)],
    ['Ridge tiles', n(totals.ridge_tiles)],
    ['Hip tiles', n(totals.hip_tiles)],
    ['Batten lengths', n(totals.batten_lengths)],
    ['Batten nails', n(totals.batten_nails)],
    ['Tile nails', n(totals.tile_nails)],
    ['Underlay rolls', n(totals.underlay_rolls)],
    ['Tile pallets', n(totals.pallets)],
    ['Weight', `${n(totals.weight_kg / 1000, 1)} t`],
  ];
  return (
    <div className="space-y-4">
      <dl className="grid grid-cols-2 gap-2 sm:grid-cols-3" data-testid="estimate-preview">
        {figures.map(([label, value]) => (
          <div key={label} className="rounded-md bg-mortar-50 px-3 py-2">
            <dt className="text-sm text-ink-600">{label}</dt>
            <dd className="text-lg font-bold tabular-nums">{value}</dd>
          </div>
        ))}
      </dl>
      {extraLines(totals).length > 0 ? (
        <section aria-label="Special pieces and fittings">
          <TakeOffExtras totals={totals} />
        </section>
      ) : null}
      {outcome.result.warnings.length > 0 ? (
        <Alert tone="caution" title={`${outcome.result.warnings.length} ${outcome.result.warnings.length === 1 ? 'thing' : 'things'} to check`} live={false}>
          <ul className="list-disc space-y-1 pl-5">
            {outcome.result.warnings.map((w, i) => (
              <li key={`${w.code}-${i}`}>
                {w.face ? (
                  <span className="font-semibold">
                    {w.building} · {w.face}:{' '}
                  </span>
                ) : w.building ? (
                  <span className="font-semibold">{w.building}: </span>
                ) : null}
                {w.message}
              </li>
            ))}
          </ul>
        </Alert>
      ) : null}
      {placed ? <FaceBreakdownTable faces={outcome.result.faces} warningsByFace={placed.byFace} compact /> : null}
    </div>
  );
}

interface EstimatePreviewProps {
  /** The form's values as typed. */
  values: Record<string, string>;
  faces: readonly Face[];
  offers: readonly RoofSystemOffer[];
  openings: readonly Opening[];
}

/**
 * The engine's figures for the form as it stands, worked out in the browser. A module of its own, loaded
 * after the form (EstimateBuilder): the engine, the CSV readers it carries and the face table are most of
 * the new estimate page's code.
 */
export function EstimatePreview({ values, faces, offers, openings }: EstimatePreviewProps) {
  const outcome = useMemo<PreviewOutcome>(() => {
    const parsed = estimateFormSchema.safeParse(values);
    if (!parsed.success) {
      const issues = parsed.error.issues.filter((issue) => issue.path[0] !== 'system_id');
      // Nothing chosen yet is not a problem to list; a half-typed figure is.
      if (issues.length === 0) return { state: 'empty' };
      return { state: 'problems', problems: issues.map((issue) => `${String(issue.path[0] ?? 'system').replace(/^system\.|^waste_pct\./, '')}: ${issue.message}`) };
    }
    return previewEstimate(faces, parsed.data, offers, openings);
  }, [values, faces, offers, openings]);

  return <Preview outcome={outcome} />;
}
