import { useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { ErrorAlert } from '../../components/ui/alert';
import { SkeletonBlock } from '../../components/ui/skeleton';
import { estimateQueryOptions } from '../../features/estimates/api/get-estimate';
import { FaceDrawing } from '../../features/estimates/components/face-drawing';
import { scheduleVersionQueryOptions } from '../../features/schedules/api/get-schedule-version';
import { isApiError } from '../../lib/api-client';
import { PERSISTED_QUERY_MAX_AGE_MS } from '../../lib/persisted-queries';
import { engineFaces } from './engine-faces';

/** Kept on the phone with the day, so the stacks show without signal too. */
const KEPT = { meta: { persist: true }, gcTime: PERSISTED_QUERY_MAX_AGE_MS, networkMode: 'offlineFirst' } as const;

const ordinal = (n: number) => (n === 1 ? 'batten' : `${n}${n % 10 === 2 && n % 100 !== 12 ? 'nd' : n % 10 === 3 && n % 100 !== 13 ? 'rd' : n % 10 === 1 && n % 100 !== 11 ? 'st' : 'th'} batten`);

/**
 * One roof face of a crane drop drawn as the estimate drew it: battens, rafters and the stacks over
 * them, so the driver lands and spreads each pallet where the roofer expects it.
 */
export function LandingFaceDrawing({ estimateId, faceIndex }: { estimateId: number; faceIndex: number }) {
  const estimate = useQuery({ ...estimateQueryOptions(estimateId), ...KEPT });
  const schedule = useQuery({
    ...scheduleVersionQueryOptions(estimate.data?.project_id ?? 0, estimate.data?.schedule.version ?? 0),
    ...KEPT,
    enabled: estimate.data !== undefined,
  });
  const faces = useMemo(() => engineFaces(schedule.data?.faces ?? []), [schedule.data]);
  const failed = estimate.error ?? schedule.error;
  if (failed) {
    const refused = isApiError(failed) && (failed.status === 403 || failed.status === 404);
    return refused ? (
      <p className="text-lg">The stack drawing for this face is not available to you; spread the stacks evenly over the rafters on every loading batten, both slopes in step.</p>
    ) : (
      <ErrorAlert error={failed} title="The stack drawing could not be loaded" onRetry={() => void (estimate.error ? estimate.refetch() : schedule.refetch())} />
    );
  }
  if (!estimate.data || !schedule.data) return <SkeletonBlock label="Loading the stack drawing" lines={3} />;
  const result = estimate.data.result.faces[faceIndex];
  const face = faces[faceIndex];
  if (!result || !face) return <p className="text-lg">This face is not on the order&rsquo;s estimate any more.</p>;
  const loading = estimate.data.system_input.roof_loading;
  return (
    <figure className="space-y-2">
      <FaceDrawing face={face} result={result} system={estimate.data.system_input} />
      <figcaption className="text-lg">
        Stacks of {loading.stack_size} on every {ordinal(loading.every_nth_batten)} from the top, {result.stacks} stacks on this face; load both slopes in step.
      </figcaption>
    </figure>
  );
}
