import './zod-messages';
import * as z from 'zod/mini';
import { DEFAULT_TILE, SYSTEM_DEFAULTS, DOUBLE_LAP_TILE_DEFAULTS, SINGLE_LAP_TILE_DEFAULTS } from '../engine/defaults';

/**
 * The roof system: the tile being laid and how it is set out, battened, fixed, loaded and delivered.
 * Lengths in millimetres, weights in kilograms, percentages as numbers (5 = 5 %).
 * Every field has a default (shared/engine/defaults.ts), so `{}` or `{ tile }` is a whole system.
 * A merchant's catalogue stores the same fields on its products.
 */

const num = (what = 'must be a number') => z.number({ error: what });
const positive = () => num().check(z.positive({ error: 'must be more than 0' }));
const nonNegative = () => num().check(z.gte(0, { error: 'must be 0 or more' }));
const wholeAtLeast = (min: number) => num('must be a whole number').check(z.int({ error: 'must be a whole number' }), z.gte(min, { error: `must be a whole number of at least ${min}` }));
const percent = () => num().check(z.gte(0, { error: 'must be 0 or more' }), z.lte(100, { error: 'must be at most 100' }));

export const TILE_KINDS = ['single_lap', 'double_lap'] as const;
export const BONDS = ['broken', 'straight'] as const;
export const FIXING_RULES = ['every_tile', 'perimeter_and_alternate_courses'] as const;
export const VERGE_KINDS = ['mortar', 'dry'] as const;
export const VALLEY_KINDS = ['lined', 'trough'] as const;

const coverSchema = z.strictObject({ min: positive(), nominal: positive(), max: positive() });

const headlapBandSchema = z.strictObject({
  from_pitch_deg: num().check(z.gt(0, { error: 'must be above 0°' }), z.lt(90, { error: 'must be below 90°' })),
  min_mm: positive(),
});

/** A tile as given: the kind, sizes, headlap bands, weight and pallet count are needed; the rest follows from the kind. */
const tileInputSchema = z.strictObject({
  /** Optional label for people (a catalogue line); the engine does not use it. */
  name: z.optional(z.string().check(z.maxLength(200))),
  kind: z.enum(TILE_KINDS, { error: 'must be single_lap or double_lap' }),
  length_mm: positive(),
  width_mm: positive(),
  cover_width_mm: z.optional(coverSchema),
  headlap_mm: z.array(headlapBandSchema).check(z.minLength(1, { error: 'needs at least one pitch band' })),
  bond: z.optional(z.enum(BONDS, { error: 'must be broken or straight' })),
  halves_per_tile: z.optional(z.union([z.literal(1), z.literal(2)], { error: 'must be 1 or 2' })),
  weight_kg: positive(),
  per_pallet: wholeAtLeast(1),
  nails_per_tile: z.optional(wholeAtLeast(0)),
  /** Double lap: weight of one eaves tile, top tile and tile-and-a-half; left out, a full tile, a full tile and 1.5 tiles. */
  eaves_tile_kg: z.optional(positive()),
  top_tile_kg: z.optional(positive()),
  tile_and_half_kg: z.optional(positive()),
});

const tileSchema = z.pipe(
  tileInputSchema.check(
    z.superRefine((t, ctx) => {
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
    }),
  ),
  z.transform((t) => {
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
  }),
);

const d = SYSTEM_DEFAULTS;

