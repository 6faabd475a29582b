const dayFormat = new Intl.DateTimeFormat('en-GB', { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
const shortDayFormat = new Intl.DateTimeFormat('en-GB', { weekday: 'short', day: 'numeric', month: 'short', timeZone: 'UTC' });

/**
 * A calendar day (YYYY-MM-DD) in words, e.g. "Thu 17 Dec 2026". The day is read as a date, not an
 * instant, so the browser's own zone never moves it to the day before.
 */
export function formatDay(date: string, withYear = true): string {
  const ms = Date.parse(`${date}T00:00:00Z`);
  if (Number.isNaN(ms)) return date;
  const parts = (withYear ? dayFormat : shortDayFormat).formatToParts(new Date(ms));
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? '';
  return [part('weekday'), part('day'), part('month'), withYear ? part('year') : ''].filter(Boolean).join(' ');
}

export const kg = (value: number) => `${Math.round(value).toLocaleString('en-GB')} kg`;

/** Millimetres as metres with two decimals, for lengths on the deck. */
export const metres = (mm: number) => `${(mm / 1000).toFixed(2)} m`;

export const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** "Front slope (plots 1–6) 180 tiles; Rear slope 60 tiles", or "no roof face" for accessories. */
export function facesText(faces: readonly { building: string; face: string; tiles: number }[]): string {
  if (faces.length === 0) return 'no roof face';
  return faces.map((f) => `${f.building ? `${f.building} · ` : ''}${f.face} ${f.tiles.toLocaleString('en-GB')} tiles`).join('; ');
}
