import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';

/** A list request as the URL holds it: 1-based page, page size, sort column with direction, filters. */
export interface TableQuery {
  page: number;
  pageSize: number;
  /** Column id to sort by, or undefined for the server's default order. */
  sort: string | undefined;
  desc: boolean;
  /** Filter values by key (only non-empty ones). */
  filters: Record<string, string>;
}

export interface TableSearchParamsOptions {
  /** Search-param names that are filters (e.g. ['q', 'order', 'state']). */
  filterKeys?: readonly string[];
  defaultPageSize?: number;
  defaultSort?: { id: string; desc: boolean };
  /** Allowed page sizes; anything else in the URL falls back to the default. */
  pageSizes?: readonly number[];
}

export interface TableSearchParams {
  query: TableQuery;
  pageSizes: readonly number[];
  setPage: (page: number) => void;
  setPageSize: (size: number) => void;
  setSort: (sort: { id: string; desc: boolean } | undefined) => void;
  setFilter: (key: string, value: string) => void;
}

export const defaultPageSizes: readonly number[] = [10, 25, 50, 100];

/**
 * Parses a list's sort, filter and page from URL search params (`?page=2&pageSize=25&
 * sort=-createdAt&order=13`), tolerating junk, and writes changes back. Pass
 * `toListSearch(query)` to the list endpoint's fetcher, and `params` to DataTable.
 */
export function parseTableQuery(search: URLSearchParams, options: TableSearchParamsOptions = {}): TableQuery {
  const pageSizes = options.pageSizes ?? defaultPageSizes;
  const defaultPageSize = options.defaultPageSize ?? pageSizes[1] ?? 25;
  const pageRaw = Number(search.get('page'));
  const page = Number.isInteger(pageRaw) && pageRaw >= 1 ? pageRaw : 1;
  const sizeRaw = Number(search.get('pageSize'));
  const pageSize = pageSizes.includes(sizeRaw) ? sizeRaw : defaultPageSize;
  const sortRaw = search.get('sort');
  let sort = options.defaultSort?.id;
  let desc = options.defaultSort?.desc ?? false;
  if (sortRaw && /^-?[A-Za-z][A-Za-z0-9_.]*$/.test(sortRaw)) {
    desc = sortRaw.startsWith('-');
    sort = desc ? sortRaw.slice(1) : sortRaw;
  }
  const filters: Record<string, string> = {};
  for (const key of options.filterKeys ?? []) {
    const value = search.get(key)?.trim();
    if (value) filters[key] = value;
  }
  return { page, pageSize, sort, desc, filters };
}

/** The query as flat API search params: `{ page, pageSize, sort: '-createdAt', ...filters }`. */
export function toListSearch(query: TableQuery): Record<string, string | number> {
  const out: Record<string, string | number> = { page: query.page, pageSize: query.pageSize, ...query.filters };
  if (query.sort) out.sort = query.desc ? `-${query.sort}` : query.sort;
  return out;
}

/** React hook over parseTableQuery + setters that update the URL (filters reset the page). */
export function useTableSearchParams(options: TableSearchParamsOptions = {}): TableSearchParams {
  const [search, setSearch] = useSearchParams();
  const { filterKeys, defaultPageSize, defaultSort, pageSizes } = options;
  // Options are usually inline literals: key the memo on their content, not identity.
  const searchKey = search.toString();
  const filterKey = (filterKeys ?? []).join(',');
  const sizesKey = (pageSizes ?? []).join(',');
  const sortId = defaultSort?.id;
  const sortDesc = defaultSort?.desc;
  const query = useMemo(
    () =>
      parseTableQuery(new URLSearchParams(searchKey), {
        filterKeys: filterKey ? filterKey.split(',') : [],
        defaultPageSize,
        defaultSort: sortId === undefined ? undefined : { id: sortId, desc: sortDesc ?? false },
        pageSizes: sizesKey ? sizesKey.split(',').map(Number) : undefined,
      }),
    [searchKey, filterKey, sizesKey, defaultPageSize, sortId, sortDesc],
  );
  const update = useCallback(
    (change: (next: URLSearchParams) => void, replace = false) => {
      setSearch(
        (prev) => {
          const next = new URLSearchParams(prev);
          change(next);
          return next;
        },
        { replace },
      );
    },
    [setSearch],
  );
  return {
    query,
    pageSizes: pageSizes ?? defaultPageSizes,
    setPage: (page) => update((next) => (page <= 1 ? next.delete('page') : next.set('page', String(page)))),
    setPageSize: (size) =>
      update((next) => {
        next.set('pageSize', String(size));
        next.delete('page');
      }),
    setSort: (sort) =>
      update((next) => {
        if (sort) next.set('sort', sort.desc ? `-${sort.id}` : sort.id);
        else next.delete('sort');
        next.delete('page');
      }),
    setFilter: (key, value) =>
      update((next) => {
        if (value.trim()) next.set(key, value);
        else next.delete(key);
        next.delete('page');
      }, true),
  };
}
