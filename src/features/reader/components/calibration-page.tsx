import type { Calibration } from '../../../../shared/contracts/reader';
import { Alert, ErrorAlert } from '../../../components/alert';
import { EmptyState } from '../../../components/empty-state';
import { Card, Loading, Page } from '../../../components/page';
import { PlainTable } from '../../../components/plain-table';
import { useCalibration } from '../api/get-calibration';
import { durationText } from './solve-format';

/** /readers/calibration (editor): the engine's grade against readers' solve times across every published puzzle. */
export function CalibrationPage() {
  const cal = useCalibration();
  return (
    <Page
      title="Grade calibration"
      description="The engine's grade of each published puzzle against the median time readers took to solve it (without revealing anything): the time boundaries between grades that fit the data best, and how the engine's grade formula would change to match."
    >
      {cal.isPending ? (
        <Loading />
      ) : cal.error ? (
        <ErrorAlert error={cal.error} title="Could not load the calibration" />
      ) : (
        <CalibrationBody cal={cal.data} />
      )}
    </Page>
  );
}

function CalibrationBody({ cal }: { cal: Calibration }) {
  if (cal.points.length === 0) {
    return <EmptyState title="Not enough solves yet">A puzzle counts here once {cal.minSolved} readers have solved it without revealing anything.</EmptyState>;
  }
  return (
    <>
      {cal.demoRecords > 0 ? (
        <Alert tone="info" title="Includes demo data">
          {cal.demoRecords.toLocaleString('en-GB')} solve records were generated for the demo by a seeded process; the suggestions below are only as good as the data.
        </Alert>
      ) : null}
      <Card title="Engine grade and readers' times">
        <GradeChart cal={cal} />
        <p className="text-sm text-ink-soft">
          {cal.points.length} puzzle{cal.points.length === 1 ? '' : 's'} with at least {cal.minSolved} clean solves.{' '}
          {cal.spearman === null ? 'Too few puzzles for a rank correlation.' : `Rank correlation (Spearman) between grade and time: ${cal.spearman.toFixed(2)}.`}{' '}
          {cal.disagreements === 0 ? 'Readers\u2019 times put every puzzle at its engine grade.' : `${cal.disagreements} puzzle${cal.disagreements === 1 ? '' : 's'} sit at another grade by readers\u2019 times.`}
        </p>
      </Card>
      <Card title="Suggested time boundaries between grades">
        <PlainTable caption="Suggested solve-time boundaries between grades" headings={['Between', 'Median solve time']}>
          {cal.boundariesMs.map((b, i) => (
            <tr key={i} className="border-b border-rule last:border-0">
              <td className="px-3 py-2">Grade {i + 1} and grade {i + 2}</td>
              <td className="px-3 py-2 tabular">{b === null ? 'no data on both sides yet' : durationText(b)}</td>
            </tr>
          ))}
        </PlainTable>
      </Card>
      <Card title="How the engine's grade formula would change">
        {cal.formula.map((f) => (
          <div key={f.kind} className="flex flex-col gap-1">
            <p className="font-semibold">{f.text}</p>
            <p className="text-sm text-ink-muted">Score: {f.score}.</p>
            <PlainTable caption={`${f.kind} grade boundaries, now and suggested`} dense headings={['Grade', 'Lowest score now', 'Suggested']}>
              {f.current.map((c, i) => (
                <tr key={i} className="border-b border-rule last:border-0">
                  <td className="px-2 py-1">Grade {i + 2}</td>
                  <td className="px-2 py-1 tabular">{c}</td>
                  <td className="px-2 py-1 tabular">{f.suggested[i] ?? 'keep (no data)'}</td>
                </tr>
              ))}
            </PlainTable>
          </div>
        ))}
      </Card>
      <Card title="Puzzles in the calibration">
        <div className="overflow-x-auto">
          <PlainTable caption="Published puzzles with their engine grade, readers' grade and median time" headings={['Puzzle', 'Kind', 'Engine grade', "Readers' grade", { label: 'Clean solves', numeric: true }, 'Median time', 'Score']}>
            {cal.points.map((p) => (
              <tr key={p.puzzleId} className="border-b border-rule last:border-0" data-testid={`calibration-${p.puzzleId}`}>
                <td className="px-3 py-2">{p.title}</td>
                <td className="px-3 py-2">{p.kind === 'assembly' ? 'Assembly' : 'Deduction'}</td>
                <td className="px-3 py-2 tabular">{p.engineGrade}</td>
                <td className="px-3 py-2 tabular">{p.readersGrade}{p.readersGrade !== p.engineGrade ? (p.readersGrade > p.engineGrade ? ' (harder)' : ' (easier)') : ''}</td>
                <td className="px-3 py-2 text-right tabular">{p.solved}</td>
                <td className="px-3 py-2 tabular">{durationText(p.medianMs)}</td>
                <td className="px-3 py-2 tabular">{p.kind === 'assembly' ? `${p.score} pieces${p.starters > 0 ? `, ${p.starters} starters` : ''}` : `${p.score} points`}</td>
              </tr>
            ))}
          </PlainTable>
        </div>
      </Card>
    </>
  );
}

