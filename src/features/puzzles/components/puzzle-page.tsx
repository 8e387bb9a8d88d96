import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { PuzzleDetail, PuzzleLevel } from '../../../../shared/contracts/puzzles';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { PrintCaution } from '../../../components/caution-note';
import { CheckboxField } from '../../../components/checkbox-field';
import { Card, Loading, Page } from '../../../components/page';
import { ProgressBar } from '../../../components/progress-bar';
import { SelectField } from '../../../components/select-field';
import { StatusBadge } from '../../../components/status-badge';
import { Tabs } from '../../../components/tabs';
import { TilingDrawing } from '../../../components/tiling-drawing';
import { formatDateTime } from '../../../lib/format';
import { isProving, usePuzzle } from '../api/get-puzzle';
import { useCancelPuzzle, useRecheckPuzzle, useUpdatePuzzle } from '../api/puzzle-mutations';
import { LayoutPackageCard } from './layout-package-card';
import { AssemblyPreview, ChooseSquares, DeductionPreview } from './puzzle-drawings';
import { kindLabel, levelLabel, levelOptions, parseLevel, statusLabel, statusTone } from './puzzle-labels';

const unfinishedWords = { failed: 'it failed', cancelled: 'it was cancelled', interrupted: 'the server stopped while it ran' } as const;

const key = (x: number, y: number) => `${x},${y}`;

/** /puzzles/:id (editor): the workbench of one puzzle. */
export function PuzzlePage() {
  const id = Number(useParams().id);
  const puzzle = usePuzzle(id);
  if (!Number.isInteger(id) || id < 1) return <Page title="Puzzle"><Alert tone="danger" title="No such puzzle">The address does not name a puzzle.</Alert></Page>;
  if (puzzle.isPending) return <Page title="Puzzle"><Loading /></Page>;
  if (puzzle.error) return <Page title="Puzzle"><ErrorAlert error={puzzle.error} title="Could not load the puzzle" /></Page>;
  return <Workbench p={puzzle.data} />;
}

