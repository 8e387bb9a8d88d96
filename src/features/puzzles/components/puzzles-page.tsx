import { Link, useNavigate } from 'react-router-dom';
import type { PuzzleSummary } from '../../../../shared/contracts/puzzles';
import { usePuzzleList } from '../../../api/puzzles';
import { ButtonLink } from '../../../components/button';
import { DataTable, dataTableColumnHelper, pageQueryProps } from '../../../components/data-table';
import { EmptyState } from '../../../components/empty-state';
import { Page } from '../../../components/page';
import { StatusBadge } from '../../../components/status-badge';
import { toListSearch, useTableSearchParams } from '../../../components/use-table-search-params';
import { formatDate } from '../../../lib/format';
import { kindLabel, levelLabel, statusLabel, statusTone } from './puzzle-labels';

const col = dataTableColumnHelper<PuzzleSummary>();
const columns = col.columns([
  col.accessor('id', { header: 'No.' }),
  col.display({ id: 'title', header: 'Puzzle', cell: (c) => <Link className="underline" to={`/puzzles/${c.row.original.id}`}>{c.row.original.title}</Link> }),
  col.display({ id: 'kind', header: 'Kind', cell: (c) => kindLabel[c.row.original.kind] }),
  col.display({ id: 'status', header: 'Status', cell: (c) => <StatusBadge tone={statusTone[c.row.original.status]}>{statusLabel[c.row.original.status]}</StatusBadge> }),
  col.display({ id: 'certificate', header: 'Printable', cell: (c) => (c.row.original.certificateCurrent ? 'Yes, certificate current' : 'No') }),
  col.accessor('grade', { header: 'Grade', cell: (c) => c.getValue() ?? '–' }),
  col.display({ id: 'level', header: 'Level', cell: (c) => levelLabel(c.row.original.level) }),
  col.accessor('order', { header: 'Tiling', cell: (c) => <Link className="underline" to={`/stock/${c.row.original.stockId}`}>{c.row.original.width} × {c.row.original.height}, order {c.row.original.order}</Link> }),
  col.display({
    id: 'usedIn',
    header: 'Used in',
    cell: (c) => (c.row.original.usedIn.length === 0 ? 'Not yet' : c.row.original.usedIn.map((u) => `${u.publicationTitle} No. ${u.number}`).join('; ')),
  }),
  col.accessor('createdAt', { header: 'Made', cell: (c) => formatDate(c.getValue()) }),
]);

const filterKeys = ['kind', 'status', 'grade', 'printable'];

/** /puzzles (editor): every puzzle with kind, grade, status, tiling and where it is used. */
export function PuzzlesPage() {
  const params = useTableSearchParams({ filterKeys, defaultSort: { id: 'createdAt', desc: true } });
  const list = usePuzzleList(toListSearch(params.query));
  const navigate = useNavigate();
  return (
    <Page
      title="Puzzles"
      description="Assembly and Deduction puzzles made from stock tilings. A puzzle can go into an edition only while its certificate of a unique solution is current."
      actions={<ButtonLink to="/stock" variant="primary">Make a puzzle from the stock</ButtonLink>}
    >
      <DataTable
        label="Puzzles"
        columns={columns}
        params={params}
        {...pageQueryProps(list)}
        onRowActivate={(r) => navigate(`/puzzles/${r.id}`)}
        filters={[
          { id: 'kind', label: 'Kind', kind: 'select', options: [{ value: 'assembly', label: 'Assembly' }, { value: 'deduction', label: 'Deduction' }] },
          { id: 'status', label: 'Status', kind: 'select', options: Object.entries(statusLabel).map(([value, label]) => ({ value, label })) },
          { id: 'grade', label: 'Grade', kind: 'select', options: [1, 2, 3, 4, 5].map((g) => ({ value: String(g), label: `Grade ${g}` })) },
          { id: 'printable', label: 'Printable', kind: 'select', options: [{ value: 'true', label: 'Yes' }, { value: 'false', label: 'No' }] },
        ]}
        empty={<EmptyState title="No puzzles match">Open a tiling in the stock and choose “Make a puzzle”.</EmptyState>}
      />
    </Page>
  );
}
