import * as z from 'zod/mini';
import { SYSTEM_ROLES } from '../../../../shared/schemas/catalogue.schema';
import type { SystemRole } from '../../../../shared/schemas/catalogue.schema';
import { roofSystemBodySchema, updateRoofSystemBodySchema } from '../../../../shared/schemas/price-list.schema';
import { textOf } from './form-values';

/** Words for each part of a roof system. */
export const ROLE_WORDS: Record<SystemRole, string> = {
  tile: 'Tile',
  ridge: 'Ridge tile',
  hip: 'Hip tile',
  batten: 'Batten',
  batten_nail: 'Batten nail',
  tile_nail: 'Tile nail',
  clip: 'Clip',
  underlay: 'Underlay',
  valley: 'Valley lining',
  eaves_tile: 'Eaves tile',
  top_tile: 'Top tile',
  tile_and_half: 'Tile-and-a-half',
  valley_trough: 'Valley trough unit',
  dry_verge: 'Dry verge unit',
  ridge_end_cap: 'Ridge end cap',
  hip_iron: 'Hip iron',
  eaves_vent: 'Eaves ventilation (by the metre)',
  verge_undercloak: 'Verge undercloak (by the metre)',
  flashing: 'Flashing (by the metre)',
};

/** Field name of a component's product picker: server details name `components.<role>`. */
export const componentField = (role: string) => `components.${role}`;

function readSystem(values: Record<string, unknown>): Record<string, unknown> {
  const components: Record<string, number> = {};
  for (const role of SYSTEM_ROLES) {
    const chosen = textOf(values[componentField(role)]);
    if (chosen) components[role] = Number(chosen);
  }
  return { name: textOf(values.name) ?? '', description: textOf(values.description) ?? '', components };
}

/** A new roof system: name, description and one product per role, at the branch given as `branch_id`. */
export const createRoofSystemFormSchema = z.pipe(
  z.pipe(
    z.record(z.string(), z.unknown()),
    z.transform((values): unknown => ({ branch_id: values.branch_id, ...readSystem(values) })),
  ),
  roofSystemBodySchema,
);

/**
 * A changed roof system: every role is sent, so a role left on "none" is taken off. The settings are
 * not on this form and are left out of the change, so the stored ones stand.
 */
export const updateRoofSystemFormSchema = z.pipe(
  z.pipe(
    z.record(z.string(), z.unknown()),
    z.transform((values): unknown => readSystem(values)),
  ),
  updateRoofSystemBodySchema,
);
