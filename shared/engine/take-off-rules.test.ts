import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Opening } from '../schemas/openings.schema';
import { roofSystemSchema, type RoofSystemInput } from '../schemas/roof-system.schema';
import { resolveFace, type Face, type FaceCandidate } from '../schemas/schedule.schema';
import { halfToTileAndHalf, vergeToRakeCourse } from './bond';
import { estimate, formatProblem, runEstimate, runEstimateFromCsv } from './estimate';
import { parseOpeningsCsv } from './openings-parse';
import type { EngineResult } from './result';
import { parseRoofSystem } from './roof-system';
import { parseScheduleCsv } from './schedule-parse';

const HEADER = 'building,face,quantity,pitch_deg,rafter_mm,run_mm,eaves_mm,top_mm,left,right,top';
/** Plain tile 265 × 165 mm at 65 mm headlap: 100 mm gauge (Treatise rule, published; NHBC 7.2.19 headlap, seen). */
const PLAIN_TILE = {
  kind: 'double_lap' as const,
  length_mm: 265,
  width_mm: 165,
  headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }],
  weight_kg: 1.1,
  per_pallet: 1000,
};

function ok(out: ReturnType<typeof runEstimateFromCsv>): EngineResult {
  if (!out.ok) throw new Error(out.errors.map(formatProblem).join('\n'));
  return out.result;
}

function face(over: Partial<Face>): Face {
  return {
    building: '1',
    face: 'Main',
    quantity: 1,
    pitch_deg: 40,
    rafter_mm: 3_255,
    run_mm: 1,
    eaves_mm: 6_510,
    top_mm: 6_510,
    left: 'verge',
    right: 'verge',
    top: 'ridge',
    ...over,
  };
}

// ---- faults ----------------------------------------------------------------------------------

describe('waste is applied to the net quantity before rounding (common practice, no source)', () => {
  it('orders underlay as ceil(slope × (1 + waste) ÷ roll cover): 43 m² at 10 % is 2 rolls of 42.5 m², not 3', () => {
    // 10 m × 4.3 m = 43 m²; a 1 m roll with a 150 mm head lap covers 0.85 × 50 = 42.5 m² (RTA laps, seen).
    const r = estimate([face({ pitch_deg: 35, rafter_mm: 4_300, eaves_mm: 10_000, top_mm: 10_000 })], roofSystemSchema.parse({}));
    expect(r.totals.slope_area_m2).toBe(43);
    expect(r.totals.underlay_rolls).toBe(Math.ceil((43 * 1.1) / 42.5)); // 2
    expect(r.totals.underlay_rolls).toBe(2);
  });

  it('orders batten lengths as max(cutting plan, ceil(metres × (1 + waste) ÷ stock)), exactly the plan at 0 %', () => {
    const f = face({ pitch_deg: 35, rafter_mm: 4_300, eaves_mm: 10_000, top_mm: 10_000 });
    const net = estimate([f], roofSystemSchema.parse({ waste_pct: { battens: 0 } })).totals;
    const withWaste = estimate([f], roofSystemSchema.parse({ waste_pct: { battens: 10 } })).totals;
    expect(withWaste.batten_lengths).toBe(Math.max(net.batten_lengths, Math.ceil((net.batten_m * 1.1) / 4.8)));
    // The old order (waste on the rounded plan) was more than that.
    expect(withWaste.batten_lengths).toBeLessThan(Math.ceil(net.batten_lengths * 1.1));
  });
});

