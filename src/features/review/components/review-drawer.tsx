import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { Dialog } from '../../../components/dialog';
import { controlClasses } from '../../../components/field';
import { Loading } from '../../../components/page';
import { SmithDiagram } from '../../../components/smith-diagram';
import { TilingDrawing } from '../../../components/tiling-drawing';
import { TilingCode, TilingFacts } from '../../../components/tiling-facts';
import { formatDateTime } from '../../../lib/format';
import { submissionTitle } from '../../../../shared/contracts/submissions';
import { useSubmissionDetail } from '../api/get-submission';
import { useReviewSubmission } from '../api/review-submission';

/** The detail drawer of one submission: drawing, Smith diagram, codes, class, sub-rectangles, duplicates; accept or reject. */
export function ReviewDrawer({ id, onClose }: { id: number | null; onClose: () => void }) {
  const detail = useSubmissionDetail(id);
  const review = useReviewSubmission();
  const [note, setNote] = useState('');
  const [sub, setSub] = useState<number | null>(null);
  const d = detail.data;
  const rect = d && sub !== null ? d.classification.subRectangles[sub] : undefined;
  const highlight = d && rect ? d.tiling.squares.flatMap((q, i) => (q.x >= rect.x && q.y >= rect.y && q.x + q.s <= rect.x + rect.w && q.y + q.s <= rect.y + rect.h ? [i] : [])) : [];

  function act(action: 'accept' | 'reject') {
    if (id === null) return;
    review.mutate(
      { id, action, ...(note.trim() ? { note: note.trim() } : {}) },
      { onSuccess: () => { setNote(''); onClose(); } },
    );
  }
  const close = () => { review.reset(); setSub(null); onClose(); };

  return (
    <Dialog
      open={id !== null}
      onClose={close}
      placement="right"
      title={d ? submissionTitle(d.title, d.source) : 'Submission'}
      footer={
        d && d.status === 'pending' ? (
          <div className="flex w-full flex-col gap-2">
            <label className="flex flex-col gap-1 text-sm">
              <span className="font-semibold">Note to the setter (needed to reject)</span>
              <textarea className={`${controlClasses} h-auto`} rows={2} value={note} onChange={(e) => setNote(e.target.value)} />
            </label>
            <div className="flex gap-2">
              <Button variant="primary" busy={review.isPending} onClick={() => act('accept')}>Accept into the stock</Button>
              <Button variant="danger" busy={review.isPending} disabled={!note.trim()} onClick={() => act('reject')}>Reject</Button>
            </div>
          </div>
        ) : undefined
      }
    >
      {detail.isPending && id !== null ? <Loading /> : null}
      <ErrorAlert error={detail.error} title="Could not load it" />
      <ErrorAlert error={review.error} title="Not saved" />
      {d ? (
        <div className="flex flex-col gap-4">
          <p className="text-sm text-ink-muted">
            From {d.setterName ?? 'a setter'}, {formatDateTime(d.createdAt)}, by {d.source}. State: {d.status}.
          </p>
          {d.note ? <blockquote className="border-l-4 border-rule-strong pl-3 text-sm">{d.note}</blockquote> : null}
          {d.duplicateOf || d.duplicates.stockId || d.duplicates.submissions.length ? (
            <Alert tone="warning" title="Duplicate">
              {d.duplicates.stockId ? (
                <p>
                  Same as{' '}
                  <Link className="underline" to={`/stock/${d.duplicates.stockId}`}>
                    stock tiling {d.duplicates.stockId}
                  </Link>
                  {d.duplicates.scale && d.duplicates.scale !== '1x' ? ` at ${d.duplicates.scale}` : ''} (already in the stock).
                </p>
              ) : null}
              {d.duplicates.submissions.length ? (
                <p>Same tiling in submission{d.duplicates.submissions.length > 1 ? 's' : ''} {d.duplicates.submissions.map((s) => `${s.id} (${s.status})`).join(', ')}.</p>
              ) : null}
            </Alert>
          ) : null}
          <div className="rounded-md border border-rule bg-surface p-2">
            <TilingDrawing tiling={d.tiling} highlight={highlight} />
          </div>
          <TilingFacts facts={d} />
          {d.classification.subRectangles.length ? (
            <div className="text-sm">
              <p className="font-semibold">Sub-rectangles (compound)</p>
              <ul className="flex flex-wrap gap-2">
                {d.classification.subRectangles.slice(0, 20).map((r, i) => (
                  <li key={i}>
                    <Button size="sm" variant={sub === i ? 'primary' : 'secondary'} aria-pressed={sub === i} onClick={() => setSub(sub === i ? null : i)}>
                      {r.w} × {r.h} at ({r.x}, {r.y})
                    </Button>
                  </li>
                ))}
              </ul>
            </div>
          ) : null}
          {d.smith ? (
            <div>
              <p className="text-sm font-semibold">Smith diagram</p>
              <div className="rounded-md border border-rule bg-surface p-2">
                <SmithDiagram diagram={d.smith} />
              </div>
            </div>
          ) : null}
          <TilingCode label="As sent" code={d.code} />
          <TilingCode label="Bouwkamp code" code={d.bouwkamp} />
          <TilingCode label="Canonical code" code={d.canonicalCode} />
          {d.editorNote ? <p className="text-sm">Editor’s note: {d.editorNote}</p> : null}
        </div>
      ) : null}
    </Dialog>
  );
}
