import { useId, useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { ProjectSummary } from '../../../../shared/schemas/project.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { Button, buttonClasses } from '../../../components/ui/button';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { Spinner } from '../../../components/ui/spinner';
import { formatDate } from '../../../lib/format';
import { useProjects } from '../api/get-projects';
import { useDebouncedValue } from '../lib/use-debounced-value';

const PAGE_SIZE = 50;
const helper = dataTableColumns<ProjectSummary>();

const columns = helper.columns([
  helper.accessor('name', {
    header: 'Site',
    sortFn: 'text',
    cell: (info) => (
      <div className="min-w-40">
        <Link to={`/sites/${info.row.original.id}`} className="font-semibold text-clay-700 underline underline-offset-2 hover:text-clay-800">
          {info.getValue()}
        </Link>
        {info.row.original.reference ? <span className="block text-sm text-ink-600">{info.row.original.reference}</span> : null}
        {info.row.original.archived_at ? <span className="mt-0.5 inline-block rounded bg-ink-100 px-1.5 text-xs font-semibold text-ink-700">Archived</span> : null}
      </div>
    ),
  }),
  helper.accessor('site_address', {
    header: 'Address',
    sortFn: 'text',
    cell: (info) => (
      <span className="block max-w-64">
        {info.getValue()}
        {info.row.original.site_postcode ? `, ${info.row.original.site_postcode}` : ''}
      </span>
    ),
  }),
  helper.accessor('contact_name', {
    header: 'Contact',
    sortFn: 'text',
    cell: (info) => (
      <span>
        {info.getValue() || <span className="text-ink-500">—</span>}
        {info.row.original.contact_phone ? <span className="block text-sm whitespace-nowrap text-ink-600">{info.row.original.contact_phone}</span> : null}
      </span>
    ),
  }),
  helper.accessor((row) => row.schedule?.face_count ?? -1, {
    id: 'schedule',
    header: 'Roof schedule',
    sortFn: 'alphanumeric',
    cell: (info) => {
      const schedule = info.row.original.schedule;
      return schedule ? (
        <span className="whitespace-nowrap">
          v{schedule.version} · {schedule.face_count} {schedule.face_count === 1 ? 'face' : 'faces'}
        </span>
      ) : (
        <span className="text-ink-600">Not yet</span>
      );
    },
  }),
  helper.accessor('estimate_count', { header: 'Estimates', sortFn: 'alphanumeric' }),
  helper.accessor('updated_at', {
    header: 'Last change',
    sortFn: 'text',
    cell: (info) => <span className="whitespace-nowrap">{formatDate(info.getValue())}</span>,
  }),
]);

/** Every site of the firm: searched on the server, sorted by any column in the browser. */
export function ProjectsList() {
  const searchId = useId();
  const [search, setSearch] = useState('');
  const [showArchived, setShowArchived] = useState(false);
  const [page, setPage] = useState(1);
  const q = useDebouncedValue(search.trim());
  const filters = useMemo(() => ({ q: q || undefined, archived: showArchived ? ('all' as const) : ('false' as const), page, page_size: PAGE_SIZE }), [q, showArchived, page]);
  const projects = useProjects(filters);
  const pages = projects.data ? Math.max(1, Math.ceil(projects.data.total / PAGE_SIZE)) : 1;

  return (
    <section aria-label="Sites" className="space-y-4">
      <div className="flex flex-wrap items-end gap-4">
        <div className="min-w-60 flex-1">
          <label htmlFor={searchId} className="mb-1.5 block font-medium">
            Search sites
          </label>
          <input
            id={searchId}
            type="search"
            value={search}
            placeholder="Name, reference, address or contact"
            onChange={(event) => {
              setSearch(event.target.value);
              setPage(1);
            }}
            className="block min-h-tap w-full rounded-md border border-ink-300 bg-white px-3"
          />
        </div>
        <label className="inline-flex min-h-tap items-center gap-2 font-medium">
          <input
            type="checkbox"
            checked={showArchived}
            onChange={(event) => {
              setShowArchived(event.target.checked);
              setPage(1);
            }}
            className="h-5 w-5 accent-clay-600"
          />
          Include archived sites
        </label>
        {projects.isFetching && !projects.isPending ? <Spinner label="Updating the list" /> : null}
      </div>

      {projects.isPending ? (
        <SkeletonBlock label="Loading the sites" lines={5} />
      ) : projects.isError ? (
        <ErrorAlert error={projects.error} title="The sites could not be loaded" onRetry={() => void projects.refetch()} />
      ) : (
        <>
          <DataTable
            caption={q ? `Sites matching “${q}”` : 'Sites'}
            captionHidden
            columns={columns}
            data={projects.data.projects}
            getRowId={(row) => String(row.id)}
            minWidthClass="min-w-[52rem]"
            empty={
              q ? (
                <EmptyState title={`No site matches “${q}”`}>Try fewer letters, or include archived sites.</EmptyState>
              ) : (
                <EmptyState
                  title="No sites yet"
                  action={
                    <Link to="/sites/new" className={buttonClasses('primary')}>
                      Add the first site
                    </Link>
                  }
                >
                  A site holds the roof schedule, the estimates and the orders for one job.
                </EmptyState>
              )
            }
          />
          <div className="flex flex-wrap items-center justify-between gap-3 text-sm text-ink-700">
            <p aria-live="polite">{projects.data.total === 0 ? 'No sites' : `${projects.data.total} ${projects.data.total === 1 ? 'site' : 'sites'}${pages > 1 ? ` · page ${page} of ${pages}` : ''}`}</p>
            {pages > 1 ? (
              <div className="flex gap-2">
                <Button variant="secondary" disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
                  Previous page
                </Button>
                <Button variant="secondary" disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>
                  Next page
                </Button>
              </div>
            ) : null}
          </div>
        </>
      )}
    </section>
  );
}