describe('systems that cannot be laid or loaded are rejected, naming the field', () => {
  it('rejects a double-lap tile laid straight bond, naming tile.bond (double lap is always broken bond: common practice, no source)', () => {
    const r = parseRoofSystem({ tile: { ...PLAIN_TILE, bond: 'straight' } });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => e.field)).toEqual(['tile.bond']);
    expect(parseRoofSystem({ tile: { ...PLAIN_TILE, bond: 'broken' } }).ok).toBe(true);
  });

  it('rejects a max pallet weight below the empty pallet, naming truck.max_pallet_kg (a pallet must carry at least one tile: common practice, no source)', () => {
    const r = parseRoofSystem({ truck: { pallet_tare_kg: 25, max_pallet_kg: 20 } });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => e.field)).toEqual(['truck.max_pallet_kg']);
    // Reported beside a tile's own problem too, not only once the tile is put right.
    const both = parseRoofSystem({ tile: { ...PLAIN_TILE, bond: 'straight' }, truck: { pallet_tare_kg: 25, max_pallet_kg: 20 } });
    expect(!both.ok && both.errors.map((e) => e.field).sort()).toEqual(['tile.bond', 'truck.max_pallet_kg']);
    // Above the empty pallet but under it and one tile: the whole-system check, which names the tile's weight.
    const oneTile = parseRoofSystem({ tile: PLAIN_TILE, truck: { pallet_tare_kg: 25, max_pallet_kg: 25.5 } });
    expect(!oneTile.ok && oneTile.errors.map((e) => `${e.field}: ${e.message}`)).toEqual([
      `truck.max_pallet_kg: must be at least the empty pallet (pallet_tare_kg, 25 kg) and one tile (${PLAIN_TILE.weight_kg} kg): a lighter limit leaves a pallet that cannot hold a tile`,
    ]);
  });
});

describe('schedule rows that give a wrong roof silently are rejected, naming row and column', () => {
  it("asks for rafter_mm on a face of 80° and steeper given only by run (slope = plan ÷ cos pitch, trigonometry as in old builders' texts; a small error in the pitch multiplies the rafter there)", () => {
    const r = parseScheduleCsv(`${HEADER}\r\nA,Steep,1,80,,600,3000,,verge,verge,ridge\r\nA,Fine,1,79,,600,3000,,verge,verge,ridge\r\n`);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map(formatProblem)).toEqual(['row 2, column run_mm: give rafter_mm for faces of 80° and steeper']);
    expect(parseScheduleCsv(`${HEADER}\r\nA,Steep,1,80,3455,600,3000,,verge,verge,ridge\r\n`).ok).toBe(true);
  });

  it("requires top_mm beside a hip or valley (0 is a triangular hip end), in a CSV and in JSON (a hip end's top is its apex: common practice, no source)", () => {
    const csv = `${HEADER}\r\nA,Front,1,35,4000,,9000,,hip,hip,ridge\r\nA,End,1,35,4000,,6000,0,hip,hip,ridge\r\nA,Wing,1,35,4000,,6000,,verge,valley,ridge\r\n`;
    const r = parseScheduleCsv(csv);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors.map(formatProblem)).toEqual(['row 2, column top_mm: required on a face with a hip or valley edge', 'row 4, column top_mm: required on a face with a hip or valley edge']);
    }
    const json = runEstimate([{ face: 'Front', pitch_deg: 35, rafter_mm: 4_000, eaves_mm: 9_000, left: 'hip', right: 'hip' }]);
    expect(json.ok).toBe(false);
    if (!json.ok) expect(json.errors).toEqual([{ row: 1, column: 'top_mm', message: 'required on a face with a hip or valley edge' }]);
  });

  it('estimates a stored face with a hip and no top as before, with the warning top_assumed (common practice, no source)', () => {
    const candidate: FaceCandidate = { building: 'A', face: 'Front', quantity: 1, pitch_deg: 35, rafter_mm: 4_000, eaves_mm: 9_000, left: 'hip', right: 'hip', top: 'ridge' };
    const stored = resolveFace(candidate);
    expect(stored.top_mm).toBe(9_000);
    const r = estimate([stored], roofSystemSchema.parse({}));
    expect(r.warnings.filter((w) => w.code === 'top_assumed').map((w) => w.face)).toEqual(['Front']);
  });
});

