import type { Run } from '../../../../shared/contracts/foundry';
import { ProgressBar } from '../../../components/progress-bar';

export function formatDuration(ms: number): string {
  const s = Math.round(ms / 1000);
  if (s < 60) return `${s} s`;
  const m = Math.floor(s / 60);
  if (m < 60) return `${m} min ${s % 60} s`;
  return `${Math.floor(m / 60)} h ${m % 60} min`;
}

export function describeRun(run: Run): string {
  const p = run.params;
  if (p.mode === 'exhaustive') return `Exhaustive, order ${p.order}${p.squaresOnly ? ', squares only' : ''}`;
  if (p.mode === 'random') {
    const extra = [p.maxSide !== undefined ? `sides ≤ ${p.maxSide}` : '', p.squaresOnly ? 'squares only' : ''].filter(Boolean).join(', ');
    return `Random, ${p.count} of order ${p.orderMin}–${p.orderMax}, seed ${p.seed}${extra ? `, ${extra}` : ''}`;
  }
  return 'Joining';
}

/** "2,609 perfect and 283 imperfect found": the split the run page and the list show. */
export function foundText(run: Pick<Run, 'found' | 'foundPerfect' | 'foundImperfect'>): string {
  if (run.found === 0) return 'no tilings found yet';
  return `${run.foundPerfect.toLocaleString('en-GB')} perfect and ${run.foundImperfect.toLocaleString('en-GB')} imperfect found`;
}

/** The progress line of a run: "412 of 1,342 graphs solved · 310 /s · 3 s left". */
export function progressDetail(run: Run): string {
  const p = run.progress;
  if (!p) return run.state === 'queued' ? 'waiting for a free worker' : '';
  const parts = [`${p.done.toLocaleString('en-GB')}${p.total !== undefined ? ` of ${p.total.toLocaleString('en-GB')}` : ''} ${p.phase ?? ''}`.trim()];
  if (p.rate !== undefined && run.state === 'running') parts.push(`${p.rate.toLocaleString('en-GB')} /s`);
  if (p.etaMs !== undefined && run.state === 'running') parts.push(`${formatDuration(p.etaMs)} left`);
  parts.push(foundText(run));
  return parts.join(' · ');
}

export function RunProgress({ run }: { run: Run }) {
  const p = run.progress;
  const finished = run.state === 'done';
  return (
    <ProgressBar
      label={describeRun(run)}
      value={finished ? 1 : p && p.total ? p.done : undefined}
      max={finished ? 1 : p?.total ?? 1}
      detail={progressDetail(run)}
    />
  );
}
