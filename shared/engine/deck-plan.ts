import type { Deck, DeckPosition } from '../schemas/run.schema';

/**
 * The deck plan: where each pallet of a run sits on the lorry's deck, in what order the yard loads
 * them, and how the weight lies. Pure; lengths in millimetres, weights in kg.
 *
 * Rules (all "common practice" in builders'-merchant delivery unless named otherwise):
 * - What comes off first is loaded last and sits where it comes off first: at the rear for a ground
 *   set-down (tail-lift or forklift from the back of the deck), nearest the crane for a crane drop.
 *   A lorry-mounted crane on a merchant's rigid stands behind the cab, and a crane lifts most at its
 *   shortest reach, so the first crane pallets off sit at the front of the deck.
 * - Pallets two abreast; each row's heavier pallet goes on the lighter side, which keeps the left
 *   and right sides of the whole deck within one (the heaviest) pallet's weight of each other.
 * - The centre of gravity along the deck is reported; outside the middle of the deck by more than a
 *   quarter of its length it is a warning. Keeping the load's weight spread so no axle is overloaded
 *   is in DVSA's "Load securing: vehicle operator guidance" (weight distribution); the quarter is
 *   this product's threshold (common practice, not a published figure).
 * - Payload and pallet positions are never exceeded without a warning; a crane drop never has a
 *   pallet heavier than the crane's lifting limit without a warning naming the pallet.
 */

export const DEFAULT_DECK_LENGTH_MM = 7300;
export const DEFAULT_DECK_WIDTH_MM = 2450;
/** The UK standard pallet, 1200 × 1000 mm (ISO 6780 lists 1200 × 1000 among its six sizes). */
export const DEFAULT_PALLET_LENGTH_MM = 1200;
export const DEFAULT_PALLET_WIDTH_MM = 1000;

export interface DeckLorry {
  registration: string;
  payload_kg: number;
  pallet_slots: number;
  has_crane: boolean;
  crane_max_kg: number | null;
  deck_length_mm: number;
  deck_width_mm: number;
}

export interface DeckPallet {
  /** Its number within its order (1 = first off at that site), as on its label. */
  n: number;
  weight_kg: number;
  faces: DeckPosition['faces'];
  /** Footprint; defaults to 1200 × 1000 mm. */
  length_mm?: number;
  width_mm?: number;
}

export interface DeckDrop {
  order_id: number;
  reference: string;
  delivery_method: 'ground' | 'roof';
  pallets: readonly DeckPallet[];
}

export interface DeckGeometry {
  rows: number;
  /** Depth of one row along the deck (mm). */
  row_depth_mm: number;
  /** The pallet's size across the deck (mm). */
  across_mm: number;
  /** The pallet's size along the deck (mm). */
  along_mm: number;
}

export interface DeckPlan extends Deck {
  geometry: DeckGeometry;
}

const round1 = (v: number) => Math.round(v * 10) / 10;
const kg = (v: number) => `${Math.round(v).toLocaleString('en-GB')} kg`;

/**
 * Rows of two pallets the deck holds: the pallet turned whichever way gives more rows while two still
 * fit side by side (1200 along × 1000 across on a 2450 mm rigid's deck gives 6 rows of 1200 mm in 7300;
 * 1000 along × 1200 across on a 13.6 m trailer gives the usual 26 pallets).
 */
export function deckGeometry(lorry: Pick<DeckLorry, 'deck_length_mm' | 'deck_width_mm'>, lengthMm = DEFAULT_PALLET_LENGTH_MM, widthMm = DEFAULT_PALLET_WIDTH_MM): DeckGeometry {
  const options: DeckGeometry[] = [];
  for (const [along, across] of [
    [lengthMm, widthMm],
    [widthMm, lengthMm],
  ]) {
    if (2 * across <= lorry.deck_width_mm) options.push({ rows: Math.floor(lorry.deck_length_mm / along), row_depth_mm: along, across_mm: across, along_mm: along });
  }
  if (options.length === 0) {
    // Not two abreast at all: still two to a row on paper, with a warning from planDeck.
    const along = Math.min(lengthMm, widthMm);
    return { rows: Math.floor(lorry.deck_length_mm / Math.max(lengthMm, widthMm)), row_depth_mm: Math.max(lengthMm, widthMm), across_mm: along, along_mm: Math.max(lengthMm, widthMm) };
  }
  return options.sort((a, b) => b.rows - a.rows || a.row_depth_mm - b.row_depth_mm)[0];
}

const palletKey = (orderId: number, n: number) => `${orderId}:${n}`;
export { palletKey as deckPalletKey };

/**
 * Places every pallet of a run's drops (in drop order, 1 = first off) on the lorry's deck. `loaded`
 * holds the keys (`order_id:pallet`) of pallets already on the lorry. Positions are listed front to
 * back, left before right; the loading sequence is the reverse of the unloading order (last drop's
 * last pallet first).
 */