describe('ridges named in the schedule (spread the load evenly so the structure is never unbalanced: BS 8000-6 guidance as summarised in trade press)', () => {
  const hipped = (ridge: string) =>
    [
      `${HEADER},ridge`,
      `A,Front,1,35,4000,,9000,1800,hip,hip,ridge,${ridge}`,
      `A,Back,1,35,4000,,9000,1800,hip,hip,ridge,${ridge}`,
      `A,East,1,35,4000,,7200,0,hip,hip,ridge,${ridge}`,
      `A,West,1,35,4000,,7200,0,hip,hip,ridge,${ridge}`,
      'A,Porch,1,30,1500,,2400,,verge,verge,abutment,',
    ].join('\r\n');

  it('groups the faces naming one ridge, and reports the difference between its slopes', () => {
    const r = ok(runEstimateFromCsv(hipped('Main')));
    expect(r.ridges).toHaveLength(1);
    expect(r.ridges[0]).toMatchObject({ building: 'A', ridge: 'Main', faces: ['Front', 'Back', 'East', 'West'], difference_kg: 0 });
    expect(r.faces[0].ridge).toBe('Main');
    expect(r.warnings.map((w) => w.code)).not.toContain('ridge_grouping_guessed');
  });

  it('shows the load a roof window takes off one slope of a named ridge', () => {
    const openings: Opening[] = [{ building: 'A', face: 'Front', kind: 'roof_window', width_mm: 1_140, height_mm: 1_180, quantity: 1 }];
    const r = ok(runEstimateFromCsv(hipped('Main'), {}, 'building,face,kind,width_mm,height_mm\r\nA,Front,roof_window,1140,1180\r\n'));
    const front = r.faces[0].load_kg;
    const back = r.faces[1].load_kg;
    expect(front).toBeLessThan(back);
    expect(r.ridges[0].difference_kg).toBeCloseTo(back - front, 1);
    expect(openings[0].kind).toBe('roof_window');
  });

  it('falls back to pairing by top length without the column, and warns ridge_grouping_guessed', () => {
    const csv = hipped('').replace(',ridge\r\n', '\r\n');
    const r = ok(runEstimateFromCsv(csv));
    expect(r.ridges.map((x) => x.faces)).toEqual([
      ['Front', 'Back'],
      ['East', 'West'],
    ]);
    expect(r.ridges.every((x) => x.ridge === null)).toBe(true);
    expect(r.warnings.filter((w) => w.code === 'ridge_grouping_guessed')).toHaveLength(1);
  });
});

// ---- double lap ------------------------------------------------------------------------------

describe('plain tiles and slates as laid (double lap)', () => {
  // Hand-worked: 40 tiles of 165 mm span 6510 mm + 2 × 45 mm verge overhang; rafter 215 + 30 × 100 + 40 mm
  // gives 30 gauges and 32 courses (k + 2 with the under-eaves course: NHBC 7.2.19, seen).
  const system = roofSystemSchema.parse({ tile: PLAIN_TILE });
  const f = estimate([face({})], system).faces[0];

  it('lays the first course of short eaves tiles and the last of short top tiles, a course of tiles_per_course each (common practice, no source)', () => {
    expect(f.courses).toBe(32);
    expect(f.tiles_per_course).toBe(40);
    expect(f.eaves_tiles).toBe(40);
    expect(f.top_tiles).toBe(40);
  });

  it('keeps the bond at each verge with a tile-and-a-half in every second full course from the second (common practice, no source)', () => {
    // Full courses 1–30; courses 2, 4 … 30 (15) have two tiles-and-a-half and 37 whole; the other 15 have 40.
    expect(f.tile_and_half).toBe(30);
    expect(f.half_tiles).toBe(0);
    expect(f.whole_tiles).toBe(15 * 40 + 15 * 37);
    expect(f.tiles).toBe(1_155);
    expect(f.cut_tiles).toBe(0);
  });

  it('puts one tile-and-a-half in a broken course with one verge, and keeps the raking cut a cut tile (common practice, no source)', () => {
    const course = halfToTileAndHalf(vergeToRakeCourse(3_000, 45, 165, 165, true));
    expect(course).toMatchObject({ halves: 0, tah: 1, cut: 1 });
    const oneVerge = estimate([face({ right: 'abutment' })], system).faces[0];
    expect(oneVerge.tile_and_half).toBe(15);
    expect(oneVerge.half_tiles).toBe(0);
  });

  it('orders each special piece with the tile waste, puts them on the tile pallets and weighs them (1.5 tiles a tile-and-a-half: common practice, no source)', () => {
    const r = estimate([face({})], system);
    expect(r.totals).toMatchObject({ eaves_tiles: 40, top_tiles: 40, tile_and_half: 30, eaves_tiles_order: 42, top_tiles_order: 42, tile_and_half_order: 32 });
    expect(r.totals.tiles_order).toBe(Math.ceil(1_155 * 1.05));
    expect(r.totals.pallets).toBe(Math.ceil((r.totals.tiles_order + 42 + 42 + 32) / 1_000));
    const onPallets = r.pallets.flatMap((p) => (p.kind === 'tiles' ? p.items : []));
    expect(onPallets.map((i) => [i.item, i.quantity])).toEqual([
      ['eaves_tiles', 42],
      ['top_tiles', 42],
      ['tile_and_half', 32],
    ]);
    expect(onPallets[2].weight_kg).toBeCloseTo(32 * 1.65, 1);
    expect(f.load_kg).toBeCloseTo(1_155 * 1.1 + 80 * 1.1 + 30 * 1.65, 1);
  });

  it('leaves single-lap faces without special pieces (an interlocking tile needs no under-eaves course: common practice, no source)', () => {
    const single = ok(runEstimateFromCsv(`${HEADER}\r\nA,F,1,35,3860,,5940,,verge,verge,ridge\r\n`)).faces[0];
    expect([single.eaves_tiles, single.top_tiles, single.tile_and_half]).toEqual([0, 0, 0]);
  });
});

