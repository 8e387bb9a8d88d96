import { useEffect, useState, type ReactNode } from 'react';
import {
  createColumnHelper,
  rowPaginationFeature,
  rowSortingFeature,
  tableFeatures,
  useTable,
  type ColumnDef,
  type PaginationState,
  type SortingState,
  type Updater,
  type RowData,
} from '@tanstack/react-table';
import { Alert } from './alert';
import { Button } from './button';
import { SelectField, type SelectOption } from './select-field';
import { TextField } from './text-field';
import type { TableSearchParams } from './use-table-search-params';

/**
 * The table features every DataTable uses (TanStack Table v9 API, see
 * docs/decisions/010-data-table-on-table-v9-with-url-state.md): sorting and pagination, both manual
 * (the server sorts and pages), state owned by the URL.
 */
export const dataTableFeatures = tableFeatures({ rowSortingFeature, rowPaginationFeature });
export type DataTableFeatures = typeof dataTableFeatures;
export type DataTableColumn<T extends RowData> = ColumnDef<DataTableFeatures, T, any>;

/**
 * Column helper for DataTable columns:
 * `const col = dataTableColumnHelper<StockRow>(); const columns = col.columns([col.accessor('order', { header: 'Order' })]);`
 * Columns are sortable unless `enableSorting: false`; keep `columns` at module scope.
 */
export function dataTableColumnHelper<T extends RowData>() {
  return createColumnHelper<DataTableFeatures, T>();
}

/**
 * A filter control above the table, bound to one URL search param. `width` 'narrow'
 * suits numbers (order from/to), 'wide' free text; the default fits most selects.
 */
export type DataTableFilter =
  | { id: string; label: string; kind: 'text'; placeholder?: string; width?: FilterWidth }
  | { id: string; label: string; kind: 'number'; placeholder?: string; width?: FilterWidth }
  | { id: string; label: string; kind: 'select'; options: readonly SelectOption[]; anyLabel?: string; width?: FilterWidth };
export type FilterWidth = 'narrow' | 'normal' | 'wide';
const filterWidth: Record<FilterWidth, string> = { narrow: 'w-28', normal: 'min-w-40', wide: 'min-w-64' };

export interface DataTableProps<T extends RowData> {
  /** Accessible name of the table (rendered as its caption, visually hidden unless `showCaption`). */
  label: string;
  showCaption?: boolean;
  columns: readonly DataTableColumn<T>[];
  /** The current page of rows from the server. Pass a stable empty array while loading. */
  rows: readonly T[];
  /** Total number of rows matching the filters (from the server). */
  total: number | undefined;
  /** From useTableSearchParams: the URL-held query and its setters. */
  params: TableSearchParams;
  filters?: readonly DataTableFilter[];
  getRowId?: (row: T) => string;
  loading?: boolean;
  error?: unknown;
  /** Shown instead of the table when there are no rows and nothing is loading. */
  empty?: ReactNode;
  /** Makes each row activatable (click, Enter or Space) e.g. to open a detail drawer. */
  onRowActivate?: (row: T) => void;
}

const noRows: never[] = [];

/** A list query whose answer is one page, `{ items, total }` (the server's pageOf). */
export interface PageQuery<T> {
  data?: { items: readonly T[]; total: number };
  isFetching: boolean;
  error: unknown;
}

/**
 * The DataTable props a page query fills in: its rows (a stable empty array while loading),
 * total, loading and error, and rows keyed by their id.
 * `<DataTable label="Puzzles" columns={columns} params={params} {...pageQueryProps(list)} />`.
 */
export function pageQueryProps<T extends { id: string | number }>(query: PageQuery<T>) {
  return {
    rows: query.data?.items ?? noRows,
    total: query.data?.total,
    loading: query.isFetching,
    error: query.error,
    getRowId: (row: T) => String(row.id),
  };
}

/** True when a row event started on a control inside the row (checkbox, link, button): that control handles it, not the row. */
function fromControlInside(event: React.SyntheticEvent): boolean {
  const target = event.target as Element | null;
  const control = target?.closest?.('a, button, input, select, textarea, label, [role="button"], [role="checkbox"]');
  return Boolean(control && control !== event.currentTarget && event.currentTarget.contains(control));
}

