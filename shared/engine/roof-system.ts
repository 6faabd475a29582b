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

/** How deep a system's input may nest to be remembered (the schema nests four deep). */
const MAX_DEPTH = 8;
/** How many systems read before are remembered (a job, or a benchmark, alternates a few). */
const REMEMBERED = 4;

/** True when a value is plain data as JSON.parse or a literal makes it: primitives, plain objects and arrays. */
function isPlainData(v: unknown, depth: number): boolean {
  if (typeof v !== 'object' || v === null) return typeof v !== 'function' && typeof v !== 'symbol';
  if (depth > MAX_DEPTH) return false;
  if (Array.isArray(v)) {
    if (Object.getPrototypeOf(v) !== Array.prototype) return false;
    for (let i = 0; i < v.length; i++) if (!(i in v) || !isPlainData(v[i], depth + 1)) return false;
    return true;
  }
  if (Object.getPrototypeOf(v) !== Object.prototype) return false;
  for (const key of Object.keys(v)) {
    const d = Object.getOwnPropertyDescriptor(v, key);
    if (!d || !('value' in d) || !isPlainData(d.value, depth + 1)) return false;
  }
  return true;
}

/** True when `given` is the same data as `kept` (plain data): same keys in the same order, same values (Object.is). */
function sameData(kept: unknown, given: unknown, depth: number): boolean {
  if (typeof kept !== 'object' || kept === null) return Object.is(kept, given);
  if (typeof given !== 'object' || given === null || depth > MAX_DEPTH) return false;
  if (Array.isArray(kept)) {
    if (!Array.isArray(given) || Object.getPrototypeOf(given) !== Array.prototype || given.length !== kept.length) return false;
    for (let i = 0; i < kept.length; i++) if (!(i in given) || !sameData(kept[i], given[i], depth + 1)) return false;
    return true;
  }
  if (Array.isArray(given) || Object.getPrototypeOf(given) !== Object.prototype) return false;
  const keys = Object.keys(kept);
  const givenKeys = Object.keys(given);
  if (keys.length !== givenKeys.length) return false;
  for (let i = 0; i < keys.length; i++) {
    const key = keys[i];
    if (givenKeys[i] !== key) return false;
    const d = Object.getOwnPropertyDescriptor(given, key);
    if (!d || !('value' in d) || !sameData((kept as Record<string, unknown>)[key], d.value, depth + 1)) return false;
  }
  return true;
}

/** A system read before: a copy of its input and a copy of the system it gave, neither ever handed out. */
class ReadSystem {
  constructor(
    readonly input: unknown,
    readonly system: RoofSystem,
  ) {}
}

const recentlyRead: ReadSystem[] = [];

/**
 * Reads a roof system: any part may be left out and takes its default. Errors name the field path.
 * An input that is the same plain data as one of the last few accepted gives a fresh copy of the
 * system read then (zod's parse is pure, and its defaults are constants), so the caller may change
 * what it gets, or change its input and read it again; anything else is read by the schema.
 */
export function parseRoofSystem(input: unknown): { ok: true; system: RoofSystem } | { ok: false; errors: InputProblem[] } {
  const given = input ?? {};
  for (let i = 0; i < recentlyRead.length; i++) {
    if (sameData(recentlyRead[i].input, given, 0)) return { ok: true, system: structuredClone(recentlyRead[i].system) };
  }
  const parsed = roofSystemSchema.safeParse(given);
  if (parsed.success) {
    if (isPlainData(given, 0)) {
      recentlyRead.unshift(new ReadSystem(structuredClone(given), structuredClone(parsed.data)));
      if (recentlyRead.length > REMEMBERED) recentlyRead.pop();
    }
    return { ok: true, system: parsed.data };
  }
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