// ---- openings --------------------------------------------------------------------------------

describe('openings (the rule is common practice, no source: positions are not given)', () => {
  // Default tile at 35°: 75 mm headlap, 345 mm gauge; rafter 370 + 10 × 345 + 40 = 3860 mm gives 11 courses;
  // 20 tiles at 300 mm cover span 5940 mm between verges. Broken bond: 6 courses of 20, 5 of 19 and two halves = 220 tiles.
  const system = roofSystemSchema.parse({});
  const plain = face({ pitch_deg: 35, rafter_mm: 3_860, eaves_mm: 5_940, top_mm: 5_940 });

  it('takes out the whole tiles a roof window spans and cuts one each side in each course it crosses', () => {
    const before = estimate([plain], system).faces[0];
    expect(before.tiles).toBe(220);
    const window: Opening = { building: '1', face: 'Main', kind: 'roof_window', width_mm: 780, height_mm: 1_180, quantity: 1 };
    const r = estimate([plain], system, [window]);
    const f = r.faces[0];
    // ceil(1180 ÷ 345) = 4 courses crossed; floor(780 ÷ 300) = 2 tiles left out of each: 8 out, 8 cut.
    expect(f.tiles).toBe(212);
    expect(f.cut_tiles).toBe(before.cut_tiles + 8);
    expect(f.whole_tiles).toBe(before.whole_tiles - 16);
    expect(f.batten_m).toBeCloseTo(before.batten_m - 0.78 * 4, 2);
    expect(f.openings_area_m2).toBe(0.92);
    expect(f.slope_area_m2).toBeCloseTo(5.94 * 3.86 - 0.78 * 1.18, 2);
    expect(r.totals.roof_windows).toBe(1);
    expect(r.totals.flashings).toEqual({ side_abutment_m: 0, top_abutment_m: 0, apron_m: 0, back_gutter_m: 0 });
  });

  it('flashes a chimney up both sides, with an apron and a back gutter 150 mm past each side; a dormer without the gutter', () => {
    const r = estimate([{ ...plain, quantity: 3 }], system, [
      { building: '1', face: 'Main', kind: 'chimney', width_mm: 600, height_mm: 900, quantity: 1 },
      { building: '1', face: 'Main', kind: 'dormer', width_mm: 1_200, height_mm: 1_500, quantity: 1 },
      { building: '1', face: 'Main', kind: 'hatch', width_mm: 500, height_mm: 600, quantity: 2 },
    ]);
    // Each of the three copies of the face has its openings.
    const fl = r.totals.flashings;
    expect(fl.side_abutment_m).toBeCloseTo(3 * (2 * 0.9 + 2 * 1.5), 2);
    expect(fl.top_abutment_m).toBe(0);
    expect(fl.apron_m).toBeCloseTo(3 * (0.6 + 0.3 + 1.2 + 0.3), 2);
    expect(fl.back_gutter_m).toBeCloseTo(3 * (0.6 + 0.3), 2);
    expect(r.totals.hatches).toBe(6);
    expect(r.totals.openings_area_m2).toBeCloseTo(3 * (0.54 + 1.8 + 0.6), 2);
  });

  it('flashes side and top abutments along their length', () => {
    const r = estimate([face({ pitch_deg: 35, rafter_mm: 3_860, eaves_mm: 5_940, top_mm: 5_940, left: 'abutment', top: 'abutment' })], system);
    expect(r.totals.flashings.side_abutment_m).toBe(3.86);
    expect(r.totals.flashings.top_abutment_m).toBe(5.94);
  });

  it('reads the openings file, rejecting a face not in the schedule, an opening too big, and a bad kind, naming row and column (common practice, no source)', () => {
    const faces = [plain];
    const r = parseOpeningsCsv(
      'building,face,kind,width_mm,height_mm,quantity\r\n1,Main,roof window,780,1180,\r\n1,Nowhere,chimney,600,900,1\r\n1,Main,dormer,7000,900,1\r\n1,Main,skylight,600,900,1\r\n1,Main,hatch,600,4000,1\r\n',
      faces,
    );
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors.map(formatProblem)).toEqual([
        "row 3, column face: no face 'Nowhere' in building '1' in the schedule",
        "row 4, column width_mm: 7000 mm is wider than face 'Main' (5940 mm at its widest)",
        "row 5, column kind: unknown kind 'skylight': use roof_window, chimney, dormer or hatch",
        "row 6, column height_mm: 4000 mm is taller than face 'Main' (rafter 3860 mm)",
      ]);
    }
    // A value past the header's last column (an unquoted comma inside a value) is refused, as in the
    // schedule; blank cells there (a spreadsheet's trailing delimiters) are not.
    const extra = parseOpeningsCsv('face,kind,width_mm,height_mm\r\nMain,hatch,600,900,2\r\nMain,hatch,600,900,,\r\n', faces);
    expect(!extra.ok && extra.errors.map(formatProblem)).toEqual(['row 2: has 5 values but the header has 4 columns; a value with a comma in it needs quotes']);
    const good = parseOpeningsCsv('face,kind,width_mm,height_mm\r\nMain,Roof window,780,1180\r\n', faces);
    expect(good.ok && good.openings).toEqual([{ building: '1', face: 'Main', kind: 'roof_window', width_mm: 780, height_mm: 1_180, quantity: 1 }]);
  });

  it("finds an opening's face by building and name without case or outer spaces when read with its schedule, and names the row of one whose face is missing (common practice, no source)", () => {
    const schedule = 'building,face,pitch_deg,rafter_mm,eaves_mm\r\nAsh,Main front,35,3860,5940\r\nAsh,Main back,35,3860,5940\r\nBirch,Main front,35,3860,5940\r\n';
    const exact = ok(runEstimateFromCsv(schedule, {}, 'building,face,kind,width_mm,height_mm\r\nAsh,Main back,roof_window,780,1180\r\nBirch,Main front,hatch,600,900\r\n'));
    const loose = ok(runEstimateFromCsv(schedule, {}, 'building,face,kind,width_mm,height_mm\r\n ash ,MAIN BACK,roof_window,780,1180\r\nBIRCH,  main Front ,hatch,600,900\r\n'));
    expect(JSON.stringify(loose)).toBe(JSON.stringify(exact));
    // Each opening is in the face it names, and only there.
    expect(exact.faces.map((f) => f.openings_area_m2)).toEqual([0, 0.92, 0.54]);
    const missing = runEstimateFromCsv(schedule, {}, 'building,face,kind,width_mm,height_mm\r\nAsh,Main front,hatch,600,900\r\nBirch,Main back,hatch,600,900\r\n');
    expect(missing.ok).toBe(false);
    if (!missing.ok) expect(missing.errors.map(formatProblem)).toEqual(["openings file, row 3, column face: no face 'Main back' in building 'Birch' in the schedule"]);
  });
});