/**
 * A real list: server-side sort, filter and pagination, all held in the URL so a view
 * can be bookmarked and shared. The server must answer `{ items, total }` for
 * `?page&pageSize&sort(-id for descending)&<filters>` (toListSearch builds that).
 */
export function DataTable<T extends RowData>({
  label,
  showCaption = false,
  columns,
  rows,
  total,
  params,
  filters = [],
  getRowId,
  loading = false,
  error,
  empty,
  onRowActivate,
}: DataTableProps<T>) {
  const { query } = params;
  const sorting: SortingState = query.sort ? [{ id: query.sort, desc: query.desc }] : [];
  const pagination: PaginationState = { pageIndex: query.page - 1, pageSize: query.pageSize };
  const table = useTable({
    features: dataTableFeatures,
    columns: columns as DataTableColumn<T>[],
    data: (rows as T[]) ?? noRows,
    ...(getRowId ? { getRowId: (row: T) => getRowId(row) } : {}),
    rowCount: total ?? 0,
    manualSorting: true,
    manualPagination: true,
    enableMultiSort: false,
    state: { sorting, pagination },
    onSortingChange: (updater: Updater<SortingState>) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      const first = next[0];
      params.setSort(first ? { id: first.id, desc: first.desc } : undefined);
    },
    onPaginationChange: (updater: Updater<PaginationState>) => {
      const next = typeof updater === 'function' ? updater(pagination) : updater;
      if (next.pageSize !== pagination.pageSize) params.setPageSize(next.pageSize);
      else params.setPage(next.pageIndex + 1);
    },
  });
  const pageCount = Math.max(1, Math.ceil((total ?? 0) / query.pageSize));
  const firstRow = total ? (query.page - 1) * query.pageSize + 1 : 0;
  const lastRow = Math.min(total ?? 0, query.page * query.pageSize);
  const showEmpty = !loading && !error && rows.length === 0 && empty;

  return (
    <div className="flex flex-col gap-3">
      {filters.length > 0 ? (
        <div role="search" aria-label={`Filter ${label}`} className="flex flex-wrap items-end gap-3">
          {filters.map((f) => (
            <FilterControl key={f.id} filter={f} value={query.filters[f.id] ?? ''} onChange={(v) => params.setFilter(f.id, v)} />
          ))}
        </div>
      ) : null}
      {error ? (
        <Alert tone="danger" title={`Could not load ${label.toLowerCase()}`}>
          {error instanceof Error ? error.message : 'Unknown error'}
        </Alert>
      ) : null}
      {showEmpty ? (
        empty
      ) : (
        <div className="overflow-x-auto rounded-lg border border-rule bg-surface">
          <table className="w-full border-collapse text-sm tabular-nums" aria-busy={loading || undefined}>
            <caption className={showCaption ? 'px-3 py-2 text-left font-semibold' : 'sr-only'}>{label}</caption>
            <thead className="bg-paper-deep text-left">
              {table.getHeaderGroups().map((group) => (
                <tr key={group.id}>
                  {group.headers.map((header) => {
                    const sorted = header.column.getIsSorted();
                    const canSort = header.column.getCanSort();
                    return (
                      <th
                        key={header.id}
                        scope="col"
                        aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : canSort ? 'none' : undefined}
                        className="border-b border-rule px-3 py-2 font-semibold whitespace-nowrap text-ink"
                      >
                        {header.isPlaceholder ? null : canSort ? (
                          <button
                            type="button"
                            onClick={header.column.getToggleSortingHandler()}
                            className="inline-flex items-center gap-1 rounded-sm hover:text-accent-strong focus-visible:outline-2 focus-visible:outline-focus"
                          >
                            <table.FlexRender header={header} />
                            <span aria-hidden className="text-ink-faint">
                              {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                            </span>
                          </button>
                        ) : (
                          <table.FlexRender header={header} />
                        )}
                      </th>
                    );
                  })}
                </tr>
              ))}
            </thead>
            <tbody>
              {table.getRowModel().rows.map((row) => (
                <tr
                  key={row.id}
                  className={`border-b border-rule last:border-b-0 ${onRowActivate ? 'cursor-pointer hover:bg-paper focus-visible:outline-2 focus-visible:outline-focus' : ''}`}
                  {...(onRowActivate
                    ? {
                        tabIndex: 0,
                        onClick: (e: React.MouseEvent) => {
                          if (!fromControlInside(e)) onRowActivate(row.original);
                        },
                        onKeyDown: (e: React.KeyboardEvent) => {
                          if ((e.key === 'Enter' || e.key === ' ') && !fromControlInside(e)) {
                            e.preventDefault();
                            onRowActivate(row.original);
                          }
                        },
                      }
                    : {})}
                >
                  {row.getAllCells().map((cell) => (
                    <td key={cell.id} className="px-3 py-2 align-middle text-ink">
                      <table.FlexRender cell={cell} />
                    </td>
                  ))}
                </tr>
              ))}
              {loading && rows.length === 0 ? (
                <tr>
                  <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-muted">
                    Loading…
                  </td>
                </tr>
              ) : null}
            </tbody>
          </table>
        </div>
      )}
      <nav aria-label={`${label} pages`} className="flex flex-wrap items-center justify-between gap-3 text-sm text-ink-muted">
        <p className="tabular-nums" aria-live="polite">
          {total === undefined ? '' : total === 0 ? 'No rows' : `${firstRow}–${lastRow} of ${total}`}
        </p>
        <div className="flex items-center gap-2">
          <label className="flex items-center gap-2">
            Rows per page
            <select
              value={query.pageSize}
              onChange={(e) => table.setPageSize(Number(e.target.value))}
              className="h-8 rounded-md border border-rule-strong bg-surface px-2 text-ink focus-visible:outline-2 focus-visible:outline-focus"
            >
              {params.pageSizes.map((n) => (
                <option key={n} value={n}>
                  {n}
                </option>
              ))}
            </select>
          </label>
          <Button size="sm" onClick={() => table.previousPage()} disabled={query.page <= 1}>
            Previous
          </Button>
          <span className="tabular-nums">
            Page {query.page} of {pageCount}
          </span>
          <Button size="sm" onClick={() => table.nextPage()} disabled={query.page >= pageCount}>
            Next
          </Button>
        </div>
      </nav>
    </div>
  );
}

