import { ACCESSORY_WORDS, type Pallet } from '../../../shared/engine/delivery';
import { DELIVERY_METHOD_LABELS, type OrderSite } from '../../../shared/schemas/order.schema';
import { CRANE_LIFT_LABELS, OVERHEAD_LINES_LABELS, VEHICLE_ACCESS_LABELS } from '../../../shared/schemas/project.schema';
import type { z } from 'zod';
import type { landingFaceSchema, shortFaceSchema } from '../../../shared/schemas/run.schema';

type ShortFace = z.infer<typeof shortFaceSchema>;
type LandingFace = z.infer<typeof landingFaceSchema>;

/** What the sheet needs of an order line. */
export interface SheetLine {
  id: number;
  sku: string;
  description: string;
  category: string;
  unit: string;
  pack_size: number;
  quantity: number;
  reserved_quantity: number;
  confirmed_quantity: number | null;
  back_order_quantity: number;
}

export interface SheetItem {
  description: string;
  quantity: number;
  unit: string;
}

/** The engine's name for the items it counts, back to the product category the order line carries (see slots/order-load). */
const ITEM_CATEGORY: Record<string, string> = {
  underlay_rolls: 'underlay',
  battens: 'batten',
  batten_nails: 'batten_nail',
  tile_nails: 'tile_nail',
  ridge_tiles: 'ridge',
  hip_tiles: 'hip',
  clips: 'clip',
};

/** Words for an item no line of the order names any more (a line removed after booking). */
const words = (item: string): [string, string] => {
  const known = (ACCESSORY_WORDS as Record<string, { label: string; unit: string } | undefined>)[item];
  return known ? [known.label, known.unit] : [item.charAt(0).toUpperCase() + item.slice(1).replace(/_/g, ' '), 'each'];
};

/**
 * Each pallet's contents as product names and units. The packer took the order's accessory lines one
 * by one in line order, so handing its items back to the lines of their category in the same order,
 * unit by unit, names every item exactly. A tile pallet lists the tile product and its count.
 */
export function palletContents(pallets: readonly Pallet[], lines: readonly SheetLine[]): SheetItem[][] {
  const left = new Map(lines.map((l) => [l.id, l.reserved_quantity * l.pack_size]));
  const tileLines = lines.filter((l) => l.category === 'tile' && l.reserved_quantity > 0);
  const tileName = tileLines.length === 1 ? tileLines[0].description : tileLines.length > 1 ? tileLines.map((l) => l.description).join(' / ') : 'Tiles';
  const tileUnit = tileLines[0]?.unit ?? 'tile';
  return [...pallets]
    .sort((a, b) => a.n - b.n)
    .map((p) => {
      if (p.kind === 'tiles') return p.tiles > 0 ? [{ description: tileName, quantity: p.tiles, unit: tileUnit }] : [];
      const out: SheetItem[] = [];
      for (const it of p.items) {
        const category = ITEM_CATEGORY[it.item] ?? it.item;
        let need = it.quantity;
        for (const l of lines) {
          if (need <= 0) break;
          if (l.category !== category) continue;
          const have = left.get(l.id) ?? 0;
          if (have <= 0) continue;
          const take = Math.min(have, need);
          left.set(l.id, have - take);
          need -= take;
          const same = out.find((o) => o.description === l.description && o.unit === l.unit);
          if (same) same.quantity += take;
          else out.push({ description: l.description, quantity: take, unit: l.unit });
        }
        if (need > 0) {
          const [description, unit] = words(it.item);
          out.push({ description, quantity: need, unit });
        }
      }
      return out;
    });
}

const faceKey = (f: { building: string; face: string }) => `${f.building}\u0000${f.face}`;

export interface EstimateFace {
  building: string;
  face: string;
  tiles: number;
  quantity: number;
}

/**
 * Faces this drop leaves short of tiles. Only when a tile line is sent short (back-ordered,
 * part-confirmed or not available): the faces' tiles (each face × its copies) less the tiles the
 * pallets carry for it. The pallets are filled face by face in schedule order, so the faces at the
 * end of the schedule are the ones left short.
 */