export const roofSystemSchema = z
  .strictObject({
    tile: z.prefault(tileSchema, DEFAULT_TILE),
    setting_out: z.prefault(
      z.strictObject({
        eaves_overhang_mm: z._default(nonNegative(), d.setting_out.eaves_overhang_mm),
        top_gap_mm: z._default(nonNegative(), d.setting_out.top_gap_mm),
        first_batten_mm: z.optional(positive()),
        verge_overhang_mm: z
          .prefault(
            z.strictObject({
              min: z._default(nonNegative(), d.setting_out.verge_overhang_mm.min),
              target: z._default(nonNegative(), d.setting_out.verge_overhang_mm.target),
              max: z._default(nonNegative(), d.setting_out.verge_overhang_mm.max),
            }),
            {},
          )
          .check(z.refine((o) => o.min <= o.target && o.target <= o.max, { error: 'must have min ≤ target ≤ max' })),
      }),
      {},
    ),
    rafter_spacing_mm: z._default(positive(), d.rafter_spacing_mm),
    batten: z.prefault(
      z.strictObject({
        stock_length_mm: z._default(positive().check(z.lte(20_000, { error: 'must be at most 20000 mm' })), d.batten.stock_length_mm),
        min_supports: z._default(wholeAtLeast(2), d.batten.min_supports),
        min_length_mm: z._default(nonNegative(), d.batten.min_length_mm),
        kg_per_m: z._default(nonNegative(), d.batten.kg_per_m),
      }),
      {},
    ),
    ridge: z.prefault(z.strictObject({ cover_mm: z._default(positive(), d.ridge.cover_mm), weight_kg: z._default(nonNegative(), d.ridge.weight_kg) }), {}),
    hip: z.prefault(
      z.strictObject({
        cover_mm: z._default(positive(), d.hip.cover_mm),
        weight_kg: z._default(nonNegative(), d.hip.weight_kg),
        iron_kg: z._default(nonNegative(), d.hip.iron_kg),
      }),
      {},
    ),
    verge: z.prefault(
      z.strictObject({
        kind: z._default(z.enum(VERGE_KINDS, { error: 'must be mortar or dry' }), d.verge.kind),
        unit_kg: z._default(nonNegative(), d.verge.unit_kg),
        end_cap_kg: z._default(nonNegative(), d.verge.end_cap_kg),
      }),
      {},
    ),
    valley: z
      .prefault(
        z.strictObject({
          kind: z._default(z.enum(VALLEY_KINDS, { error: 'must be lined or trough' }), d.valley.kind),
          unit_length_mm: z._default(positive(), d.valley.unit_length_mm),
          lap_mm: z._default(nonNegative(), d.valley.lap_mm),
          unit_kg: z._default(nonNegative(), d.valley.unit_kg),
        }),
        {},
      )
      .check(z.refine((v) => v.lap_mm < v.unit_length_mm, { error: 'lap_mm must be less than unit_length_mm', path: ['lap_mm'] })),
    underlay: z
      .prefault(
        z.strictObject({
          roll_width_mm: z._default(positive(), d.underlay.roll_width_mm),
          roll_length_mm: z._default(positive(), d.underlay.roll_length_mm),
          head_lap_mm: z._default(nonNegative(), d.underlay.head_lap_mm),
          roll_kg: z._default(nonNegative(), d.underlay.roll_kg),
        }),
        {},
      )
      .check(
        z.refine((u) => u.head_lap_mm < u.roll_width_mm, {
          error: 'head_lap_mm must be less than roll_width_mm',
          path: ['head_lap_mm'],
        }),
      ),
    fixing: z.prefault(
      z.strictObject({
        rule: z._default(z.enum(FIXING_RULES, { error: 'must be every_tile or perimeter_and_alternate_courses' }), d.fixing.rule),
        batten_nail_g: z._default(nonNegative(), d.fixing.batten_nail_g),
        tile_nail_g: z._default(nonNegative(), d.fixing.tile_nail_g),
        // Each field left out follows the tile kind (SINGLE_LAP_CLIP_DEFAULTS, DOUBLE_LAP_CLIP_DEFAULTS);
        // the engine resolves them, as the fixing section is read without the tile.
        clips: z.prefault(
          z.strictObject({
            eaves: z.optional(z.boolean({ error: 'must be true or false' })),
            verges: z.optional(z.boolean({ error: 'must be true or false' })),
            every_tile_from_pitch_deg: z.optional(
              z.union(
                [
                  num('must be a pitch in degrees above 0 and at most 90, or null for never').check(
                    z.gt(0, { error: 'must be a pitch in degrees above 0 and at most 90, or null for never' }),
                    z.lte(90, { error: 'must be a pitch in degrees above 0 and at most 90, or null for never' }),
                  ),
                  z.null(),
                ],
                { error: 'must be a pitch in degrees above 0 and at most 90, or null for never' },
              ),
            ),
          }),
          {},
        ),
        clip_g: z._default(nonNegative(), d.fixing.clip_g),
      }),
      {},
    ),
    waste_pct: z.prefault(
      z.strictObject({
        tiles: z._default(percent(), d.waste_pct.tiles),
        battens: z._default(percent(), d.waste_pct.battens),
        underlay: z._default(percent(), d.waste_pct.underlay),
        ridge_hip: z._default(percent(), d.waste_pct.ridge_hip),
      }),
      {},
    ),
    roof_loading: z.prefault(
      z.strictObject({
        stack_size: z._default(wholeAtLeast(1), d.roof_loading.stack_size),
        every_nth_batten: z._default(wholeAtLeast(1), d.roof_loading.every_nth_batten),
      }),
      {},
    ),
    truck: z.prefault(
      z
        .strictObject({
          payload_kg: z._default(positive(), d.truck.payload_kg),
          pallet_slots: z._default(wholeAtLeast(1), d.truck.pallet_slots),
          pallet_tare_kg: z._default(nonNegative(), d.truck.pallet_tare_kg),
          max_pallet_kg: z._default(positive(), d.truck.max_pallet_kg),
        })
        // Checked here as well as with the tile below, so a pallet limit at or under the empty pallet is
        // reported even when the tile has problems of its own (the whole-system check waits for a valid tile).
        .check(
          z.refine((t) => t.max_pallet_kg > t.pallet_tare_kg, {
            error: (issue) => `must be more than the empty pallet (pallet_tare_kg, ${(issue.input as { pallet_tare_kg: number }).pallet_tare_kg} kg): such a pallet cannot hold a tile`,
            path: ['max_pallet_kg'],
          }),
        ),
      {},
    ),
  })
  .check(
    z.superRefine((s, ctx) => {
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
      // At or under the empty pallet it is reported by the truck's own check.
      if (s.truck.max_pallet_kg > s.truck.pallet_tare_kg && s.truck.max_pallet_kg < s.truck.pallet_tare_kg + s.tile.weight_kg) {
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
    }),
  );

/** What a caller may send: any part may be left out. */
export type RoofSystemInput = z.input<typeof roofSystemSchema>;
/** The whole system after defaults: what the engine works from. */
export type RoofSystem = z.output<typeof roofSystemSchema>;
export type Tile = RoofSystem['tile'];
export type HeadlapBand = Tile['headlap_mm'][number];
