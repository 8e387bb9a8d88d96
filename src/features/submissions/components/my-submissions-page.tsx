import type { Submission } from '../../../../shared/contracts/submissions';
import { useSubmissionList } from '../../../api/submissions';
import { ButtonLink } from '../../../components/button';
import { DataTable, dataTableColumnHelper, pageQueryProps } from '../../../components/data-table';
import { EmptyState } from '../../../components/empty-state';
import { Page } from '../../../components/page';
import { toListSearch, useTableSearchParams } from '../../../components/use-table-search-params';
import { formatDate } from '../../../lib/format';
import { SubmissionStatusBadge } from './submission-status';

const col = dataTableColumnHelper<Submission>();
const columns = col.columns([
  col.accessor('title', { header: 'Title', cell: (c) => c.getValue() ?? <span className="text-ink-muted">Untitled ({c.row.original.source})</span> }),
  col.accessor('width', { header: 'Size', cell: (c) => `${c.row.original.width} × ${c.row.original.height}` }),
  col.accessor('order', { header: 'Order' }),
  col.accessor('status', {
    header: 'State',
    cell: (c) => (
      <span className="flex flex-wrap items-center gap-1">
        <SubmissionStatusBadge status={c.getValue()} />
        {c.row.original.duplicateOf ? <span className="text-xs text-warning">duplicate</span> : null}
      </span>
    ),
  }),
  col.accessor('editorNote', { header: 'Editor’s note', enableSorting: false, cell: (c) => c.getValue() ?? '–' }),
  col.accessor('createdAt', { header: 'Date', cell: (c) => formatDate(c.getValue()) }),
]);

/** /submissions (setter): my submissions with state and the editor's note. */
export function MySubmissionsPage() {
  const params = useTableSearchParams({ filterKeys: ['status', 'q'], defaultSort: { id: 'createdAt', desc: true } });
  const list = useSubmissionList(toListSearch(params.query));
  return (
    <Page title="My submissions" description="Every tiling you sent, where it stands, and what the editor said." actions={<ButtonLink to="/submit" variant="primary">Submit a tiling</ButtonLink>}>
      <DataTable
        label="My submissions"
        columns={columns}
        params={params}
        {...pageQueryProps(list)}
        filters={[
          { id: 'q', label: 'Title contains', kind: 'text' },
          { id: 'status', label: 'State', kind: 'select', options: [{ value: 'pending', label: 'Pending review' }, { value: 'accepted', label: 'Accepted' }, { value: 'rejected', label: 'Not accepted' }] },
        ]}
        empty={<EmptyState title="No submissions yet" action={<ButtonLink to="/submit">Submit your first tiling</ButtonLink>} />}
      />
    </Page>
  );
}
