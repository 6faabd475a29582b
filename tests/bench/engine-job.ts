/**
 * The invented job the engine benchmark times, and a smaller copy of it that the engine's tests hold
 * to fixed figures: houses of 20 faces of mixed shapes (hips, valleys, gables, dormers, a bay, a
 * lean-to, an outbuilding) with roof windows, a chimney and a hatch in them, from a seeded generator.
 */
import type { RoofSystemInput } from '../../shared/schemas/roof-system.schema';

export const FACES_PER_HOUSE = 20;

/** An invented natural slate, 500 × 250 mm (75 mm headlap from 30°, 100 mm from 22.5°). */
export const SLATE_SYSTEM: RoofSystemInput = {
  tile: {
    kind: 'double_lap',
    length_mm: 500,
    width_mm: 250,
    headlap_mm: [
      { from_pitch_deg: 22.5, min_mm: 100 },
      { from_pitch_deg: 30, min_mm: 75 },
    ],
    weight_kg: 2.2,
    per_pallet: 600,
  },
  verge: { kind: 'dry' },
  valley: { kind: 'trough' },
};

/**
 * An invented clay plain tile, 265 × 165 mm, at 65 mm headlap from 35°, its lowest pitch (NHBC
 * Standards 7.2.19, table "Pitch, gauge and lap": plain tiles 65 mm headlap, minimum pitch 35°), so a
 * 100 mm gauge ((length − headlap) ÷ 2) and about 60 tiles a m²; weight and pallet count invented.
 * Mortar verges and lined valleys (the defaults).
 */
export const PLAIN_TILE_SYSTEM: RoofSystemInput = {
  tile: {
    kind: 'double_lap',
    length_mm: 265,
    width_mm: 165,
    headlap_mm: [{ from_pitch_deg: 35, min_mm: 65 }],
    weight_kg: 1.2,
    per_pallet: 1000,
  },
};

/** Lowest pitch a plain tile is laid at (its headlap band above). */
export const PLAIN_TILE_LOWEST_PITCH_DEG = 35;

/** Small seeded generator (mulberry32), so every run times the same schedule. */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * A house: hipped main roof, a wing with valleys, a garage, dormers, a bay, a porch and an outbuilding.
 * `lowestPitch` raises every face below it to it (a plain-tiled house: its porch and lean-to at 35°, not
 * 25°); the random figures drawn are the same either way.
 */
export function generateSchedule(houses: number, seed = 1, prefix = 'H', lowestPitch = 0): { schedule: string; openings: string; count: number } {
  const rand = rng(seed);
  const pitch = (deg: number) => Math.max(deg, lowestPitch);
  const between = (lo: number, hi: number) => Math.round(lo + rand() * (hi - lo));
  const lines = ['building,face,quantity,pitch_deg,rafter_mm,run_mm,eaves_mm,top_mm,left,right,top,ridge'];
  const openingLines = ['building,face,kind,width_mm,height_mm,quantity'];
  const cos = (deg: number) => Math.cos((deg * Math.PI) / 180);
  for (let h = 1; h <= houses; h++) {
    const b = `${prefix}${String(h).padStart(3, '0')}`;
    const rows: string[] = [];
    const add = (face: string, pitch: number, rafter: number | '', run: number | '', eaves: number, top: number | '', left: string, right: string, topKind: string) => {
      const ridge =
        topKind === 'abutment'
          ? ''
          : face
              .split(' ')
              .slice(0, face.startsWith('Dormer') ? 2 : 1)
              .join(' ');
      rows.push([b, face, 1, pitch, rafter, run, eaves, top, left, right, topKind, ridge].join(','));
    };
    const opening = (face: string, kind: string, width: number, height: number) => openingLines.push([b, face, kind, width, height, 1].join(','));

    // Main hipped roof: two slopes to a ridge and two hip ends, equal pitch, given by run.
    const p = pitch(between(30, 45));
    const run = between(3600, 5200);
    const length = 2 * run + between(1200, 5600);
    add('Main front', p, '', run, length, length - 2 * run, 'hip', 'hip', 'ridge');
    add('Main back', p, '', run, length, length - 2 * run, 'hip', 'hip', 'ridge');
    add('Main east', p, '', run, 2 * run, 0, 'hip', 'hip', 'ridge');
    add('Main west', p, '', run, 2 * run, 0, 'hip', 'hip', 'ridge');
    // Rear wing: a gable whose slopes widen upwards into valleys against the main roof.
    const wp = pitch(between(35, 45));
    const wrun = between(2400, 3400);
    const weaves = between(3000, 6000);
    const wrafter = Math.round(wrun / cos(wp));
    add('Wing left', wp, wrafter, wrun, weaves, weaves + wrun, 'verge', 'valley', 'ridge');
    add('Wing right', wp, wrafter, wrun, weaves, weaves + wrun, 'valley', 'verge', 'ridge');
    // Garage gable.
    const gp = pitch(between(30, 40));
    const grafter = between(2600, 3600);
    const geaves = between(5400, 7200);
    add('Garage front', gp, grafter, '', geaves, '', 'verge', 'verge', 'ridge');
    add('Garage back', gp, grafter, '', geaves, '', 'verge', 'verge', 'ridge');
    // Porch lean-to against the front wall.
    add('Porch', pitch(25), between(1400, 2200), '', between(1800, 3200), '', 'verge', 'verge', 'abutment');
    // Two gabled dormers.
    for (const d of ['Dormer 1', 'Dormer 2']) {
      const dr = between(1300, 1900);
      const de = between(1600, 2400);
      add(`${d} left`, pitch(45), dr, '', de, '', 'verge', 'abutment', 'ridge');
      add(`${d} right`, pitch(45), dr, '', de, '', 'abutment', 'verge', 'ridge');
    }
    // Bay window: a hipped canopy against the wall.
    const bayRun = between(700, 1100);
    const bayRafter = Math.round(bayRun / cos(35));
    const bayEaves = 2 * bayRun + between(600, 1600);
    add('Bay front', 35, bayRafter, '', bayEaves, bayEaves - 2 * bayRun, 'hip', 'hip', 'abutment');
    add('Bay left', 35, bayRafter, '', bayRun, 0, 'abutment', 'hip', 'abutment');
    add('Bay right', 35, bayRafter, '', bayRun, 0, 'hip', 'abutment', 'abutment');
    // Outbuilding: a small hipped roof and a mono-pitch log store.
    const op = pitch(between(30, 40));
    const orun = between(1800, 2600);
    const olen = 2 * orun + between(600, 2400);
    add('Shed front', op, '', orun, olen, olen - 2 * orun, 'hip', 'hip', 'ridge');
    add('Shed back', op, '', orun, olen, olen - 2 * orun, 'hip', 'hip', 'ridge');
    add('Shed end', op, '', orun, 2 * orun, 0, 'hip', 'hip', 'ridge');
    add('Log store', pitch(25), between(1500, 2100), '', between(2000, 3000), '', 'verge', 'verge', 'mono_ridge');
    if (rows.length !== FACES_PER_HOUSE) throw new Error(`house has ${rows.length} faces`);
    lines.push(...rows);
    // Two roof windows at the back, a chimney through the front slope, a hatch on the garage.
    opening('Main back', 'roof_window', 780, 1180);
    opening('Main back', 'roof_window', 780, 1180);
    opening('Main front', 'chimney', between(600, 1200), between(500, 900));
    opening('Garage back', 'hatch', 600, 900);
  }
  return { schedule: lines.join('\r\n') + '\r\n', openings: openingLines.join('\r\n') + '\r\n', count: openingLines.length - 1 };
}
