import { useState, type FormEvent } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { puzzleCreateSchema, type PuzzleKind } from '../../../../shared/contracts/puzzles';
import { useStockDetail } from '../../../api/stock';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button, ButtonLink } from '../../../components/button';
import { CheckboxField } from '../../../components/checkbox-field';
import { EmptyState } from '../../../components/empty-state';
import { Card, Loading, Page } from '../../../components/page';
import { SelectField } from '../../../components/select-field';
import { TilingDrawing } from '../../../components/tiling-drawing';
import { useCreatePuzzle } from '../api/puzzle-mutations';
import { levelOptions, parseLevel } from './puzzle-labels';

/** /puzzles/new?stockId= (editor): choose the kind and level; the engine proposes the rest. */
export function NewPuzzlePage() {
  const [search] = useSearchParams();
  const raw = Number(search.get('stockId'));
  const stockId = Number.isInteger(raw) && raw > 0 ? raw : null;
  const stock = useStockDetail(stockId);
  const create = useCreatePuzzle();
  const navigate = useNavigate();
  const [kind, setKind] = useState<PuzzleKind>('deduction');
  const [level, setLevel] = useState('');
  const [grade, setGrade] = useState('');
  const [showFrame, setShowFrame] = useState(false);
  const [formError, setFormError] = useState<string | null>(null);

  if (stockId === null) {
    return (
      <Page title="Make a puzzle">
        <EmptyState title="Choose a tiling first" action={<ButtonLink to="/stock" variant="primary">Open the stock</ButtonLink>}>
          Puzzles are made from stock tilings: open one and choose “Make a puzzle”.
        </EmptyState>
      </Page>
    );
  }

  function submit(e: FormEvent) {
    e.preventDefault();
    setFormError(null);
    const body = kind === 'assembly'
      ? { stockId, kind }
      : { stockId, kind, showFrame, ...(parseLevel(level) !== undefined ? { level: parseLevel(level) } : {}), ...(grade ? { grade: Number(grade) } : {}) };
    // the same contract the server checks
    const parsed = puzzleCreateSchema.safeParse(body);
    if (!parsed.success) { setFormError(parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')); return; }
    create.mutate(parsed.data, { onSuccess: (r) => navigate(`/puzzles/${r.id}`) });
  }

  return (
    <Page title="Make a puzzle" description={<>From stock tiling <Link className="underline" to={`/stock/${stockId}`}>No. {stockId}</Link>. The engine proposes the starter pieces or givens and proves the solution unique; you can adjust them afterwards on the workbench.</>}>
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <Card title="The tiling">
          {stock.isPending ? <Loading /> : stock.error ? <ErrorAlert error={stock.error} title="Could not load the tiling" /> : (
            <>
              <TilingDrawing tiling={stock.data.tiling} pixelWidth={360} />
              <p className="text-sm text-ink-muted">{stock.data.width} × {stock.data.height}, order {stock.data.order}{stock.data.perfect ? ', perfect' : ''}{stock.data.useCount > 0 ? ` · already used for ${stock.data.useCount} puzzle(s)` : ''}</p>
            </>
          )}
        </Card>
        <Card title="The puzzle">
          <form onSubmit={submit} className="flex flex-col gap-4" aria-label="Make a puzzle">
            <fieldset className="flex flex-col gap-2">
              <legend className="text-sm font-medium text-ink">Kind</legend>
              {(['deduction', 'assembly'] as const).map((k) => (
                <label key={k} className="flex items-start gap-2 text-sm">
                  <input type="radio" name="kind" value={k} checked={kind === k} onChange={() => setKind(k)} className="mt-1" />
                  <span>
                    <strong>{k === 'deduction' ? 'Deduction' : 'Assembly'}</strong>{' '}
                    {k === 'deduction' ? '— the solver sees the layout, not to scale, and a few sizes, and works out the rest.' : '— the solver gets the frame and the pieces and fits them together; starter pieces are added when the set alone is not unique.'}
                  </span>
                </label>
              ))}
            </fieldset>
            {kind === 'deduction' ? (
              <>
                <SelectField label="Level" hint="The longest chain of known lengths one step may use. Leave it to the grade wished, or pick one." placeholder="Choose from the grade wished (or level 3)" options={levelOptions} value={level} onChange={(e) => setLevel(e.target.value)} />
                <SelectField label="Grade wished" hint="1 is gentlest, 5 hardest. Used when no level is chosen." placeholder="No preference" options={[1, 2, 3, 4, 5].map((g) => ({ value: String(g), label: `Grade ${g}` }))} value={grade} onChange={(e) => setGrade(e.target.value)} />
                <CheckboxField label="Print the frame’s width and height" checked={showFrame} onChange={(e) => setShowFrame(e.target.checked)} />
              </>
            ) : null}
            {formError ? <Alert tone="danger" title="Check the form">{formError}</Alert> : null}
            <ErrorAlert error={create.error} title="Could not make the puzzle" />
            <div><Button type="submit" variant="primary" busy={create.isPending}>Make and prove</Button></div>
          </form>
        </Card>
      </div>
    </Page>
  );
}
