import { roofSystemSchema, type RoofSystem } from '../schemas/roof-system.schema';
import type { InputProblem } from './result';

/** Dotted path of an issue, with array indices in brackets: tile.headlap_mm[0].min_mm. */
export function fieldPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out === '' ? String(part) : `.${String(part)}`;
  }
  return out;
}

/**
 * Reads a roof system: any part may be left out and takes its default. Errors name the field path.
 */
export function parseRoofSystem(input: unknown): { ok: true; system: RoofSystem } | { ok: false; errors: InputProblem[] } {
  const parsed = roofSystemSchema.safeParse(input ?? {});
  if (parsed.success) return { ok: true, system: parsed.data };
  const errors: InputProblem[] = [];
  for (const issue of parsed.error.issues) {
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) {
        errors.push({ field: fieldPath([...issue.path, key]), message: 'is not a field of the roof system' });
      }
    } else if (issue.path.length === 0) {
      errors.push({ field: '(system)', message: 'must be an object of roof-system fields' });
    } else {
      errors.push({ field: fieldPath(issue.path), message: issue.message });
    }
  }
  return { ok: false, errors };
}
