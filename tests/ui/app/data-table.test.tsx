import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { describe, expect, it } from 'vitest';
import { DataTable, dataTableColumnHelper } from '../../../src/components/data-table';
import { useTableSearchParams } from '../../../src/components/use-table-search-params';

type Row = { id: string; order: number; size: string };
const col = dataTableColumnHelper<Row>();
const columns = col.columns([
  col.accessor('order', { header: 'Order' }),
  col.accessor('size', { header: 'Size', enableSorting: false }),
]);
const rows: Row[] = [
  { id: 'a', order: 9, size: '33 x 32' },
  { id: 'b', order: 10, size: '65 x 47' },
];

function Harness() {
  const params = useTableSearchParams({ filterKeys: ['state'] });
  return (
    <DataTable
      label="Stock"
      columns={columns}
      rows={rows}
      total={60}
      params={params}
      getRowId={(r) => r.id}
      filters={[{ id: 'state', label: 'State', kind: 'select', options: [{ value: 'new', label: 'New' }] }]}
    />
  );
}

function renderAt(path: string) {
  const router = createMemoryRouter([{ path: '/stock', element: <Harness /> }], { initialEntries: [path] });
  render(<RouterProvider router={router} />);
  return router;
}

describe('DataTable', () => {
  it('shows the server page and writes sort, page and filter changes to the URL', async () => {
    const user = userEvent.setup();
    const router = renderAt('/stock?page=2&pageSize=25');
    const table = screen.getByRole('table', { name: 'Stock' });
    expect(within(table).getAllByRole('row')).toHaveLength(3);
    expect(screen.getByText('26–50 of 60')).toBeTruthy();
    expect(screen.getByText('Page 2 of 3')).toBeTruthy();

    await user.click(screen.getByRole('button', { name: 'Next' }));
    expect(new URLSearchParams(router.state.location.search).get('page')).toBe('3');
    expect((screen.getByRole('button', { name: 'Next' }) as HTMLButtonElement).disabled).toBe(true);

    await user.click(within(table).getByRole('button', { name: /Order/ }));
    const afterSort = new URLSearchParams(router.state.location.search);
    expect(afterSort.get('sort')).toMatch(/^-?order$/);
    expect(afterSort.get('page')).toBeNull();
    expect(within(table).getByRole('columnheader', { name: /Order/ }).getAttribute('aria-sort')).toMatch(/ascending|descending/);
    expect(within(table).queryByRole('button', { name: /Size/ })).toBeNull();

    await user.selectOptions(screen.getByLabelText('State'), 'new');
    expect(new URLSearchParams(router.state.location.search).get('state')).toBe('new');
  });
});

describe('DataTable rows', () => {
  it('activate on click or Enter, but not when a control inside the row is used', async () => {
    const activated: string[] = [];
    const withBox = col.columns([
      col.display({ id: 'pick', header: 'Pick', cell: (c) => <input type="checkbox" aria-label={`Pick ${c.row.original.id}`} /> }),
      col.accessor('order', { header: 'Order' }),
    ]);
    function Rows() {
      const params = useTableSearchParams();
      return <DataTable label="Stock" columns={withBox} rows={rows} total={2} params={params} getRowId={(r) => r.id} onRowActivate={(r) => activated.push(r.id)} />;
    }
    const router = createMemoryRouter([{ path: '/', element: <Rows /> }]);
    render(<RouterProvider router={router} />);
    const user = userEvent.setup();
    await user.click(screen.getByLabelText('Pick a'));
    expect(activated).toEqual([]);
    const table = screen.getByRole('table', { name: 'Stock' });
    await user.click(within(table).getByText('10'));
    expect(activated).toEqual(['b']);
    within(table).getByText('9').closest('tr')?.focus();
    await user.keyboard('{Enter}');
    expect(activated).toEqual(['b', 'a']);
  });
});