export function planDeck(lorry: DeckLorry, drops: readonly DeckDrop[], loaded: ReadonlySet<string> = new Set()): DeckPlan {
  const warnings: Deck['warnings'] = [];
  const all = drops.flatMap((d, i) => [...d.pallets].sort((a, b) => a.n - b.n).map((p) => ({ drop: i + 1, dropInfo: d, pallet: p })));
  // Rows are sized by the largest footprint on the run.
  const lengthMm = all.length > 0 ? Math.max(...all.map((x) => x.pallet.length_mm ?? DEFAULT_PALLET_LENGTH_MM)) : DEFAULT_PALLET_LENGTH_MM;
  const widthMm = all.length > 0 ? Math.max(...all.map((x) => x.pallet.width_mm ?? DEFAULT_PALLET_WIDTH_MM)) : DEFAULT_PALLET_WIDTH_MM;
  const geometry = deckGeometry(lorry, lengthMm, widthMm);
  if (2 * geometry.across_mm > lorry.deck_width_mm) {
    warnings.push({ code: 'not_two_abreast', message: `Two ${lengthMm} × ${widthMm} mm pallets do not fit side by side on ${lorry.registration}'s ${lorry.deck_width_mm} mm deck` });
  }
  const capacity = Math.min(geometry.rows * 2, lorry.pallet_slots);
  if (all.length > capacity) {
    warnings.push({ code: 'over_positions', message: `${all.length} pallets, but ${lorry.registration} takes ${capacity}: ${all.length - capacity} will not fit` });
  }
  const total = all.reduce((s, x) => s + x.pallet.weight_kg, 0);
  if (total > lorry.payload_kg + 0.001) {
    warnings.push({ code: 'over_payload', message: `The load weighs ${kg(total)}, more than the ${kg(lorry.payload_kg)} payload of ${lorry.registration}` });
  }
  for (const x of all) {
    if (x.dropInfo.delivery_method !== 'roof') continue;
    if (!lorry.has_crane) {
      warnings.push({ code: 'no_crane', message: `Drop ${x.drop} (${x.dropInfo.reference}) is lifted onto the roof, and ${lorry.registration} has no crane` });
      break;
    }
  }
  for (const x of all) {
    if (x.dropInfo.delivery_method === 'roof' && lorry.has_crane && lorry.crane_max_kg !== null && x.pallet.weight_kg > lorry.crane_max_kg) {
      warnings.push({
        code: 'over_crane',
        message: `Pallet ${x.pallet.n} of ${x.dropInfo.reference} (drop ${x.drop}) weighs ${kg(x.pallet.weight_kg)}, more than the ${kg(lorry.crane_max_kg)} the crane lifts`,
      });
    }
  }

  // Slots two to a row. The load is kept as one block in the middle of the deck (over the axles);
  // inside it crane pallets take slots from the front and ground pallets from the rear, each in
  // unloading order, so the first off of each kind is where it comes off first.
  const rows = Math.max(geometry.rows, Math.ceil(all.length / 2));
  const usedRows = Math.ceil(all.length / 2);
  const first = Math.floor((rows - usedRows) / 2) * 2;
  const isCrane = all.map((x) => x.dropInfo.delivery_method === 'roof' && lorry.has_crane);
  let front = first;
  let rear = first + all.length - 1;
  const rowOf: number[] = [];
  all.forEach((_, i) => {
    const slot = isCrane[i] ? front++ : rear--;
    rowOf[i] = Math.floor(slot / 2) + 1;
  });

  // Sides: row by row from the front, the heavier pallet of each row onto the lighter side.
  const byRow = new Map<number, number[]>();
  all.forEach((_, i) => byRow.set(rowOf[i], [...(byRow.get(rowOf[i]) ?? []), i]));
  const sideOf: Array<'left' | 'right'> = [];
  let left = 0;
  let right = 0;
  for (const row of [...byRow.keys()].sort((a, b) => a - b)) {
    const members = byRow.get(row)!.sort((a, b) => all[b].pallet.weight_kg - all[a].pallet.weight_kg || a - b);
    const lighter = left <= right ? 'left' : 'right';
    members.forEach((i, k) => {
      const side = k === 0 ? lighter : lighter === 'left' ? 'right' : 'left';
      sideOf[i] = side;
      if (side === 'left') left += all[i].pallet.weight_kg;
      else right += all[i].pallet.weight_kg;
    });
  }

  const order = all.map((_, i) => i).sort((a, b) => rowOf[a] - rowOf[b] || (sideOf[a] === sideOf[b] ? 0 : sideOf[a] === 'left' ? -1 : 1));
  const positions: DeckPosition[] = order.map((i) => ({
    row: rowOf[i],
    side: sideOf[i],
    drop: all[i].drop,
    order_id: all[i].dropInfo.order_id,
    pallet: all[i].pallet.n,
    weight_kg: all[i].pallet.weight_kg,
    faces: all[i].pallet.faces,
    loaded: loaded.has(palletKey(all[i].dropInfo.order_id, all[i].pallet.n)),
  }));
  const loading_sequence = positions.map((_, idx) => idx).sort((a, b) => positions[b].drop - positions[a].drop || positions[b].pallet - positions[a].pallet);

  const heaviest = Math.max(0, ...positions.map((p) => p.weight_kg));
  if (Math.abs(left - right) > heaviest + 0.001) {
    warnings.push({ code: 'side_imbalance', message: `Left ${kg(left)} and right ${kg(right)} differ by more than the heaviest pallet (${kg(heaviest)})` });
  }

  const centre = (row: number) => (row - 1) * geometry.row_depth_mm + geometry.row_depth_mm / 2;
  const cog = total > 0 ? positions.reduce((s, p) => s + p.weight_kg * centre(p.row), 0) / total : lorry.deck_length_mm / 2;
  if (total > 0 && Math.abs(cog - lorry.deck_length_mm / 2) > lorry.deck_length_mm / 4) {
    warnings.push({
      code: 'cog_off_centre',
      message: `The load's centre of gravity is ${Math.round(cog).toLocaleString('en-GB')} mm from the front of a ${lorry.deck_length_mm.toLocaleString('en-GB')} mm deck, more than a quarter of its length from the middle: check the axle weights`,
    });
  }

  return { positions, loading_sequence, left_kg: round1(left), right_kg: round1(right), cog_from_front_mm: Math.round(cog), warnings, geometry };
}