export function shortFaces(faces: readonly EstimateFace[], pallets: readonly Pallet[], lines: readonly SheetLine[], followUp: { reference: string; due_date: string | null } | null): ShortFace[] {
  const tilesShort = lines.some((l) => l.category === 'tile' && l.reserved_quantity < (l.confirmed_quantity ?? l.quantity) + l.back_order_quantity);
  if (!tilesShort) return [];
  const carried = new Map<string, number>();
  for (const p of pallets) for (const f of p.faces) carried.set(faceKey(f), (carried.get(faceKey(f)) ?? 0) + f.tiles);
  const needed = new Map<string, { building: string; face: string; tiles: number }>();
  for (const f of faces) {
    const k = faceKey(f);
    const n = needed.get(k) ?? { building: f.building, face: f.face, tiles: 0 };
    n.tiles += f.tiles * f.quantity;
    needed.set(k, n);
  }
  return [...needed.entries()]
    .map(([k, f]) => ({ building: f.building, face: f.face, tiles_short: f.tiles - (carried.get(k) ?? 0) }))
    .filter((f) => f.tiles_short > 0)
    .map((f) => ({ ...f, follow_up_reference: followUp?.reference ?? null, due_date: followUp?.due_date ?? null }));
}

/**
 * For a crane drop: each face with the pallets whose tiles land on it, in the order they come off;
 * spare tiles last. Each face's drawing is filled in by the caller, which has the estimate to hand.
 */
export function landingPlan(faces: readonly EstimateFace[], pallets: readonly Pallet[]): LandingFace[] {
  const plan = new Map<string, LandingFace>();
  for (const p of [...pallets].sort((a, b) => a.n - b.n)) {
    for (const f of p.faces) {
      const k = faceKey(f);
      let entry = plan.get(k);
      if (!entry) {
        const index = f.face === 'spare' && f.building === '' ? -1 : faces.findIndex((x) => x.building === f.building && x.face === f.face);
        entry = { building: f.building, face: f.face, pallets: [], tiles: 0, estimate_face_index: index >= 0 ? index : null, drawing: null };
        plan.set(k, entry);
      }
      if (!entry.pallets.includes(p.n)) entry.pallets.push(p.n);
      entry.tiles += f.tiles;
    }
  }
  const all = [...plan.values()];
  return [...all.filter((f) => f.face !== 'spare'), ...all.filter((f) => f.face === 'spare')];
}

/** A `geo:` link the phone hands to its own maps app, searching for the site's address and postcode. */
export function mapsUrl(site: Pick<OrderSite, 'site_address' | 'site_postcode'>): string {
  const q = [site.site_address, site.site_postcode]
    .map((s) => s.trim())
    .filter(Boolean)
    .join(', ');
  return `geo:0,0?q=${encodeURIComponent(q)}`;
}

/** Each caution once, in the order first met: a run of three drops shares its cautions. */
export function runCautions(perDrop: readonly (readonly string[])[]): string[] {
  return [...new Set(perDrop.flat())];
}

/**
 * The order the drops come off the lorry. The one place that decides it: the yard's drop position
 * where one is set, then the booking time (new bookings go last).
 */
export function dropOrder<T extends { booked_at: string; id: number; drop_position?: number | null }>(bookings: readonly T[]): T[] {
  return [...bookings].sort((a, b) => (a.drop_position ?? Number.MAX_SAFE_INTEGER) - (b.drop_position ?? Number.MAX_SAFE_INTEGER) || a.booked_at.localeCompare(b.booked_at) || a.id - b.id);
}

/** The driver's notes for a drop: how it is set down, where, access, contact and the order's own notes. */
export function dropNotes(method: 'ground' | 'roof', site: OrderSite, orderNotes: string): string[] {
  return [
    `${DELIVERY_METHOD_LABELS[method]}.`,
    site.set_down_place ? `Set down: ${site.set_down_place}` : 'No set-down place recorded: ask the site contact.',
    `Vehicle access: ${VEHICLE_ACCESS_LABELS[site.vehicle_access]}. Crane lift: ${CRANE_LIFT_LABELS[site.crane_lift]}. Overhead lines: ${OVERHEAD_LINES_LABELS[site.overhead_lines]}.`,
    ...(site.access_notes ? [`Access: ${site.access_notes}`] : []),
    ...(site.contact_name || site.contact_phone ? [`Site contact: ${[site.contact_name, site.contact_phone].filter(Boolean).join(', ')}`] : []),
    ...(orderNotes ? [`Order notes: ${orderNotes}`] : []),
    ...(method === 'roof' ? ['Roof loading: spread the stacks evenly over both slopes and across braced rafters, as the roof loading plan shows; never stack on one spot.'] : []),
  ];
}
