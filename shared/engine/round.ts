/** Rounding of the figures a result shows. */
export const r1 = (v: number) => Math.round(v * 10) / 10;
export const r2 = (v: number) => Math.round(v * 100) / 100;
/** Down to 0.1 mm: a gauge shown rounded up could read above the maximum gauge and open the lap. */
export const down1 = (v: number) => Math.floor(v * 10 + 1e-6) / 10;