// ---- fittings --------------------------------------------------------------------------------

describe('fittings sold with the tiles (common practice, no source)', () => {
  const gable = (name: string, over: Partial<Face> = {}) => face({ face: name, pitch_deg: 35, rafter_mm: 3_860, eaves_mm: 5_940, top_mm: 5_940, ...over });

  it('counts a dry verge unit a course on each verge, and a cap at each ridge end that finishes at a verge', () => {
    const dry = estimate([gable('Front'), gable('Back')], roofSystemSchema.parse({ verge: { kind: 'dry' } }));
    const courses = dry.faces[0].courses;
    expect(dry.totals.dry_verge_units).toBe(courses * 2 * 2);
    expect(dry.totals.ridge_end_caps).toBe(2);
    expect(dry.totals.verge_m).toBe(4 * 3.86);
    expect(dry.totals.eaves_m).toBe(2 * 5.94);
    const mortar = estimate([gable('Front'), gable('Back')], roofSystemSchema.parse({}));
    expect([mortar.totals.dry_verge_units, mortar.totals.ridge_end_caps]).toEqual([0, 0]);
    expect(mortar.totals.verge_m).toBe(4 * 3.86);
    const mono = estimate([gable('Lean-to', { top: 'mono_ridge' })], roofSystemSchema.parse({ verge: { kind: 'dry' } }));
    expect(mono.totals.ridge_end_caps).toBe(2);
  });

  it('counts a hip iron a hip (each hip shared by two faces)', () => {
    const r = ok(runEstimateFromCsv(EXAMPLE_HIPPED));
    expect(r.totals.hip_irons).toBe(4 * 2); // two copies of a four-hip roof
  });

  it('counts trough valley units as ceil(valley ÷ (unit − lap)) a valley edge, halved; none for lined valleys', () => {
    // A valley edge √(3000² + 2000²) = 3606 mm over 3000 − 150 = 2850 mm a unit: 2 units; two faces share it.
    const wing = [
      face({ face: 'Wing L', pitch_deg: 35, rafter_mm: 3_000, eaves_mm: 4_000, top_mm: 6_000, left: 'verge', right: 'valley' }),
      face({ face: 'Wing R', pitch_deg: 35, rafter_mm: 3_000, eaves_mm: 4_000, top_mm: 6_000, left: 'valley', right: 'verge' }),
    ];
    expect(estimate(wing, roofSystemSchema.parse({ valley: { kind: 'trough' } })).totals.valley_units).toBe(2);
    expect(estimate(wing, roofSystemSchema.parse({})).totals.valley_units).toBe(0);
  });
});

