import { useState } from 'react';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { CRANE_LIFT_LABELS, OVERHEAD_LINES_LABELS, VEHICLE_ACCESS_LABELS } from '../../../../shared/schemas/project.schema';
import type { Project } from '../../../../shared/schemas/project.schema';
import { Alert, errorMessage } from '../../../components/ui/alert';
import { Button, buttonClasses } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { useToast } from '../../../components/ui/toast';
import { formatDate } from '../../../lib/format';
import { useSetProjectArchived } from '../api/archive-project';
import { focusOnShow } from '../../../lib/focus-on-show';

function Row({ term, children }: { term: string; children: ReactNode }) {
  return (
    <>
      <dt className="text-sm font-medium text-ink-600">{term}</dt>
      <dd className="min-w-0 break-words">{children || <span className="text-ink-500">Not given</span>}</dd>
    </>
  );
}

/**
 * The buildings of a site: those entered on the site, then any more the roof schedule names (each
 * face row names its building), so an imported schedule's buildings always show.
 */
export function siteBuildings(project: Pick<Project, 'buildings'>, scheduleBuildings: readonly string[] = []): string[] {
  const named = project.buildings.map((b) => `${b.name}${b.kind === 'plot' ? ' (plot)' : ''}`);
  const known = new Set(project.buildings.map((b) => b.name.trim().toLowerCase()));
  const fromSchedule = [...new Set(scheduleBuildings.map((b) => b.trim()).filter(Boolean))].filter((b) => !known.has(b.toLowerCase()));
  return [...named, ...fromSchedule];
}

/** Where the site is and who to ring; `scheduleBuildings` are the buildings the site's roof schedule names. */
export function ProjectContactCard({ project, scheduleBuildings = [] }: { project: Project; scheduleBuildings?: readonly string[] }) {
  const buildings = siteBuildings(project, scheduleBuildings);
  return (
    <Card title="Site and contact">
      <dl className="grid grid-cols-[minmax(7rem,auto)_1fr] gap-x-6 gap-y-2">
        <Row term="Address">
          {project.site_address}
          {project.site_postcode ? `, ${project.site_postcode}` : ''}
        </Row>
        <Row term="Reference">{project.reference}</Row>
        <Row term="Contact">{project.contact_name}</Row>
        <Row term="Phone">
          {project.contact_phone ? (
            <a href={`tel:${project.contact_phone.replace(/[^0-9+]/g, '')}`} className="font-medium text-clay-700 underline underline-offset-2">
              {project.contact_phone}
            </a>
          ) : null}
        </Row>
        <Row term="Buildings">{buildings.length > 0 ? buildings.join(', ') : null}</Row>
      </dl>
    </Card>
  );
}

/** What a lorry finds on arrival; the order form copies it for the merchant. */
export function ProjectAccessCard({ project }: { project: Project }) {
  return (
    <Card title="Access for deliveries">
      <dl className="grid grid-cols-[minmax(7rem,auto)_1fr] gap-x-6 gap-y-2">
        <Row term="Lorries">{VEHICLE_ACCESS_LABELS[project.vehicle_access]}</Row>
        <Row term="Crane">{CRANE_LIFT_LABELS[project.crane_lift]}</Row>
        <Row term="Overhead lines">{OVERHEAD_LINES_LABELS[project.overhead_lines]}</Row>
        <Row term="Set-down place">{project.set_down_place}</Row>
        <Row term="Notes">{project.access_notes ? <span className="whitespace-pre-line">{project.access_notes}</span> : null}</Row>
      </dl>
      {project.overhead_lines === 'present' ? (
        <Alert tone="caution" className="mt-4" live={false}>
          Overhead lines are recorded here: a crane must keep its safety clearance from them.
        </Alert>
      ) : null}
    </Card>
  );
}

/** Edit and archive, with a second press to archive so a slip of the thumb does not hide a live job. */
export function ProjectActions({ project }: { project: Project }) {
  const archive = useSetProjectArchived(project.id);
  const toast = useToast();
  const [confirming, setConfirming] = useState(false);
  const archived = project.archived_at !== null;

  const run = (value: boolean) =>
    archive.mutate(value, {
      onSuccess: () => {
        setConfirming(false);
        toast.show(value ? `${project.name} is archived.` : `${project.name} is open again.`, 'success');
      },
      onError: (error) => toast.show(errorMessage(error), 'danger'),
    });

  if (archived) {
    return (
      <div className="flex flex-wrap items-center gap-3">
        <span className="text-sm text-ink-700">Archived {formatDate(project.archived_at!)}</span>
        <Button variant="secondary" busy={archive.isPending} onClick={() => run(false)}>
          Restore the site
        </Button>
      </div>
    );
  }
  return (
    <div className="flex flex-wrap items-center gap-3">
      <Link to={`/sites/${project.id}/edit`} className={buttonClasses('secondary')}>
        Edit the site
      </Link>
      {confirming ? (
        <div role="group" aria-label="Archive this site?" className="flex flex-wrap items-center gap-2">
          <span className="text-sm font-medium">Archive {project.name}?</span>
          <Button variant="danger" ref={focusOnShow} busy={archive.isPending} onClick={() => run(true)}>
            Yes, archive
          </Button>
          <Button variant="secondary" onClick={() => setConfirming(false)}>
            Keep it open
          </Button>
        </div>
      ) : (
        <Button variant="ghost" onClick={() => setConfirming(true)}>
          Archive
        </Button>
      )}
    </div>
  );
}
