import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { roofSystemSchema, type RoofSystemInput } from '../schemas/roof-system.schema';
import type { Face } from '../schemas/schedule.schema';
import { headlapFor, maxGauge } from './courses';
import { ScheduleRejectedError, estimate, formatProblem, orderQuantity, runEstimate, runEstimateFromCsv } from './estimate';
import { EXAMPLE_SCHEDULE_CSV } from './example-schedule';
import type { EngineResult } from './result';
import { ENGINE_VERSION } from './version';

const HEADER = 'building,face,quantity,pitch_deg,rafter_mm,run_mm,eaves_mm,top_mm,left,right,top';
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

describe('the estimate', () => {
  it('gives the contract’s fields for every face, the totals, pallets, loads and warnings', () => {
    const r = ok(runEstimateFromCsv(EXAMPLE_SCHEDULE_CSV));
    expect(r.engine_version).toBe(ENGINE_VERSION);
    expect(Object.keys(r.faces[0])).toEqual(
      expect.arrayContaining([
        'building',
        'face',
        'quantity',
        'pitch_deg',
        'rafter_mm',
        'slope_area_m2',
        'headlap_mm',
        'gauge_mm',
        'courses',
        'tiles_per_course',
        'cover_width_mm',
        'verge_overhang_mm',
        'whole_tiles',
        'half_tiles',
        'cut_tiles',
        'tiles',
        'batten_m',
        'stacks',
        'stack_positions',
        'load_kg',
        'setting_out_marks_mm',
        'clips',
      ]),
    );
    expect(Object.keys(r.totals).sort()).toEqual(
      [
        'slope_area_m2',
        'plan_area_m2',
        'tiles',
        'tiles_order',
        'half_tiles',
        'cut_tiles',
        'batten_m',
        'batten_lengths',
        'batten_nails',
        'tile_nails',
        'clips',
        'ridge_m',
        'ridge_tiles',
        'hip_m',
        'hip_tiles',
        'valley_m',
        'underlay_rolls',
        'pallets',
        'weight_kg',
        'eaves_tiles',
        'top_tiles',
        'tile_and_half',
        'eaves_tiles_order',
        'top_tiles_order',
        'tile_and_half_order',
        'openings_area_m2',
        'roof_windows',
        'hatches',
        'flashings',
        'verge_m',
        'eaves_m',
        'dry_verge_units',
        'ridge_end_caps',
        'hip_irons',
        'valley_units',
      ].sort(),
    );
    expect(r.faces.map((f) => `${f.building}/${f.face}`)).toEqual(['Alder/Front', 'Alder/Back', 'Alder/East hip end', 'Alder/West hip end', 'Birch/Front', 'Birch/Back', 'Birch/Porch']);
    expect(r.cautions.length).toBeGreaterThan(0);
  });

  it('lays a 265 × 165 mm plain tile at 100 mm gauge and about 60 tiles per m² of slope (double-lap rule of the Treatise, published)', () => {
    const face: Face = {
      building: '1',
      face: 'Main',
      quantity: 1,
      pitch_deg: 40,
      rafter_mm: 215 + 7_800 + 40,
      run_mm: 1,
      eaves_mm: 10_000,
      top_mm: 10_000,
      left: 'verge',
      right: 'verge',
      top: 'ridge',
    };
    const r = estimate([face], roofSystemSchema.parse({ tile: PLAIN_TILE }));
    const f = r.faces[0];
    expect(f.gauge_mm).toBe(100);
    expect(f.headlap_mm).toBe(65);
    // 1 ÷ (0.100 × 0.165) = 60.6 per m², counting every piece by the tile widths it covers; the
    // under-eaves course and the verge overhangs add a little.
    const covering = f.tiles + f.eaves_tiles + f.top_tiles + 1.5 * f.tile_and_half;
    expect(covering / f.slope_area_m2).toBeGreaterThan(60.6 * 0.98);
    expect(covering / f.slope_area_m2).toBeLessThan(60.6 * 1.05);
    // 10 m of batten per m² at 100 mm gauge.
    expect(f.batten_m / f.slope_area_m2).toBeCloseTo(10, 0);
  });

  it('shows the gauge rounded down to 0.1 mm, so it never reads above the maximum gauge', () => {
    // A 500 mm slate at 60.1 mm headlap: maximum gauge (500 − 60.1) ÷ 2 = 219.95 mm (Treatise rule, published).
    const slate = { kind: 'double_lap' as const, length_mm: 500, width_mm: 250, headlap_mm: [{ from_pitch_deg: 20, min_mm: 60.1 }], weight_kg: 2, per_pallet: 800 };
    const face: Face = {
      building: '1',
      face: 'Main',
      quantity: 1,
      pitch_deg: 30,
      rafter_mm: 450 + 10 * 219.95 + 40,
      run_mm: 1,
      eaves_mm: 5_000,
      top_mm: 5_000,
      left: 'verge',
      right: 'verge',
      top: 'ridge',
    };
    const f = estimate([face], roofSystemSchema.parse({ tile: slate })).faces[0];
    expect(f.courses).toBe(12);
    expect(f.gauge_mm).toBe(219.9);
  });

  it('orders tiles with waste: ceil(net × (1 + waste ÷ 100)), and pallets for what is ordered', () => {
    expect(orderQuantity(1_000, 5)).toBe(1_050);
    expect(orderQuantity(1_001, 5)).toBe(1_052);
    expect(orderQuantity(0, 5)).toBe(0);
    const r = ok(runEstimateFromCsv(EXAMPLE_SCHEDULE_CSV, { waste_pct: { tiles: 10 } }));
    expect(r.totals.tiles_order).toBe(Math.ceil((r.totals.tiles * 110) / 100));
    expect(r.totals.pallets).toBe(Math.ceil(r.totals.tiles_order / 180));
    expect(r.pallets.filter((p) => p.kind === 'tiles').reduce((s, p) => s + p.tiles, 0)).toBe(r.totals.tiles_order);
  });

  it('orders batten lengths and hip tiles with their own waste on the net figures', () => {
    const net = ok(runEstimateFromCsv(EXAMPLE_SCHEDULE_CSV, { waste_pct: { battens: 0, ridge_hip: 0 } })).totals;
    const r = ok(runEstimateFromCsv(EXAMPLE_SCHEDULE_CSV, { waste_pct: { battens: 10, ridge_hip: 5 } })).totals;
    expect(net.hip_tiles).toBeGreaterThan(0);
    // Waste on the net metres, rounded up once; never below the cutting plan (common practice, no source).
    expect(r.batten_lengths).toBe(Math.max(net.batten_lengths, Math.ceil((net.batten_m * 1.1) / 4.8 - 1e-9)));
    expect(r.batten_lengths).toBeLessThan(Math.ceil((net.batten_lengths * 110) / 100));
    expect(r.hip_tiles).toBe(Math.ceil((net.hip_tiles * 105) / 100));
    expect(r.ridge_tiles).toBe(Math.ceil((net.ridge_tiles * 105) / 100));
  });

  it('orders underlay rolls by slope area over the roll’s cover (roll width − head lap) × length, with waste', () => {
    const r = ok(runEstimateFromCsv(EXAMPLE_SCHEDULE_CSV));
    expect(r.totals.underlay_rolls).toBe(Math.ceil((r.totals.slope_area_m2 * 1.1) / (0.85 * 50) - 1e-6));
  });

  it('weighs the delivery as its pallets: tiles, accessories and the pallets themselves', () => {
    const r = ok(runEstimateFromCsv(EXAMPLE_SCHEDULE_CSV));
    const sum = r.pallets.reduce((s, p) => s + p.weight_kg, 0);
    expect(r.totals.weight_kg).toBeCloseTo(sum, -1);
    expect(r.loads.reduce((s, l) => s + l.weight_kg, 0)).toBeCloseTo(sum, 0);
    expect(r.totals.weight_kg).toBeGreaterThan(r.totals.tiles_order * 4.4);
  });

  it('throws a typed error when called directly with a face the tile cannot be laid at', () => {
    const face: Face = {
      building: '1',
      face: 'Flat',
      quantity: 1,
      pitch_deg: 10,
      rafter_mm: 3_000,
      run_mm: 1,
      eaves_mm: 5_000,
      top_mm: 5_000,
      left: 'verge',
      right: 'verge',
      top: 'ridge',
    };
    expect(() => estimate([face], roofSystemSchema.parse({}))).toThrow(ScheduleRejectedError);
  });

  it('handles degenerate shapes without throwing: a triangular hip end, a tiny face, a huge quantity', () => {
    const r = ok(
      runEstimateFromCsv(
        [HEADER, 'A,Hip end,1,45,3000,,6000,0,hip,hip,ridge', 'A,Sliver,1,45,120,,150,,verge,verge,ridge', 'A,Point,1,45,5000,,100,0,hip,verge,mono_ridge', 'B,Estate,10000,35,5000,,9000,,verge,verge,ridge'].join('\n'),
      ),
    );
    expect(r.faces[0].tiles).toBeGreaterThan(0);
    expect(r.faces[1].courses).toBe(1);
    expect(r.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['tiny_face']));
    expect(r.totals.tiles).toBe(r.faces.reduce((s, f) => s + f.tiles * f.quantity, 0));
  });

  it('runs from a JSON schedule as well, with errors by entry and column', () => {
    const good = runEstimate([{ face: 'Front', pitch_deg: 35, rafter_mm: 4_000, eaves_mm: 9_000 }]);
    expect(good.ok && good.result.faces[0].tiles).toBeGreaterThan(0);
    const bad = runEstimate([
      { face: 'Front', pitch_deg: 35, rafter_mm: 4, eaves_mm: 9_000, left: 'gable' },
      { face: 'Back', pitch_deg: 15, rafter_mm: 4_000, eaves_mm: 9_000 },
    ]);
    expect(bad).toEqual({
      ok: false,
      errors: [
        { row: 1, column: 'rafter_mm', message: 'looks like metres (4); give millimetres, e.g. 4000' },
        { row: 1, column: 'left', message: "unknown edge 'gable': use verge, hip, valley or abutment" },
      ],
    });
    const low = runEstimate([{ face: 'Back', pitch_deg: 15, rafter_mm: 4_000, eaves_mm: 9_000 }]);
    expect(low).toEqual({ ok: false, errors: [{ row: 1, column: 'pitch_deg', message: '15° is below the lowest pitch this tile may be laid at (22.5°)' }] });
    const twice = runEstimate([
      { face: 'Front', pitch_deg: 35, rafter_mm: 4_000, eaves_mm: 9_000 },
      { face: 'front', pitch_deg: 35, rafter_mm: 4_000, eaves_mm: 9_000 },
    ]);
    expect(twice).toEqual({ ok: false, errors: [{ row: 2, column: 'face', message: "duplicate face 'front' in building '1' (first given at entry 1)" }] });
  });

  it('reports system and schedule problems together, and no result', () => {
    const out = runEstimateFromCsv(`${HEADER}\nA,Front,1,35,4000,,-1,,,,\n`, { rafter_spacing_mm: -600 });
    expect(out.ok).toBe(false);
    if (!out.ok) {
      expect(out.errors.map(formatProblem)).toEqual(['system field rafter_spacing_mm: must be more than 0', 'row 2, column eaves_mm: must be a positive number of millimetres']);
    }
  });
});

