import { describe, expect, it } from 'vitest';
import { roofSystemSchema } from '../schemas/roof-system.schema';
import { faceKey, faceSchema } from '../schemas/schedule.schema';
import { EXAMPLE_SCHEDULE_CSV } from './example-schedule';
import { parseOpeningsCsv, readOpeningsCsv } from './openings-parse';
import { CSV_CHUNK_CHARS, detectDelimiter, parseScheduleCsv, readScheduleCsv } from './schedule-parse';

const sys = roofSystemSchema.parse({});
const HEADER = 'building,face,quantity,pitch_deg,rafter_mm,run_mm,eaves_mm,top_mm,left,right,top';

function errorsOf(csv: string) {
  const r = parseScheduleCsv(csv, sys);
  if (r.ok) throw new Error('expected the schedule to be rejected');
  return r.errors;
}

function facesOf(csv: string) {
  const r = parseScheduleCsv(csv, sys);
  if (!r.ok) throw new Error(`rejected: ${JSON.stringify(r.errors)}`);
  return r;
}

describe('reading a schedule', () => {
  it('reads the example schedule into resolved faces that match the face schema', () => {
    const r = facesOf(EXAMPLE_SCHEDULE_CSV);
    expect(r.faces).toHaveLength(7);
    for (const f of r.faces) expect(faceSchema.parse(f)).toEqual(f);
    // Alder is given by run: its rafter is run ÷ cos 35°.
    expect(r.faces[0]).toMatchObject({ building: 'Alder', face: 'Front', quantity: 12, top_mm: 1_800, left: 'hip', right: 'hip' });
    expect(r.faces[0].rafter_mm).toBeCloseTo(4_200 / Math.cos((35 * Math.PI) / 180), 6);
    // Birch leaves top_mm blank: a face between verges is as long at the top as at the eaves.
    expect(r.faces[4]).toMatchObject({ building: 'Birch', rafter_mm: 5_091, top_mm: 9_000 });
  });

  it('takes columns in any order and any case, with defaults for building, quantity, top and edges', () => {
    const r = facesOf('Eaves_MM,Pitch Deg,FACE,Rafter_mm\r\n9000,35,Front,4000\r\n');
    expect(r.faces[0]).toEqual({
      building: '1',
      face: 'Front',
      quantity: 1,
      pitch_deg: 35,
      rafter_mm: 4_000,
      run_mm: 4_000 * Math.cos((35 * Math.PI) / 180),
      eaves_mm: 9_000,
      top_mm: 9_000,
      left: 'verge',
      right: 'verge',
      top: 'ridge',
    });
  });

  it('accepts a BOM, CRLF line ends, blank lines and trailing blank lines', () => {
    const r = facesOf(`\uFEFF${HEADER}\r\nA,Front,1,35,4000,,9000,,,,\r\n\r\nA,Back,1,35,4000,,9000,,,,\r\n\r\n\r\n`);
    expect(r.faces.map((f) => f.face)).toEqual(['Front', 'Back']);
  });

  it('reads semicolon-delimited files with decimal commas, as comma-decimal spreadsheets export them', () => {
    expect(detectDelimiter('face;pitch_deg;eaves_mm\n')).toBe(';');
    const r = facesOf('face;pitch_deg;rafter_mm;eaves_mm;left;right;top_mm\nFront;37,5;4000,5;9000;verge;hip;7000\n');
    expect(r.delimiter).toBe(';');
    expect(r.faces[0]).toMatchObject({ pitch_deg: 37.5, rafter_mm: 4_000.5, right: 'hip', top_mm: 7_000 });
  });

  it('reads quoted fields, with delimiters, quotes and line breaks inside', () => {
    const r = facesOf(`${HEADER}\n"Plot 4, rear","Front ""A""",1,35,4000,,9000,,verge,verge,ridge\n"B","Back\nslope",1,35,4000,,9000,,,,\n`);
    expect(r.faces[0]).toMatchObject({ building: 'Plot 4, rear', face: 'Front "A"' });
    expect(r.faces[1].face).toBe('Back\nslope');
  });

  it('reads edge words without case and with a hyphen or space for the underscore', () => {
    const r = facesOf(`${HEADER}\nA,Lean-to,1,35,2000,,3000,,Verge,VERGE,Mono-Ridge\nA,Hip end,1,35,2000,,3000,0,HIP,hip,ridge\n`);
    expect(r.faces.map((f) => [f.left, f.right, f.top])).toEqual([
      ['verge', 'verge', 'mono_ridge'],
      ['hip', 'hip', 'ridge'],
    ]);
  });

  it('warns about unknown columns instead of rejecting them', () => {
    const r = facesOf(`${HEADER},colour\nA,Front,1,35,4000,,9000,,,,,red\n`);
    expect(r.warnings).toEqual([{ code: 'unknown_column', building: null, face: null, message: "column 'colour' is not a schedule column and was ignored" }]);
  });

  it('accepts rafter and run together when they agree with the pitch within 1 %', () => {
    const r = facesOf(`${HEADER}\nA,Front,1,40,5091,3900,9000,,,,\n`);
    expect(r.faces[0]).toMatchObject({ rafter_mm: 5_091, run_mm: 3_900 });
  });
});

