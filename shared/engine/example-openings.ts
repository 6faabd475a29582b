/**
 * The example openings file for the example roof schedule: roof windows in the back slopes of the
 * hipped "Alder" type, a chimney through the front slope of the gabled "Birch" type and a loft hatch
 * in its back. Served as the downloadable example (GET /api/examples/openings.csv) and used in tests.
 */
export const EXAMPLE_OPENINGS_FILENAME = 'openings.csv';

export const EXAMPLE_OPENINGS_CSV = ['building,face,kind,width_mm,height_mm,quantity', 'Alder,Back,roof_window,780,1180,2', 'Birch,Front,chimney,900,700,1', 'Birch,Back,hatch,600,900,1', ''].join('\r\n');
