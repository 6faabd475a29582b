import type { RoofSystem } from '../schemas/roof-system.schema';

export type AccessoryItem =
  | 'underlay_rolls'
  | 'battens'
  | 'batten_nails'
  | 'tile_nails'
  | 'clips'
  | 'ridge_tiles'
  | 'hip_tiles'
  | 'eaves_tiles'
  | 'top_tiles'
  | 'tile_and_half'
  | 'valley_units'
  | 'hip_irons'
  | 'dry_verge_units'
  | 'ridge_end_caps';

/** Each accessory the engine puts on a pallet, in the words and unit a yard and a driver use. */
export const ACCESSORY_WORDS: Record<AccessoryItem, { label: string; unit: string }> = {
  underlay_rolls: { label: 'Underlay', unit: 'roll' },
  battens: { label: 'Battens (stock lengths)', unit: 'length' },
  batten_nails: { label: 'Batten nails', unit: 'nail' },
  tile_nails: { label: 'Tile nails', unit: 'nail' },
  clips: { label: 'Tile clips', unit: 'clip' },
  ridge_tiles: { label: 'Ridge tiles', unit: 'tile' },
  hip_tiles: { label: 'Hip tiles', unit: 'tile' },
  eaves_tiles: { label: 'Eaves tiles', unit: 'tile' },
  top_tiles: { label: 'Top tiles', unit: 'tile' },
  tile_and_half: { label: 'Tile-and-a-half', unit: 'tile' },
  valley_units: { label: 'Valley troughs', unit: 'piece' },
  hip_irons: { label: 'Hip irons', unit: 'piece' },
  dry_verge_units: { label: 'Dry verge units', unit: 'piece' },
  ridge_end_caps: { label: 'Ridge end caps', unit: 'piece' },
};

export interface PalletFace {
  building: string;
  face: string;
  tiles: number;
}

export interface PalletItem {
  item: AccessoryItem;
  quantity: number;
  weight_kg: number;
}

export interface Pallet {
  /** Pallet number, in the order the pallets come off at site (1 = first off). */
  n: number;
  kind: 'tiles' | 'accessories';
  tiles: number;
  /** Gross: contents and the pallet itself. */
  weight_kg: number;
  /** Faces the tiles serve (whole faces over every copy); spare tiles (the waste allowance) have face "spare". */
  faces: PalletFace[];
  /** Accessories on an accessory pallet; on a tile pallet, the eaves tiles, top tiles and tiles-and-a-half it carries. */
  items: PalletItem[];
}

export interface Load {
  /** Lorry load number, in delivery order. */
  load: number;
  /** Pallet numbers in the order they go onto the lorry: what comes off first is loaded last. */
  pallets: number[];
  weight_kg: number;
}

export interface DeliveryIssue {
  code: 'pallet_over_max' | 'pallet_over_payload' | 'delivery_plan_too_large';
  message: string;
}

export interface Accessory {
  item: AccessoryItem;
  quantity: number;
  unit_kg: number;
}

export interface DeliveryInput {
  tilesOrdered: number;
  /** Net tiles of one copy of each face and its quantity, in schedule order; the rest of tilesOrdered is spare. */
  faces: ReadonlyArray<{ building: string; face: string; tiles: number; quantity: number }>;
  /**
   * Double-lap special pieces (eaves tiles, top tiles, tiles-and-a-half), ordered: they travel on the
   * tile pallets after the full tiles, each taking a tile's place.
   */
  withTiles?: Accessory[];
  /** Needed at the start (underlay, battens, nails, clips): off first. */
  firstOff: Accessory[];
  /** Needed at the end (ridge and hip tiles): off last. */
  lastOff: Accessory[];
}

export interface DeliveryPlan {
  pallets: Pallet[];
  loads: Load[];
  tile_pallets: number;
  accessory_pallets: number;
  weight_kg: number;
  issues: DeliveryIssue[];
}

function round1(v: number): number {
  return Math.round(v * 10) / 10;
}