describe('rejecting a schedule', () => {
  it('rejects an eaves length that is not a positive number of millimetres, naming row and column', () => {
    expect(errorsOf(`${HEADER}\nA,Front,1,35,4000,,9000,,,,\nA,Back,1,35,4000,,-5,,,,\n`)).toEqual([{ row: 3, column: 'eaves_mm', message: 'must be a positive number of millimetres' }]);
    expect(errorsOf(`${HEADER}\nA,Front,1,35,4000,,0,,,,\n`)[0]).toMatchObject({ row: 2, column: 'eaves_mm' });
  });

  it('rejects a value in metres typed into a millimetre column, and says so', () => {
    const [e] = errorsOf(`${HEADER}\nA,Front,1,35,4.2,,9000,,,,\n`);
    expect(e).toEqual({ row: 2, column: 'rafter_mm', message: 'looks like metres (4.2); give millimetres, e.g. 4200' });
  });

  it('rejects text where a number belongs', () => {
    const [e] = errorsOf(`${HEADER}\nA,Front,two,35,4000,,9000,,,,\n`);
    expect(e).toEqual({ row: 2, column: 'quantity', message: "must be a number, not 'two'" });
    const [p] = errorsOf(`${HEADER}\nA,Front,1,steep,4000,,9000,,,,\n`);
    expect(p).toMatchObject({ row: 2, column: 'pitch_deg' });
  });

  it('hints at a decimal comma in a comma-delimited file', () => {
    const [e] = errorsOf(`${HEADER}\nA,Front,1,"37,5",4000,,9000,,,,\n`);
    expect(e.message).toBe("must be a number, not '37,5'; with a comma delimiter, write decimals with a point");
  });

  it('rejects missing required columns in the header (row 1)', () => {
    expect(errorsOf('face,eaves_mm\nFront,9000\n')).toEqual([
      { row: 1, column: 'pitch_deg', message: 'this required column is missing' },
      { row: 1, column: 'rafter_mm', message: 'the header needs rafter_mm or run_mm (or both)' },
    ]);
  });

  it('rejects a file without a header row', () => {
    expect(errorsOf('Front,35,4000,9000\n')[0]).toMatchObject({ row: 1, message: expect.stringMatching(/header/) });
  });

  it('rejects an empty file and a header with no faces', () => {
    expect(errorsOf('')).toEqual([{ message: 'the schedule is empty: it needs a header row and at least one face' }]);
    expect(errorsOf('\uFEFF\r\n\r\n')[0].message).toMatch(/empty/);
    expect(errorsOf(`${HEADER}\r\n\r\n`)).toEqual([{ message: 'the schedule has a header but no faces' }]);
  });

  it('rejects duplicate faces in a building, without case, and names the first row', () => {
    expect(errorsOf(`${HEADER}\nA,Front,1,35,4000,,9000,,,,\nB,Front,1,35,4000,,9000,,,,\nA, front ,1,35,4000,,9000,,,,\n`)).toEqual([
      { row: 4, column: 'face', message: "duplicate face 'front' in building 'A' (first at row 2)" },
    ]);
  });

  it('rejects unknown edge words', () => {
    expect(errorsOf(`${HEADER}\nA,Front,1,35,4000,,9000,,gable,verge,peak\n`)).toEqual([
      { row: 2, column: 'left', message: "unknown edge 'gable': use verge, hip, valley or abutment" },
      { row: 2, column: 'top', message: "unknown top edge 'peak': use ridge, mono_ridge or abutment" },
    ]);
  });

  it('rejects a pitch below the tile’s lowest allowed pitch', () => {
    expect(errorsOf(`${HEADER}\nA,Front,1,15,4000,,9000,,,,\n`)).toEqual([{ row: 2, column: 'pitch_deg', message: '15° is below the lowest pitch this tile may be laid at (22.5°)' }]);
    expect(errorsOf(`${HEADER}\nA,Front,1,90,4000,,9000,,,,\n`)[0]).toMatchObject({ column: 'pitch_deg', message: expect.stringMatching(/below 90/) });
  });

  it('rejects rafter and run that disagree with the pitch by more than 1 %', () => {
    const [e] = errorsOf(`${HEADER}\nA,Front,1,40,5200,3900,9000,,,,\n`);
    expect(e).toMatchObject({ row: 2, column: 'run_mm' });
    expect(e.message).toMatch(/does not agree with rafter_mm/);
  });

  it('rejects a face with neither rafter nor run', () => {
    expect(errorsOf(`${HEADER}\nA,Front,1,40,,,9000,,,,\n`)).toEqual([{ row: 2, column: 'rafter_mm', message: 'give rafter_mm or run_mm (or both)' }]);
  });

  it('rejects a face between two verges whose top differs from its eaves', () => {
    expect(errorsOf(`${HEADER}\nA,Front,1,40,4000,,9000,6000,verge,verge,ridge\n`)[0]).toMatchObject({ row: 2, column: 'top_mm' });
  });

  it('rejects a quantity that is not a whole number from 1', () => {
    expect(errorsOf(`${HEADER}\nA,Front,0,35,4000,,9000,,,,\nA,Back,2.5,35,4000,,9000,,,,\n`).map((e) => [e.row, e.column])).toEqual([
      [2, 'quantity'],
      [3, 'quantity'],
    ]);
  });

  it('rejects a row with more values than the header has columns (an unquoted comma)', () => {
    expect(errorsOf('face,pitch_deg,rafter_mm,eaves_mm\nFront, left,35,4000,9000\n')[0]).toEqual({
      row: 2,
      message: 'has 5 values but the header has 4 columns; a value with a comma in it needs quotes',
    });
  });

  it('lists every problem of every row at once, with spreadsheet row numbers (blank rows counted)', () => {
    const errors = errorsOf(`${HEADER}\nA,Front,1,35,4000,,9000,,,,\n\nA,Back,x,35,4000,,9,,hip,verge,\nA,,1,95,-1,,9000,,,,\n`);
    expect(errors.map((e) => `${e.row}/${e.column}`)).toEqual(['4/quantity', '4/eaves_mm', '5/face', '5/pitch_deg', '5/rafter_mm']);
  });

  it('numbers rows right across the chunks a big file is read in', () => {
    const rows = [HEADER];
    const n = Math.ceil((3 * CSV_CHUNK_CHARS) / 60);
    for (let i = 1; i <= n; i++) rows.push(`A,"Face ${i}, with a note",1,35,4000,,${i === n - 7 ? 'oops' : 9000},,,,`);
    const csv = rows.join('\r\n');
    expect(csv.length).toBeGreaterThan(2 * CSV_CHUNK_CHARS);
    expect(errorsOf(csv)).toEqual([{ row: n - 7 + 1, column: 'eaves_mm', message: "must be a number, not 'oops'" }]);
    rows[n - 7] = rows[n - 7].replace('oops', '9000');
    expect(facesOf(rows.join('\r\n')).faces).toHaveLength(n);
  });
});

