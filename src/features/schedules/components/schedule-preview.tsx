import { createContext, useContext, useEffect, useId, useMemo, useRef, useState } from 'react';
import type { CSSProperties } from 'react';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import type { DataTableColumn } from '../../../components/ui/data-table';
import { Button } from '../../../components/ui/button';
import { cellKey, columnLetter, describePlace, indexProblems, normaliseHeaderCell } from '../lib/csv-grid';
import type { CsvGrid, GridCheck, LocatedProblem } from '../lib/csv-grid';

const PAGE_ROWS = 50;
const LISTED_PROBLEMS = 30;

interface PreviewRow {
  /** Spreadsheet row number (header = 1). */
  row: number;
}

interface PreviewState {
  grid: CsvGrid;
  byCell: Map<string, string[]>;
  byRow: Map<number, string[]>;
  idPrefix: string;
  onCellChange: (row: number, column: number, value: string) => void;
  /** Each column's width in characters. */
  widths: number[];
}

const PreviewContext = createContext<PreviewState | null>(null);

const STICKY_ROW = 'sticky left-0 z-10 bg-white';
/** The row column is 4rem wide plus 1rem of padding. */
const STICKY_FIRST = 'sticky left-20 z-10 bg-white';
const STICKY_SECOND = 'sticky left-(--face-left) z-10 bg-white shadow-[1px_0_0_var(--color-mortar-300)]';

function usePreview(): PreviewState {
  const state = useContext(PreviewContext);
  if (!state) throw new Error('Preview cells need the preview around them');
  return state;
}

/** Width of each column in characters: its longest value, between 5 and 40, plus room for padding. */
export function columnWidths(rows: readonly (readonly string[])[], width: number): number[] {
  return Array.from({ length: width }, (_, c) => Math.min(40, Math.max(5, ...rows.map((r) => (r[c] ?? '').length))) + 3);
}

/**
 * The columns that say which face a row is (building, face) when they lead the file: they stay in
 * view while the rest scrolls sideways. Only leading columns can stay put without covering others.
 */
export function stickyColumns(header: readonly string[]): number[] {
  const names = header.map((h) => normaliseHeaderCell(h));
  const out: number[] = [];
  for (let c = 0; c < Math.min(2, names.length); c++) {
    if (names[c] === 'building' || names[c] === 'face') out.push(c);
    else break;
  }
  return out;
}

export function cellInputId(prefix: string, row: number, column: number): string {
  return `${prefix}-r${row}-c${column}`;
}