/** Median solve time (log scale) against engine grade: a circle per Deduction, a square per Assembly; dashed lines at the suggested boundaries. */
function GradeChart({ cal }: { cal: Calibration }) {
  const W = 640;
  const H = 320;
  const pad = { l: 64, r: 16, t: 12, b: 40 };
  const times = [...cal.points.map((p) => p.medianMs), ...cal.boundariesMs.filter((b): b is number => b !== null)];
  const lo = Math.log(Math.min(...times) * 0.5);
  const hi = Math.log(Math.max(...times) * 2);
  const y = (ms: number) => pad.t + (H - pad.t - pad.b) * (1 - (Math.log(ms) - lo) / (hi - lo || 1));
  const x = (grade: number) => pad.l + ((W - pad.l - pad.r) * (grade - 0.5)) / 5;
  const ticks = [30_000, 60_000, 120_000, 300_000, 600_000, 1_200_000, 1_800_000, 3_600_000, 7_200_000].filter((t) => Math.log(t) >= lo && Math.log(t) <= hi);
  // spread the points of one grade sideways so they do not hide each other
  const seen = new Map<number, number>();
  return (
    <figure>
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full max-w-3xl" role="img" aria-label="Chart: median solve time of each puzzle against its engine grade; the table below lists the same data">
        {ticks.map((t) => (
          <g key={t}>
            <line x1={pad.l} x2={W - pad.r} y1={y(t)} y2={y(t)} stroke="#e0d9cc" />
            <text x={pad.l - 6} y={y(t)} textAnchor="end" dominantBaseline="central" fontSize={11} fill="#5c6169">
              {durationText(t)}
            </text>
          </g>
        ))}
        {[1, 2, 3, 4, 5].map((g) => (
          <text key={g} x={x(g)} y={H - pad.b + 18} textAnchor="middle" fontSize={12} fill="#3a3f46">
            Grade {g}
          </text>
        ))}
        {cal.boundariesMs.map((b, i) =>
          b === null ? null : (
            <g key={i}>
              <line x1={pad.l} x2={W - pad.r} y1={y(b)} y2={y(b)} stroke="#96411f" strokeDasharray="6 4" />
              <text x={W - pad.r} y={y(b) - 4} textAnchor="end" fontSize={11} fill="#96411f">
                {i + 1}|{i + 2}: {durationText(b)}
              </text>
            </g>
          ),
        )}
        {cal.points.map((p) => {
          const n = seen.get(p.engineGrade) ?? 0;
          seen.set(p.engineGrade, n + 1);
          const cx = x(p.engineGrade) + ((n % 7) - 3) * 9;
          const cy = y(p.medianMs);
          return p.kind === 'assembly' ? (
            <rect key={p.puzzleId} x={cx - 5} y={cy - 5} width={10} height={10} fill="#fffdf9" stroke="#1f2328" strokeWidth={1.5}>
              <title>{`${p.title}: ${durationText(p.medianMs)}, engine grade ${p.engineGrade}, readers' grade ${p.readersGrade}`}</title>
            </rect>
          ) : (
            <circle key={p.puzzleId} cx={cx} cy={cy} r={5.5} fill="#b5522b" stroke="#1f2328" strokeWidth={1}>
              <title>{`${p.title}: ${durationText(p.medianMs)}, engine grade ${p.engineGrade}, readers' grade ${p.readersGrade}`}</title>
            </circle>
          );
        })}
      </svg>
      <figcaption className="mt-1 text-sm text-ink-muted">Squares: Assembly puzzles. Circles: Deduction puzzles. Dashed lines: suggested boundaries between grades. Time on a log scale.</figcaption>
    </figure>
  );
}