// Names that differ only in case or outer spaces, and names whose lower case is not the ASCII rule's:
// the Kelvin sign lowers to "k", a dotted capital I to "i" and a combining dot, "ß" upper-cases to "SS"
// but "SS" lowers to "ss", and a no-break space is an outer space to trim().
const NAMES = ['Front', 'FRONT', ' front\t', '\u00a0Front', 'Kelvin', '\u212aelvin', 'kELVIN', 'İsle', 'i\u0307sle', 'ISLE', 'Straße', 'STRASSE', 'strasse', 'Σ roof', 'σ ROOF', 'Back'];
const quoted = (s: string) => `"${s}"`;

describe('finding faces by name', () => {
  it('finds a duplicate face exactly when faceKey gives both the same key, whatever its letters', () => {
    const rows = NAMES.map((n, i) => `${i % 2 === 0 ? 'Oak' : ' OAK '},${quoted(n)},1,35,4000,,9000,,,,`);
    const expected: Array<{ row: number; column: string; message: string }> = [];
    NAMES.forEach((n, j) => {
      const first = NAMES.findIndex((m) => faceKey('oak', m) === faceKey('oak', n));
      const building = j % 2 === 0 ? 'Oak' : 'OAK';
      if (first < j) expected.push({ row: j + 2, column: 'face', message: `duplicate face '${n.trim()}' in building '${building}' (first at row ${first + 2})` });
    });
    // Kelvin, İsle, Straße/strasse, Σ and Front each come back more than once.
    expect(expected.length).toBeGreaterThanOrEqual(8);
    expect(errorsOf(`${HEADER}\n${rows.join('\n')}\n`)).toEqual(expected);
  });

  it("finds each opening's face by name as faceKey compares them, through the reader's index and without it", () => {
    const faces = NAMES.filter((n, i) => NAMES.findIndex((m) => faceKey('oak', m) === faceKey('oak', n)) === i);
    const csv = `${HEADER}\n${faces.map((n) => `Oak,${quoted(n)},1,35,4000,,9000,,,,`).join('\n')}\n`;
    const asked = [...NAMES, 'kelvın', 'Stra\u00dfe ', 'Fronts', 'Σ ROOF', 'ς roof'];
    const read = readScheduleCsv(csv, sys);
    if (!read.parsed.ok) throw new Error(JSON.stringify(read.parsed.errors));
    const expected = asked.map((n) => faces.findIndex((f) => faceKey('Oak', f) === faceKey(' oak', n)));
    expect(expected.filter((at) => at < 0).length).toBe(3);
    for (const [k, name] of asked.entries()) {
      const one = `building,face,kind,width_mm,height_mm\n oak ,${quoted(name)},hatch,600,900\n`;
      const withIndex = readOpeningsCsv(one, read.parsed.faces, read.index);
      const without = parseOpeningsCsv(one, read.parsed.faces);
      expect(withIndex.parsed.ok).toBe(expected[k] >= 0);
      expect(withIndex.parsed).toEqual(without);
      expect(withIndex.faceOf).toEqual(expected[k] >= 0 ? [expected[k]] : null);
    }
  });
});
