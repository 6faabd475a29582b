import { deckGeometry } from '../../../../shared/engine/deck-plan';
import type { Run } from '../../../../shared/schemas/run.schema';

/** Space left between a pallet and the edge of its half of the deck when drawn (mm). */
const GAP_MM = 40;

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
  /** Depth of one row along the deck. */
  rowDepthMm: number;
  boxes: PalletBox[];
}

/**
 * Where each deck position is drawn, to scale and where the plan put it: the rows of the shared deck
 * geometry (the default 1200 × 1000 mm pallet turned whichever way gives more rows two abreast, as the
 * server's plan does), more rows if the plan uses more (an overfull lorry shows its pallets past the
 * deck's end). A run of larger pallets is planned in deeper rows than drawn here: the plan's response
 * does not carry its row depth.
 */
export function deckLayout(run: Pick<Run, 'lorry' | 'deck'>): DeckLayout {
  const lengthMm = run.lorry.deck_length_mm;
  const widthMm = run.lorry.deck_width_mm;
  const geometry = deckGeometry(run.lorry);
  const maxRow = run.deck.positions.reduce((m, p) => Math.max(m, p.row), 0);
  const rows = Math.max(1, geometry.rows, maxRow);
  const half = widthMm / 2;
  const width = Math.max(1, Math.min(geometry.across_mm, half - GAP_MM));
  const length = Math.max(1, Math.min(geometry.along_mm, geometry.row_depth_mm) - GAP_MM);
  const boxes = run.deck.positions.map((p, index) => ({
    index,
    x: (p.side === 'left' ? 0 : half) + (half - width) / 2,
    y: (p.row - 1) * geometry.row_depth_mm + (geometry.row_depth_mm - length) / 2,
    width,
    length,
  }));
  return { lengthMm, widthMm, rows, rowDepthMm: geometry.row_depth_mm, boxes };
}
