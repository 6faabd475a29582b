import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { estimate } from './estimate';
import { sameNameWithoutCase } from './ridge-groups';
import { parseRoofSystem } from './roof-system';
import { resolveFace } from '../schemas/schedule.schema';

// Ridge names are compared as the schedule reader compares names: trimmed and without case
// (String.prototype.trim and toLowerCase, ECMAScript). The fast path must agree with them exactly.
const slow = (a: string, b: string) => a.trim().toLowerCase() === b.trim().toLowerCase();

describe('ridge names compared without case', () => {
  it('agrees with trim().toLowerCase() on plain and awkward names', () => {
    const pairs: Array<[string, string]> = [
      ['Main', 'main'],
      ['Main', 'MAIN '],
      [' Main', 'main'],
      ['Main', 'Wing'],
      ['Main', 'Mains'],
      ['Ärger', 'ärger'],
      ['İx', 'i̇x'],
      ['Gar age', 'gar age'],
      ['a\tb', 'A\tB'],
      ['', ' '],
      ['x', 'X'],
      ['Z', '['],
      ['@', '`'],
    ];
    for (const [a, b] of pairs) expect(sameNameWithoutCase(a, b), `${a} / ${b}`).toBe(slow(a, b));
  });

  it('agrees with trim().toLowerCase() on any two strings', () => {
    const word = fc.string({ unit: fc.constantFrom('a', 'A', 'z', 'Z', ' ', '\t', 'Ä', 'ä', 'İ', 'i', '\u0307', '1', '[', '@'), maxLength: 6 });
    fc.assert(fc.property(word, word, (a, b) => sameNameWithoutCase(a, b) === slow(a, b)));
  });

  it('groups the faces of a ridge whatever the case of its name, also past sixteen ridges in a building', () => {
    const sys = parseRoofSystem({});
    if (!sys.ok) throw new Error('default system');
    const face = (name: string, ridge: string) => resolveFace({ building: 'A', face: name, quantity: 1, pitch_deg: 35, rafter_mm: 4000, eaves_mm: 6000, left: 'verge', right: 'verge', top: 'ridge', ridge });
    const faces = [];
    for (let i = 0; i < 20; i++) faces.push(face(`F${i}`, `Ridge ${i}`), face(`B${i}`, ` ridge ${i}`.toUpperCase()));
    const r = estimate(faces, sys.system);
    expect(r.ridges).toHaveLength(20);
    expect(r.ridges[17]).toMatchObject({ ridge: 'Ridge 17', faces: ['F17', 'B17'] });
    expect(r.warnings.filter((w) => w.code === 'unpaired_ridge_face')).toEqual([]);
  });
});
