import { describe, expect, it } from 'vitest';
import { parseTableQuery, toListSearch } from '../../../src/components/use-table-search-params';

describe('list queries held in the URL', () => {
  const options = { filterKeys: ['q', 'order'], defaultSort: { id: 'createdAt', desc: true } };

  it('reads page, size, sort with direction, and only the known non-empty filters', () => {
    const q = parseTableQuery(new URLSearchParams('page=3&pageSize=50&sort=-order&q=%20perfect%20&order=&other=1'), options);
    expect(q).toEqual({ page: 3, pageSize: 50, sort: 'order', desc: true, filters: { q: 'perfect' } });
  });

  it('falls back to defaults on junk instead of failing', () => {
    const q = parseTableQuery(new URLSearchParams('page=-2&pageSize=7&sort=drop%20table'), options);
    expect(q).toEqual({ page: 1, pageSize: 25, sort: 'createdAt', desc: true, filters: {} });
  });

  it('writes the API search params the list endpoints read', () => {
    expect(toListSearch({ page: 2, pageSize: 25, sort: 'order', desc: false, filters: { q: 'x' } })).toEqual({ page: 2, pageSize: 25, sort: 'order', q: 'x' });
    expect(toListSearch({ page: 1, pageSize: 10, sort: 'width', desc: true, filters: {} })).toEqual({ page: 1, pageSize: 10, sort: '-width' });
  });
});
