import type { EngineResult, Totals } from '../../../../shared/engine/result';
import { RIDGE_BALANCE_TOLERANCE } from '../../../../shared/engine/defaults';
import { Alert } from '../../../components/ui/alert';

const n = (v: number, digits = 0) => v.toLocaleString('en-GB', { maximumFractionDigits: digits });

interface ExtraLine {
  label: string;
  value: string;
  hint: string;
}

/**
 * The take-off's own lines beyond tiles, battens and ridges: double-lap special pieces, verge, hip and
 * valley fittings, openings and flashings. An estimate from an earlier engine has none of these.
 */
export function extraLines(totals: Partial<Totals>): ExtraLine[] {
  const lines: ExtraLine[] = [];
  const add = (value: number | undefined, label: string, shown: string, hint: string) => {
    if (value !== undefined && value > 0) lines.push({ label, value: shown, hint });
  };
  add(totals.eaves_tiles_order, 'Eaves tiles', n(totals.eaves_tiles_order ?? 0), `${n(totals.eaves_tiles ?? 0)} laid, tile waste added`);
  add(totals.top_tiles_order, 'Top tiles', n(totals.top_tiles_order ?? 0), `${n(totals.top_tiles ?? 0)} laid, tile waste added`);
  add(totals.tile_and_half_order, 'Tiles-and-a-half', n(totals.tile_and_half_order ?? 0), `${n(totals.tile_and_half ?? 0)} at the verges, tile waste added`);
  add(totals.dry_verge_units, 'Dry verge units', n(totals.dry_verge_units ?? 0), 'one a course on each verge');
  add(totals.ridge_end_caps, 'Ridge end caps', n(totals.ridge_end_caps ?? 0), 'each ridge end at a dry verge');
  add(totals.hip_irons, 'Hip irons', n(totals.hip_irons ?? 0), 'one at the foot of each hip');
  add(totals.valley_units, 'Valley trough units', n(totals.valley_units ?? 0), 'lapped along each valley');
  add(totals.verge_m, 'Verges', `${n(totals.verge_m ?? 0, 2)} m`, 'raking length of every verge');
  add(totals.eaves_m, 'Eaves', `${n(totals.eaves_m ?? 0, 2)} m`, 'for eaves ventilation and comb fillers');
  add(totals.roof_windows, 'Roof windows', n(totals.roof_windows ?? 0), 'each with its own flashing kit');
  add(totals.hatches, 'Roof hatches', n(totals.hatches ?? 0), 'each with its own flashing kit');
  add(totals.openings_area_m2, 'Openings', `${n(totals.openings_area_m2 ?? 0, 2)} m²`, 'left out of the tiled area');
  const f = totals.flashings;
  if (f) {
    add(f.side_abutment_m, 'Side abutment flashing', `${n(f.side_abutment_m, 2)} m`, 'up walls beside the slope, chimney and dormer sides');
    add(f.top_abutment_m, 'Top abutment flashing', `${n(f.top_abutment_m, 2)} m`, 'along walls at the top of a face');
    add(f.apron_m, 'Apron flashing', `${n(f.apron_m, 2)} m`, 'below chimneys and dormers, 150 mm past each side');
    add(f.back_gutter_m, 'Back gutter', `${n(f.back_gutter_m, 2)} m`, 'behind chimneys, 150 mm past each side');
  }
  return lines;
}

export function TakeOffExtras({ totals }: { totals: Partial<Totals> }) {
  const lines = extraLines(totals);
  if (lines.length === 0) {
    return <p className="text-sm text-ink-700">None on this roof: no double-lap special pieces, dry verges, hips, trough valleys, openings or abutments.</p>;
  }
  return (
    <table className="w-full text-left text-sm">
      <caption className="sr-only">Special pieces, fittings and flashings</caption>
      <thead>
        <tr className="border-b border-mortar-300">
          <th scope="col" className="py-2 pr-4 font-semibold">
            What
          </th>
          <th scope="col" className="py-2 pr-4 text-right font-semibold">
            Quantity
          </th>
          <th scope="col" className="py-2 font-semibold">
            How it is counted
          </th>
        </tr>
      </thead>
      <tbody>
        {lines.map((line) => (
          <tr key={line.label} className="border-b border-mortar-200">
            <th scope="row" className="py-2 pr-4 font-medium">
              {line.label}
            </th>
            <td className="py-2 pr-4 text-right tabular-nums">{line.value}</td>
            <td className="py-2 text-ink-700">{line.hint}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/**
 * Each ridge with the faces that meet it and their loads, heaviest less lightest; a ridge whose
 * slopes differ by more than a tenth of the heavier is flagged. Ridges not named in the schedule
 * were paired by their top length, which can hide an uneven load.
 */
export function RidgeLoads({ result }: { result: EngineResult }) {
  if (result.ridges.length === 0) return <p className="text-sm text-ink-700">No ridges on this roof.</p>;
  const guessed = result.ridges.some((r) => (r.ridge ?? null) === null);
  return (
    <div className="space-y-3">
      <Alert tone="caution" title="Load the roof evenly" live={false}>
        Load the slopes of each ridge in step, top to bottom, over braced rafters or trusses, and never leave one side loaded alone. A structural engineer decides what the roof can carry; the tile maker&rsquo;s fixing
        specification and local codes come first.
      </Alert>
      {guessed ? <p className="text-sm text-ink-700">Some faces name no ridge: they were paired by equal top length. Give the ridge column in the schedule to group them as built.</p> : null}
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Ridges and the loads of their faces</caption>
        <thead>
          <tr className="border-b border-mortar-300">
            <th scope="col" className="py-2 pr-4 font-semibold">
              Building
            </th>
            <th scope="col" className="py-2 pr-4 font-semibold">
              Ridge
            </th>
            <th scope="col" className="py-2 pr-4 font-semibold">
              Faces and loads
            </th>
            <th scope="col" className="py-2 text-right font-semibold">
              Load difference
            </th>
          </tr>
        </thead>
        <tbody>
          {result.ridges.map((r, i) => {
            const heavier = Math.max(...r.load_kg);
            const uneven = heavier > 0 && r.difference_kg > RIDGE_BALANCE_TOLERANCE * heavier;
            return (
              <tr key={`${r.building}-${r.ridge ?? i}`} className="border-b border-mortar-200" data-testid="ridge-row">
                <td className="py-2 pr-4">{r.building}</td>
                <td className="py-2 pr-4 font-medium">{r.ridge ?? <span className="text-ink-600">paired by top length</span>}</td>
                <td className="py-2 pr-4">{r.faces.map((face, j) => `${face} ${n(r.load_kg[j])} kg`).join(' · ')}</td>
                <td className={`py-2 text-right tabular-nums ${uneven ? 'font-semibold text-brick-700' : ''}`}>
                  {n(r.difference_kg)} kg{uneven ? ' · uneven' : ''}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
