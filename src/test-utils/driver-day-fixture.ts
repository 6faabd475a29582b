import { estimate } from '../../shared/engine/estimate';
import { parseRoofSystem } from '../../shared/engine/roof-system';
import type { RoofSystem } from '../../shared/schemas/roof-system.schema';
import type { DriverDay, DriverDrop, LandingFaceDrawing } from '../../shared/schemas/run.schema';
import type { Face } from '../../shared/schemas/schedule.schema';

/** The engine's default roof system: stacks of six on every second batten. */
export function landingSystem(): RoofSystem {
  const parsed = parseRoofSystem({});
  if (!parsed.ok) throw new Error('the default roof system does not parse');
  return parsed.system;
}

/** A gable slope between verges under a ridge: 9 m of eaves and a 5,091 mm rafter at 40°. */
export function gableFace(building: string, face: string): Face {
  return {
    building,
    face,
    quantity: 1,
    pitch_deg: 40,
    rafter_mm: 5091,
    run_mm: 5091 * Math.cos((40 * Math.PI) / 180),
    eaves_mm: 9000,
    top_mm: 9000,
    left: 'verge',
    right: 'verge',
    top: 'ridge',
  };
}

/** Two gable slopes of one house. */
const ALDER: Face[] = ['Front', 'Rear'].map((face) => gableFace('Alder', face));

/** Each Alder face as the driver's day carries it: its shape and the engine's own figures for it. */
export function landingDrawings(system = landingSystem()): LandingFaceDrawing[] {
  return estimate(ALDER, system).faces.map((result, i) => {
    const f = ALDER[i]!;
    return { shape: { eaves_mm: f.eaves_mm, top_mm: f.top_mm, rafter_mm: f.rafter_mm, pitch_deg: f.pitch_deg, left: f.left, right: f.right, top: f.top }, result, openings: [] };
  });
}

/**
 * An invented driver's day for component tests: two runs on one crane lorry; the first run has a
 * crane drop onto the roof (with its landing plan and a face left short by a back-order) and a ground
 * drop, the second run one ground drop already delivered. Firms, people and places are made up.
 */
export function driverDrop(overrides: Partial<DriverDrop> = {}): DriverDrop {
  return {
    order_id: 11,
    reference: 'RL-000011',
    position: 1,
    status: 'on_the_road',
    contractor: { id: 5, name: 'Brackenfold Roofworks' },
    site: {
      name: 'Hollin Brow, plots 1–20',
      site_address: '4 Hollin Brow, Tollerbeck',
      site_postcode: 'TB4 7QX',
      contact_name: 'Gethin Marlow',
      contact_phone: '07700 900 001',
      vehicle_access: 'rigid_only',
      crane_lift: 'allowed',
      overhead_lines: 'present',
      set_down_place: 'Hardstanding by the cabin',
      access_notes: 'Gate code 4512; reverse in from Mill Lane.',
    },
    maps_url: 'https://maps.example.test/?q=4%20Hollin%20Brow%2C%20Tollerbeck%20TB4%207QX',
    delivery_method: 'roof',
    weight_kg: 2246,
    pallets: [
      { n: 1, weight_kg: 1080, faces: [{ building: 'Alder', face: 'Front', tiles: 240 }], items: [] },
      {
        n: 2,
        weight_kg: 1070,
        faces: [
          { building: 'Alder', face: 'Rear', tiles: 200 },
          { building: 'spare', face: '', tiles: 38 },
        ],
        items: [],
      },
      {
        n: 3,
        weight_kg: 96,
        faces: [],
        items: [
          { description: 'Dry ridge tile, slate grey', quantity: 24, unit: 'pieces' },
          { description: 'clips', quantity: 200, unit: 'pieces' },
        ],
      },
    ],
    lines: [
      { line_id: 101, sku: 'TRS-FL420-SG', description: 'Interlocking tile, slate grey', unit: 'pack', quantity: 10 },
      { line_id: 102, sku: 'TRS-RDG-SG', description: 'Dry ridge tile, slate grey', unit: 'pack', quantity: 2 },
    ],
    notes: ['Crane lift booked for 08:00'],
    short_faces: [{ building: 'Alder', face: 'Rear', tiles_short: 120, follow_up_reference: 'RL-000019', due_date: '2027-03-08' }],
    landing_plan: [
      { building: 'Alder', face: 'Front', pallets: [1], tiles: 240, estimate_face_index: 0, drawing: landingDrawings()[0]! },
      { building: 'Alder', face: 'Rear', pallets: [2], tiles: 200, estimate_face_index: 1, drawing: landingDrawings()[1]! },
    ],
    roof_system: landingSystem(),
    estimate_id: 31,
    delivered: false,
    ...overrides,
  };
}

const LORRY = {
  id: 1,
  registration: 'RL-TY01',
  name: 'Crane rigid',
  has_crane: true,
  crane_max_kg: 1200,
  payload_kg: 10000,
  pallet_slots: 12,
  deck_length_mm: 7300,
  deck_width_mm: 2450,
};

export const RUN_CAUTIONS = [
  'Crane lifts need a lift plan by a competent person: check the ground, the outriggers and overhead lines before lifting.',
  'Land pallets on the roof only where the contractor says the structure can take them, both slopes in step.',
];

export function driverDay(): DriverDay {
  return {
    date: '2027-03-01',
    driver: { id: 8, name: 'Kofi Brennagh' },
    runs: [
      {
        id: 40,
        date: '2027-03-01',
        time_window: '07:30-12:00',
        lorry: LORRY,
        status: 'on_the_road',
        cautions: RUN_CAUTIONS,
        cautions_read_at: null,
        drops: [
          driverDrop(),
          driverDrop({
            order_id: 12,
            reference: 'RL-000012',
            position: 2,
            site: { ...driverDrop().site, name: 'Quarry Rise', site_address: '9 Quarry Rise, Emberton', site_postcode: 'EM2 1RD' },
            maps_url: 'https://maps.example.test/?q=9%20Quarry%20Rise',
            delivery_method: 'ground',
            short_faces: [],
            landing_plan: [],
            roof_system: null,
            estimate_id: null,
          }),
        ],
      },
      {
        id: 41,
        date: '2027-03-01',
        time_window: '12:30-16:30',
        lorry: LORRY,
        status: 'on_the_road',
        cautions: RUN_CAUTIONS,
        cautions_read_at: null,
        drops: [
          driverDrop({
            order_id: 13,
            reference: 'RL-000013',
            position: 1,
            status: 'delivered',
            delivered: true,
            site: { ...driverDrop().site, name: 'Larchgate Farm' },
            delivery_method: 'ground',
            short_faces: [],
            landing_plan: [],
            roof_system: null,
          }),
        ],
      },
    ],
  };
}