function RowHeader({ row }: { row: number }) {
  const { byRow, idPrefix } = usePreview();
  const messages = byRow.get(row);
  return (
    <div className="w-16">
      <span className={`font-mono text-sm font-semibold ${messages ? 'text-brick-700' : 'text-ink-600'}`}>{row}</span>
      {messages ? (
        <ul id={`${idPrefix}-row-${row}-msg`} className="mt-1 space-y-0.5 text-xs font-medium break-words text-brick-700">
          {messages.map((message) => (
            <li key={message}>{message}</li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}

function CellInput({ row, column }: { row: number; column: number }) {
  const { grid, byCell, byRow, idPrefix, onCellChange, widths } = usePreview();
  const value = grid.rows[row - 1]?.[column] ?? '';
  const messages = byCell.get(cellKey(row, column));
  const header = row === 1 ? null : (grid.rows[0]?.[column] ?? '').trim();
  const id = cellInputId(idPrefix, row, column);
  const messageId = `${id}-msg`;
  const describedBy = [messages ? messageId : null, byRow.has(row) ? `${idPrefix}-row-${row}-msg` : null].filter(Boolean).join(' ') || undefined;
  const isHeader = row === 1;
  return (
    <div style={{ width: `${widths[column] ?? 6}ch` }}>
      <input
        id={id}
        value={value}
        onChange={(event) => onCellChange(row, column, event.target.value)}
        aria-label={`Row ${row}, column ${columnLetter(column)}${header ? ` (${header})` : isHeader ? ' (header)' : ''}`}
        aria-invalid={messages ? true : undefined}
        aria-describedby={describedBy}
        spellCheck={false}
        autoComplete="off"
        className={[
          'block min-h-tap w-full rounded border px-2 font-mono text-sm',
          isHeader ? 'font-semibold' : '',
          messages ? 'border-brick-600 bg-brick-50 text-brick-800 ring-1 ring-brick-600' : 'border-mortar-300 bg-white',
        ].join(' ')}
      />
      {messages ? (
        <p id={messageId} className="mt-1 text-xs font-medium break-words text-brick-700" data-testid="cell-problem">
          {messages.join('; ')}
        </p>
      ) : null}
    </div>
  );
}

const helper = dataTableColumns<PreviewRow>();

function buildColumns(width: number): DataTableColumn<PreviewRow>[] {
  return [
    helper.display({ id: 'row', header: () => <span className="sr-only">Row number</span>, cell: (info) => <RowHeader row={info.row.original.row} /> }),
    ...Array.from({ length: width }, (_, column) =>
      helper.display({
        id: `c${column}`,
        header: () => <span className="font-mono">{columnLetter(column)}</span>,
        cell: (info) => <CellInput row={info.row.original.row} column={column} />,
      }),
    ),
  ] as DataTableColumn<PreviewRow>[];
}

interface SchedulePreviewProps {
  grid: CsvGrid;
  check: GridCheck;
  /** True while the newest edit has not been checked yet. */
  checking: boolean;
  onCellChange: (row: number, column: number, value: string) => void;
}

/**
 * The file as a spreadsheet would show it (row 1 is the header, columns are lettered), every cell
 * editable in place; each rejected cell is marked and carries the reader's message.
 */
export function SchedulePreview({ grid, check, checking, onCellChange }: SchedulePreviewProps) {
  const idPrefix = useId().replace(/:/g, '');
  const [page, setPage] = useState(0);
  const [onlyProblems, setOnlyProblems] = useState(false);
  const [focusTarget, setFocusTarget] = useState<{ row: number; column: number | null } | null>(null);
  const { byCell, byRow, unplaced } = useMemo(() => indexProblems(check.problems), [check.problems]);
  const width = Math.max(1, ...grid.rows.map((row) => row.length));
  const columns = useMemo(() => buildColumns(width), [width]);

  const problemRows = useMemo(() => {
    const rows = new Set<number>();
    for (const p of check.problems) if (p.row !== null && p.row > 1) rows.add(p.row);
    return rows;
  }, [check.problems]);

  // Rows stay listed once shown, so a row does not vanish from under the cursor the moment it is fixed.
  const [listedRows, setListedRows] = useState<ReadonlySet<number>>(new Set());
  if (onlyProblems && ![...problemRows].every((row) => listedRows.has(row))) setListedRows(new Set([...listedRows, ...problemRows]));

  const dataRows = useMemo(() => {
    const all: number[] = [];
    for (let row = 2; row <= grid.rows.length; row++) if (!onlyProblems || problemRows.has(row) || listedRows.has(row)) all.push(row);
    return all;
  }, [grid.rows.length, onlyProblems, problemRows, listedRows]);
  const pages = Math.max(1, Math.ceil(dataRows.length / PAGE_ROWS));
  const shownPage = Math.min(page, pages - 1);
  const visible: PreviewRow[] = useMemo(() => [{ row: 1 }, ...dataRows.slice(shownPage * PAGE_ROWS, (shownPage + 1) * PAGE_ROWS).map((row) => ({ row }))], [dataRows, shownPage]);

  // Each "go to" focuses its cell once, after the page that shows the cell is on the screen.
  const focusedTarget = useRef<typeof focusTarget>(null);
  useEffect(() => {
    if (!focusTarget || focusedTarget.current === focusTarget) return;
    focusedTarget.current = focusTarget;
    const id = focusTarget.column === null ? null : cellInputId(idPrefix, focusTarget.row, focusTarget.column);
    const element = id ? document.getElementById(id) : document.getElementById(cellInputId(idPrefix, focusTarget.row, 0));
    element?.focus();
    element?.scrollIntoView?.({ block: 'center', inline: 'center' });
  }, [focusTarget, idPrefix, visible]);

  function goTo(problem: LocatedProblem) {
    if (problem.row === null) return;
    if (problem.row > 1) {
      const at = dataRows.indexOf(problem.row);
      if (at >= 0) setPage(Math.floor(at / PAGE_ROWS));
      else {
        setOnlyProblems(false);
        setPage(Math.floor((problem.row - 2) / PAGE_ROWS));
      }
    }
    setFocusTarget({ row: problem.row, column: problem.column });
  }

  // Each column as wide as its longest value (in characters, with room for the input's padding).
  const widths = useMemo(() => columnWidths(grid.rows, width), [grid.rows, width]);
  const sticky = useMemo(() => stickyColumns(grid.rows[0] ?? []), [grid.rows]);
  const state = useMemo(() => ({ grid, byCell, byRow, idPrefix, onCellChange, widths }), [grid, byCell, byRow, idPrefix, onCellChange, widths]);
  const placed = check.problems.filter((p) => p.row !== null && (p.row > 1 || p.column !== null));
  const faceRows = grid.rows.length - 1;

  return (
    <PreviewContext.Provider value={state}>
      <div className="space-y-4">
        <div aria-live="polite" className="text-sm font-medium text-ink-700">
          {checking ? 'Checking…' : check.ok ? `All ${check.faces.length} faces read without a problem.` : `${check.problems.length} ${check.problems.length === 1 ? 'problem' : 'problems'} to fix.`}
        </div>

        {unplaced.length > 0 ? (
          <div role="alert" className="rounded-md border-l-4 border-brick-600 bg-brick-50 px-4 py-3 text-brick-800">
            <p className="font-semibold">The file as a whole</p>
            <ul className="mt-1 list-disc space-y-1 pl-5">
              {unplaced.map((p, i) => (
                <li key={i}>
                  {describePlace(p) ? `${describePlace(p)}: ` : ''}
                  {p.message}
                </li>
              ))}
            </ul>
          </div>
        ) : null}

        {placed.length > 0 ? (
          <details open className="rounded-md border border-brick-600 bg-white px-4 py-3">
            <summary className="cursor-pointer font-semibold text-brick-800">Problems by cell (select one to go to it)</summary>
            <ul className="mt-2 space-y-1">
              {placed.slice(0, LISTED_PROBLEMS).map((p, i) => (
                <li key={i}>
                  <button type="button" onClick={() => goTo(p)} className="min-h-tap text-left text-brick-800 underline underline-offset-2 hover:text-brick-700">
                    {describePlace(p)}: {p.message}
                  </button>
                </li>
              ))}
            </ul>
            {placed.length > LISTED_PROBLEMS ? <p className="mt-2 text-sm text-ink-700">…and {placed.length - LISTED_PROBLEMS} more; fix these and the list moves on.</p> : null}
          </details>
        ) : null}

        {check.warnings.length > 0 ? (
          <ul className="space-y-1 rounded-md border-l-4 border-ochre-500 bg-ochre-50 px-4 py-3 text-ochre-800">
            {check.warnings.map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
        ) : null}

        <div className="flex flex-wrap items-center justify-between gap-3">
          <label className="inline-flex min-h-tap items-center gap-2 font-medium">
            <input
              type="checkbox"
              checked={onlyProblems}
              onChange={(event) => {
                setOnlyProblems(event.target.checked);
                setListedRows(new Set(problemRows));
                setPage(0);
              }}
              className="h-5 w-5 accent-clay-600"
            />
            Show only rows with problems
          </label>
          <p className="text-sm text-ink-600">
            {faceRows} {faceRows === 1 ? 'row' : 'rows'} under the header{normaliseHeaderCell(grid.rows[0]?.[0] ?? '') ? '' : ' (the first header cell is blank)'}
          </p>
        </div>

        {/* The row number and the leading building and face columns stay in view while the grid scrolls sideways. */}
        <div style={{ '--face-left': `calc(5rem + ${widths[0] ?? 0}ch + 1rem)` } as CSSProperties}>
          <DataTable
            caption="The schedule file: row 1 is the header; every cell can be edited"
            captionHidden
            columns={columns}
            data={visible}
            getRowId={(row) => String(row.row)}
            minWidthClass="min-w-max"
            cellPaddingClass="px-2"
            columnClassName={(id) => (id === 'row' ? STICKY_ROW : id === 'c0' && sticky.includes(0) ? STICKY_FIRST : id === 'c1' && sticky.includes(1) ? STICKY_SECOND : undefined)}
          />
        </div>

        {pages > 1 ? (
          <nav aria-label="Pages of the preview" className="flex flex-wrap items-center gap-3">
            <Button variant="secondary" disabled={shownPage === 0} onClick={() => setPage(shownPage - 1)}>
              Previous rows
            </Button>
            <span className="text-sm text-ink-700">
              Rows {dataRows[shownPage * PAGE_ROWS]}–{dataRows[Math.min(dataRows.length, (shownPage + 1) * PAGE_ROWS) - 1]} · page {shownPage + 1} of {pages}
            </span>
            <Button variant="secondary" disabled={shownPage >= pages - 1} onClick={() => setPage(shownPage + 1)}>
              Next rows
            </Button>
          </nav>
        ) : null}
      </div>
    </PreviewContext.Provider>
  );
}
