import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, count, eq, isNotNull } from 'drizzle-orm';
import { uploadJobSchema } from '../../../shared/contracts/submissions';
import { uploadLine } from '../../../server/areas/intake/schema';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { longCode } from '../../fixtures/long-codes';
import { order10Codes } from '../../fixtures/intake/order10';
import { followUpload } from './upload-helper';
import { STORING_PHASE } from '../../../server/platform/jobs/progress';

// Uploads are checked on a job worker and stored by the server in small batches: the POST
// answers at once; cancel stops it and keeps what was stored; an interrupted upload resumes
// where it stopped and stores every line once.

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** A file of `n` long codes (each ~1,000 squares, tens of ms to check: see tests/fixtures/long-codes.ts). */
const longFile = (n: number, from = 0) => Buffer.from(Array.from({ length: n }, (_, i) => longCode(from + i, 100)).join('\n'));
const stored = (jobId: string) => t.db.select({ n: count() }).from(uploadLine).where(eq(uploadLine.jobId, jobId)).get()!.n;
const made = (jobId: string) => t.db.select({ n: count() }).from(uploadLine).where(and(eq(uploadLine.jobId, jobId), isNotNull(uploadLine.submissionId))).get()!.n;

async function until(test: () => boolean, what: string, timeoutMs = 60_000) {
  const deadline = Date.now() + timeoutMs;
  while (!test()) {
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 20));
  }
}

describe('an upload as a job', () => {
  it('answers at once (202) with the job; progress counts lines checked of all; the report comes when it is done', async () => {
    const setter = await t.signInAs('setter');
    // 240 lines of ~5 ms each: longer than the worker's 250 ms between progress messages, so a
    // poll can see it midway even on a fast machine (40 lines once finished before the first one)
    const LINES = 240;
    const res = await setter.post('/api/submissions/upload').attach('file', longFile(LINES), 'long.txt').expect(202);
    const started = uploadJobSchema.parse(res.body);
    expect(['queued', 'running']).toContain(started.state);
    expect(started.report).toBeNull();
    expect(started.fileName).toBe('long.txt');
    let midway = null as null | ReturnType<typeof uploadJobSchema.parse>;
    for (let i = 0; i < 600 && !midway; i++) {
      const u = uploadJobSchema.parse((await setter.get(`/api/submissions/uploads/${started.id}`).expect(200)).body);
      // midway: lines being checked, or (the checking thread waits for storing to catch up,
      // server/platform/jobs/types.ts MAX_UNSTORED_BATCHES) the checked lines being stored
      if (u.state === 'running' && (u.progress?.phase === 'lines checked' || u.progress?.phase === STORING_PHASE) && u.progress.done > 0 && u.progress.done < LINES) midway = u;
      if (u.state === 'done') break;
      await new Promise((r) => setTimeout(r, 25));
    }
    expect(midway).not.toBeNull();
    if (midway!.progress!.phase === 'lines checked') expect(midway!.progress!.total).toBe(LINES);
    else expect(midway!.progress!.total).toBeLessThanOrEqual(LINES);
    expect(midway!.report).toBeNull();
    const done = await followUpload(setter, started.id);
    expect(done.state).toBe('done');
    expect(done.report!.summary).toEqual({ valid: LINES, invalid: 0, duplicate: 0, created: LINES });
    expect(done.summary.lines).toBe(LINES);
  });

  it('cancel stops it: the lines stored so far stay (the report lists them), nothing more is stored', async () => {
    const setter = await t.signInAs('setter');
    const started = uploadJobSchema.parse((await setter.post('/api/submissions/upload').attach('file', longFile(200, 1000), 'many.txt').expect(202)).body);
    await until(() => stored(started.id) >= 3, 'the first stored lines');
    const c = uploadJobSchema.parse((await setter.post(`/api/submissions/uploads/${started.id}/cancel`).expect(200)).body);
    expect(c.state).toBe('cancelled');
    const atCancel = stored(started.id);
    expect(atCancel).toBeLessThan(200);
    await new Promise((r) => setTimeout(r, 1500));
    expect(stored(started.id)).toBe(atCancel);
    const u = await followUpload(setter, started.id);
    expect(u.report!.lines).toHaveLength(atCancel);
    expect(u.report!.summary.created).toBe(made(started.id));
    // each stored line is a submission of this setter, once
    expect(new Set(u.report!.lines.map((l) => l.submissionId)).size).toBe(atCancel);
    await setter.post(`/api/submissions/uploads/${started.id}/cancel`).expect(409);
  });

  it('an upload interrupted by a server stop is shown interrupted; resumed, it stores every line exactly once', async () => {
    const setter = await t.signInAs('setter', { email: 'resume@test.squarewright.test' });
    const lines = [...Array.from({ length: 60 }, (_, i) => longCode(2000 + i, 100)), order10Codes[4]!, '10 65 47 (25,17,23)(11,6)(5,24)(22,4)(19)'];
    const started = uploadJobSchema.parse((await setter.post('/api/submissions/upload').attach('file', Buffer.from(lines.join('\n')), 'resume.txt').expect(202)).body);
    await until(() => stored(started.id) >= 5, 'some stored lines');
    await t.restartJobs();
    const interrupted = uploadJobSchema.parse((await setter.get(`/api/submissions/uploads/${started.id}`).expect(200)).body);
    expect(interrupted.state).toBe('interrupted');
    expect(interrupted.retry.resume).toBe(true);
    const before = stored(started.id);
    expect(before).toBeLessThan(62);
    await setter.post(`/api/submissions/uploads/${started.id}/retry`).send({ how: 'resume' }).expect(200);
    const u = await followUpload(setter, started.id);
    expect(u.state).toBe('done');
    expect(u.report!.lines.map((l) => l.line)).toEqual(Array.from({ length: 62 }, (_, i) => i + 1));
    expect(u.report!.summary).toEqual({ valid: 61, invalid: 1, duplicate: 0, created: 61 });
    // no line was stored twice: one submission per valid line
    expect(made(started.id)).toBe(61);
  });

  it("is the uploader's own: another setter gets 404 (as if there were none); other roles 403", async () => {
    const setter = await t.signInAs('setter');
    const started = uploadJobSchema.parse((await setter.post('/api/submissions/upload').attach('file', Buffer.from(order10Codes[5]!), 'one.txt').expect(202)).body);
    await followUpload(setter, started.id);
    const other = await t.signInAs('setter', { email: 'other@test.squarewright.test' });
    await other.get(`/api/submissions/uploads/${started.id}`).expect(404);
    await other.post(`/api/submissions/uploads/${started.id}/cancel`).expect(404);
    await (await t.signInAs('editor')).get(`/api/submissions/uploads/${started.id}`).expect(403);
  });
});