/** Shared by every tile pallet (no accessories) and accessory pallet (no faces): not to be written to. */
const NO_ITEMS: PalletItem[] = Object.freeze([]) as unknown as PalletItem[];
const NO_FACES: PalletFace[] = Object.freeze([]) as unknown as PalletFace[];

/**
 * Pallets, their faces and items and the loads are built by constructors, not object literals: V8 moves
 * objects from a literal whose copies all outlive a young-generation collection straight into the old
 * generation from then on, and a big job's thousands of pallets would stay in memory until the next
 * full collection (DEVELOPERS.md, decision 31). Fields, their order and the JSON are the interfaces'.
 */
class PalletRecord implements Pallet {
  declare n: number;
  declare kind: 'tiles' | 'accessories';
  declare tiles: number;
  declare weight_kg: number;
  declare faces: PalletFace[];
  declare items: PalletItem[];
  constructor(n: number, kind: 'tiles' | 'accessories', tiles: number, weightKg: number, faces: PalletFace[], items: PalletItem[]) {
    this.n = n;
    this.kind = kind;
    this.tiles = tiles;
    this.weight_kg = weightKg;
    this.faces = faces;
    this.items = items;
  }
}

class PalletShare implements PalletFace {
  declare building: string;
  declare face: string;
  declare tiles: number;
  constructor(building: string, face: string, tiles: number) {
    this.building = building;
    this.face = face;
    this.tiles = tiles;
  }
}

class PalletLine implements PalletItem {
  declare item: AccessoryItem;
  declare quantity: number;
  declare weight_kg: number;
  constructor(item: AccessoryItem, quantity: number, weightKg: number) {
    this.item = item;
    this.quantity = quantity;
    this.weight_kg = weightKg;
  }
}

class LorryLoad implements Load {
  declare load: number;
  declare pallets: number[];
  declare weight_kg: number;
  constructor(load: number, pallets: number[], weightKg: number) {
    this.load = load;
    this.pallets = pallets;
    this.weight_kg = weightKg;
  }
}

/**
 * Accessory pallets being made up, one after another (a class, not closures: a call site keeps the
 * last closure it called, and with it the pallets, until the next full collection).
 */
class AccessoryPacker {
  readonly pallets: PalletItem[][] = [];
  count = 0;
  current: PalletItem[] | null = null;
  room = 0;
  constructor(
    readonly capacityKg: number,
    readonly build: boolean,
  ) {}

  open() {
    this.count++;
    this.room = this.capacityKg;
    this.current = this.build ? NO_ITEMS.slice() : null;
    if (this.current) this.pallets.push(this.current);
  }
}

/** Accessory pallets made up to a net capacity in kg, items in the order given, whole units only. */
function packAccessories(items: readonly Accessory[], capacityKg: number, build: boolean): { pallets: PalletItem[][]; count: number } {
  const p = new AccessoryPacker(capacityKg, build);
  let started = false;
  for (let k = 0; k < items.length; k++) {
    const it = items[k];
    let units = it.quantity;
    if (units <= 0) continue;
    if (it.unit_kg <= 0) {
      // Weightless in the system (no weight given): rides on whatever pallet is open.
      if (!started) {
        p.open();
        started = true;
      }
      if (p.current) p.current.push(new PalletLine(it.item, units, 0));
      continue;
    }
    const perFull = Math.max(1, Math.floor(capacityKg / it.unit_kg + 1e-9));
    while (units > 0) {
      if (!started) {
        p.open();
        started = true;
      }
      let fit = Math.floor(p.room / it.unit_kg + 1e-9);
      if (fit <= 0) {
        if (p.room < capacityKg) {
          p.open();
          continue;
        }
        fit = 1; // one unit heavier than a pallet: it goes alone
      }
      if (p.room === capacityKg && units >= 2 * perFull && !build) {
        // Counting only: whole pallets of this item in one step.
        const whole = Math.floor(units / perFull) - 1;
        p.count += whole;
        units -= whole * perFull;
        continue;
      }
      const take = Math.min(units, fit);
      if (p.current) p.current.push(new PalletLine(it.item, take, round1(take * it.unit_kg)));
      units -= take;
      p.room -= take * it.unit_kg;
      if (units > 0) p.open();
    }
  }
  return { pallets: p.pallets, count: p.count };
}

