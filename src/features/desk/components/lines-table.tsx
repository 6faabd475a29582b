import type { ReactNode } from 'react';

export interface LinesTableColumn {
  heading: string;
  /** Figures are set to the right, under a right-aligned heading. */
  numeric?: boolean;
}

/**
 * The table of an order's lines on a desk form, one row per line with inputs in its cells. It is wider
 * than a phone, so it scrolls sideways as a labelled region that takes focus, so keyboard users can
 * scroll it too. `minWidthClass` is a literal class (min-w-[44rem]) so the style build sees it.
 */
export function LinesTable({ caption, minWidthClass, columns, children }: { caption: string; minWidthClass: string; columns: readonly LinesTableColumn[]; children: ReactNode }) {
  return (
    <div className="overflow-x-auto rounded-md border border-mortar-300 bg-white" role="region" aria-label={caption} tabIndex={0}>
      <table className={`w-full ${minWidthClass} border-collapse text-left text-sm`}>
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-mortar-100">
          <tr>
            {columns.map((c) => (
              <th key={c.heading} scope="col" className={c.numeric ? 'px-3 py-2 text-right' : 'px-3 py-2'}>
                {c.heading}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  );
}
