import { z } from 'zod';
import { DEFAULT_TILE, SYSTEM_DEFAULTS, DOUBLE_LAP_TILE_DEFAULTS, SINGLE_LAP_TILE_DEFAULTS } from '../engine/defaults';

/**
 * The roof system: the tile being laid and how it is set out, battened, fixed, loaded and delivered.
 * Lengths in millimetres, weights in kilograms, percentages as numbers (5 = 5 %).
 * Every field has a default (shared/engine/defaults.ts), so `{}` or `{ tile }` is a whole system.
 * A merchant's catalogue stores the same fields on its products.
 */

const num = (what = 'must be a number') => z.number({ error: what });
const positive = () => num().positive({ error: 'must be more than 0' });
const nonNegative = () => num().min(0, { error: 'must be 0 or more' });
const wholeAtLeast = (min: number) =>
  num('must be a whole number')
    .int({ error: 'must be a whole number' })
    .min(min, { error: `must be a whole number of at least ${min}` });
const percent = () => num().min(0, { error: 'must be 0 or more' }).max(100, { error: 'must be at most 100' });

export const TILE_KINDS = ['single_lap', 'double_lap'] as const;
export const BONDS = ['broken', 'straight'] as const;
export const FIXING_RULES = ['every_tile', 'perimeter_and_alternate_courses'] as const;
export const VERGE_KINDS = ['mortar', 'dry'] as const;
export const VALLEY_KINDS = ['lined', 'trough'] as const;

const coverSchema = z.strictObject({ min: positive(), nominal: positive(), max: positive() });

const headlapBandSchema = z.strictObject({
  from_pitch_deg: num().gt(0, { error: 'must be above 0°' }).lt(90, { error: 'must be below 90°' }),
  min_mm: positive(),
});

/** A tile as given: the kind, sizes, headlap bands, weight and pallet count are needed; the rest follows from the kind. */
const tileInputSchema = z.strictObject({
  /** Optional label for people (a catalogue line); the engine does not use it. */
  name: z.string().max(200).optional(),
  kind: z.enum(TILE_KINDS, { error: 'must be single_lap or double_lap' }),
  length_mm: positive(),
  width_mm: positive(),
  cover_width_mm: coverSchema.optional(),
  headlap_mm: z.array(headlapBandSchema).min(1, { error: 'needs at least one pitch band' }),
  bond: z.enum(BONDS, { error: 'must be broken or straight' }).optional(),
  halves_per_tile: z.union([z.literal(1), z.literal(2)], { error: 'must be 1 or 2' }).optional(),
  weight_kg: positive(),
  per_pallet: wholeAtLeast(1),
  nails_per_tile: wholeAtLeast(0).optional(),
  /** Double lap: weight of one eaves tile, top tile and tile-and-a-half; left out, a full tile, a full tile and 1.5 tiles. */
  eaves_tile_kg: positive().optional(),
  top_tile_kg: positive().optional(),
  tile_and_half_kg: positive().optional(),
});

const tileSchema = tileInputSchema
  .superRefine((t, ctx) => {
    if (t.kind === 'single_lap' && !t.cover_width_mm) {
      ctx.addIssue({
        code: 'custom',
        path: ['cover_width_mm'],
        message: 'is required for a single-lap tile: give min, nominal and max (the side-lock play)',
      });
    }
    const c = t.cover_width_mm;
    if (t.kind === 'double_lap' && t.bond === 'straight') {
      ctx.addIssue({
        code: 'custom',
        path: ['bond'],
        message: 'a double-lap tile or slate is always laid broken bond (a tile-and-a-half at the verges): leave bond out or give broken',
      });
    }
    if (c && !(c.min <= c.nominal && c.nominal <= c.max)) {
      ctx.addIssue({ code: 'custom', path: ['cover_width_mm'], message: 'must have min ≤ nominal ≤ max' });
    }
    const seen = new Set<number>();
    t.headlap_mm.forEach((band, i) => {
      if (seen.has(band.from_pitch_deg)) {
        ctx.addIssue({ code: 'custom', path: ['headlap_mm', i, 'from_pitch_deg'], message: 'is given twice' });
      }
      seen.add(band.from_pitch_deg);
      if (band.min_mm >= t.length_mm) {
        ctx.addIssue({
          code: 'custom',
          path: ['headlap_mm', i, 'min_mm'],
          message: `must be less than the tile length (${t.length_mm} mm)`,
        });
      }
    });
  })
  .transform((t) => {
    const kindDefaults = t.kind === 'double_lap' ? DOUBLE_LAP_TILE_DEFAULTS : SINGLE_LAP_TILE_DEFAULTS;
    return {
      ...(t.name === undefined ? {} : { name: t.name }),
      kind: t.kind,
      length_mm: t.length_mm,
      width_mm: t.width_mm,
      // A double-lap tile or slate is laid butt-jointed: its cover is its width unless told otherwise.
      cover_width_mm: t.cover_width_mm ?? { min: t.width_mm, nominal: t.width_mm, max: t.width_mm },
      headlap_mm: [...t.headlap_mm].sort((a, b) => a.from_pitch_deg - b.from_pitch_deg),
      bond: t.bond ?? kindDefaults.bond,
      halves_per_tile: t.halves_per_tile ?? kindDefaults.halves_per_tile,
      weight_kg: t.weight_kg,
      per_pallet: t.per_pallet,
      nails_per_tile: t.nails_per_tile ?? kindDefaults.nails_per_tile,
      eaves_tile_kg: t.eaves_tile_kg ?? t.weight_kg,
      top_tile_kg: t.top_tile_kg ?? t.weight_kg,
      tile_and_half_kg: t.tile_and_half_kg ?? 1.5 * t.weight_kg,
    };
  });

