import type { Run, RunWeek } from '../../shared/schemas/run.schema';

/**
 * An invented run for component tests: a crane rigid of Tollerbeck Yard with three drops on
 * 2027-03-01. Drop 1 (RL-000015) comes off first, so its pallets sit at the rear (rows 5–6) and are
 * loaded last; drop 3 (RL-000017) sits behind the cab. Nothing is loaded yet.
 */
export function runFixture(overrides: Partial<Run> = {}): Run {
  const drop = (order_id: number, reference: string, position: number, pallets: number, weight_kg: number, extra: Partial<Run['drops'][number]> = {}): Run['drops'][number] => ({
    order_id,
    reference,
    position,
    pallets,
    weight_kg,
    status: 'confirmed',
    contractor: { id: 5, name: 'Brackenfold Roofworks' },
    site_name: `Site of ${reference}`,
    site_address: 'Hollin Brow, Tollerbeck',
    site_postcode: 'TB1 4XX',
    delivery_method: 'ground',
    short: false,
    ...extra,
  });
  const face = (face: string, tiles: number) => ({ building: 'Alder', face, tiles });
  const pos = (row: number, side: 'left' | 'right', d: number, order_id: number, pallet: number, weight_kg: number, faces = [face('Front', 240)]) => ({
    row,
    side,
    drop: d,
    order_id,
    pallet,
    weight_kg,
    faces,
    loaded: false,
  });
  return {
    id: 7,
    branch_id: 3,
    date: '2027-03-01',
    time_window: '07:30-12:00',
    lorry: { id: 4, registration: 'TY61 KRB', name: 'Crane rigid', has_crane: true, crane_max_kg: 1_200, payload_kg: 12_000, pallet_slots: 12, deck_length_mm: 7_300, deck_width_mm: 2_450 },
    driver: { id: 9, name: 'Dee Fenwick' },
    status: 'planned',
    dispatched_at: null,
    weight_kg: 5_380,
    pallets: 6,
    loaded_count: 0,
    drops: [drop(15, 'RL-000015', 1, 3, 2_700), drop(16, 'RL-000016', 2, 2, 1_780, { contractor: { id: 6, name: 'Quillsby Roofing' }, short: true }), drop(17, 'RL-000017', 3, 1, 900, { delivery_method: 'roof' })],
    deck: {
      positions: [
        pos(1, 'left', 3, 17, 1, 900, [face('Rear', 180), face('Hip', 20)]),
        pos(2, 'left', 2, 16, 1, 900),
        pos(2, 'right', 2, 16, 2, 880),
        pos(5, 'left', 1, 15, 1, 900),
        pos(5, 'right', 1, 15, 2, 900),
        pos(6, 'right', 1, 15, 3, 900, []),
      ],
      loading_sequence: [0, 1, 2, 3, 4, 5],
      left_kg: 2_700,
      right_kg: 2_680,
      cog_from_front_mm: 3_900,
      warnings: [],
    },
    pick_list: [
      { order_id: 15, reference: 'RL-000015', lines: [{ sku: 'TL-PLN-RED', description: 'Plain tile, red', unit: 'pack', quantity: 3, packs: 3 }] },
      { order_id: 16, reference: 'RL-000016', lines: [{ sku: 'BT-25x38', description: 'Batten 25 × 38 mm', unit: 'length', quantity: 120, packs: null }] },
      { order_id: 17, reference: 'RL-000017', lines: [{ sku: 'RG-HALF', description: 'Half-round ridge', unit: 'each', quantity: 20, packs: null }] },
    ],
    ...overrides,
  };
}

/** The same run with every pallet ticked loaded. */
export function loadedRunFixture(overrides: Partial<Run> = {}): Run {
  const run = runFixture();
  return { ...run, status: 'loaded', loaded_count: run.deck.positions.length, deck: { ...run.deck, positions: run.deck.positions.map((p) => ({ ...p, loaded: true })) }, ...overrides };
}

/** A week of Tollerbeck Yard's runs from Monday 2027-03-01: two runs on the Monday, one on the Wednesday. */
export function runWeekFixture(): RunWeek {
  const summary = (id: number, time_window: string, registration: string, drops: number, weight_kg: number, pallets: number, loaded_count: number, status: RunWeek['days'][number]['runs'][number]['status']) => ({
    id,
    time_window,
    lorry: { id: id * 10, registration, has_crane: registration === 'TY61 KRB' },
    driver: id === 8 ? null : { id: 9, name: 'Dee Fenwick' },
    drops,
    weight_kg,
    pallets,
    loaded_count,
    status,
  });
  return {
    from: '2027-03-01',
    days: [
      { date: '2027-03-01', runs: [summary(7, '07:30-12:00', 'TY61 KRB', 3, 5_380, 6, 6, 'loaded'), summary(8, '12:30-16:30', 'TB12 ORD', 1, 900, 1, 0, 'planned')] },
      { date: '2027-03-02', runs: [] },
      { date: '2027-03-03', runs: [summary(11, '07:30-12:00', 'TY61 KRB', 2, 4_100, 5, 2, 'loading')] },
      { date: '2027-03-04', runs: [] },
      { date: '2027-03-05', runs: [] },
    ],
  };
}
