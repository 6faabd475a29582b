import { useSearchParams } from 'react-router-dom';
import { Button } from './button';

export type SortDir = 'asc' | 'desc';

/**
 * A list whose filters, sort and page live in the address (reload, a shared link and Back all show
 * the same page). `set` changes some keys, drops empty ones, and goes back to page 1 unless told not
 * to: another filter or sort puts other rows on page 2. `step: true` makes the change a step of its
 * own in the history; otherwise it replaces the current one.
 */
export function useListAddress() {
  const [search, setSearch] = useSearchParams();
  const set = (changes: Record<string, string | undefined>, { resetPage = true, step = false } = {}) => {
    const next = new URLSearchParams(search);
    for (const [k, v] of Object.entries(changes)) {
      if (v === undefined || v === '') next.delete(k);
      else next.set(k, v);
    }
    if (resetPage) next.delete('page');
    setSearch(next, { replace: !step });
  };
  return { search, setSearch, set };
}

/** What survives "Clear the filters": how someone likes a list ordered and paged is not a filter. */
export function keepListOrder(search: URLSearchParams): URLSearchParams {
  const kept = new URLSearchParams();
  for (const key of ['sort', 'dir', 'page_size']) {
    const value = search.get(key);
    if (value) kept.set(key, value);
  }
  return kept;
}

export interface SortChoice<S extends string> {
  value: string;
  sort: S;
  dir: SortDir;
  label: string;
}

/** Every sort a list offers, in both directions, worded ("newest asked first") for a select and a count line. */
export function sortChoices<S extends string>(sorts: readonly S[], words: Record<S, Partial<Record<SortDir, string>>>): SortChoice<S>[] {
  return sorts.flatMap((sort) => (Object.keys(words[sort]) as SortDir[]).map((dir) => ({ value: `${sort}:${dir}`, sort, dir, label: words[sort][dir]! })));
}

/**
 * The sort as a select, for phones: most column headers are off to the side of the scrolling table
 * there, so the sort is offered beside the filters too (hidden from small screens up).
 */
export function PhoneSortSelect<S extends string>({
  id,
  choices,
  sort,
  dir,
  onChoose,
  labelClass = 'mb-1 block text-sm font-medium',
}: {
  id: string;
  choices: SortChoice<S>[];
  sort: S;
  dir: SortDir;
  onChoose: (sort: S, dir: SortDir) => void;
  labelClass?: string;
}) {
  return (
    <div className="sm:hidden">
      <label htmlFor={id} className={labelClass}>
        Sort
      </label>
      <select
        id={id}
        value={`${sort}:${dir}`}
        onChange={(e) => {
          const choice = choices.find((c) => c.value === e.target.value);
          if (choice) onChoose(choice.sort, choice.dir);
        }}
        className="block min-h-tap rounded-md border border-ink-300 bg-white px-2"
      >
        {choices.map((c) => (
          <option key={c.value} value={c.value}>
            {c.label.charAt(0).toUpperCase() + c.label.slice(1)}
          </option>
        ))}
      </select>
    </div>
  );
}

/**
 * Previous / next with "Page X of Y" (Y+ when the count is capped). Shown when there is more than one
 * page, or when the address is already past the first (so one can always get back).
 */
export function ListPager({ label, page, pages, capped = false, onPage }: { label: string; page: number; pages: number; capped?: boolean; onPage: (page: number) => void }) {
  if (pages <= 1 && page <= 1) return null;
  return (
    <nav aria-label={label} className="flex flex-wrap items-center gap-3">
      <Button variant="secondary" disabled={page <= 1} onClick={() => onPage(page - 1)}>
        Previous page
      </Button>
      <span className="text-sm">
        Page {page} of {capped ? `${pages}+` : pages}
      </span>
      <Button variant="secondary" disabled={page >= pages && !capped} onClick={() => onPage(page + 1)}>
        Next page
      </Button>
    </nav>
  );
}