const d = SYSTEM_DEFAULTS;

export const roofSystemSchema = z
  .strictObject({
    tile: tileSchema.prefault(DEFAULT_TILE),
    setting_out: z
      .strictObject({
        eaves_overhang_mm: nonNegative().default(d.setting_out.eaves_overhang_mm),
        top_gap_mm: nonNegative().default(d.setting_out.top_gap_mm),
        first_batten_mm: positive().optional(),
        verge_overhang_mm: z
          .strictObject({
            min: nonNegative().default(d.setting_out.verge_overhang_mm.min),
            target: nonNegative().default(d.setting_out.verge_overhang_mm.target),
            max: nonNegative().default(d.setting_out.verge_overhang_mm.max),
          })
          .prefault({})
          .refine((o) => o.min <= o.target && o.target <= o.max, { error: 'must have min ≤ target ≤ max' }),
      })
      .prefault({}),
    rafter_spacing_mm: positive().default(d.rafter_spacing_mm),
    batten: z
      .strictObject({
        stock_length_mm: positive().max(20_000, { error: 'must be at most 20000 mm' }).default(d.batten.stock_length_mm),
        min_supports: wholeAtLeast(2).default(d.batten.min_supports),
        min_length_mm: nonNegative().default(d.batten.min_length_mm),
        kg_per_m: nonNegative().default(d.batten.kg_per_m),
      })
      .prefault({}),
    ridge: z.strictObject({ cover_mm: positive().default(d.ridge.cover_mm), weight_kg: nonNegative().default(d.ridge.weight_kg) }).prefault({}),
    hip: z
      .strictObject({
        cover_mm: positive().default(d.hip.cover_mm),
        weight_kg: nonNegative().default(d.hip.weight_kg),
        iron_kg: nonNegative().default(d.hip.iron_kg),
      })
      .prefault({}),
    verge: z
      .strictObject({
        kind: z.enum(VERGE_KINDS, { error: 'must be mortar or dry' }).default(d.verge.kind),
        unit_kg: nonNegative().default(d.verge.unit_kg),
        end_cap_kg: nonNegative().default(d.verge.end_cap_kg),
      })
      .prefault({}),
    valley: z
      .strictObject({
        kind: z.enum(VALLEY_KINDS, { error: 'must be lined or trough' }).default(d.valley.kind),
        unit_length_mm: positive().default(d.valley.unit_length_mm),
        lap_mm: nonNegative().default(d.valley.lap_mm),
        unit_kg: nonNegative().default(d.valley.unit_kg),
      })
      .prefault({})
      .refine((v) => v.lap_mm < v.unit_length_mm, { error: 'lap_mm must be less than unit_length_mm', path: ['lap_mm'] }),
    underlay: z
      .strictObject({
        roll_width_mm: positive().default(d.underlay.roll_width_mm),
        roll_length_mm: positive().default(d.underlay.roll_length_mm),
        head_lap_mm: nonNegative().default(d.underlay.head_lap_mm),
        roll_kg: nonNegative().default(d.underlay.roll_kg),
      })
      .prefault({})
      .refine((u) => u.head_lap_mm < u.roll_width_mm, {
        error: 'head_lap_mm must be less than roll_width_mm',
        path: ['head_lap_mm'],
      }),
    fixing: z
      .strictObject({
        rule: z.enum(FIXING_RULES, { error: 'must be every_tile or perimeter_and_alternate_courses' }).default(d.fixing.rule),
        batten_nail_g: nonNegative().default(d.fixing.batten_nail_g),
        tile_nail_g: nonNegative().default(d.fixing.tile_nail_g),
        // Each field left out follows the tile kind (SINGLE_LAP_CLIP_DEFAULTS, DOUBLE_LAP_CLIP_DEFAULTS);
        // the engine resolves them, as the fixing section is read without the tile.
        clips: z
          .strictObject({
            eaves: z.boolean({ error: 'must be true or false' }).optional(),
            verges: z.boolean({ error: 'must be true or false' }).optional(),
            every_tile_from_pitch_deg: z
              .union(
                [
                  num('must be a pitch in degrees above 0 and at most 90, or null for never')
                    .gt(0, { error: 'must be a pitch in degrees above 0 and at most 90, or null for never' })
                    .max(90, { error: 'must be a pitch in degrees above 0 and at most 90, or null for never' }),
                  z.null(),
                ],
                { error: 'must be a pitch in degrees above 0 and at most 90, or null for never' },
              )
              .optional(),
          })
          .prefault({}),
        clip_g: nonNegative().default(d.fixing.clip_g),
      })
      .prefault({}),
    waste_pct: z
      .strictObject({
        tiles: percent().default(d.waste_pct.tiles),
        battens: percent().default(d.waste_pct.battens),
        underlay: percent().default(d.waste_pct.underlay),
        ridge_hip: percent().default(d.waste_pct.ridge_hip),
      })
      .prefault({}),
    roof_loading: z
      .strictObject({
        stack_size: wholeAtLeast(1).default(d.roof_loading.stack_size),
        every_nth_batten: wholeAtLeast(1).default(d.roof_loading.every_nth_batten),
      })
      .prefault({}),
    truck: z
      .strictObject({
        payload_kg: positive().default(d.truck.payload_kg),
        pallet_slots: wholeAtLeast(1).default(d.truck.pallet_slots),
        pallet_tare_kg: nonNegative().default(d.truck.pallet_tare_kg),
        max_pallet_kg: positive().default(d.truck.max_pallet_kg),
      })
      .prefault({}),
  })
  .superRefine((s, ctx) => {
    const minPiece = s.rafter_spacing_mm * (s.batten.min_supports - 1);
    if (s.batten.stock_length_mm < minPiece) {
      ctx.addIssue({
        code: 'custom',
        path: ['batten', 'stock_length_mm'],
        message: `must be at least ${minPiece} mm so one length spans ${s.batten.min_supports} rafters at ${s.rafter_spacing_mm} mm centres`,
      });
    }
    if (s.batten.stock_length_mm < s.batten.min_length_mm) {
      ctx.addIssue({
        code: 'custom',
        path: ['batten', 'stock_length_mm'],
        message: `must be at least the minimum batten length (${s.batten.min_length_mm} mm)`,
      });
    }
    if (s.truck.max_pallet_kg < s.truck.pallet_tare_kg + s.tile.weight_kg) {
      ctx.addIssue({
        code: 'custom',
        path: ['truck', 'max_pallet_kg'],
        message: `must be at least the empty pallet (pallet_tare_kg, ${s.truck.pallet_tare_kg} kg) and one tile (${s.tile.weight_kg} kg): a lighter limit leaves a pallet that cannot hold a tile`,
      });
    }
    if (s.setting_out.first_batten_mm === undefined && s.setting_out.eaves_overhang_mm >= s.tile.length_mm) {
      ctx.addIssue({
        code: 'custom',
        path: ['setting_out', 'eaves_overhang_mm'],
        message: `must be less than the tile length (${s.tile.length_mm} mm)`,
      });
    }
  });

/** What a caller may send: any part may be left out. */
export type RoofSystemInput = z.input<typeof roofSystemSchema>;
/** The whole system after defaults: what the engine works from. */
export type RoofSystem = z.output<typeof roofSystemSchema>;
export type Tile = RoofSystem['tile'];
export type HeadlapBand = Tile['headlap_mm'][number];
