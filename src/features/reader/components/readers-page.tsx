import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { PuzzleSolveStats } from '../../../../shared/contracts/reader';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { Dialog } from '../../../components/dialog';
import { EmptyState } from '../../../components/empty-state';
import { Card, Loading, Page } from '../../../components/page';
import { PlainTable } from '../../../components/plain-table';
import { SelectField } from '../../../components/select-field';
import { TextField } from '../../../components/text-field';
import { useAdjustGrade } from '../api/adjust-grade';
import { useSolveStats } from '../api/get-solve-stats';
import { durationText, embedSnippet, percentText } from './solve-format';

/** /readers (editor): how readers fared with every published puzzle, per puzzle and per grade; embed snippets; grade adjustments. */
export function ReadersPage() {
  const stats = useSolveStats();
  const [adjusting, setAdjusting] = useState<PuzzleSolveStats | null>(null);
  return (
    <Page
      title="Readers"
      description="Anonymous solve records from the public puzzle pages: how many readers started and finished each published puzzle, how long they took, and how often they revealed the answer."
      actions={<Link to="/readers/calibration" className="font-semibold">Grade calibration</Link>}
    >
      {stats.isPending ? (
        <Loading />
      ) : stats.error ? (
        <ErrorAlert error={stats.error} title="Could not load the solve statistics" />
      ) : (
        <>
          {stats.data.demoRecords > 0 ? (
            <Alert tone="info" title="Includes demo data">
              {stats.data.demoRecords.toLocaleString('en-GB')} of {stats.data.records.toLocaleString('en-GB')} solve records were generated for the demo by a seeded process; they are not real readers.
            </Alert>
          ) : null}
          <Card title="By engine grade">
            {stats.data.grades.length === 0 ? (
              <EmptyState title="No published puzzles yet" />
            ) : (
              <PlainTable caption="Solve statistics per engine grade" headings={['Grade', { label: 'Puzzles', numeric: true }, { label: 'Started', numeric: true }, { label: 'Finished', numeric: true }, 'Solve time: median (quartiles)', { label: 'Revealed', numeric: true }]}>
                {stats.data.grades.map((g) => (
                  <tr key={g.grade} className="border-b border-rule last:border-0">
                    <td className="px-3 py-2">Grade {g.grade}</td>
                    <td className="px-3 py-2 text-right tabular">{g.puzzles}</td>
                    <td className="px-3 py-2 text-right tabular">{g.starts}</td>
                    <td className="px-3 py-2 text-right tabular">{g.finishes}</td>
                    <td className="px-3 py-2 tabular">{g.timeMs ? `${durationText(g.timeMs.median)} (${durationText(g.timeMs.q1)} to ${durationText(g.timeMs.q3)})` : 'no solves yet'}</td>
                    <td className="px-3 py-2 text-right tabular">{percentText(g.revealRate)}</td>
                  </tr>
                ))}
              </PlainTable>
            )}
          </Card>
          <Card title="Published puzzles">
            {stats.data.puzzles.length === 0 ? (
              <EmptyState title="No published puzzles yet">Puzzles appear here when their edition is published.</EmptyState>
            ) : (
              <div className="overflow-x-auto">
                <PlainTable
                  caption="Solve statistics per published puzzle"
                  headings={['Puzzle', 'Edition', 'Grade (engine / shown)', { label: 'Started', numeric: true }, { label: 'Finished', numeric: true }, { label: 'Solved', numeric: true }, 'Solve time: median (quartiles)', { label: 'Revealed', numeric: true }, '']}
                >
                  {stats.data.puzzles.map((p) => (
                    <tr key={`${p.publicationTitle}-${p.editionNumber}-${p.position}`} className="border-b border-rule align-top last:border-0" data-testid={`reader-stats-${p.puzzleId}`}>
                      <td className="px-3 py-2">
                        {p.path ? <a href={p.path}>{p.title}</a> : p.title}
                        <span className="block text-xs text-ink-muted">{p.kind === 'assembly' ? 'Assembly' : 'Deduction'}{p.demoRecords > 0 ? ` \u00b7 ${p.demoRecords} demo plays` : ''}</span>
                      </td>
                      <td className="px-3 py-2">{p.publicationTitle} No. {p.editionNumber}</td>
                      <td className="px-3 py-2 tabular">
                        {p.engineGrade} / {p.shownGrade}
                        {p.gradeNote ? <span className="block text-xs text-ink-muted">Note: {p.gradeNote}</span> : null}
                      </td>
                      <td className="px-3 py-2 text-right tabular">{p.starts}</td>
                      <td className="px-3 py-2 text-right tabular">{p.finishes}</td>
                      <td className="px-3 py-2 text-right tabular">{p.solved}</td>
                      <td className="px-3 py-2 tabular">{p.timeMs ? `${durationText(p.timeMs.median)} (${durationText(p.timeMs.q1)} to ${durationText(p.timeMs.q3)})` : 'no solves yet'}</td>
                      <td className="px-3 py-2 text-right tabular">{percentText(p.revealRate)}</td>
                      <td className="px-3 py-2">
                        <Button size="sm" onClick={() => setAdjusting(p)} aria-label={`Adjust grade of ${p.title}`}>
                          Adjust grade
                        </Button>
                      </td>
                    </tr>
                  ))}
                </PlainTable>
              </div>
            )}
          </Card>
          <EmbedCard puzzles={stats.data.puzzles} />
          <Alert tone="info" title="What readers' data is kept">
            Only anonymous events (started, checked, revealed, finished) with the time played and a random play number made in the reader&rsquo;s browser. No cookies, accounts, names, addresses or device details; readers are told so on every public page.
          </Alert>
        </>
      )}
      {adjusting ? <AdjustGradeDialog puzzle={adjusting} onClose={() => setAdjusting(null)} /> : null}
    </Page>
  );
}

