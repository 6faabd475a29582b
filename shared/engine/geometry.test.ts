import { describe, expect, it } from 'vitest';
import { extentAt, hipRafterLength, insets, planAreaM2, rafterFromRun, rakingEdgeLength, slopeAreaM2, slopeFactor, widthAt, type FaceShape } from './geometry';

const FT = 304.8; // mm in a foot

describe('slope area = plan area ÷ cos(pitch)', () => {
  // Trigonometry: the slope factor 1 ÷ cos(pitch), tabulated to four places.
  it.each([
    [30, 1.1547],
    [35, 1.2208],
    [40, 1.3054],
    [45, 1.4142],
  ])('at %i° one square metre on plan is %f m² on the slope', (pitch, factor) => {
    expect(slopeFactor(pitch)).toBeCloseTo(factor, 4);
    // A 10 m × 6 m face on the slope has 60 m² of slope area and 60 ÷ factor on plan.
    const slope = slopeAreaM2({ eaves_mm: 10_000, top_mm: 10_000, rafter_mm: 6_000 });
    expect(slope).toBeCloseTo(60, 9);
    expect(planAreaM2(slope, pitch) * factor).toBeCloseTo(60, 2);
    expect(planAreaM2(slope, pitch)).toBeCloseTo(60 * Math.cos((pitch * Math.PI) / 180), 9);
  });

  it('100 sq ft on the level needs about 142 sq ft on a half-pitch (45°) slope (old builders’ text, published)', () => {
    expect(Math.round(100 * slopeFactor(45))).toBe(141); // 141.4, which the text rounds up to 142
    expect(100 * slopeFactor(45)).toBeGreaterThan(141);
    expect(100 * slopeFactor(45)).toBeLessThan(142);
  });

  it('reads a rafter from its run: 4200 mm on plan at 35° is 5127 mm on the slope', () => {
    expect(rafterFromRun(4200, 35)).toBeCloseTo(5127.3, 1);
  });

  it('gives a trapezoid its mean width times its rafter', () => {
    expect(slopeAreaM2({ eaves_mm: 10_200, top_mm: 1_800, rafter_mm: 5_000 })).toBeCloseTo(30, 9);
    expect(slopeAreaM2({ eaves_mm: 8_400, top_mm: 0, rafter_mm: 5_000 })).toBeCloseTo(21, 9);
  });
});

describe('hip rafter of an equal-pitch hip', () => {
  // Published: US Navy "Builder" training manual, hip rafter worked example.
  it('21.21 ft of hip run with 10 ft of rise gives a 23.45 ft hip (US Navy Builder manual)', () => {
    expect(hipRafterLength(21.21, 10)).toBeCloseTo(23.45, 2);
  });

  it('the same roof measured on its slope: common rafter 18.03 ft set back 15 ft gives the same 23.45 ft (US Navy Builder manual)', () => {
    expect(rakingEdgeLength(18.03 * FT, 15 * FT) / FT).toBeCloseTo(23.45, 2);
  });
});

describe('insets and widths of a face', () => {
  const hipEnd: FaceShape = { eaves_mm: 8_000, top_mm: 0, rafter_mm: 4_000, left: 'hip', right: 'hip' };
  const oneHip: FaceShape = { eaves_mm: 6_000, top_mm: 4_000, rafter_mm: 4_000, left: 'hip', right: 'verge' };
  const valley: FaceShape = { eaves_mm: 4_000, top_mm: 6_000, rafter_mm: 3_000, left: 'verge', right: 'valley' };

  it('shares the set-back equally between two raking sides', () => {
    expect(insets(hipEnd)).toEqual({ left: 4_000, right: 4_000 });
  });

  it('gives all the set-back to the one raking side and none to a verge', () => {
    expect(insets(oneHip)).toEqual({ left: 2_000, right: 0 });
  });

  it('gives the set-back to the hip, not to an abutment beside it: a wall runs square up the slope', () => {
    const baySide: FaceShape = { eaves_mm: 900, top_mm: 0, rafter_mm: 1_100, left: 'abutment', right: 'hip' };
    expect(insets(baySide)).toEqual({ left: 0, right: 900 });
    expect(insets({ ...baySide, left: 'valley', right: 'abutment', top_mm: 1_500 })).toEqual({ left: -600, right: 0 });
    // With no hip or valley, an abutment is the raking side (a lean-to against a sloping wall).
    expect(insets({ ...baySide, left: 'verge', right: 'abutment', top_mm: 500 })).toEqual({ left: 0, right: 400 });
    expect(insets({ ...baySide, left: 'abutment', right: 'abutment', top_mm: 500 })).toEqual({ left: 200, right: 200 });
  });

  it('gives a face that widens upwards a negative inset', () => {
    expect(insets(valley)).toEqual({ left: 0, right: -2_000 });
  });

  it('narrows a hip end to nothing at its apex', () => {
    expect(widthAt(hipEnd, 0)).toBe(8_000);
    expect(widthAt(hipEnd, 2_000)).toBe(4_000);
    expect(widthAt(hipEnd, 4_000)).toBe(0);
    expect(widthAt(hipEnd, 9_999)).toBe(0);
    expect(extentAt(hipEnd, insets(hipEnd), 2_000)).toEqual({ from: 2_000, to: 6_000 });
  });

  it('measures the extent from the right-hand end of the eaves, past it for a valley face', () => {
    expect(extentAt(valley, insets(valley), 1_500)).toEqual({ from: -1_000, to: 4_000 });
  });
});
