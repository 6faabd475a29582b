import { CATEGORY_LABELS, PRODUCT_CATEGORIES } from '../../../../shared/schemas/catalogue.schema';
import type { ProductCategory } from '../../../../shared/schemas/catalogue.schema';
import type { EstimateLine } from '../../../../shared/schemas/estimate.schema';

export interface BillGroup {
  category: ProductCategory;
  label: string;
  lines: EstimateLine[];
  /** Sum of the group's totals in minor units; null when any line has no price (a generic system). */
  subtotal: number | null;
}

/** The lines of a bill under their categories, in the order a bill of materials lists them; lines keep their own order within a group. */
export function groupBillLines(lines: readonly EstimateLine[]): BillGroup[] {
  return PRODUCT_CATEGORIES.flatMap((category) => {
    const inGroup = lines.filter((line) => line.category === category).sort((a, b) => a.position - b.position);
    if (inGroup.length === 0) return [];
    const priced = inGroup.every((line) => line.total !== null);
    return [
      {
        category,
        label: CATEGORY_LABELS[category],
        lines: inGroup,
        subtotal: priced ? inGroup.reduce((sum, line) => sum + (line.total ?? 0), 0) : null,
      },
    ];
  });
}

const UNIT_WORDS: Record<string, [string, string]> = {
  tile: ['tile', 'tiles'],
  piece: ['piece', 'pieces'],
  length: ['length', 'lengths'],
  nail: ['nail', 'nails'],
  roll: ['roll', 'rolls'],
  m: ['m', 'm'],
  clip: ['clip', 'clips'],
};

/** "22,176 tiles", "1 roll", "12.5 m". */
export function formatQuantity(quantity: number, unit: string): string {
  const words = UNIT_WORDS[unit] ?? [unit, unit];
  const number = quantity.toLocaleString('en-GB', { maximumFractionDigits: 2 });
  return `${number} ${quantity === 1 ? words[0] : words[1]}`;
}