// ---- properties over generated schedules ----------------------------------------------------

const edge = fc.constantFrom('verge', 'hip', 'valley', 'abutment');
const topKind = fc.constantFrom('ridge', 'mono_ridge', 'abutment');

interface GenFace {
  building: string;
  face: string;
  quantity: number;
  pitch: number;
  rafter: number | null;
  run: number | null;
  eaves: number;
  top: number | null;
  left: string;
  right: string;
  topKind: string;
}

const goodFace = fc
  .record({
    building: fc.constantFrom('A', 'B', 'C'),
    face: fc.string({ minLength: 1, maxLength: 8 }).filter((s) => s.trim() !== '' && !/[\r\n"]/.test(s)),
    quantity: fc.oneof(fc.constant(1), fc.integer({ min: 1, max: 50 }), fc.constant(10_000)),
    pitch: fc.double({ min: 22.5, max: 85, noNaN: true }),
    length: fc.oneof(fc.integer({ min: 100, max: 2_000 }), fc.integer({ min: 2_000, max: 30_000 }), fc.constant(100_000)),
    eaves: fc.oneof(fc.integer({ min: 100, max: 1_000 }), fc.integer({ min: 1_000, max: 30_000 }), fc.constant(100_000)),
    topRatio: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 1.5, noNaN: true })),
    byRun: fc.boolean(),
    left: edge,
    right: edge,
    topKind,
  })
  .map((g): GenFace => {
    const bothVerges = g.left === 'verge' && g.right === 'verge';
    const rafter = g.byRun && g.pitch < 79.9 ? null : g.length;
    const byRun = g.byRun && g.pitch < 79.9;
    const run = byRun ? Math.max(100, Math.round(g.length * Math.cos((g.pitch * Math.PI) / 180))) : null;
    const rawTop = Math.round(g.eaves * g.topRatio);
    const top = bothVerges ? null : rawTop > 0 && rawTop < 100 ? 0 : Math.min(rawTop, 100_000);
    return { building: g.building, face: g.face, quantity: g.quantity, pitch: Math.round(g.pitch * 10) / 10, rafter, run, eaves: g.eaves, top, left: g.left, right: g.right, topKind: g.topKind };
  });

