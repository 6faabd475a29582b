import { Link } from 'react-router-dom';
import type { EngineWarning, FaceResult } from '../../../../shared/engine/result';
import type { Opening } from '../../../../shared/schemas/openings.schema';
import type { RoofSystem } from '../../../../shared/schemas/roof-system.schema';
import { Alert } from '../../../components/ui/alert';
import { EmptyState } from '../../../components/ui/empty-state';
import { FaceDrawing } from './face-drawing';
import type { DrawnFace } from './face-drawing';

interface FaceDrawingsProps {
  estimateId: number;
  faces: readonly DrawnFace[];
  results: readonly FaceResult[];
  system: RoofSystem;
  warningsByFace: Map<number, EngineWarning[]>;
  /** The openings of each face, in the order of the faces. */
  openings?: readonly (readonly Opening[])[];
}

export function FaceWarnings({ warnings }: { warnings: readonly EngineWarning[] }) {
  if (warnings.length === 0) return null;
  return (
    <Alert tone="caution" title={warnings.length === 1 ? 'Check this face' : `Check this face (${warnings.length})`} live={false}>
      <ul className="list-disc space-y-1 pl-5">
        {warnings.map((w, i) => (
          <li key={`${w.code}-${i}`}>{w.message}</li>
        ))}
      </ul>
    </Alert>
  );
}

/** A drawing for every face of the estimate, each with the warnings that concern it. */
export function FaceDrawings({ estimateId, faces, results, system, warningsByFace, openings }: FaceDrawingsProps) {
  if (faces.length !== results.length) {
    return <EmptyState title="The drawings cannot be shown">The schedule version of this estimate could not be matched to its faces.</EmptyState>;
  }
  return (
    <ul className="grid gap-6 xl:grid-cols-2">
      {results.map((result, index) => (
        <li key={index} id={`face-${index}`} className="scroll-mt-24 space-y-3 rounded-lg border border-mortar-300 bg-white p-4 shadow-card">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h3 className="text-lg font-semibold">
              {result.building} · {result.face}
              {result.quantity > 1 ? <span className="ml-2 text-base font-normal text-ink-600">× {result.quantity}</span> : null}
            </h3>
            <Link to={`/estimates/${estimateId}/faces/${index}`} className="inline-flex min-h-tap items-center font-medium text-clay-700 underline underline-offset-2">
              Open large
            </Link>
          </div>
          <FaceWarnings warnings={warningsByFace.get(index) ?? []} />
          <FaceDrawing face={faces[index]} result={result} system={system} openings={openings?.[index]} />
        </li>
      ))}
    </ul>
  );
}
