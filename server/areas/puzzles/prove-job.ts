import { defineJob } from '../../platform/jobs/types';
import { provePuzzle, PUZZLE_JOB_KIND, puzzleJobParamsSchema, type PuzzleJobInput } from './rules';

// The puzzle proof as a job in the worker pool (kind 'puzzle-prove'); the work itself is
// provePuzzle in ./rules.ts.
export const handler = defineJob({
  kind: PUZZLE_JOB_KIND,
  parseParams: (raw) => puzzleJobParamsSchema.parse(raw),
  run(ctx) {
    const input = ctx.input as PuzzleJobInput;
    return provePuzzle(input, ctx.params.task, ctx.params.revision, {
      shouldStop: () => ctx.shouldStop(),
      progress: (phase, done) => ctx.progress({ phase, done }),
    });
  },
});