function Workbench({ p }: { p: PuzzleDetail }) {
  const update = useUpdatePuzzle();
  const recheck = useRecheckPuzzle();
  const cancel = useCancelPuzzle();
  const [draft, setDraft] = useState<Set<string> | null>(null);
  const [draftLevel, setDraftLevel] = useState<PuzzleLevel | null>(null);
  const [draftFrame, setDraftFrame] = useState<boolean | null>(null);
  const proving = isProving(p);
  const what = p.kind === 'deduction' ? 'givens' : 'starter pieces';
  const current = new Set((p.kind === 'deduction' ? p.givens : p.starters).map((g) => key(g.x, g.y)));
  const chosen = draft ?? current;
  const changed = draft !== null || draftLevel !== null || draftFrame !== null;

  function toggle(x: number, y: number) {
    const next = new Set(chosen);
    const k = key(x, y);
    if (next.has(k)) next.delete(k); else next.add(k);
    setDraft(next);
  }
  function proveAgain() {
    const refs = [...chosen].map((s) => { const [x, y] = s.split(',').map(Number); return { x: x!, y: y! }; });
    const patch = p.kind === 'deduction'
      ? { givens: refs, ...(draftLevel !== null ? { level: draftLevel } : {}), ...(draftFrame !== null ? { showFrame: draftFrame } : {}) }
      : { starters: refs };
    update.mutate({ id: p.id, patch }, { onSuccess: () => { setDraft(null); setDraftLevel(null); setDraftFrame(null); } });
  }
  function discard() { setDraft(null); setDraftLevel(null); setDraftFrame(null); }

  return (
    <Page
      title={`${p.title} (No. ${p.id})`}
      description={<>{kindLabel[p.kind]} puzzle from stock tiling <Link className="underline" to={`/stock/${p.stockId}`}>No. {p.stockId}</Link>{p.kind === 'deduction' ? ` · ${levelLabel(p.level)}` : ''}{p.grade !== null ? ` · grade ${p.grade}` : ''}</>}
      actions={
        <>
          {proving ? <Button onClick={() => cancel.mutate(p.id)} busy={cancel.isPending}>Cancel the proof</Button> : null}
          <Button onClick={() => recheck.mutate(p.id)} busy={recheck.isPending} disabled={proving || p.certificate === null}>Re-check certificate</Button>
        </>
      }
    >
      <section aria-label="Verdict" className="flex flex-col gap-3" aria-live="polite">
        <div className="flex flex-wrap items-center gap-3">
          <span className="text-sm font-medium text-ink">Verdict:</span>
          <StatusBadge tone={statusTone[p.status]}>{statusLabel[p.status]}</StatusBadge>
          <StatusBadge tone={p.certificateCurrent ? 'success' : 'warning'}>{p.certificateCurrent ? 'Certificate current: printable' : 'Not printable'}</StatusBadge>
        </div>
        {proving && p.job ? (
          <ProgressBar
            label="Proving uniqueness"
            detail={[p.job.state === 'queued' ? 'waiting for a free worker' : p.job.phase ?? 'starting', p.job.done !== null ? `${p.job.done.toLocaleString('en-GB')}` : '', p.job.elapsedMs !== null ? `${(p.job.elapsedMs / 1000).toFixed(1)} s` : ''].filter(Boolean).join(' · ')}
          />
        ) : null}
        {p.status === 'failed' && p.job?.error ? <Alert tone="danger" title="The proof did not finish">{p.job.error}</Alert> : null}
        {!p.certificateCurrent && !proving && p.staleReasons.length > 0 ? (
          <Alert tone="warning" title="This puzzle cannot go into an edition yet">
            <ul className="list-disc pl-5">{p.staleReasons.map((r) => <li key={r}>{r}</li>)}</ul>
          </Alert>
        ) : null}
        {p.notes.length > 0 ? <ul className="list-disc pl-5 text-sm text-ink-muted">{p.notes.map((n) => <li key={n}>{n}</li>)}</ul> : null}
      </section>

      <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <Card title={`Adjust the ${what}`}>
          <p className="text-sm text-ink-muted">
            {p.kind === 'deduction'
              ? 'Press squares to print their size or hide it again. Every change is proved again before the puzzle can print.'
              : 'Press squares to place them in the frame as starter pieces, or take them out. Every change is proved again before the puzzle can print.'}
          </p>
          <ChooseSquares tiling={p.tiling} chosen={chosen} onToggle={toggle} what={what} disabled={update.isPending} />
          <p className="text-sm tabular-nums">{chosen.size} {chosen.size === 1 ? (p.kind === 'deduction' ? 'given' : 'starter piece') : what} chosen{draft !== null ? ' (not yet proved)' : ''}</p>
          {p.kind === 'deduction' ? (
            <div className="flex flex-wrap items-end gap-4">
              <SelectField label="Level" options={levelOptions} value={String(draftLevel ?? p.level ?? 3)} onChange={(e) => setDraftLevel(parseLevel(e.target.value) ?? null)} />
              <CheckboxField label="Print the frame’s width and height" checked={draftFrame ?? p.showFrame} onChange={(e) => setDraftFrame(e.target.checked)} />
            </div>
          ) : null}
          <ErrorAlert error={update.error} title="Could not change the puzzle" />
          <ErrorAlert error={recheck.error} title="Could not re-check" />
          <div className="flex gap-2">
            <Button variant="primary" onClick={proveAgain} disabled={!changed} busy={update.isPending}>Prove again</Button>
            <Button onClick={discard} disabled={!changed}>Discard changes</Button>
            <Button
              onClick={() => update.mutate({ id: p.id, patch: { propose: true, ...(p.kind === 'deduction' && draftLevel !== null ? { level: draftLevel } : {}) } }, { onSuccess: discard })}
              disabled={update.isPending || proving}
            >
              Let the engine propose
            </Button>
          </div>
        </Card>
        <Card title="Print preview">
          <PreviewTabs p={p} />
          <PrintCaution />
        </Card>
      </div>

      {p.second ? (
        <Card title="A second solution">
          <p className="text-sm text-ink-muted">The highlighted squares sit elsewhere than in the intended tiling: add a starter piece among them.</p>
          <TilingDrawing tiling={p.second.tiling} highlight={p.second.differ} pixelWidth={320} title="A second way to assemble the pieces" />
        </Card>
      ) : null}

      <CertificateCard p={p} />
      <LayoutPackageCard p={p} />
    </Page>
  );
}

