import { useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { submissionTitle, type Submission } from '../../../../shared/contracts/submissions';
import { useSubmissionList } from '../../../api/submissions';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { DataTable, dataTableColumnHelper, pageQueryProps } from '../../../components/data-table';
import { EmptyState } from '../../../components/empty-state';
import { controlClasses } from '../../../components/field';
import { Page } from '../../../components/page';
import { StatusBadge } from '../../../components/status-badge';
import { toListSearch, useTableSearchParams } from '../../../components/use-table-search-params';
import { formatDate } from '../../../lib/format';
import { useBulkReview } from '../api/review-submission';
import { ReviewDrawer } from './review-drawer';

const col = dataTableColumnHelper<Submission>();

/** The duplicate badge: the same words as the drawer ("Same as stock tiling 12 at 2x", "Also pending"). */
export function duplicateText(s: Pick<Submission, 'duplicateOf' | 'sameAs'>): string | null {
  if (s.sameAs) return `Same as stock tiling ${s.sameAs.stockId}${s.sameAs.scale === '1x' ? '' : ` at ${s.sameAs.scale}`}`;
  if (s.duplicateOf === 'stock') return 'In the stock';
  if (s.duplicateOf === 'pending') return 'Also pending';
  return null;
}

/** /review (editor): the queue of pending submissions; open one, accept or reject; several at once. */
export function ReviewPage() {
  const params = useTableSearchParams({ filterKeys: ['status', 'duplicate', 'q'], defaultSort: { id: 'createdAt', desc: false } });
  const search = toListSearch(params.query);
  if (!params.query.filters.status) search.status = 'pending';
  if (params.query.filters.status === 'all') delete search.status;
  const list = useSubmissionList(search);
  // the open submission lives in the URL (?open=ID): titles are links, and Back closes the drawer
  const [searchParams, setSearchParams] = useSearchParams();
  const openParam = Number(searchParams.get('open'));
  const open = Number.isInteger(openParam) && openParam > 0 ? openParam : null;
  const openHref = (id: number) => {
    const n = new URLSearchParams(searchParams);
    n.set('open', String(id));
    return `?${n.toString()}`;
  };
  const setOpen = (id: number | null) =>
    setSearchParams((prev) => {
      const n = new URLSearchParams(prev);
      if (id === null) n.delete('open');
      else n.set('open', String(id));
      return n;
    });
  const [selected, setSelected] = useState<Set<number>>(new Set());
  const [bulkNote, setBulkNote] = useState('');
  const bulk = useBulkReview();

  const toggle = (id: number) => setSelected((s) => { const n = new Set(s); if (n.has(id)) n.delete(id); else n.add(id); return n; });
  const columns = col.columns([
    col.display({
      id: 'select',
      header: () => <span className="sr-only">Select</span>,
      cell: (c) => (
        <input
          type="checkbox"
          aria-label={`Select submission ${c.row.original.id}`}
          checked={selected.has(c.row.original.id)}
          disabled={c.row.original.status !== 'pending'}
          onClick={(e) => e.stopPropagation()}
          onKeyDown={(e) => e.stopPropagation()}
          onChange={() => toggle(c.row.original.id)}
        />
      ),
    }),
    col.accessor('title', {
      header: 'Title',
      cell: (c) => (
        <Link to={openHref(c.row.original.id)} className="font-medium underline">
          {submissionTitle(c.getValue(), c.row.original.source)}
        </Link>
      ),
    }),
    col.accessor('setterName', { header: 'Setter', enableSorting: false, cell: (c) => c.getValue() ?? '–' }),
    col.accessor('width', { header: 'Size', cell: (c) => `${c.row.original.width} × ${c.row.original.height}` }),
    col.accessor('order', { header: 'Order' }),
    col.display({
      id: 'class',
      header: 'Class',
      cell: (c) => `${c.row.original.perfect ? 'perfect' : 'imperfect'}, ${c.row.original.simple ? 'simple' : 'compound'}`,
    }),
    col.accessor('duplicateOf', {
      header: 'Duplicate',
      enableSorting: false,
      cell: (c) => {
        const text = duplicateText(c.row.original);
        return text ? <StatusBadge tone="warning">{text}</StatusBadge> : '–';
      },
    }),
    col.accessor('status', { header: 'State' }),
    col.accessor('createdAt', { header: 'Sent', cell: (c) => formatDate(c.getValue()) }),
  ]);

  function runBulk(action: 'accept' | 'reject') {
    bulk.mutate(
      { ids: [...selected], action, ...(bulkNote.trim() ? { note: bulkNote.trim() } : {}) },
      { onSuccess: () => { setSelected(new Set()); setBulkNote(''); } },
    );
  }
  const failed = bulk.data?.results.filter((r) => !r.ok) ?? [];

  return (
    <Page title="Review queue" description="Submissions waiting for a decision. Open one to see its drawing, Smith diagram, codes and duplicates.">
      {selected.size > 0 ? (
        <div role="region" aria-label="Bulk review" className="flex flex-wrap items-end gap-3 rounded-md border border-rule bg-paper-deep p-3">
          <p className="text-sm font-semibold">{selected.size} selected</p>
          <label className="flex grow flex-col gap-1 text-sm">
            <span className="font-semibold">Note to the setters (needed to reject)</span>
            <input className={controlClasses} value={bulkNote} onChange={(e) => setBulkNote(e.target.value)} />
          </label>
          <Button variant="primary" busy={bulk.isPending} onClick={() => runBulk('accept')}>Accept selected</Button>
          <Button variant="danger" busy={bulk.isPending} disabled={!bulkNote.trim()} onClick={() => runBulk('reject')}>Reject selected</Button>
        </div>
      ) : null}
      <ErrorAlert error={bulk.error} title="Nothing was changed" />
      {failed.length > 0 ? (
        <Alert tone="warning" title={`${failed.length} could not be changed`}>
          <ul>{failed.map((f) => <li key={f.id}>Submission {f.id}: {f.error}</li>)}</ul>
        </Alert>
      ) : null}
      <DataTable
        label="Submissions to review"
        columns={columns}
        params={params}
        {...pageQueryProps(list)}
        onRowActivate={(r) => setOpen(r.id)}
        filters={[
          { id: 'q', label: 'Title contains', kind: 'text' },
          { id: 'status', label: 'State', kind: 'select', anyLabel: 'Pending', options: [{ value: 'accepted', label: 'Accepted' }, { value: 'rejected', label: 'Rejected' }, { value: 'all', label: 'All' }] },
          { id: 'duplicate', label: 'Duplicates', kind: 'select', options: [{ value: 'true', label: 'Only duplicates' }, { value: 'false', label: 'No duplicates' }] },
        ]}
        empty={<EmptyState title="Nothing waiting">The queue is empty. New submissions appear here as setters send them.</EmptyState>}
      />
      <ReviewDrawer id={open} onClose={() => setOpen(null)} />
    </Page>
  );
}
