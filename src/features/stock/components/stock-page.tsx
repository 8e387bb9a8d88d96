import { useNavigate } from 'react-router-dom';
import { listItemTiling, type StockListItem } from '../../../../shared/contracts/stock';
import { buttonClasses } from '../../../components/button';
import { DataTable, dataTableColumnHelper, pageQueryProps } from '../../../components/data-table';
import { EmptyState } from '../../../components/empty-state';
import { Card, Page } from '../../../components/page';
import { TilingDrawing } from '../../../components/tiling-drawing';
import { toListSearch, useTableSearchParams } from '../../../components/use-table-search-params';
import { formatDate } from '../../../lib/format';
import { stockExportUrl, useStockList, useStockSummary } from '../api/list-stock';
import { StockChart } from './stock-chart';

const col = dataTableColumnHelper<StockListItem>();
const columns = col.columns([
  col.display({ id: 'thumb', header: () => <span className="sr-only">Drawing</span>, cell: (c) => <TilingDrawing tiling={listItemTiling(c.row.original)} pixelWidth={64} title={`Stock tiling ${c.row.original.id}`} /> }),
  col.accessor('id', { header: 'No.' }),
  col.accessor('width', { header: 'Width' }),
  col.accessor('height', { header: 'Height' }),
  col.accessor('order', { header: 'Order' }),
  col.display({ id: 'class', header: 'Class', cell: (c) => `${c.row.original.square ? 'square, ' : ''}${c.row.original.perfect ? 'perfect' : 'imperfect'}, ${c.row.original.simple ? 'simple' : 'compound'}` }),
  col.accessor('provenance', { header: 'From', enableSorting: false }),
  col.accessor('useCount', { header: 'Puzzles', enableSorting: false }),
  col.accessor('createdAt', { header: 'Added', cell: (c) => formatDate(c.getValue()) }),
]);

const filterKeys = ['orderMin', 'orderMax', 'widthMin', 'widthMax', 'heightMin', 'heightMax', 'square', 'perfect', 'simple', 'provenance', 'used', 'setterId'];
const yesNo = [{ value: 'true', label: 'Yes' }, { value: 'false', label: 'No' }];

/** /stock (editor): every verified tiling; filters live in the URL; exports of the filtered selection. */
export function StockPage() {
  const params = useTableSearchParams({ filterKeys, defaultSort: { id: 'createdAt', desc: true } });
  const list = useStockList(toListSearch(params.query));
  const summary = useStockSummary();
  const navigate = useNavigate();
  const filters = params.query.filters;
  return (
    <Page
      title="Stock"
      description="Every verified tiling with its provenance and reuse. Filter, open one to make a puzzle, or export a selection."
      actions={
        <>
          <a className={buttonClasses('secondary')} href={stockExportUrl('csv', filters)} download>Export CSV</a>
          <a className={buttonClasses('secondary')} href={stockExportUrl('txt', filters)} download>Export codes</a>
        </>
      }
    >
      {summary.data ? (
        <Card title={`${summary.data.total} tilings in the stock`}>
          <StockChart summary={summary.data} />
        </Card>
      ) : null}
      <DataTable
        label="Stock tilings"
        columns={columns}
        params={params}
        {...pageQueryProps(list)}
        onRowActivate={(r) => navigate(`/stock/${r.id}`)}
        filters={[
          { id: 'orderMin', label: 'Order from', kind: 'number' },
          { id: 'orderMax', label: 'Order to', kind: 'number' },
          { id: 'widthMin', label: 'Width from', kind: 'number' },
          { id: 'widthMax', label: 'Width to', kind: 'number' },
          { id: 'heightMin', label: 'Height from', kind: 'number' },
          { id: 'heightMax', label: 'Height to', kind: 'number' },
          { id: 'square', label: 'Square only', kind: 'select', options: yesNo },
          { id: 'perfect', label: 'Perfect', kind: 'select', options: yesNo },
          { id: 'simple', label: 'Simple', kind: 'select', options: yesNo },
          { id: 'provenance', label: 'From', kind: 'select', options: [{ value: 'setter', label: 'Setter' }, { value: 'foundry', label: 'Foundry' }, { value: 'demo', label: 'Demo' }] },
          { id: 'used', label: 'Used', kind: 'select', options: [{ value: 'unused', label: 'Unused' }, { value: 'used', label: 'Used' }] },
        ]}
        empty={<EmptyState title="No tilings match">Loosen the filters, accept submissions, or run the foundry.</EmptyState>}
      />
    </Page>
  );
}
