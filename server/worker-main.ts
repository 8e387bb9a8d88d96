import { jobEnvSchema, redactUrl } from './platform/jobs/runtime';
import { QueueWorker } from './platform/jobs/queue-worker';

// `npm run worker`: a job worker process for the Redis mode (decision 032), on this machine or
// another one that reaches Redis. It needs REDIS_URL (and the same JOB_QUEUE_PREFIX as the
// server) and no database, no DATA_DIR: it takes parts of jobs from the queues, runs them on
// JOB_WORKERS threads (default 1) and sends results back for the server to store.

const parsed = jobEnvSchema.safeParse(process.env);
const problems = parsed.success ? [] : parsed.error.issues.map((i) => `  ${String(i.path[0] ?? '')}: ${i.message}`);
if (parsed.success && !parsed.data.REDIS_URL) problems.push('  REDIS_URL: required (the Redis the server uses)');
if (!parsed.success || !parsed.data.REDIS_URL) {
  console.error(`Invalid environment for the worker:\n${problems.join('\n')}\nSet REDIS_URL to the server's Redis, e.g. REDIS_URL=redis://127.0.0.1:6379 npm run worker`);
  process.exit(1);
}
const env = { ...parsed.data, REDIS_URL: parsed.data.REDIS_URL };
const threads = Math.max(1, env.JOB_WORKERS ?? 1);
const worker = new QueueWorker({
  redisUrl: env.REDIS_URL,
  prefix: env.JOB_QUEUE_PREFIX,
  threads,
  lockMs: env.JOB_LOCK_MS,
  log: (line) => console.error(line),
});

try {
  await worker.ready();
} catch (e) {
  console.error(`Could not reach Redis at ${redactUrl(env.REDIS_URL)}: ${(e as Error).message}`);
  process.exit(1);
}
console.log(`Squarewright job worker ${worker.id}: ${threads} thread(s), queues ${env.JOB_QUEUE_PREFIX}:* on ${redactUrl(env.REDIS_URL)}`);

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.once(signal, () => {
    // parts still running stall and run again on another worker
    worker.close().finally(() => process.exit(0));
  });
}
