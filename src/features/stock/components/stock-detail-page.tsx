import { Link, useParams } from 'react-router-dom';
import { useStockDetail } from '../../../api/stock';
import { ErrorAlert } from '../../../components/alert';
import { ButtonLink } from '../../../components/button';
import { Card, Loading, Page } from '../../../components/page';
import { SmithDiagram } from '../../../components/smith-diagram';
import { TilingDrawing } from '../../../components/tiling-drawing';
import { TilingCode, TilingFacts } from '../../../components/tiling-facts';
import { formatDate, formatDateTime } from '../../../lib/format';

const eventText = { submitted: 'Submitted', accepted: 'Accepted into the stock', added: 'Added' } as const;

const modeText: Record<string, string> = { exhaustive: 'an exhaustive run', random: 'a random run', joining: 'a joining run' };

/** Where a stock tiling came from, in words (never its stored parameters as JSON). */
function Provenance({ provenance, params }: { provenance: 'setter' | 'foundry' | 'demo'; params: Record<string, unknown> | null }) {
  const p = params ?? {};
  if (provenance === 'setter') {
    const sub = typeof p.submissionId === 'number' ? p.submissionId : null;
    return (
      <p>
        From a setter:{' '}
        {sub !== null ? (
          <Link className="underline" to={`/review?status=all&open=${sub}`}>
            the submission it was accepted from
          </Link>
        ) : (
          'accepted from a submission'
        )}
        .
      </p>
    );
  }
  if (provenance === 'foundry') {
    const run = typeof p.runId === 'string' ? p.runId : null;
    const mode = typeof p.mode === 'string' ? (modeText[p.mode] ?? 'a run') : 'a run';
    const order = typeof p.order === 'number' ? ` of order ${p.order}` : typeof p.orderMin === 'number' ? ` of orders ${p.orderMin} to ${String(p.orderMax)}` : '';
    return (
      <p>
        Made by the foundry in{' '}
        {run ? (
          <Link className="underline" to={`/foundry/runs/${run}`}>
            {`${mode}${order}`}
          </Link>
        ) : (
          `${mode}${order}`
        )}
        .
      </p>
    );
  }
  return <p>Demo data of Larkspur &amp; Quill Press, made by our own engine.</p>;
}

/** /stock/:id (editor): drawing, Smith diagram, codes, class, provenance, history, "make a puzzle". */
export function StockDetailPage() {
  const { id } = useParams();
  const n = Number(id);
  const detail = useStockDetail(Number.isInteger(n) && n > 0 ? n : 0);
  if (detail.isPending) return <Loading />;
  if (detail.error) return <ErrorAlert error={detail.error} title="Could not load this tiling" />;
  const d = detail.data;
  return (
    <Page
      title={`Stock tiling ${d.id}`}
      description={
        <Link className="underline" to="/stock">
          ← Back to the stock
        </Link>
      }
      actions={<ButtonLink to={`/puzzles/new?stockId=${d.id}`} variant="primary">Make a puzzle</ButtonLink>}
    >
      <div className="grid gap-4 lg:grid-cols-2">
        <Card title="Drawing">
          <TilingDrawing tiling={d.tiling} />
        </Card>
        <Card title="Smith diagram">{d.smith ? <SmithDiagram diagram={d.smith} /> : <p>Not available.</p>}</Card>
        <Card title="Class and codes">
          <div className="flex flex-col gap-3">
            <TilingFacts facts={d} />
            <p className="text-sm text-ink-muted">Sizes {d.classification.minSize} to {d.classification.maxSize}; {d.classification.subRectangles.length} sub-rectangle(s).</p>
            <TilingCode label="Bouwkamp code" code={d.bouwkamp} />
            <TilingCode label="Canonical code" code={d.canonicalCode} />
          </div>
        </Card>
        <Card title="Provenance and history">
          <div className="flex flex-col gap-2 text-sm">
            <Provenance provenance={d.provenance} params={d.params} />
            <ol className="flex flex-col gap-1">
              {d.history.events.map((e, i) => (
                <li key={i}>{formatDateTime(e.at)}: {eventText[e.kind]}{e.submissionId ? ` (submission ${e.submissionId})` : ''}{e.note ? `, ${e.note}` : ''}</li>
              ))}
            </ol>
            <p className="font-semibold">Puzzles derived</p>
            {d.history.puzzles.length ? (
              <ul>{d.history.puzzles.map((p) => <li key={p.id}><Link className="underline" to={`/puzzles/${p.id}`}>{p.kind === 'assembly' ? 'Assembly' : 'Deduction'} puzzle {p.id}</Link>{p.grade ? `, grade ${p.grade}` : ''}, {formatDate(p.createdAt)}</li>)}</ul>
            ) : <p className="text-ink-muted">None yet.</p>}
            <p className="font-semibold">Editions used in</p>
            {d.history.editions.length ? (
              <ul>{d.history.editions.map((e) => <li key={e.id}>{e.title}, {formatDate(e.date)}</li>)}</ul>
            ) : <p className="text-ink-muted">None yet.</p>}
          </div>
        </Card>
      </div>
    </Page>
  );
}
