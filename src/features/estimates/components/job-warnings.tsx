import type { EngineWarning } from '../../../../shared/engine/result';
import { Alert } from '../../../components/ui/alert';

interface JobWarningsProps {
  byBuilding: Map<string, EngineWarning[]>;
  job: EngineWarning[];
}

/** Warnings about a building (ridge, hips, load balance) or the whole job; face warnings sit on their faces. */
export function JobWarnings({ byBuilding, job }: JobWarningsProps) {
  if (byBuilding.size === 0 && job.length === 0) return null;
  return (
    <Alert tone="caution" title="Check before ordering" live={false}>
      <ul className="list-disc space-y-1 pl-5">
        {job.map((w, i) => (
          <li key={`job-${w.code}-${i}`}>{w.message}</li>
        ))}
        {[...byBuilding].flatMap(([building, warnings]) =>
          warnings.map((w, i) => (
            <li key={`${building}-${w.code}-${i}`}>
              <span className="font-semibold">{building}:</span> {w.message}
            </li>
          )),
        )}
      </ul>
    </Alert>
  );
}