function FilterControl({ filter, value, onChange }: { filter: DataTableFilter; value: string; onChange: (v: string) => void }) {
  if (filter.kind === 'select') {
    return (
      <SelectField
        label={filter.label}
        options={filter.options}
        placeholder={filter.anyLabel ?? 'Any'}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        className={filterWidth[filter.width ?? 'normal']}
      />
    );
  }
  if (filter.kind === 'number') {
    return <DebouncedText label={filter.label} placeholder={filter.placeholder} value={value} onChange={onChange} className={filterWidth[filter.width ?? 'narrow']} wholeNumber />;
  }
  return <DebouncedText label={filter.label} placeholder={filter.placeholder} value={value} onChange={onChange} className={filterWidth[filter.width ?? 'wide']} />;
}

/** Text filter that writes to the URL 300 ms after typing stops. */
function DebouncedText({ label, placeholder, value, onChange, className, wholeNumber = false }: { label: string; placeholder?: string | undefined; value: string; onChange: (v: string) => void; className: string; wholeNumber?: boolean }) {
  const [draft, setDraft] = useState(value);
  // a number filter says what is wrong beside the field and sends nothing until it reads as a whole number
  const invalid = wholeNumber && !/^\d{0,12}$/.test(draft.trim());
  const [seen, setSeen] = useState(value);
  if (value !== seen) {
    // the URL changed from elsewhere (back button, clear): follow it
    setSeen(value);
    setDraft(value);
  }
  useEffect(() => {
    if (draft === value || invalid) return;
    const timer = setTimeout(() => onChange(wholeNumber ? draft.trim() : draft), 300);
    return () => clearTimeout(timer);
  }, [draft, value, onChange, invalid, wholeNumber]);
  return (
    <TextField
      type="search"
      inputMode={wholeNumber ? 'numeric' : undefined}
      label={label}
      placeholder={placeholder}
      value={draft}
      onChange={(e) => setDraft(e.target.value)}
      className={className}
      error={invalid ? 'a whole number, e.g. 12' : undefined}
    />
  );
}
