import { lazy, Suspense, useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { ProjectSummary } from '../../../../shared/schemas/project.schema';
import type { ProjectSearch } from '../../../../shared/schemas/list-search.schema';
import { SearchBarLoading } from '../../../components/form/search-bar-loading';
import { ErrorAlert } from '../../../components/ui/alert';
import { Button, buttonClasses } from '../../../components/ui/button';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { EmptyState } from '../../../components/ui/empty-state';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { formatDate } from '../../../lib/format';
import { useProjects } from '../api/get-projects';
import { useDebouncedValue } from '../lib/use-debounced-value';

/** The search bar (the form library with it) loads after the list's own code, while the sites are asked for. */
const SiteSearch = lazy(() => import('./site-search').then((m) => ({ default: m.SiteSearch })));

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
  const [page, setPage] = useState(1);
  const [search, setSearch] = useState<ProjectSearch>({ q: undefined, archived: 'false' });
  const q = useDebouncedValue(search.q ?? '');
  const filters = useMemo(() => ({ q: q || undefined, archived: search.archived, page, page_size: PAGE_SIZE }), [q, search.archived, page]);
  const projects = useProjects(filters);
  const pages = projects.data ? Math.max(1, Math.ceil(projects.data.total / PAGE_SIZE)) : 1;

  return (
    <section aria-label="Sites" className="space-y-4">
      <Suspense fallback={<SearchBarLoading label="Loading the search…" />}>
        <SiteSearch onSearch={setSearch} onFilterChange={() => setPage(1)} updating={projects.isFetching && !projects.isPending} />
      </Suspense>

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