function EmbedCard({ puzzles }: { puzzles: PuzzleSolveStats[] }) {
  const origin = window.location.origin;
  const editions = new Map<string, { title: string; path: string; puzzles: PuzzleSolveStats[] }>();
  for (const p of puzzles) {
    if (!p.path) continue;
    const editionPath = p.path.replace(/\/\d+$/, '');
    const e = editions.get(editionPath) ?? { title: `${p.publicationTitle} No. ${p.editionNumber}`, path: editionPath, puzzles: [] };
    e.puzzles.push(p);
    editions.set(editionPath, e);
  }
  return (
    <Card title="Public pages and embeds">
      <p className="text-sm text-ink-muted">
        Each public edition and puzzle has an address and an embed snippet for the publisher&rsquo;s own site. Only the origins listed in the publication&rsquo;s reader settings may frame it.
      </p>
      {editions.size === 0 ? (
        <EmptyState title="No edition is public yet" />
      ) : (
        [...editions.values()].map((e) => (
          <details key={e.path} className="rounded-md border border-rule px-3 py-2">
            <summary className="cursor-pointer font-semibold">{e.title}</summary>
            <p className="mt-2 text-sm">
              Public page: <a href={e.path}>{e.path}</a>
            </p>
            <Snippet label={`Embed ${e.title}`} text={embedSnippet(origin, e.path.replace(/^\/read\//, '/embed/'), e.title)} />
            {e.puzzles.map((p) => (
              <Snippet key={p.path} label={`Embed ${p.title}`} text={embedSnippet(origin, p.path!.replace(/^\/read\//, '/embed/'), p.title)} />
            ))}
          </details>
        ))
      )}
    </Card>
  );
}

function Snippet({ label, text }: { label: string; text: string }) {
  return (
    <label className="mt-2 block text-sm">
      <span className="font-semibold">{label}</span>
      <textarea readOnly value={text} rows={3} className="mt-1 block w-full rounded border border-rule bg-paper px-2 py-1 font-mono text-xs" onFocus={(e) => e.currentTarget.select()} />
    </label>
  );
}

function AdjustGradeDialog({ puzzle, onClose }: { puzzle: PuzzleSolveStats; onClose: () => void }) {
  const adjust = useAdjustGrade();
  const [grade, setGrade] = useState(String(puzzle.shownGrade === puzzle.engineGrade && !puzzle.gradeNote ? '' : puzzle.shownGrade));
  const [note, setNote] = useState('');
  return (
    <Dialog
      open
      onClose={onClose}
      title={`Grade shown to readers: ${puzzle.title}`}
      footer={
        <>
          <Button onClick={onClose}>Cancel</Button>
          <Button
            variant="primary"
            busy={adjust.isPending}
            disabled={note.trim().length === 0}
            onClick={() => adjust.mutate({ puzzleId: puzzle.puzzleId, input: { grade: grade === '' ? null : Number(grade), note } }, { onSuccess: onClose })}
          >
            Save the grade
          </Button>
        </>
      }
    >
      <div className="flex flex-col gap-3">
        <p className="text-sm text-ink-muted">The engine graded it {puzzle.engineGrade}. The grade you set here is shown on the public pages with your note; the engine&rsquo;s grade and the statistics do not change.</p>
        <SelectField
          label="Grade shown to readers"
          value={grade}
          onChange={(e) => setGrade(e.target.value)}
          options={[{ value: '', label: `The engine's grade (${puzzle.engineGrade})` }, ...[1, 2, 3, 4, 5].map((g) => ({ value: String(g), label: `Grade ${g}` }))]}
        />
        <TextField label="Note (shown to readers)" value={note} onChange={(e) => setNote(e.target.value)} maxLength={500} hint="Say why, e.g. readers took twice as long as other grade-3 puzzles." />
        <ErrorAlert error={adjust.error} title="The grade was not saved" />
      </div>
    </Dialog>
  );
}