function uniqueFaces(faces: GenFace[]): GenFace[] {
  const seen = new Set<string>();
  return faces.filter((f) => {
    const k = `${f.building}|${f.face.trim().toLowerCase()}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}

function toCsv(faces: GenFace[], delimiter: ',' | ';'): string {
  const cell = (v: string | number | null) => {
    if (v === null) return '';
    let s = String(v);
    if (delimiter === ';' && typeof v === 'number') s = s.replace('.', ',');
    return /[",;\s]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
  };
  const lines = [HEADER.split(',').join(delimiter)];
  for (const f of faces) {
    lines.push([f.building, f.face, f.quantity, f.pitch, f.rafter, f.run, f.eaves, f.top, f.left, f.right, f.topKind].map(cell).join(delimiter));
  }
  return lines.join('\r\n');
}

const systems: RoofSystemInput[] = [{}, { tile: PLAIN_TILE }, { fixing: { rule: 'perimeter_and_alternate_courses' }, roof_loading: { stack_size: 8, every_nth_batten: 3 } }];

function checkInvariants(r: EngineResult, faces: GenFace[], input: RoofSystemInput): string | null {
  const system = roofSystemSchema.parse(input);
  if (r.faces.length !== faces.length) return 'face count';
  const sum = (pick: (f: EngineResult['faces'][number]) => number) => r.faces.reduce((s, f) => s + pick(f) * f.quantity, 0);
  if (r.totals.tiles !== sum((f) => f.tiles)) return 'tiles total';
  if (r.totals.half_tiles !== sum((f) => f.half_tiles)) return 'half tiles total';
  if (r.totals.cut_tiles !== sum((f) => f.cut_tiles)) return 'cut tiles total';
  if (r.totals.clips !== sum((f) => f.clips)) return 'clips total';
  if (Math.abs(r.totals.batten_m - sum((f) => f.batten_m)) > 0.01 * sum(() => 1) + 0.01) return 'batten total';
  if (Math.abs(r.totals.slope_area_m2 - sum((f) => f.slope_area_m2)) > 0.01 * sum(() => 1) + 0.01) return 'area total';
  if (r.totals.tiles_order < r.totals.tiles) return 'ordered below net';
  if (r.totals.batten_lengths < Math.ceil((r.totals.batten_m * 1000 - 10) / system.batten.stock_length_mm)) return 'batten lengths below bound';
  const pieces = r.totals.tiles_order + r.totals.eaves_tiles_order + r.totals.top_tiles_order + r.totals.tile_and_half_order;
  if (r.totals.pallets !== Math.ceil(pieces / system.tile.per_pallet)) return 'pallets';
  if (r.totals.eaves_tiles !== sum((f) => f.eaves_tiles)) return 'eaves tiles total';
  if (r.totals.top_tiles !== sum((f) => f.top_tiles)) return 'top tiles total';
  if (r.totals.tile_and_half !== sum((f) => f.tile_and_half)) return 'tile-and-a-half total';
  if (system.tile.kind === 'double_lap' && r.totals.half_tiles !== 0) return 'halves on double lap';
  for (const f of r.faces) {
    const headlap = headlapFor(system.tile.headlap_mm, f.pitch_deg);
    if (headlap === null || f.headlap_mm !== headlap) return 'headlap';
    if (f.gauge_mm > maxGauge(system.tile.kind, system.tile.length_mm, headlap) + 1e-9) return `gauge ${f.gauge_mm} above max`;
    if (f.tiles < f.whole_tiles + f.cut_tiles) return 'tiles below pieces';
    if (f.stacks !== Math.ceil((f.tiles + f.eaves_tiles + f.top_tiles + f.tile_and_half) / system.roof_loading.stack_size)) return 'stacks';
  }
  if (r.pallets.length > 0) {
    if (r.pallets.filter((p) => p.kind === 'tiles').reduce((s, p) => s + p.tiles, 0) !== r.totals.tiles_order) return 'pallet tiles';
    for (const load of r.loads) {
      if (load.pallets.length > system.truck.pallet_slots) return 'slots';
      if (load.pallets.length > 1 && load.weight_kg > system.truck.payload_kg + 0.5) return 'payload';
      for (let i = 1; i < load.pallets.length; i++) if (load.pallets[i] > load.pallets[i - 1]) return 'loading order';
    }
  }
  return null;
}

describe('properties of the estimate over generated schedules', () => {
  it('accepts every well-formed schedule, never throws, and keeps its totals, orders and gauges consistent', () => {
    fc.assert(
      fc.property(fc.array(goodFace, { minLength: 1, maxLength: 8 }).map(uniqueFaces), fc.constantFrom<',' | ';'>(',', ';'), fc.constantFrom(...systems), (faces, delimiter, system) => {
        const out = runEstimateFromCsv(toCsv(faces, delimiter), system);
        if (!out.ok) {
          // Only the plain-tile system may refuse (its lowest pitch is 35°), and then only by pitch.
          return out.errors.every((e) => e.column === 'pitch_deg' && /below the lowest pitch/.test(e.message)) && system.tile !== undefined;
        }
        const breach = checkInvariants(out.result, faces, system);
        if (breach) throw new Error(breach);
        return true;
      }),
      { numRuns: 100 },
    );
  }, 60_000);

  it('multiplies every total by quantity: twice the houses, twice the tiles, nails and areas', () => {
    fc.assert(
      fc.property(fc.array(goodFace, { minLength: 1, maxLength: 5 }).map(uniqueFaces), (faces) => {
        const one = faces.map((f) => ({ ...f, quantity: 1 }));
        const two = faces.map((f) => ({ ...f, quantity: 2 }));
        const a = runEstimateFromCsv(toCsv(one, ','));
        const b = runEstimateFromCsv(toCsv(two, ','));
        if (!a.ok || !b.ok) return !a.ok && !b.ok;
        const t1 = a.result.totals;
        const t2 = b.result.totals;
        return (
          t2.tiles === 2 * t1.tiles &&
          t2.batten_nails === 2 * t1.batten_nails &&
          t2.tile_nails === 2 * t1.tile_nails &&
          t2.clips === 2 * t1.clips &&
          t2.cut_tiles === 2 * t1.cut_tiles &&
          Math.abs(t2.slope_area_m2 - 2 * t1.slope_area_m2) <= 0.011 &&
          Math.abs(t2.batten_m - 2 * t1.batten_m) <= 0.011
        );
      }),
      { numRuns: 100 },
    );
  }, 60_000);

  it('never gives fewer tiles for a wider face', () => {
    fc.assert(
      fc.property(goodFace, fc.integer({ min: 0, max: 3_000 }), (face, more) => {
        const f = { ...face, quantity: 1, top: face.left === 'verge' && face.right === 'verge' ? null : face.top };
        const wider = { ...f, eaves: f.eaves + more, top: f.top === null ? null : f.top + more };
        const a = runEstimateFromCsv(toCsv([f], ','));
        const b = runEstimateFromCsv(toCsv([wider], ','));
        if (!a.ok || !b.ok) return true;
        return b.result.faces[0].tiles >= a.result.faces[0].tiles;
      }),
      { numRuns: 300 },
    );
  }, 60_000);

  it('rejects a schedule with a bad cell, naming its row and column, and gives no result', () => {
    const badCell = fc.constantFrom(['eaves_mm', '-3'], ['eaves_mm', '7.5'], ['rafter_mm', 'long'], ['pitch_deg', '0'], ['pitch_deg', '12'], ['quantity', '1.5'], ['left', 'gable'], ['top', 'peak'], ['face', '']);
    fc.assert(
      fc.property(fc.array(goodFace, { minLength: 1, maxLength: 6 }).map(uniqueFaces), fc.nat(), badCell, (faces, pick, [column, value]) => {
        const idx = pick % faces.length;
        const lines = toCsv(faces, ',').split('\r\n');
        const cols = HEADER.split(',');
        const cells = lines[idx + 1].match(/("([^"]|"")*"|[^,]*)(,|$)/g)!.map((c) => c.replace(/,$/, ''));
        cells[cols.indexOf(column)] = value;
        if (column === 'rafter_mm') cells[cols.indexOf('run_mm')] = '';
        lines[idx + 1] = cells.slice(0, cols.length).join(',');
        // A throw fails the property as it stands: fast-check reports it with the schedule that caused it.
        const out = runEstimateFromCsv(lines.join('\r\n'));
        if (out.ok) return false;
        return out.errors.some((e) => e.row === idx + 2 && e.column === column && e.message.length > 0);
      }),
      { numRuns: 200 },
    );
  }, 60_000);

  it('never throws on arbitrary text: it is a result or a list of problems', () => {
    fc.assert(
      fc.property(
        fc.oneof(
          fc.string({ maxLength: 300 }),
          fc.array(fc.array(fc.string({ maxLength: 12 }), { maxLength: 12 }), { maxLength: 8 }).map((rows) => [HEADER, ...rows.map((r) => r.join(','))].join('\n')),
        ),
        (text) => {
          const out = runEstimateFromCsv(text);
          return out.ok ? out.result.faces.length > 0 : out.errors.length > 0 && out.errors.every((e) => typeof e.message === 'string' && e.message.length > 0);
        },
      ),
      { numRuns: 300 },
    );
  }, 60_000);
});
