import { render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { estimate } from '../../../../shared/engine/estimate';
import { parseRoofSystem } from '../../../../shared/engine/roof-system';
import type { Face } from '../../../../shared/schemas/schedule.schema';
import { gableFace, landingSystem } from '../../../test-utils/driver-day-fixture';
import { FaceDrawing } from './face-drawing';

/** A gable slope between two verges: 9 m of eaves, 5,091 mm rafter at 40° (the example schedule's Birch Front). */
const gable = gableFace('Birch', 'Front');

/** A triangular hip end: 8.4 m of eaves rising to a point. */
const hipEnd: Face = { ...gable, face: 'East hip end', eaves_mm: 8400, top_mm: 0, left: 'hip', right: 'hip', pitch_deg: 35, rafter_mm: 5127.3, run_mm: 4200 };

describe('FaceDrawing', () => {
  const system = landingSystem();

  it('draws a batten for every course at the gauge worked out by hand, and the loading battens every 2nd from the top', () => {
    // Default tile: 420 mm long, 75 mm headlap from 30°. Single-lap gauge = length − headlap = 345 mm at most
    // (common practice; the tile maker gives the maximum gauge). First batten 420 − 50 mm eaves overhang = 370 mm,
    // top batten 40 mm below the ridge = 5,051 mm; 4,681 mm between them needs ceil(4681 ÷ 345) = 14 gauges of
    // 334.36 mm, so 15 courses and 15 battens. Loading battens every 2nd from the top: floor(15 ÷ 2) = 7.
    const [result] = estimate([gable], system).faces;
    expect(result.courses).toBe(15);
    // Shown to 0.1 mm and never above the gauge itself.
    expect(result.gauge_mm).toBeLessThanOrEqual(4681 / 14);
    expect(result.gauge_mm).toBeGreaterThan(4681 / 14 - 0.1);

    render(<FaceDrawing face={gable} result={result} system={system} />);
    const drawing = screen.getByTestId('face-drawing');
    const plain = drawing.querySelectorAll('[data-testid="batten"]');
    const loading = drawing.querySelectorAll('[data-testid="loading-batten"]');
    expect(plain.length + loading.length).toBe(15);
    expect(loading).toHaveLength(7);

    // Battens sit at the engine's heights: the first 370 mm up from the eaves, then one gauge apart.
    const heights = [...plain, ...loading].map((line) => 5091 - Number(line.getAttribute('y1'))).sort((a, b) => a - b);
    expect(heights[0]).toBeCloseTo(370, 6);
    expect(heights[1] - heights[0]).toBeCloseTo(4681 / 14, 6);
    expect(heights[14]).toBeCloseTo(5051, 6);
  });

  it('draws as many stacks as the engine placed, one stack of 6 per 6 tiles, on the loading battens only', () => {
    const [result] = estimate([gable], system).faces;
    // Stacks = ceil(tiles ÷ 6), the engine's default stack size (common practice), while there are enough places over the rafters.
    expect(result.stacks).toBe(Math.ceil(result.tiles / 6));
    expect(result.stacks).toBeLessThanOrEqual(result.stack_positions);

    render(<FaceDrawing face={gable} result={result} system={system} />);
    const drawing = screen.getByTestId('face-drawing');
    const stacks = [...drawing.querySelectorAll('[data-testid="stack"]')];
    expect(stacks).toHaveLength(result.stacks);

    const loadingHeights = new Set([...drawing.querySelectorAll('[data-testid="loading-batten"]')].map((line) => Number(line.getAttribute('y1'))));
    for (const stack of stacks) {
      const centre = Number(stack.getAttribute('y')) + Number(stack.getAttribute('height')) / 2;
      expect([...loadingHeights].some((y) => Math.abs(y - centre) < 1e-6)).toBe(true);
    }
    // Each loading batten carries what the engine put on it, top batten first.
    const perRow = [...loadingHeights].sort((a, b) => a - b).map((y) => stacks.filter((s) => Math.abs(Number(s.getAttribute('y')) + Number(s.getAttribute('height')) / 2 - y) < 1e-6).length);
    expect(perRow).toEqual(result.stacks_by_row);
  });

  it('strikes the setting-out lines the engine gave, measured from the right-hand verge', () => {
    const [result] = estimate([gable], system).faces;
    expect(result.setting_out_from).toBe('right_verge');
    render(<FaceDrawing face={gable} result={result} system={system} />);
    const lines = [...screen.getByTestId('face-drawing').querySelectorAll('[data-testid="setting-out-line"]')];
    expect(lines).toHaveLength(result.setting_out_marks_mm.length);
    // The right-hand verge is at x = 9,000 on the drawing; a mark n mm from it is at 9,000 − n.
    expect(lines.map((l) => Number(l.getAttribute('x1')))).toEqual(result.setting_out_marks_mm.map((mm) => 9000 - mm));
  });

  it('says the same in words, for people who cannot see the drawing', () => {
    const [result] = estimate([gable], system).faces;
    render(<FaceDrawing face={gable} result={result} system={system} />);
    const svg = screen.getByRole('img');
    expect(svg.getAttribute('aria-labelledby')).toBeTruthy();
    const words = within(screen.getByTestId('face-drawing-words'));
    expect(words.getByText(`15 battens, one per course, at ${result.gauge_mm} mm gauge (75 mm headlap): the first 370 mm up from the eaves, the top one at 5,051 mm.`)).toBeTruthy();
    expect(words.getByText(new RegExp(`^${result.stacks} stacks of up to 6 tiles`))).toBeTruthy();
  });

  it('draws a hip end as a triangle, its battens shortening towards the top', () => {
    const [result] = estimate([hipEnd], system).faces;
    render(<FaceDrawing face={hipEnd} result={result} system={system} />);
    const drawing = screen.getByTestId('face-drawing');
    const polygon = drawing.querySelector('polygon')!;
    const points = polygon.getAttribute('points')!.split(' ');
    // The two top corners meet at the middle of the eaves: 8,400 ÷ 2 = 4,200 mm.
    expect(points[2]).toBe(points[3]);
    expect(points[2]).toBe(`4200,0`);
    const battens = [...drawing.querySelectorAll('[data-testid="batten"], [data-testid="loading-batten"]')]
      .map((l) => ({ y: Number(l.getAttribute('y1')), length: Number(l.getAttribute('x2')) - Number(l.getAttribute('x1')) }))
      .sort((a, b) => b.y - a.y);
    expect(battens).toHaveLength(result.courses);
    for (let i = 1; i < battens.length; i++) expect(battens[i].length).toBeLessThan(battens[i - 1].length);
  });
});

describe('FaceDrawing with openings and double-lap courses', () => {
  it('draws each opening to scale with the tiles it leaves out and a cut tile each side of each course it crosses', () => {
    const system = landingSystem();
    const opening = { building: 'Birch', face: 'Front', kind: 'roof_window' as const, width_mm: 780, height_mm: 1180, quantity: 2 };
    const [result] = estimate([gable], system, [opening]).faces;
    render(<FaceDrawing face={gable} result={result} system={system} openings={[opening]} />);
    const svg = screen.getByTestId('face-drawing');
    expect(within(svg).getAllByTestId('opening')).toHaveLength(2);
    const drawn = within(svg).getAllByTestId('opening')[0];
    expect(Number(drawn.getAttribute('width'))).toBe(780);
    expect(Number(drawn.getAttribute('height'))).toBe(1180);
    // ceil(1180 ÷ gauge) courses crossed, two cut tiles in each, for each of the two windows.
    const crossed = Math.ceil(1180 / result.gauge_mm);
    expect(within(svg).getAllByTestId('opening-cut-tile')).toHaveLength(2 * 2 * crossed);
    expect(screen.getByTestId('face-drawing-words').textContent).toMatch(/2 × roof window 780 × 1,180 mm/);
  });

  it('marks the eaves and top courses and the tiles-and-a-half at both verges of a plain-tile face', () => {
    const parsed = parseRoofSystem({ tile: { kind: 'double_lap', length_mm: 265, width_mm: 165, headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }], weight_kg: 1.1, per_pallet: 1000 } });
    if (!parsed.ok) throw new Error('plain tile system rejected');
    const [result] = estimate([gable], parsed.system).faces;
    render(<FaceDrawing face={gable} result={result} system={parsed.system} />);
    const svg = screen.getByTestId('face-drawing');
    expect(within(svg).getByTestId('eaves-course')).toBeTruthy();
    expect(within(svg).getByTestId('top-course')).toBeTruthy();
    // Two marks (one a verge) in each course that has tiles-and-a-half.
    expect(within(svg).getAllByTestId('tile-and-half')).toHaveLength(result.tile_and_half);
  });
});
