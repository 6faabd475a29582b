import type { RoofSystem } from '../../../shared/schemas/roof-system.schema';
import type { LandingFaceDrawing as LandingFaceDrawingData } from '../../../shared/schemas/run.schema';
import { FaceDrawing } from '../../features/estimates/components/face-drawing';

const ordinal = (n: number) => (n === 1 ? 'batten' : `${n}${n % 10 === 2 && n % 100 !== 12 ? 'nd' : n % 10 === 3 && n % 100 !== 13 ? 'rd' : n % 10 === 1 && n % 100 !== 11 ? 'st' : 'th'} batten`);

/**
 * One roof face of a crane drop drawn as the estimate draws it (the same component): battens, rafters
 * and the stacks over them, so the driver lands and spreads each pallet where the roofer expects it.
 * Drawn from the driver's day alone, so it shows without signal and without access to the estimate.
 */
export function LandingFaceDrawing({ drawing, system }: { drawing: LandingFaceDrawingData; system: RoofSystem }) {
  const loading = system.roof_loading;
  return (
    <figure className="space-y-2">
      <FaceDrawing face={drawing.shape} result={drawing.result} system={system} openings={drawing.openings} />
      <figcaption className="text-lg">
        Stacks of {loading.stack_size} on every {ordinal(loading.every_nth_batten)} from the top, {drawing.result.stacks} stacks on this face; load both slopes in step.
      </figcaption>
    </figure>
  );
}
