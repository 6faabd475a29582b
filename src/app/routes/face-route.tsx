import { useMemo } from 'react';
import { useParams } from 'react-router-dom';
import { NotFoundContent } from '../../components/errors/not-found-page';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { TextLink } from '../../components/ui/text-link';
import { useEstimate } from '../../features/estimates/api/get-estimate';
import { FaceDrawing } from '../../features/estimates/components/face-drawing';
import { FaceWarnings } from '../../features/estimates/components/face-drawings';
import { placeWarnings } from '../../features/estimates/lib/warnings';
import { useScheduleVersion } from '../../features/schedules/api/get-schedule-version';
import { usePageTitle } from '../../lib/use-page-title';
import { engineFaces, openingsByFace } from './engine-faces';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

export function FaceRoute() {
  const params = useParams();
  const estimateId = idParam(params, 'estimateId');
  const index = Number(params.faceIndex);
  const estimate = useEstimate(estimateId);
  const schedule = useScheduleVersion(estimate.data?.project_id ?? 0, estimate.data?.schedule.version);
  const faces = useMemo(() => engineFaces(schedule.data?.faces ?? []), [schedule.data]);
  const openings = useMemo(() => openingsByFace(faces, schedule.data?.openings ?? []), [faces, schedule.data]);
  const result = estimate.data?.result.faces[index];
  usePageTitle(result ? `${result.building} · ${result.face}` : 'Roof face');
  return (
    <>
      <TextLink to={`/estimates/${estimateId}#face-${index}`}>← Estimate {estimateId}</TextLink>
      <PageQuery query={schedule} what="the face">
        {() =>
          !estimate.data || !result || !faces[index] ? (
            <NotFoundContent />
          ) : (
            <>
              <PageHeader
                title={`${result.building} · ${result.face}`}
                lead={`${result.quantity} ${result.quantity === 1 ? 'face' : 'faces'} like this · ${result.pitch_deg}° · ${result.courses} courses at ${result.gauge_mm} mm gauge`}
              />
              <div className="space-y-4">
                <FaceWarnings warnings={placeWarnings(estimate.data.result).byFace.get(index) ?? []} />
                <Card>
                  <FaceDrawing face={faces[index]} result={result} system={estimate.data.system_input} openings={openings[index]} large />
                </Card>
              </div>
            </>
          )
        }
      </PageQuery>
    </>
  );
}