function PreviewTabs({ p }: { p: PuzzleDetail }) {
  const [tab, setTab] = useState('puzzle');
  return (
    <Tabs
      label="Print preview"
      value={tab}
      onChange={setTab}
      tabs={[
        {
          id: 'puzzle',
          label: 'Puzzle',
          panel: p.kind === 'deduction' ? <DeductionPreview tiling={p.tiling} givens={p.givens} showFrame={p.showFrame} /> : <AssemblyPreview tiling={p.tiling} starters={p.starters} />,
        },
        {
          id: 'solution',
          label: 'Solution',
          panel: (
            <div className="flex flex-col gap-3">
              <TilingDrawing tiling={p.tiling} pixelWidth={360} title="The solution" />
              {p.kind === 'deduction' ? (
                p.steps.length > 0 ? (
                  <ol aria-label="Steps" className="list-decimal pl-6 text-sm tabular-nums">{p.steps.map((s, i) => <li key={i}>{s.text}</li>)}</ol>
                ) : <p className="text-sm text-ink-muted">No steps: the givens reach no further sizes at this level.</p>
              ) : null}
            </div>
          ),
        },
      ]}
    />
  );
}

function CertificateCard({ p }: { p: PuzzleDetail }) {
  const c = p.certificate;
  if (!c) return <Card title="Certificate"><p className="text-sm text-ink-muted">No certificate yet.</p></Card>;
  return (
    <Card title="Certificate">
      <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-ink-muted">Verdict</dt><dd>{c.verdict}</dd>
        <dt className="text-ink-muted">Engine</dt><dd>{c.engineVersion}</dd>
        <dt className="text-ink-muted">Input hash (SHA-256)</dt><dd className="break-all font-mono text-xs">{c.inputHash}</dd>
        <dt className="text-ink-muted">Counts</dt><dd>{c.counts.classes} solution class(es){c.counts.rank !== undefined ? ` · rank ${c.counts.rank} of ${c.counts.unknowns} unknowns` : ''}{c.counts.rawSolutions !== undefined ? ` · ${c.counts.rawSolutions} placements` : ''}</dd>
        <dt className="text-ink-muted">Work</dt><dd>{c.nodes.toLocaleString('en-GB')} {c.kind === 'assembly' ? 'search nodes' : 'steps'} in {c.ms.toFixed(1)} ms</dd>
        <dt className="text-ink-muted">Issued</dt><dd>{formatDateTime(c.createdAt)}</dd>
      </dl>
      <ul className="list-disc pl-5 text-sm">{c.checks.map((x) => <li key={x}>{x}</li>)}</ul>
      {p.lastRecheck ? (
        <Alert tone={p.lastRecheck.holds ? 'success' : 'warning'} title={p.lastRecheck.holds ? `Re-checked ${formatDateTime(p.lastRecheck.at)}: it holds` : `Re-checked ${formatDateTime(p.lastRecheck.at)}: it did not hold, a fresh certificate was stored`}>
          {p.lastRecheck.reasons.length > 0 ? <ul className="list-disc pl-5">{p.lastRecheck.reasons.map((r) => <li key={r}>{r}</li>)}</ul> : 'The recomputation reached the same verdict and counts for the same input.'}
        </Alert>
      ) : null}
      {p.lastUnfinishedRecheck ? (
        <Alert tone="neutral" title={`Re-check of ${formatDateTime(p.lastUnfinishedRecheck.at)} did not finish (${unfinishedWords[p.lastUnfinishedRecheck.state]})`}>
          The certificate above stays in force; re-check again when you like.
        </Alert>
      ) : null}
    </Card>
  );
}
