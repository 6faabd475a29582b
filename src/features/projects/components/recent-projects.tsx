import { Link } from 'react-router-dom';
import { ErrorAlert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { TextLink } from '../../../components/ui/text-link';
import { formatDate } from '../../../lib/format';
import { useProjects } from '../api/get-projects';

/** The sites touched most lately, for the estimating home. */
export function RecentProjects({ limit = 5 }: { limit?: number }) {
  const projects = useProjects({ sort: 'updated_at', dir: 'desc', page_size: limit });
  return (
    <Card title="Recent sites">
      {projects.isPending ? (
        <SkeletonBlock label="Loading the recent sites" lines={4} />
      ) : projects.isError ? (
        <ErrorAlert error={projects.error} title="The sites could not be loaded" onRetry={() => void projects.refetch()} />
      ) : projects.data.projects.length === 0 ? (
        <EmptyState title="No sites yet">Add a site, then import its roof schedule.</EmptyState>
      ) : (
        <ul className="divide-y divide-mortar-200">
          {projects.data.projects.map((project) => (
            <li key={project.id} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 py-2">
              <Link to={`/sites/${project.id}`} className="inline-flex min-h-tap items-center font-semibold text-clay-700 underline underline-offset-2">
                {project.name}
              </Link>
              <span className="text-sm text-ink-600">
                {project.schedule ? `Schedule v${project.schedule.version}, ${project.schedule.face_count} faces` : 'No schedule yet'} · {project.estimate_count} {project.estimate_count === 1 ? 'estimate' : 'estimates'}{' '}
                · {formatDate(project.updated_at)}
              </span>
            </li>
          ))}
        </ul>
      )}
      <div className="mt-3">
        <TextLink to="/sites">All sites</TextLink>
      </div>
    </Card>
  );
}
