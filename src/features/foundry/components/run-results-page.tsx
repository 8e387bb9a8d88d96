import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { EmptyState } from '../../../components/empty-state';
import { FramedTable } from '../../../components/framed-table';
import { Card, Loading, Page } from '../../../components/page';
import { isActive } from '../api/list-runs';
import { useRun, useRunResults } from '../api/run-results';
import { describeRun, RunProgress } from './run-progress';

/** /foundry/runs/:id: one run's progress and the tilings it found. */
export function RunResultsPage() {
  const { id = '' } = useParams();
  const [page, setPage] = useState(1);
  const run = useRun(id);
  const results = useRunResults(id, page, run.data ? isActive(run.data) : false);
  return (
    <Page title="Foundry run" description={run.data ? describeRun(run.data) : undefined} actions={<Link className="text-accent-strong underline" to="/foundry">All runs</Link>}>
      {run.isPending ? <Loading /> : run.error ? <ErrorAlert error={run.error} title="Could not load the run" /> : (
        <Card>
          <RunProgress run={run.data} />
          <dl className="mt-3 grid grid-cols-3 gap-3 text-sm">
            <div>
              <dt className="text-ink-muted">Perfect found</dt>
              <dd className="text-xl font-semibold tabular-nums">{run.data.foundPerfect.toLocaleString('en-GB')}</dd>
            </div>
            <div>
              <dt className="text-ink-muted">Imperfect found</dt>
              <dd className="text-xl font-semibold tabular-nums">{run.data.foundImperfect.toLocaleString('en-GB')}</dd>
            </div>
            <div>
              <dt className="text-ink-muted">New in the stock</dt>
              <dd className="text-xl font-semibold tabular-nums">{run.data.addedToStock.toLocaleString('en-GB')}</dd>
            </div>
          </dl>
          {run.data.params.mode === 'exhaustive' ? (
            <p className="mt-2 text-sm text-ink-muted">{run.data.params.includeImperfect ? 'Perfect and imperfect tilings went into the stock.' : 'Only the perfect tilings went into the stock; the imperfect ones are listed here.'}</p>
          ) : null}
          {run.data.error ? <p className="text-sm text-danger">{run.data.error}</p> : null}
        </Card>
      )}
      {results.isPending ? <Loading /> : results.error ? <ErrorAlert error={results.error} title="Could not load the results" /> : results.data.total === 0 ? (
        <EmptyState title="Nothing found yet" />
      ) : (
        <div className="flex flex-col gap-3">
          <FramedTable caption="Tilings found by this run" headings={['Order', 'Size', 'Class', 'Largest square', 'Bouwkamp code', 'Stock']} ruledHead>
            {results.data.items.map((r) => (
              <tr key={r.canonicalKey} className="border-b border-rule last:border-b-0">
                <td className="px-3 py-2 tabular-nums">{r.order}</td>
                <td className="px-3 py-2 tabular-nums">{r.width} × {r.height}</td>
                <td className="px-3 py-2">{[r.simple ? 'simple' : 'compound', r.perfect ? 'perfect' : 'imperfect', r.square ? 'square' : ''].filter(Boolean).join(', ')}</td>
                <td className="px-3 py-2 tabular-nums">{r.maxSize}</td>
                <td className="max-w-md px-3 py-2"><code className="break-all text-xs text-ink-soft">{r.code}</code></td>
                <td className="px-3 py-2">{r.stockId !== null ? <Link className="text-accent-strong underline" to={`/stock/${r.stockId}`}>#{r.stockId}</Link> : '—'}</td>
              </tr>
            ))}
          </FramedTable>
          <div className="flex items-center gap-3 text-sm">
            <Button size="sm" disabled={page <= 1} onClick={() => setPage(page - 1)}>Previous</Button>
            <span className="tabular-nums text-ink-muted">Page {page} of {Math.max(1, Math.ceil(results.data.total / 100))} · {results.data.total} tilings</span>
            <Button size="sm" disabled={page * 100 >= results.data.total} onClick={() => setPage(page + 1)}>Next</Button>
          </div>
        </div>
      )}
    </Page>
  );
}
