import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { SCHEDULE_COLUMNS } from '../schemas/schedule.schema';
import { runEstimateFromCsv } from './estimate';
import { EXAMPLE_SCHEDULE_CSV, EXAMPLE_SCHEDULE_FILENAME } from './example-schedule';

describe('example schedule', () => {
  const rows = Papa.parse<Record<string, string>>(EXAMPLE_SCHEDULE_CSV, { header: true, skipEmptyLines: true }).data;

  it('uses every schedule column, under its CSV file name', () => {
    expect(EXAMPLE_SCHEDULE_FILENAME).toBe('roof-schedule.csv');
    expect(Object.keys(rows[0])).toEqual([...SCHEDULE_COLUMNS]);
  });

  it('holds two house types, one hipped and one gabled, with a lean-to', () => {
    expect(new Set(rows.map((r) => r.building))).toEqual(new Set(['Alder', 'Birch']));
    expect(rows.some((r) => r.left === 'hip' && r.top_mm === '0')).toBe(true);
    expect(rows.some((r) => r.left === 'verge' && r.right === 'verge' && r.top === 'ridge')).toBe(true);
    expect(rows.some((r) => r.top === 'abutment')).toBe(true);
  });

  it('estimates with the default system, the hipped type balanced on its ridge', () => {
    const out = runEstimateFromCsv(EXAMPLE_SCHEDULE_CSV);
    if (!out.ok) throw new Error('example rejected');
    expect(out.result.faces).toHaveLength(7);
    expect(out.result.totals.hip_m).toBeGreaterThan(0);
    expect(out.result.ridges.filter((r) => r.building === 'Alder').every((r) => r.difference_kg === 0)).toBe(true);
    expect(out.result.warnings.filter((w) => w.code !== 'no_whole_tile_fit')).toEqual([]);
  });
});
