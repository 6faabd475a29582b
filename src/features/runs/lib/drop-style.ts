/**
 * How a drop is told apart on the deck drawing: its number, a pattern and a colour, so no one needs to
 * tell colours apart. The colours are the Okabe–Ito set, chosen to stay distinct under the common
 * kinds of colour blindness; the patterns repeat after eight drops, the colours after eight too, and the
 * number is always printed on the pallet.
 */
export interface DropStyle {
  /** Stroke colour of the pattern. */
  colour: string;
  /** Light ground under the pattern, so the pallet's text stays readable. */
  tint: string;
  colourName: string;
  pattern: DropPatternKind;
  patternName: string;
}

export type DropPatternKind = 'diagonal' | 'dots' | 'horizontal' | 'crosshatch' | 'vertical' | 'backslash' | 'checks' | 'rings';

const COLOURS = [
  { colour: '#c27c00', tint: '#fbeccc', colourName: 'orange' },
  { colour: '#2b7fb8', tint: '#dcecf7', colourName: 'sky blue' },
  { colour: '#007a5e', tint: '#d3eee6', colourName: 'green' },
  { colour: '#a88f00', tint: '#f8f3c4', colourName: 'yellow' },
  { colour: '#0060a0', tint: '#d4e3f0', colourName: 'blue' },
  { colour: '#c24e00', tint: '#f7dccb', colourName: 'vermilion' },
  { colour: '#b0588e', tint: '#f3dcea', colourName: 'purple' },
  { colour: '#343e4d', tint: '#e6eaef', colourName: 'grey' },
] as const;

const PATTERNS: readonly { pattern: DropPatternKind; patternName: string }[] = [
  { pattern: 'diagonal', patternName: 'diagonal stripes' },
  { pattern: 'dots', patternName: 'dots' },
  { pattern: 'horizontal', patternName: 'across stripes' },
  { pattern: 'crosshatch', patternName: 'cross-hatching' },
  { pattern: 'vertical', patternName: 'lengthwise stripes' },
  { pattern: 'backslash', patternName: 'back-diagonal stripes' },
  { pattern: 'checks', patternName: 'checks' },
  { pattern: 'rings', patternName: 'rings' },
];

/** The style of drop `drop` (1 = the first drop off). */
export function dropStyle(drop: number): DropStyle {
  const i = (Math.max(1, drop) - 1) % 8;
  return { ...COLOURS[i]!, ...PATTERNS[i]! };
}
