import type { Run } from '../../../../shared/schemas/run.schema';

/** The pallet footprint drawn when it fits the cell: 1200 × 1000 mm, the common trade pallet (common practice). */
export const DEFAULT_PALLET_MM = { long: 1200, short: 1000 } as const;
const GAP_MM = 50;

export interface PalletBox {
  index: number;
  /** Millimetres from the left edge of the deck. */
  x: number;
  /** Millimetres from the front of the deck (the cab end). */
  y: number;
  width: number;
  length: number;
}

export interface DeckLayout {
  lengthMm: number;
  widthMm: number;
  rows: number;
  cellLengthMm: number;
  cellWidthMm: number;
  boxes: PalletBox[];
}

/**
 * Where each deck position is drawn, to scale: the deck is split into rows of two (left and right)
 * from the front; there are as many rows as the lorry has pallet slots two abreast, or as the plan
 * uses if more. Each pallet is drawn at the default footprint turned to fit its cell, or fills the
 * cell (less a small gap) when that does not fit.
 */
export function deckLayout(run: Pick<Run, 'lorry' | 'deck'>): DeckLayout {
  const lengthMm = run.lorry.deck_length_mm;
  const widthMm = run.lorry.deck_width_mm;
  const maxRow = run.deck.positions.reduce((m, p) => Math.max(m, p.row), 0);
  const rows = Math.max(1, Math.ceil(run.lorry.pallet_slots / 2), maxRow);
  const cellLengthMm = lengthMm / rows;
  const cellWidthMm = widthMm / 2;
  // Pallets are loaded tight, so a footprint fits when it is no bigger than its cell.
  const fits = (along: number, across: number) => along <= cellLengthMm && across <= cellWidthMm;
  const [length, width] = fits(DEFAULT_PALLET_MM.long, DEFAULT_PALLET_MM.short)
    ? [DEFAULT_PALLET_MM.long, DEFAULT_PALLET_MM.short]
    : fits(DEFAULT_PALLET_MM.short, DEFAULT_PALLET_MM.long)
      ? [DEFAULT_PALLET_MM.short, DEFAULT_PALLET_MM.long]
      : [Math.max(1, cellLengthMm - GAP_MM), Math.max(1, cellWidthMm - GAP_MM)];
  const boxes = run.deck.positions.map((p, index) => ({
    index,
    x: (p.side === 'left' ? 0 : cellWidthMm) + (cellWidthMm - width) / 2,
    y: (p.row - 1) * cellLengthMm + (cellLengthMm - length) / 2,
    width,
    length,
  }));
  return { lengthMm, widthMm, rows, cellLengthMm, cellWidthMm, boxes };
}
