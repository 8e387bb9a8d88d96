import { defineJob } from '../../platform/jobs/types';
import { issuesText } from '../../platform/db/stored-json';
import { provePuzzle, PUZZLE_JOB_KIND, puzzleJobInputSchema, puzzleJobParamsSchema } from './rules';

// The puzzle proof as a job in the worker pool (kind 'puzzle-prove'); the work itself is
// provePuzzle in ./rules.ts. Params and input are parsed here, in the worker: a malformed
// input fails the job with an error naming the puzzle and the place of the problem.
export const handler = defineJob({
  kind: PUZZLE_JOB_KIND,
  parseParams: (raw) => puzzleJobParamsSchema.parse(raw),
  run(ctx) {
    const input = puzzleJobInputSchema.safeParse(ctx.input);
    if (!input.success) throw new Error(`puzzle ${ctx.params.puzzleId}: the proof's input is malformed: ${issuesText(input.error)}`);
    return provePuzzle(input.data, ctx.params.task, ctx.params.revision, {
      shouldStop: () => ctx.shouldStop(),
      progress: (phase, done) => ctx.progress({ phase, done }),
    });
  },
});
