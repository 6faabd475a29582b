import { describe, expect, it } from 'vitest';
import { DEFAULT_TILE } from './defaults';
import { fieldPath, parseRoofSystem } from './roof-system';

describe('reading a roof system', () => {
  it('fills every left-out field with its default, from nothing or from a tile alone', () => {
    const empty = parseRoofSystem(undefined);
    expect(empty.ok && empty.system.tile.length_mm).toBe(420);
    const tileOnly = parseRoofSystem({
      tile: { kind: 'double_lap', length_mm: 265, width_mm: 165, headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }], weight_kg: 1.1, per_pallet: 1000 },
    });
    if (!tileOnly.ok) throw new Error(JSON.stringify(tileOnly.errors));
    expect(tileOnly.system.tile).toEqual({
      kind: 'double_lap',
      length_mm: 265,
      width_mm: 165,
      cover_width_mm: { min: 165, nominal: 165, max: 165 },
      headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }],
      bond: 'broken',
      halves_per_tile: 2,
      weight_kg: 1.1,
      per_pallet: 1000,
      nails_per_tile: 2,
      // Left out, an eaves or top tile weighs as a full tile and a tile-and-a-half as 1.5 (common practice, no source).
      eaves_tile_kg: 1.1,
      top_tile_kg: 1.1,
      tile_and_half_kg: 1.5 * 1.1,
    });
    expect(tileOnly.system.batten.stock_length_mm).toBe(4_800);
  });

  it('merges a partial section with the defaults of the rest of that section', () => {
    const r = parseRoofSystem({ setting_out: { verge_overhang_mm: { target: 50 } }, truck: { payload_kg: 9_000 } });
    if (!r.ok) throw new Error('rejected');
    expect(r.system.setting_out).toMatchObject({ eaves_overhang_mm: 50, verge_overhang_mm: { min: 30, target: 50, max: 60 } });
    expect(r.system.truck).toEqual({ payload_kg: 9_000, pallet_slots: 12, pallet_tare_kg: 25, max_pallet_kg: 1_000 });
  });

  it('sorts headlap bands by pitch', () => {
    const r = parseRoofSystem({
      tile: {
        ...DEFAULT_TILE,
        headlap_mm: [
          { from_pitch_deg: 30, min_mm: 75 },
          { from_pitch_deg: 22.5, min_mm: 100 },
        ],
      },
    });
    expect(r.ok && r.system.tile.headlap_mm.map((b) => b.from_pitch_deg)).toEqual([22.5, 30]);
  });

  it('names the field path of every problem', () => {
    const r = parseRoofSystem({
      tile: { ...DEFAULT_TILE, length_mm: -1, cover_width_mm: { min: 300, nominal: 'wide', max: 303 } },
      batten: { min_supports: 1 },
      waste_pct: { tiles: 150 },
      rafter_spacing: 400,
    });
    if (r.ok) throw new Error('accepted');
    expect(r.errors).toEqual(
      expect.arrayContaining([
        { field: 'tile.length_mm', message: 'must be more than 0' },
        { field: 'tile.cover_width_mm.nominal', message: 'must be a number' },
        { field: 'batten.min_supports', message: 'must be a whole number of at least 2' },
        { field: 'waste_pct.tiles', message: 'must be at most 100' },
        { field: 'rafter_spacing', message: 'is not a field of the roof system' },
      ]),
    );
  });

  it('rejects a single-lap tile without its cover play, a cover out of order and a headlap as long as the tile', () => {
    const r = parseRoofSystem({ tile: { ...DEFAULT_TILE, cover_width_mm: undefined, headlap_mm: [{ from_pitch_deg: 30, min_mm: 420 }] } });
    if (r.ok) throw new Error('accepted');
    expect(r.errors.map((e) => e.field)).toEqual(['tile.cover_width_mm', 'tile.headlap_mm[0].min_mm']);
    const order = parseRoofSystem({ tile: { ...DEFAULT_TILE, cover_width_mm: { min: 305, nominal: 300, max: 303 } } });
    expect(!order.ok && order.errors[0]).toEqual({ field: 'tile.cover_width_mm', message: 'must have min ≤ nominal ≤ max' });
  });

  it('rejects a stock length too short for the minimum batten', () => {
    const r = parseRoofSystem({ batten: { stock_length_mm: 1_000 } });
    expect(!r.ok && r.errors.map((e) => e.field)).toEqual(['batten.stock_length_mm', 'batten.stock_length_mm']);
  });

  it('rejects what is not an object', () => {
    expect(parseRoofSystem('tile')).toEqual({ ok: false, errors: [{ field: '(system)', message: 'must be an object of roof-system fields' }] });
  });

  it('writes paths with dots and array indices in brackets', () => {
    expect(fieldPath(['tile', 'headlap_mm', 2, 'min_mm'])).toBe('tile.headlap_mm[2].min_mm');
  });
});

describe('reading the same roof system again', () => {
  const slate = () => ({
    tile: { kind: 'double_lap', length_mm: 500, width_mm: 250, headlap_mm: [{ from_pitch_deg: 22.5, min_mm: 100 }], weight_kg: 2.2, per_pallet: 600 },
    verge: { kind: 'dry' },
  });
  const systemOf = (input: unknown) => {
    const r = parseRoofSystem(input);
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    return r.system;
  };

  it('gives each caller a system of its own, however often the same input is read', () => {
    const input = slate();
    const first = systemOf(input);
    const again = systemOf(input);
    const likeIt = systemOf(slate());
    expect(again).toEqual(first);
    expect(likeIt).toEqual(first);
    expect(again).not.toBe(first);
    expect(again.tile.headlap_mm).not.toBe(first.tile.headlap_mm);
    // A caller changing what it was given changes nothing for the next caller.
    again.tile.headlap_mm[0].min_mm = 1;
    again.truck.payload_kg = 1;
    expect(systemOf(input)).toEqual(first);
    expect(systemOf(undefined).tile).toEqual(systemOf({}).tile);
  });

  it('reads an input again after its caller changed it', () => {
    const input = slate();
    expect(systemOf(input).tile.length_mm).toBe(500);
    input.tile.length_mm = 600;
    expect(systemOf(input).tile.length_mm).toBe(600);
    input.tile.headlap_mm.push({ from_pitch_deg: 30, min_mm: 75 });
    expect(systemOf(input).tile.headlap_mm).toEqual([
      { from_pitch_deg: 22.5, min_mm: 100 },
      { from_pitch_deg: 30, min_mm: 75 },
    ]);
    (input.verge as Record<string, unknown>).unit_kg = -1;
    expect(parseRoofSystem(input)).toEqual({ ok: false, errors: [{ field: 'verge.unit_kg', message: 'must be 0 or more' }] });
  });

  it('reads an input that is not plain data through the schema every time', () => {
    let length = 500;
    const input = slate();
    Object.defineProperty(input.tile, 'length_mm', { enumerable: true, get: () => length });
    expect(systemOf(input).tile.length_mm).toBe(500);
    length = 450;
    expect(systemOf(input).tile.length_mm).toBe(450);
  });
});