const EXAMPLE_HIPPED = [
  `${HEADER},ridge`,
  'A,Front,2,35,4000,,9000,1800,hip,hip,ridge,Main',
  'A,Back,2,35,4000,,9000,1800,hip,hip,ridge,Main',
  'A,East,2,35,4000,,7200,0,hip,hip,ridge,Main',
  'A,West,2,35,4000,,7200,0,hip,hip,ridge,Main',
].join('\r\n');

// ---- properties ------------------------------------------------------------------------------

const genFace = fc.record({
  eaves: fc.integer({ min: 1_000, max: 20_000 }),
  rafter: fc.integer({ min: 1_000, max: 9_000 }),
  pitch: fc.integer({ min: 35, max: 60 }),
  left: fc.constantFrom('verge' as const, 'abutment' as const, 'hip' as const),
  right: fc.constantFrom('verge' as const, 'abutment' as const, 'valley' as const),
  topRatio: fc.double({ min: 0, max: 1.4, noNaN: true }),
  quantity: fc.integer({ min: 1, max: 20 }),
});
const genOpening = fc.record({
  kind: fc.constantFrom('roof_window' as const, 'chimney' as const, 'dormer' as const, 'hatch' as const),
  w: fc.double({ min: 0.01, max: 1, noNaN: true }),
  h: fc.double({ min: 0.01, max: 1, noNaN: true }),
  quantity: fc.integer({ min: 1, max: 3 }),
});
const systems: RoofSystemInput[] = [{}, { tile: PLAIN_TILE }, { verge: { kind: 'dry' }, valley: { kind: 'trough' } }, { tile: PLAIN_TILE, verge: { kind: 'dry' } }];

