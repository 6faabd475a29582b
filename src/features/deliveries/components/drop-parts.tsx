import type { ReactNode } from 'react';
import type { RoofSystem } from '../../../../shared/schemas/roof-system.schema';
import type { DriverDrop, LandingFaceDrawing } from '../../../../shared/schemas/run.schema';
import { CRANE_LIFT_LABELS, OVERHEAD_LINES_LABELS, VEHICLE_ACCESS_LABELS } from '../../../../shared/schemas/project.schema';
import { Alert } from '../../../components/ui/alert';
import { buttonClasses } from '../../../components/ui/button';
import { formatDate } from '../../../lib/format';
import { faceWords, kg, productWords, quantityWords } from '../lib/words';

/**
 * Draws one roof face with its stacks for the landing plan, from what the driver's day carries (the
 * face's shape and figures, the drop's roof system); given by the page, which has the face drawing.
 */
export type RenderFaceDrawing = (drawing: LandingFaceDrawing, system: RoofSystem) => ReactNode;

/** The site's address with a link that opens the phone's own maps app, and a call button. */
export function SiteBlock({ drop }: { drop: DriverDrop }) {
  const { site } = drop;
  const phone = site.contact_phone.replace(/[^\d+]/g, '');
  return (
    <section aria-label="Site" className="space-y-3">
      <p className="text-xl">
        {site.site_address}
        {site.site_postcode ? `, ${site.site_postcode}` : ''}
      </p>
      <a href={drop.maps_url} className={buttonClasses('primary', 'lg', 'w-full')} rel="noopener">
        Open in maps
      </a>
      {phone ? (
        <a href={`tel:${phone}`} className={buttonClasses('secondary', 'lg', 'w-full')}>
          Call {site.contact_name || 'the site'} {site.contact_phone}
        </a>
      ) : null}
    </section>
  );
}

/** Access and set-down notes: lorry size, crane, overhead lines, where to set down, the site's notes. */
export function AccessNotes({ drop }: { drop: DriverDrop }) {
  const { site } = drop;
  const notes = [
    VEHICLE_ACCESS_LABELS[site.vehicle_access],
    CRANE_LIFT_LABELS[site.crane_lift],
    OVERHEAD_LINES_LABELS[site.overhead_lines],
    site.set_down_place ? `Set down: ${site.set_down_place}` : null,
    site.access_notes || null,
    ...drop.notes,
  ].filter((n): n is string => Boolean(n));
  const unique = [...new Set(notes)];
  return (
    <section aria-label="Access notes">
      <h4 className="text-xl font-semibold">Access and set-down</h4>
      <ul className="mt-1 list-disc space-y-1 pl-6">
        {unique.map((n) => (
          <li key={n} className="whitespace-pre-line">
            {n}
          </li>
        ))}
      </ul>
    </section>
  );
}

/** Faces this drop leaves short, with how many tiles and when the rest is due. */
export function ShortFaces({ drop }: { drop: DriverDrop }) {
  if (drop.short_faces.length === 0) return null;
  return (
    <Alert tone="caution" title="Short on this drop" live={false}>
      <ul className="space-y-1" aria-label="Short faces">
        {drop.short_faces.map((f) => (
          <li key={`${f.building}-${f.face}`} data-testid="short-face">
            <span className="font-semibold">{faceWords(f)}</span>: {f.tiles_short.toLocaleString('en-GB')} tiles missing; {f.due_date ? `the rest due ${formatDate(f.due_date)}` : 'no date yet for the rest'}
            {f.follow_up_reference ? ` on ${f.follow_up_reference}` : ''}.
          </li>
        ))}
      </ul>
      <p className="mt-1">Tell the receiver; do not spread the shortage over the other faces.</p>
    </Alert>
  );
}

/** The pallets in the order they come off (pallet 1 first), with the faces and products on each. */
export function PalletList({ drop }: { drop: DriverDrop }) {
  const pallets = [...drop.pallets].sort((a, b) => a.n - b.n);
  return (
    <section aria-label={`Pallets to hand over for ${drop.reference}`}>
      <h4 className="text-xl font-semibold">Pallets, in the order they come off</h4>
      <ol className="mt-2 space-y-2">
        {pallets.map((p) => (
          <li key={p.n} data-testid="pallet" className="rounded-md border-2 border-mortar-300 bg-white p-3">
            <p className="font-bold">
              Pallet {p.n} of {pallets.length} · {kg(p.weight_kg)}
            </p>
            {p.faces.length > 0 ? (
              <ul className="mt-1" aria-label={`Roof faces pallet ${p.n} serves`}>
                {p.faces.map((f) => (
                  <li key={`${f.building}-${f.face}`}>
                    For <span className="font-semibold">{faceWords(f)}</span>: {f.tiles.toLocaleString('en-GB')} tiles
                  </li>
                ))}
              </ul>
            ) : null}
            <PalletProducts pallet={p} />
          </li>
        ))}
      </ol>
    </section>
  );
}

/** The products a pallet carries besides the tiles for its faces, one line each; nothing when it has none. */
function PalletProducts({ pallet }: { pallet: DriverDrop['pallets'][number] }) {
  if (pallet.items.length === 0) return null;
  return (
    <ul className="mt-1" aria-label={`Products on pallet ${pallet.n}`}>
      {pallet.items.map((item) => (
        <li key={item.description}>
          {productWords(item.description)}: {quantityWords(item.quantity, item.unit)}
        </li>
      ))}
    </ul>
  );
}

/**
 * For a crane drop: which pallets land on which roof face, each face with its stack drawing when the
 * order has an estimate. Stacks are spread as the drawing shows, both slopes in step.
 */
export function LandingPlan({ drop, renderFaceDrawing }: { drop: DriverDrop; renderFaceDrawing?: RenderFaceDrawing }) {
  if (drop.delivery_method !== 'roof' || drop.landing_plan.length === 0) return null;
  return (
    <section aria-label="Roof landing plan" className="space-y-2">
      <h4 className="text-xl font-semibold">Roof landing plan</h4>
      <p>Land each pallet on its face and spread it in stacks as drawn: load both slopes in step, never one side first.</p>
      <ol className="space-y-2">
        {drop.landing_plan.map((face) => (
          <li key={`${face.building}-${face.face}`} data-testid="landing-face" className="rounded-md border-2 border-ink-200 p-3">
            <p>
              <span className="font-semibold">{faceWords(face)}</span> ← {face.pallets.length === 1 ? 'pallet' : 'pallets'} {face.pallets.join(', ')} · {face.tiles.toLocaleString('en-GB')} tiles
            </p>
            {face.drawing && drop.roof_system && renderFaceDrawing ? (
              <details className="mt-2">
                <summary className="min-h-tap-lg cursor-pointer content-center font-semibold">Show the stacks on {faceWords(face)}</summary>
                <div className="mt-2">{renderFaceDrawing(face.drawing, drop.roof_system)}</div>
              </details>
            ) : face.face !== 'spare' ? (
              <p className="mt-1 text-ink-700">No drawing for this face: spread the stacks evenly over the rafters on every loading batten, both slopes in step.</p>
            ) : null}
          </li>
        ))}
      </ol>
    </section>
  );
}
