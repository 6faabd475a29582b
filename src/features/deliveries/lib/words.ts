import { ACCESSORY_WORDS } from '../../../../shared/engine/delivery';

/** A product line's name as people say it: never a raw key such as "ridge_tiles" or "clip". */
export function productWords(description: string): string {
  const known = (ACCESSORY_WORDS as Record<string, { label: string } | undefined>)[description]?.label;
  if (known) return known;
  if (/^[a-z]+(_[a-z]+)*$/.test(description)) {
    const spaced = description.replace(/_/g, ' ');
    return spaced.charAt(0).toUpperCase() + spaced.slice(1);
  }
  return description;
}

/** "24 pieces", "1 roll": the unit as the merchant sells it, in the singular for one. */
export function quantityWords(quantity: number, unit: string): string {
  const n = quantity.toLocaleString('en-GB');
  if (!unit) return n;
  if (quantity === 1) return `${n} ${unit.replace(/(?<=[^s])s$/, '')}`;
  return `${n} ${unit}`;
}

export const kg = (value: number) => `${Math.round(value).toLocaleString('en-GB')} kg`;

/** "Alder · Front", and the waste allowance as such. */
export function faceWords(face: { building: string; face: string }): string {
  if (face.building === 'spare') return 'spare (waste allowance)';
  return face.face ? `${face.building} · ${face.face}` : face.building;
}