/** Accessory pallets for `items`, numbered on from the pallets already listed, each put on a lorry load. */
function addAccessoryPallets(pallets: Pallet[], items: readonly Accessory[], capacity: number, tare: number, loads: LoadFiller) {
  const packed = packAccessories(items, capacity, true).pallets;
  for (let k = 0; k < packed.length; k++) {
    const content = packed[k];
    let kg = 0;
    for (let j = 0; j < content.length; j++) kg += content[j].weight_kg;
    kg += tare;
    const weightKg = round1(kg);
    pallets.push(new PalletRecord(pallets.length + 1, 'accessories', 0, weightKg, NO_FACES, content));
    loads.add(pallets.length, weightKg);
  }
}

/**
 * Lorry loads filled pallet by pallet in the order they come off, up to the payload and the pallet
 * slots (a class, not closures: see AccessoryPacker). The open load is pallets `from` … `from + count − 1`.
 */
class LoadFiller {
  readonly loads: Load[] = [];
  from = 1;
  count = 0;
  kg = 0;
  overPayload = 0;
  constructor(
    readonly slots: number,
    readonly payloadKg: number,
  ) {}

  /** Pallet `n` (the one after the last added), weighing `weightKg`. */
  add(n: number, weightKg: number) {
    if (this.count > 0 && (this.count >= this.slots || this.kg + weightKg > this.payloadKg + 1e-9)) {
      this.close();
      this.from = n;
      this.count = 0;
      this.kg = 0;
    }
    if (weightKg > this.payloadKg) this.overPayload++;
    this.count++;
    this.kg += weightKg;
  }

  /** Closes the load being filled: its pallets in loading order (the first off goes on last). */
  close() {
    if (this.count === 0) return;
    const order = new Array<number>(this.count);
    const last = this.from + this.count - 1;
    for (let k = 0; k < this.count; k++) order[k] = last - k;
    this.loads.push(new LorryLoad(this.loads.length + 1, order, round1(this.kg)));
  }
}

/**
 * Delivery: tiles on pallets of per_pallet (the last one part-full), each listing its count, gross
 * weight and the faces it serves, in schedule order, then the double-lap special pieces on the same
 * pallets, a piece to a tile's place; accessories on pallets made up to max_pallet_kg,
 * underlay, battens, nails and clips first off and ridge and hip tiles last. Pallets are numbered in the order
 * they come off; lorry loads are filled in that order up to the payload and the pallet slots, and each
 * load is loaded in reverse, so what comes off first is loaded last. Weights in kg.
 */