function toFace(g: { eaves: number; rafter: number; pitch: number; left: Face['left']; right: Face['right']; topRatio: number; quantity: number }, i: number): Face {
  const rect = g.left === 'verge' && g.right === 'verge';
  return face({
    face: `F${i}`,
    quantity: g.quantity,
    pitch_deg: g.pitch,
    rafter_mm: g.rafter,
    eaves_mm: g.eaves,
    top_mm: rect ? g.eaves : Math.round(g.eaves * g.topRatio),
    left: g.left,
    right: g.right,
  });
}

describe('properties of the second edition over generated roofs', () => {
  it('openings never add tiles: each face has no more tiles with its openings than without, and the totals stay faces × quantity', () => {
    fc.assert(
      fc.property(fc.array(genFace, { minLength: 1, maxLength: 5 }), fc.array(fc.tuple(fc.nat(4), genOpening), { maxLength: 6 }), fc.constantFrom(...systems), (gs, os, input) => {
        const faces = gs.map(toFace);
        const system = roofSystemSchema.parse(input);
        const openings: Opening[] = os.map(([at, o]) => {
          const f = faces[at % faces.length];
          return {
            building: f.building,
            face: f.face,
            kind: o.kind,
            quantity: o.quantity,
            width_mm: Math.max(100, Math.floor(Math.max(f.eaves_mm, f.top_mm) * o.w)),
            height_mm: Math.max(100, Math.floor(f.rafter_mm * o.h)),
          };
        });
        const without = estimate(faces, system);
        const withOpenings = estimate(faces, system, openings);
        withOpenings.faces.forEach((f, i) => {
          expect(f.tiles).toBeLessThanOrEqual(without.faces[i].tiles);
          expect(f.tiles + f.eaves_tiles + f.top_tiles + f.tile_and_half).toBeLessThanOrEqual(without.faces[i].tiles + without.faces[i].eaves_tiles + without.faces[i].top_tiles + without.faces[i].tile_and_half);
        });
        expect(withOpenings.totals.tiles).toBeLessThanOrEqual(without.totals.tiles);
        const sum = (pick: (f: EngineResult['faces'][number]) => number) => withOpenings.faces.reduce((s, f) => s + pick(f) * f.quantity, 0);
        expect(withOpenings.totals.tiles).toBe(sum((f) => f.tiles));
        expect(withOpenings.totals.eaves_tiles).toBe(sum((f) => f.eaves_tiles));
        expect(withOpenings.totals.top_tiles).toBe(sum((f) => f.top_tiles));
        expect(withOpenings.totals.tile_and_half).toBe(sum((f) => f.tile_and_half));
        expect(withOpenings.totals.cut_tiles).toBe(sum((f) => f.cut_tiles));
        expect(Math.abs(withOpenings.totals.openings_area_m2 - sum((f) => f.openings_area_m2))).toBeLessThanOrEqual(0.01 * sum(() => 1) + 0.0100001);
        if (system.tile.kind === 'double_lap') expect(withOpenings.totals.half_tiles).toBe(0);
      }),
      { numRuns: 60 },
    );
  });

  it('dry verge units are courses × verge edges × quantity, summed over the faces', () => {
    fc.assert(
      fc.property(fc.array(genFace, { minLength: 1, maxLength: 5 }), fc.constantFrom(...systems), (gs, input) => {
        const faces = gs.map(toFace);
        const system = roofSystemSchema.parse(input);
        const r = estimate(faces, system);
        const expected = r.faces.reduce((s, f, i) => s + f.courses * ((faces[i].left === 'verge' ? 1 : 0) + (faces[i].right === 'verge' ? 1 : 0)) * f.quantity, 0);
        expect(r.totals.dry_verge_units).toBe(system.verge.kind === 'dry' ? expected : 0);
      }),
      { numRuns: 60 },
    );
  });
});
