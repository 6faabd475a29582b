import type { ReactNode } from 'react';

export interface LinesTableColumn {
  heading: ReactNode;
  /** Figures are set to the right, under a right-aligned heading. */
  numeric?: boolean;
}

/**
 * A table of an order's or a quote's lines, one row per line (often with inputs in its cells). It is
 * wider than a phone, so it scrolls sideways as a labelled region that takes focus, and keyboard users
 * can scroll it too. `minWidthClass` is a literal class (min-w-[44rem]) so the style build sees it.
 */
export function LinesTable({
  caption,
  regionLabel = caption,
  minWidthClass,
  columns,
  children,
  foot,
}: {
  caption: string;
  /** The scrolling region's name, when it is shorter than the caption. */
  regionLabel?: string;
  minWidthClass: string;
  columns: readonly LinesTableColumn[];
  children: ReactNode;
  foot?: ReactNode;
}) {
  return (
    <div className="overflow-x-auto rounded-md border border-mortar-300 bg-white" role="region" aria-label={regionLabel} tabIndex={0}>
      <table className={`w-full ${minWidthClass} border-collapse text-left text-sm`}>
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-mortar-100">
          <tr>
            {columns.map((c, i) => (
              <th key={i} scope="col" className={c.numeric ? 'px-3 py-2 text-right' : 'px-3 py-2'}>
                {c.heading}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>{children}</tbody>
        {foot ? <tfoot>{foot}</tfoot> : null}
      </table>
    </div>
  );
}
