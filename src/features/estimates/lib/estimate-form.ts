import * as z from 'zod/mini';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import type { InputProblem } from '../../../../shared/engine/result';
import { parseRoofSystem } from '../../../../shared/engine/roof-system';
import { wastePctSchema } from '../../../../shared/schemas/estimate.schema';
import type { CreateEstimateBody } from '../../../../shared/schemas/estimate.schema';

/**
 * The estimate form's fields are flat inputs named by the path the API reports errors on
 * (waste_pct.tiles, system.tile.length_mm, system.tile.headlap_mm.0.min_mm), so a refusal from the
 * server lands on the same input the browser would have marked.
 */
export const WASTE_FIELDS = ['tiles', 'battens', 'underlay', 'ridge_hip'] as const;
export const HEADLAP_ROWS = 3;

export const tileField = (name: string) => `system.tile.${name}`;
export const VERGE_KIND_FIELD = 'system.verge.kind';
export const VALLEY_KIND_FIELD = 'system.valley.kind';
export const valleyField = (name: 'unit_length_mm' | 'lap_mm') => `system.valley.${name}`;
/** A double-lap tile's special pieces, each weighed on its own; left blank, the engine weighs them from the tile. */
export const SPECIAL_PIECE_FIELDS = ['eaves_tile_kg', 'top_tile_kg', 'tile_and_half_kg'] as const;
export const headlapField = (i: number, name: 'from_pitch_deg' | 'min_mm') => `system.tile.headlap_mm.${i}.${name}`;

type Ctx = z.core.$RefinementCtx<unknown>;

function numberAt(values: Record<string, string>, name: string, ctx: Ctx, required: boolean): number | undefined {
  const text = (values[name] ?? '').trim().replace(',', '.');
  if (text === '') {
    if (required) ctx.addIssue({ code: 'custom', path: [name], message: 'is required' });
    return undefined;
  }
  const value = Number(text);
  if (!Number.isFinite(value)) {
    ctx.addIssue({ code: 'custom', path: [name], message: 'must be a number' });
    return undefined;
  }
  return value;
}

function readWaste(values: Record<string, string>, ctx: Ctx) {
  const waste: Record<string, number> = {};
  for (const key of WASTE_FIELDS) {
    const value = numberAt(values, `waste_pct.${key}`, ctx, false);
    if (value !== undefined) waste[key] = value;
  }
  const checked = wastePctSchema.safeParse(waste);
  if (!checked.success) {
    for (const issue of checked.error.issues) ctx.addIssue({ code: 'custom', path: [`waste_pct.${issue.path.join('.')}`], message: issue.message });
  }
  return waste;
}

/** The generic system's fields as the engine's roof-system input; blank optional fields take the engine's defaults. */
function readGenericSystem(values: Record<string, string>, ctx: Ctx): Record<string, unknown> {
  const kind = values[tileField('kind')] === 'double_lap' ? 'double_lap' : 'single_lap';
  const tile: Record<string, unknown> = { kind };
  const name = (values[tileField('name')] ?? '').trim();
  if (name) tile.name = name;
  for (const field of ['length_mm', 'width_mm', 'weight_kg', 'per_pallet'] as const) {
    const value = numberAt(values, tileField(field), ctx, true);
    if (value !== undefined) tile[field] = value;
  }
  const nails = numberAt(values, tileField('nails_per_tile'), ctx, false);
  if (nails !== undefined) tile.nails_per_tile = nails;
  const bond = values[tileField('bond')];
  if (bond === 'broken' || bond === 'straight') tile.bond = bond;
  if (kind === 'double_lap') {
    for (const field of SPECIAL_PIECE_FIELDS) {
      const value = numberAt(values, tileField(field), ctx, false);
      if (value !== undefined) tile[field] = value;
    }
  }
  const cover = ['min', 'nominal', 'max'].map((part) => numberAt(values, tileField(`cover_width_mm.${part}`), ctx, false));
  if (cover.some((v) => v !== undefined)) {
    const [min, nominal, max] = cover;
    tile.cover_width_mm = { min: min ?? nominal, nominal: nominal ?? min, max: max ?? nominal };
  }
  const bands: { from_pitch_deg: number; min_mm: number }[] = [];
  for (let i = 0; i < HEADLAP_ROWS; i++) {
    const from = numberAt(values, headlapField(i, 'from_pitch_deg'), ctx, false);
    const lap = numberAt(values, headlapField(i, 'min_mm'), ctx, false);
    if (from === undefined && lap === undefined) continue;
    if (from === undefined) ctx.addIssue({ code: 'custom', path: [headlapField(i, 'from_pitch_deg')], message: 'give the pitch this headlap applies from' });
    if (lap === undefined) ctx.addIssue({ code: 'custom', path: [headlapField(i, 'min_mm')], message: 'give the headlap for this pitch' });
    if (from !== undefined && lap !== undefined) bands.push({ from_pitch_deg: from, min_mm: lap });
  }
  if (bands.length === 0) ctx.addIssue({ code: 'custom', path: [headlapField(0, 'min_mm')], message: 'give at least one pitch and its headlap' });
  tile.headlap_mm = bands;
  const system: Record<string, unknown> = { tile };
  const spacing = numberAt(values, 'system.rafter_spacing_mm', ctx, false);
  if (spacing !== undefined) system.rafter_spacing_mm = spacing;
  // The kinds go to the roof-system schema as chosen, so a value it does not know is refused on its field.
  const verge = values[VERGE_KIND_FIELD] ?? '';
  if (verge !== '') system.verge = { kind: verge };
  const valleyKind = values[VALLEY_KIND_FIELD] ?? '';
  if (valleyKind !== '') {
    const valley: Record<string, unknown> = { kind: valleyKind };
    // Unit length and lap belong to trough units; a lined valley is ordered by the metre.
    if (valleyKind === 'trough') {
      for (const field of ['unit_length_mm', 'lap_mm'] as const) {
        const value = numberAt(values, valleyField(field), ctx, false);
        if (value !== undefined) valley[field] = value;
      }
    }
    system.valley = valley;
  }
  return system;
}

/** Engine field paths (tile.headlap_mm[0].min_mm) as the form's input names. */
export function systemProblemsToFields(problems: readonly InputProblem[]): { path: string; message: string }[] {
  return problems.map((p) => ({ path: p.field ? (p.field.startsWith('waste_pct') ? p.field : `system.${p.field}`) : 'system', message: p.message }));
}

/**
 * Reads the form into the API body: a merchant's system by id, or a generic system typed in, and
 * the waste allowances. The generic system is checked with the engine's own roof-system reader.
 */
export const estimateFormSchema = z.pipe(
  z.record(z.string(), z.string()),
  transformWithIssues((values, ctx): CreateEstimateBody => {
    const waste = readWaste(values, ctx);
    const waste_pct = Object.keys(waste).length > 0 ? waste : undefined;
    if (values.source === 'generic') {
      const system = readGenericSystem(values, ctx);
      const parsed = parseRoofSystem({ ...system, ...(waste_pct ? { waste_pct } : {}) });
      if (!parsed.ok) for (const p of systemProblemsToFields(parsed.errors)) ctx.addIssue({ code: 'custom', path: [p.path], message: p.message });
      return { system, ...(waste_pct ? { waste_pct } : {}) };
    }
    const id = Number(values.system_id);
    if (!values.system_id || !Number.isInteger(id) || id <= 0) {
      ctx.addIssue({ code: 'custom', path: ['system_id'], message: 'choose a roof system, or type in a generic one' });
      return z.NEVER;
    }
    return { system_id: id, ...(waste_pct ? { waste_pct } : {}) };
  }),
);
