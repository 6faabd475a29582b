import { lazy, Suspense, useMemo } from 'react';
import { Link, useParams } from 'react-router-dom';
import { SectionBoundary } from '../../components/errors/section-boundary';
import { buttonClasses } from '../../components/ui/button';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { SkeletonBlock } from '../../components/ui/skeleton';
import { ErrorAlert } from '../../components/ui/alert';
import { TextLink } from '../../components/ui/text-link';
import { useEstimate } from '../../features/estimates/api/get-estimate';
import { BillOfMaterials } from '../../features/estimates/components/bill-of-materials';
import { EstimateExports } from '../../features/estimates/components/estimate-exports';
import { EstimateSummary } from '../../features/estimates/components/estimate-summary';
import { FaceBreakdownTable } from '../../features/estimates/components/face-breakdown-table';
import { JobWarnings } from '../../features/estimates/components/job-warnings';
import { RidgeLoads, TakeOffExtras } from '../../features/estimates/components/ridges-and-fittings';
import { placeWarnings } from '../../features/estimates/lib/warnings';
import { useProject } from '../../features/projects/api/get-project';
import { useScheduleVersion } from '../../features/schedules/api/get-schedule-version';
import { usePageTitle } from '../../lib/use-page-title';
import { engineFaces, openingsByFace } from './engine-faces';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

/** The face drawings (below the bill): their drawing and loading code comes while the faces are asked for. */
const FaceDrawings = lazy(() => import('../../features/estimates/components/face-drawings').then((m) => ({ default: m.FaceDrawings })));

export function EstimateRoute() {
  const estimateId = idParam(useParams(), 'estimateId');
  const estimate = useEstimate(estimateId);
  const project = useProject(estimate.data?.project_id ?? 0);
  const schedule = useScheduleVersion(estimate.data?.project_id ?? 0, estimate.data?.schedule.version);
  const placed = useMemo(() => (estimate.data ? placeWarnings(estimate.data.result) : null), [estimate.data]);
  const faces = useMemo(() => engineFaces(schedule.data?.faces ?? []), [schedule.data]);
  const openings = useMemo(() => openingsByFace(faces, schedule.data?.openings ?? []), [faces, schedule.data]);
  usePageTitle(`Estimate ${estimateId}`);

  return (
    <>
      {estimate.data ? <TextLink to={`/sites/${estimate.data.project_id}`}>← {project.data?.name ?? 'The site'}</TextLink> : null}
      <PageQuery query={estimate} what="the estimate">
        {(saved) => {
          const branch = saved.system.branch;
          const archived = project.data?.archived_at != null;
          return (
            <>
              <PageHeader
                title={`Estimate ${saved.id}`}
                lead={`${project.data?.name ?? ''}${project.data ? ' · ' : ''}${saved.system.name}${branch ? `, ${branch.name}` : ''}`}
                actions={<EstimateExports estimateId={saved.id} />}
              />
              <div className="space-y-6">
                {!archived ? (
                  <div className="flex flex-wrap gap-2">
                    {branch && saved.lines.some((l) => l.product_id !== null) ? (
                      <Link to={`/estimates/${saved.id}/order`} className={buttonClasses('primary', 'lg')}>
                        Order from {branch.name}
                      </Link>
                    ) : null}
                    <Link to={`/estimates/${saved.id}/quote`} className={buttonClasses(branch ? 'secondary' : 'primary', 'lg')}>
                      Ask merchants for quotes
                    </Link>
                  </div>
                ) : null}
                <EstimateSummary estimate={saved} />
                {placed ? <JobWarnings byBuilding={placed.byBuilding} job={placed.job} /> : null}
                <Card title="Bill of materials">
                  <BillOfMaterials lines={saved.lines} notCounted={saved.not_counted} subtotal={saved.totals.subtotal} />
                </Card>
                <Card title="Special pieces, fittings and flashings">
                  <TakeOffExtras totals={saved.result.totals} />
                </Card>
                <Card title="Ridges and roof loading">
                  <RidgeLoads result={saved.result} />
                </Card>
                <Card title="Per face">
                  <p className="mb-3 text-sm text-ink-700">Figures for one face; the job multiplies each by its quantity.</p>
                  <FaceBreakdownTable faces={saved.result.faces} warningsByFace={placed?.byFace ?? new Map()} />
                </Card>
                <section aria-labelledby="drawings-title" className="space-y-4">
                  <h2 id="drawings-title" className="text-xl font-semibold">
                    Face drawings
                  </h2>
                  <SectionBoundary name="face drawings">
                    {schedule.isPending ? (
                      <SkeletonBlock label="Loading the faces to draw" lines={4} />
                    ) : schedule.isError ? (
                      <ErrorAlert error={schedule.error} title="The faces could not be loaded" onRetry={() => void schedule.refetch()} />
                    ) : (
                      <Suspense fallback={<SkeletonBlock label="Loading the face drawings" lines={4} />}>
                        <FaceDrawings estimateId={saved.id} faces={faces} results={saved.result.faces} system={saved.system_input} warningsByFace={placed?.byFace ?? new Map()} openings={openings} />
                      </Suspense>
                    )}
                  </SectionBoundary>
                </section>
              </div>
            </>
          );
        }}
      </PageQuery>
    </>
  );
}
