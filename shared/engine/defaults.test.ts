import { describe, expect, it } from 'vitest';
import { roofSystemSchema } from '../schemas/roof-system.schema';
import { maxGauge, tilesPerSquareMetre } from './courses';
import { DEFAULT_TILE, SAFETY_CAUTIONS, SYSTEM_DEFAULTS } from './defaults';

describe('defaults', () => {
  it('makes a whole roof system from nothing, with the documented default tile', () => {
    const s = roofSystemSchema.parse({});
    expect(s.tile).toMatchObject({ kind: 'single_lap', length_mm: 420, bond: 'broken', halves_per_tile: 2 });
    expect(s.setting_out).toEqual({ eaves_overhang_mm: 50, top_gap_mm: 40, verge_overhang_mm: { min: 30, target: 45, max: 60 } });
    expect(s.rafter_spacing_mm).toBe(600);
    expect(s.batten).toMatchObject({ stock_length_mm: 4_800, min_supports: 3, min_length_mm: 1_200 });
    expect(s.roof_loading).toEqual({ stack_size: 6, every_nth_batten: 2 });
    expect(s.fixing).toEqual({ rule: 'every_tile', batten_nail_g: 4.5, tile_nail_g: 1.5, clips: {}, clip_g: 6 });
  });

  it('gives the default tile a dead load inside 40–44 kg/m² for interlocking tile at its usual gauge (US Army TI 809-53, published)', () => {
    // From 30° (75 mm headlap, 345 mm gauge). Below 30° the 100 mm headlap closes the gauge to 320 mm,
    // and the roof carries about 8 % more tiles a square metre (about 46 kg/m²).
    const usual = maxGauge('single_lap', DEFAULT_TILE.length_mm, 75);
    const kgPerM2 = tilesPerSquareMetre(usual, DEFAULT_TILE.cover_width_mm.nominal) * DEFAULT_TILE.weight_kg;
    expect(kgPerM2).toBeGreaterThanOrEqual(40);
    expect(kgPerM2).toBeLessThanOrEqual(44);
    const shallow = maxGauge('single_lap', DEFAULT_TILE.length_mm, 100);
    expect(tilesPerSquareMetre(shallow, 300) / tilesPerSquareMetre(usual, 300)).toBeCloseTo(345 / 320, 9);
  });

  it('puts about two squares (2 × 9.3 m²) of concrete tiles on a pallet (Canadian Roofing Reference Manual §9.3.3.1, published)', () => {
    const m2 = DEFAULT_TILE.per_pallet / tilesPerSquareMetre(345, DEFAULT_TILE.cover_width_mm.nominal);
    expect(m2).toBeGreaterThan(2 * 9.3 * 0.9);
    expect(m2).toBeLessThan(2 * 9.3 * 1.1);
  });

  it('keeps the battening and lap defaults to the published minimums', () => {
    // NHBC Standards 7.2.17: battens at least 1.2 m long over at least three rafters; tiles at least 50 mm over the gutter.
    expect(SYSTEM_DEFAULTS.batten.min_length_mm).toBeGreaterThanOrEqual(1_200);
    expect(SYSTEM_DEFAULTS.batten.min_supports).toBeGreaterThanOrEqual(3);
    expect(SYSTEM_DEFAULTS.setting_out.eaves_overhang_mm).toBeGreaterThanOrEqual(50);
    // Roof Tile Association, "Installing underlay and tile battens": horizontal laps at least 150 mm (100 mm at 35° and above).
    expect(SYSTEM_DEFAULTS.underlay.head_lap_mm).toBeGreaterThanOrEqual(150);
    // Single-lap tiles have about 3 mm of tolerance at the side joint (NHBC 7.2.19, published).
    expect(DEFAULT_TILE.cover_width_mm.max - DEFAULT_TILE.cover_width_mm.nominal).toBeLessThanOrEqual(3);
    expect(DEFAULT_TILE.cover_width_mm.nominal - DEFAULT_TILE.cover_width_mm.min).toBeLessThanOrEqual(3);
  });

  it('sets the lorry payload inside a three-axle rigid’s 26,000 kg gross weight (Road Vehicles (Authorised Weight) Regulations 1998, published; own weight from memory)', () => {
    const ownWeightFromMemory = 11_000;
    expect(SYSTEM_DEFAULTS.truck.payload_kg + ownWeightFromMemory).toBeLessThanOrEqual(26_000);
  });

  it('carries the cautions for work at height, roof loading and lifting, and defers to the tile maker and local rules', () => {
    const text = SAFETY_CAUTIONS.join(' ');
    expect(text).toMatch(/falls/);
    expect(text).toMatch(/evenly/);
    expect(text).toMatch(/lift plan/);
    expect(text).toMatch(/fixing specification/);
  });
});