export function planDelivery(input: DeliveryInput, system: RoofSystem, maxPallets: number): DeliveryPlan {
  const { tile, truck } = system;
  const issues: DeliveryIssue[] = [];
  const tare = truck.pallet_tare_kg;
  const capacity = Math.max(1e-9, truck.max_pallet_kg - tare);
  const specials: Accessory[] = [];
  if (input.withTiles) for (const a of input.withTiles) if (a.quantity > 0) specials.push(a);
  let specialCount = 0;
  let specialKg = 0;
  for (const a of specials) {
    specialCount += a.quantity;
    specialKg += a.quantity * a.unit_kg;
  }
  const pieces = input.tilesOrdered + specialCount;
  const tilePallets = pieces > 0 ? Math.ceil(pieces / tile.per_pallet) : 0;
  const firstCount = packAccessories(input.firstOff, capacity, false).count;
  const lastCount = packAccessories(input.lastOff, capacity, false).count;
  let accessoryKg = 0;
  for (const a of input.firstOff) accessoryKg += a.quantity * a.unit_kg;
  for (const a of input.lastOff) accessoryKg += a.quantity * a.unit_kg;
  const totalPallets = tilePallets + firstCount + lastCount;
  const weight = input.tilesOrdered * tile.weight_kg + specialKg + accessoryKg + totalPallets * tare;

  const fullTilePallet = tile.per_pallet * tile.weight_kg + tare;
  if (tilePallets > 0 && Math.min(input.tilesOrdered, tile.per_pallet) * tile.weight_kg + tare > truck.max_pallet_kg) {
    issues.push({
      code: 'pallet_over_max',
      message: `a full pallet of ${tile.per_pallet} tiles weighs ${round1(fullTilePallet)} kg, more than the ${truck.max_pallet_kg} kg the crane and yard are set to handle`,
    });
  }
  if (totalPallets > maxPallets) {
    issues.push({
      code: 'delivery_plan_too_large',
      message: `the job needs ${totalPallets} pallets, more than ${maxPallets}: split it into smaller jobs for a pallet list and lorry loads`,
    });
    return {
      pallets: [],
      loads: [],
      tile_pallets: tilePallets,
      accessory_pallets: firstCount + lastCount,
      weight_kg: weight,
      issues,
    };
  }

  const pallets: Pallet[] = [];
  const filler = new LoadFiller(truck.pallet_slots, truck.payload_kg);
  addAccessoryPallets(pallets, input.firstOff, capacity, tare, filler);

  // Stream the faces' tiles onto pallets, then the spare tiles.
  const sources = input.faces;
  let faceIdx = 0;
  let faceLeft = sources.length > 0 ? sources[0].tiles * sources[0].quantity : 0;
  let netLeft = 0;
  for (let k = 0; k < sources.length; k++) netLeft += sources[k].tiles * sources[k].quantity;
  let spareLeft = Math.max(0, input.tilesOrdered - netLeft);
  let toPlace = input.tilesOrdered;
  let specialIdx = 0;
  let specialLeft = specials.length > 0 ? specials[0].quantity : 0;
  const palletFaces: PalletFace[] = [];
  for (let p = 0; p < tilePallets; p++) {
    const count = Math.min(tile.per_pallet, toPlace);
    toPlace -= count;
    let room = count;
    let specialRoom = tile.per_pallet - count;
    let items: PalletItem[] = NO_ITEMS;
    let itemsKg = 0;
    while (specialRoom > 0 && specialIdx < specials.length) {
      if (specialLeft <= 0) {
        specialIdx++;
        specialLeft = specialIdx < specials.length ? specials[specialIdx].quantity : 0;
        continue;
      }
      const take = Math.min(specialRoom, specialLeft);
      const a = specials[specialIdx];
      if (items === NO_ITEMS) items = NO_ITEMS.slice();
      items.push(new PalletLine(a.item, take, round1(take * a.unit_kg)));
      itemsKg += take * a.unit_kg;
      specialLeft -= take;
      specialRoom -= take;
    }
    let served = 0;
    while (room > 0 && faceIdx < sources.length) {
      if (faceLeft <= 0) {
        faceIdx++;
        faceLeft = faceIdx < sources.length ? sources[faceIdx].tiles * sources[faceIdx].quantity : 0;
        continue;
      }
      const take = Math.min(room, faceLeft);
      const f = sources[faceIdx];
      palletFaces[served++] = new PalletShare(f.building, f.face, take);
      faceLeft -= take;
      room -= take;
    }
    if (room > 0 && spareLeft > 0) {
      const take = Math.min(room, spareLeft);
      palletFaces[served++] = new PalletShare('', 'spare', take);
      spareLeft -= take;
    }
    // The faces as an exact-size copy: a big job holds one of these per pallet.
    const weightKg = round1(count * tile.weight_kg + itemsKg + tare);
    pallets.push(new PalletRecord(pallets.length + 1, 'tiles', count, weightKg, palletFaces.slice(0, served), items));
    filler.add(pallets.length, weightKg);
  }
  addAccessoryPallets(pallets, input.lastOff, capacity, tare, filler);
  filler.close();
  const loads = filler.loads;
  if (filler.overPayload > 0) {
    issues.push({
      code: 'pallet_over_payload',
      message: `${filler.overPayload} pallet(s) weigh more than the lorry's ${truck.payload_kg} kg payload and travel alone, over the limit: use a bigger lorry`,
    });
  }
  return {
    pallets,
    loads,
    tile_pallets: tilePallets,
    accessory_pallets: firstCount + lastCount,
    weight_kg: weight,
    issues,
  };
}
