import { describe, expect, it } from 'vitest';
import { jobProgressDetail } from '../../../src/components/job-progress';

// The progress line every job shows (uploads, foundry runs, proofs): while it runs, the phase
// with done of total, rate and time left; once done, what it left behind, not its last phase.

describe('jobProgressDetail', () => {
  it('a running job says its phase, rate and time left, and what is stored while it searches', () => {
    expect(jobProgressDetail('running', { phase: 'graphs solved', done: 412, total: 1342, rate: 310.5, etaMs: 3000, stored: 1200, received: 1300 })).toBe(
      '412 of 1,342 graphs solved · 310.5 /s · 3 s left · 1,200 stored',
    );
    expect(jobProgressDetail('running', { phase: 'storing results', done: 1200, total: 3000, rate: 900, etaMs: 2000, stored: 1200 })).toBe('1,200 of 3,000 storing results · 900 /s · 2 s left');
  });

  it('a finished job says how many results it stored (a run once read "3 of 3 storing results" when done)', () => {
    expect(jobProgressDetail('done', { phase: 'storing results', done: 3, total: 3, stored: 3 })).toBe('3 results stored');
    expect(jobProgressDetail('done', { phase: 'storing results', done: 1, total: 1 })).toBe('1 result stored');
    expect(jobProgressDetail('done', { phase: 'lines checked', done: 40, total: 40 })).toBe('40 of 40 lines checked');
  });

  it('a queued job without progress waits for a worker', () => {
    expect(jobProgressDetail('queued', null)).toBe('waiting for a free worker');
  });
});
