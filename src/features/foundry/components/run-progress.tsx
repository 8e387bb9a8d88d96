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

/** "2,609 perfect and 283 imperfect found": the split the run page and the list show. */
export function foundText(run: Pick<Run, 'found' | 'foundPerfect' | 'foundImperfect'>): string {
  if (run.found === 0) return 'no tilings found yet';
  return `${run.foundPerfect.toLocaleString('en-GB')} perfect and ${run.foundImperfect.toLocaleString('en-GB')} imperfect found`;
}

export function RunProgress({ run }: { run: Run }) {
  return <JobProgress label={describeRun(run)} state={run.state} progress={run.progress} detail={foundText(run)} />;
}
