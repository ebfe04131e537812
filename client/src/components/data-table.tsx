import {
  type ColumnDef,
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createSortedRowModel,
  filterFn_includesString,
  globalFilteringFeature,
  type RowData,
  rowSortingFeature,
  type SortingState,
  sortFn_alphanumeric,
  sortFn_basic,
  sortFn_datetime,
  sortFn_text,
  tableFeatures,
  useTable,
} from '@tanstack/react-table';
import { type ReactNode, useId } from 'react';
import { Link } from 'react-router-dom';

/** Client-side sorting and a text filter over every column: lists here are small. */
const features = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text, basic: sortFn_basic, datetime: sortFn_datetime },
  columnFilteringFeature,
  globalFilteringFeature,
  filteredRowModel: createFilteredRowModel(),
  filterFns: { includesString: filterFn_includesString },
});

export type DataTableFeatures = typeof features;
// biome-ignore lint/suspicious/noExplicitAny: column value types differ per column, as in TanStack's own ColumnDef arrays
export type DataTableColumns<Row extends RowData> = ColumnDef<DataTableFeatures, Row, any>[];

/** Column builder for a DataTable over rows of type Row. */
export function tableColumns<Row extends RowData>() {
  return createColumnHelper<DataTableFeatures, Row>();
}

/** Rows are records with an id, which keeps a row's identity across sorting and refetches. */
type Identified = RowData & { id: number | string };
const rowId = (row: Identified) => String(row.id);

interface DataTableProps<Row extends Identified> {
  /** Keep stable across renders (module scope or useMemo). */
  columns: DataTableColumns<Row>;
  data: Row[];
  /** Accessible name of the table, e.g. "Projects". */
  caption: string;
  initialSorting?: SortingState;
}

const SORT_WORD = { asc: 'ascending', desc: 'descending' } as const;

export function DataTable<Row extends Identified>({ columns, data, caption, initialSorting = [] }: DataTableProps<Row>) {
  const filterId = useId();
  const table = useTable({
    features,
    columns,
    data,
    getRowId: rowId,
    globalFilterFn: 'includesString',
    initialState: { sorting: initialSorting, globalFilter: '' },
  });
  const rows = table.getRowModel().rows;
  const filter = String(table.state.globalFilter ?? '');

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <div className="flex min-w-0 grow flex-col gap-1 sm:max-w-sm">
          <label htmlFor={filterId} className="font-semibold">
            Filter {caption.toLowerCase()}
          </label>
          <input
            id={filterId}
            type="search"
            value={filter}
            onChange={(e) => table.setGlobalFilter(e.target.value)}
            className="min-h-touch rounded-md border-2 border-neutral-700 px-3 text-base"
            placeholder="Type to narrow the list"
          />
        </div>
        <p className="text-neutral-800" aria-live="polite">
          <span className="font-mono">{rows.length}</span> of <span className="font-mono">{data.length}</span> shown
        </p>
      </div>
      <div className="overflow-x-auto rounded-md border-2 border-neutral-300">
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">{caption}</caption>
          <thead className="bg-neutral-100">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const canSort = header.column.getCanSort();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted ? SORT_WORD[sorted] : undefined}
                      className="border-b-2 border-neutral-300 p-0 font-semibold whitespace-nowrap"
                    >
                      {header.isPlaceholder ? null : canSort ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="flex min-h-touch w-full items-center gap-1 px-3 text-left hover:bg-neutral-200"
                        >
                          <table.FlexRender header={header} />
                          <span aria-hidden="true" className="font-mono">
                            {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                          </span>
                        </button>
                      ) : (
                        <span className="flex min-h-touch items-center px-3">
                          <table.FlexRender header={header} />
                        </span>
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.id} className="border-b border-neutral-300 last:border-b-0 hover:bg-neutral-50">
                {row.getAllCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-2 align-middle">
                    <table.FlexRender cell={cell} />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
        {rows.length === 0 && <p className="p-4 text-neutral-800">Nothing matches “{filter}”.</p>}
      </div>
    </div>
  );
}

/** The link that opens a row's page; a full-height touch target. */
export function CellLink({ to, mono = false, children }: { to: string; mono?: boolean; children: ReactNode }) {
  return (
    <Link to={to} className={`inline-flex min-h-touch items-center font-bold underline underline-offset-4 ${mono ? 'font-mono' : ''}`}>
      {children}
    </Link>
  );
}

/** A number or date in the monospace face so digits line up down the column. */
export function MonoCell({ children }: { children: ReactNode }) {
  return <span className="font-mono whitespace-nowrap">{children}</span>;
}
