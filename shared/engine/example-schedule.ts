/**
 * The example roof schedule: two invented house types on one development. "Alder" has a hipped roof
 * (two slopes to a ridge and two triangular hip ends, all at 35°, given by run on plan); "Birch" has a
 * gable roof at 40° (given by rafter and run) with a lean-to porch against the front wall. Served as
 * the downloadable example (its `ridge` column names the ridge each face meets) (GET /api/examples/roof-schedule.csv) and used in tests.
 */
export const EXAMPLE_SCHEDULE_FILENAME = 'roof-schedule.csv';

export const EXAMPLE_SCHEDULE_CSV = [
  'building,face,quantity,pitch_deg,rafter_mm,run_mm,eaves_mm,top_mm,left,right,top,ridge',
  'Alder,Front,12,35,,4200,10200,1800,hip,hip,ridge,Main',
  'Alder,Back,12,35,,4200,10200,1800,hip,hip,ridge,Main',
  'Alder,East hip end,12,35,,4200,8400,0,hip,hip,ridge,Main',
  'Alder,West hip end,12,35,,4200,8400,0,hip,hip,ridge,Main',
  'Birch,Front,8,40,5091,3900,9000,,verge,verge,ridge,Main',
  'Birch,Back,8,40,5091,3900,9000,,verge,verge,ridge,Main',
  'Birch,Porch,8,25,1800,,2400,,verge,verge,abutment,',
  '',
].join('\r\n');
