import type { Run } from '../../../../shared/contracts/foundry';
import { JobProgress } from '../../../components/job-progress';

export function describeRun(run: Run): string {
  const p = run.params;
  if (p.mode === 'exhaustive') return `Exhaustive, order ${p.order}${p.squaresOnly ? ', squares only' : ''}`;
  if (p.mode === 'random') {
    const extra = [p.maxSide !== undefined ? `sides ≤ ${p.maxSide}` : '', p.squaresOnly ? 'squares only' : ''].filter(Boolean).join(', ');
    return `Random, ${p.count} of order ${p.orderMin}–${p.orderMax}, seed ${p.seed}${extra ? `, ${extra}` : ''}`;
  }
  return 'Joining';
}

/** "2,892 tilings found: 2,609 perfect and 283 imperfect": the split the run page and the list show. */
export function foundText(run: Pick<Run, 'found' | 'foundPerfect' | 'foundImperfect'>): string {
  if (run.found === 0) return 'no tilings found yet';
  const n = (x: number) => x.toLocaleString('en-GB');
  return `${n(run.found)} ${run.found === 1 ? 'tiling' : 'tilings'} found: ${n(run.foundPerfect)} perfect and ${n(run.foundImperfect)} imperfect`;
}

export function RunProgress({ run }: { run: Run }) {
  return <JobProgress label={describeRun(run)} state={run.state} progress={run.progress} detail={foundText(run)} />;
}
