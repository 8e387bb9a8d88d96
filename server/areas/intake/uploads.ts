import { randomUUID } from 'node:crypto';
import { readFileSync, rmSync } from 'node:fs';
import { mkdir, writeFile } from 'node:fs/promises';
import { isUtf8 } from 'node:buffer';
import { dirname, isAbsolute, join, resolve } from 'node:path';
import { and, asc, count, eq, sql } from 'drizzle-orm';
import type { SessionUser } from '../../../shared/contracts/auth';
import { MAX_UPLOAD_LINES, type UploadJob, type UploadLine, type UploadReport } from '../../../shared/contracts/submissions';
import { tilingErrorSchema } from '../../../shared/contracts/tilings';
import { appRoot } from '../../platform/app-root';
import type { Db, DbOrTx } from '../../platform/db/client';
import { parseStoredJson } from '../../platform/db/stored-json';
import type { Env } from '../../platform/env';
import { notPlainTextReason } from '../../../shared/contracts/code-list';
import { Conflict, NotFound, Unprocessable } from '../../platform/http/errors';
import { defineJobSink, type JobRecord, type Jobs, type JobSink } from '../../platform/jobs/port';
import type { StockPort } from '../stock/ports';
import { uploadLine } from './schema';
import { duplicateOf, insertSubmission } from './submissions';
import { checkedLineSchema, UPLOAD_KIND, uploadParamsSchema, type CheckedLine, type UploadParams } from './upload-job';

// Uploads (decision 051): POST /api/submissions/upload checks the file's form at once (type,
// NUL bytes, number of lines) and answers with a job; the lines are checked on a job worker
// (./upload-job.ts) and stored here, by the job's sink, in small transactions: one submission
// and one upload_line per line. A cancel stops it: the lines stored so far stay (and the report
// lists them). The file waits in DATA_DIR/uploads/ until the job has ended, so an interrupted
// upload can be resumed (lines already stored are skipped) or restarted.

const isEditor = (u: Pick<SessionUser, 'role'>) => u.role === 'editor' || u.role === 'admin';

function dataDirOf(env: Pick<Env, 'DATA_DIR'>): string {
  return isAbsolute(env.DATA_DIR) ? env.DATA_DIR : resolve(appRoot(), env.DATA_DIR);
}

function paramsOf(job: Pick<JobRecord, 'id' | 'params'>): UploadParams {
  const r = uploadParamsSchema.safeParse(job.params);
  if (!r.success) throw new Error(`job ${job.id}: the upload's params do not have their stored shape`);
  return r.data;
}

function parseLine(jobId: string, raw: unknown): CheckedLine {
  const r = checkedLineSchema.safeParse(raw);
  if (!r.success) throw new Error(`upload ${jobId}: a checked line from the worker is malformed: ${r.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
  return r.data;
}

/** Store checked lines (inside the storing transaction). Idempotent: a line already stored is skipped. */
export function storeLines(stock: StockPort, tx: DbOrTx, jobId: string, setterId: string, items: unknown[]): void {
  for (const raw of items) {
    const l = parseLine(jobId, raw);
    const stored = tx.select({ line: uploadLine.line }).from(uploadLine).where(and(eq(uploadLine.jobId, jobId), eq(uploadLine.line, l.line))).get();
    if (stored) continue;
    if (l.verdict === 'invalid') {
      tx.insert(uploadLine).values({ jobId, line: l.line, verdict: 'invalid', errorJson: JSON.stringify(l.error) }).run();
      continue;
    }
    const size = { order: l.order, width: l.width, height: l.height };
    if (l.verdict === 'this-file') {
      tx.insert(uploadLine).values({ jobId, line: l.line, verdict: 'duplicate', duplicateOf: 'this-file', ...size }).run();
      continue;
    }
    const dup = duplicateOf(stock, tx, { reducedKey: l.reducedKey, gcd: l.gcd });
    const facts = { canonicalCode: l.canonicalCode, canonicalKey: l.canonicalKey, reducedKey: l.reducedKey, tiling: l.tiling, classification: { order: l.order, square: l.square, perfect: l.perfect, simple: l.simple } };
    const id = insertSubmission(tx, { id: setterId }, facts, { code: l.code, title: l.title, source: 'file' }, dup);
    tx.insert(uploadLine).values({ jobId, line: l.line, verdict: dup ? 'duplicate' : 'valid', duplicateOf: dup, submissionId: id, ...size }).run();
  }
}

/** The upload job's server half (wired in server/compose.ts). */
export function uploadSink(stock: StockPort, env: Pick<Env, 'DATA_DIR'>): JobSink {
  const root = dataDirOf(env);
  return defineJobSink({
    kind: UPLOAD_KIND,
    lane: 'interactive',
    // the file, kept until the job ends (a resumed job reads it again)
    input: (raw) => {
      const p = uploadParamsSchema.parse(raw);
      return { text: readFileSync(join(root, p.file), 'utf8') };
    },
    onResults(items, tx, job) {
      if (!job.createdBy) throw new Error(`upload ${job.id}: the setter who uploaded it no longer exists`);
      storeLines(stock, tx, job.id, job.createdBy, items);
    },
    onFinish(_summary, _tx, state, job) {
      // a cancelled, interrupted or failed upload keeps its file, to be resumed
      if (state === 'done') rmSync(join(root, uploadParamsSchema.parse(job.params).file), { force: true });
    },
  });
}

/**
 * POST /api/submissions/upload: the file's form is checked here (type, NUL bytes, line count:
 * native scans of the bytes, one decode, about 15 ms for 5 MB); the file is written without
 * holding the request thread; then a job checks and stores its lines. Answers at once.
 */
export async function startUpload(deps: { jobs: Jobs; env: Pick<Env, 'DATA_DIR'>; db: Db }, actor: SessionUser, fileName: string, buf: Buffer): Promise<UploadJob> {
  // accepted by its content, whatever its name: plain text, one code a line
  const notText = notPlainTextReason(buf, isUtf8);
  if (notText) throw new Unprocessable(`"${fileName}" cannot be read as a list of codes: ${notText}`, { path: 'file', fileName });
  const n = lineCount(buf);
  if (n > MAX_UPLOAD_LINES) {
    throw new Unprocessable(`the file has ${n} lines; at most ${MAX_UPLOAD_LINES} are read in one upload`, { path: 'file', lines: n, limit: MAX_UPLOAD_LINES });
  }
  // without a byte-order mark (EF BB BF)
  const body = buf[0] === 0xef && buf[1] === 0xbb && buf[2] === 0xbf ? buf.subarray(3) : buf;
  const text = body.toString('utf8');
  const rel = join('uploads', `${randomUUID()}.txt`);
  const file = join(dataDirOf(deps.env), rel);
  await mkdir(dirname(file), { recursive: true });
  await writeFile(file, body);
  const params: UploadParams = { fileName: fileName.slice(0, 255), file: rel };
  const id = deps.jobs.submit({ kind: UPLOAD_KIND, params, input: { text }, createdBy: actor.id });
  return getUpload(deps, actor, id);
}

/** Lines of the file as text.split(/\r\n|\r|\n/) counts them (a last empty line not counted), by native byte scans. */
export function lineCount(buf: Uint8Array): number {
  let breaks = 0;
  for (let p = buf.indexOf(10); p >= 0; p = buf.indexOf(10, p + 1)) breaks++;
  // a CR is a line break of its own unless a LF follows it
  for (let p = buf.indexOf(13); p >= 0; p = buf.indexOf(13, p + 1)) if (buf[p + 1] !== 10) breaks++;
  if (buf.length === 0) return 0;
  const lastByte = buf[buf.length - 1];
  return lastByte === 10 || lastByte === 13 ? breaks : breaks + 1;
}

function uploadJobOf(deps: { jobs: Jobs }, actor: Pick<SessionUser, 'id' | 'role'>, id: string): JobRecord {
  const r = deps.jobs.get(id);
  // someone else's upload: as if it did not exist
  if (!r || r.kind !== UPLOAD_KIND || (!isEditor(actor) && r.createdBy !== actor.id)) throw new NotFound(`upload ${id} does not exist`);
  return r;
}

const FINAL = ['done', 'cancelled', 'failed', 'interrupted'];

function reportOf(db: DbOrTx, jobId: string, fileName: string): UploadReport {
  const rows = db.select().from(uploadLine).where(eq(uploadLine.jobId, jobId)).orderBy(asc(uploadLine.line)).all();
  const lines: UploadLine[] = rows.map((r) => {
    const l: UploadLine = { line: r.line, verdict: r.verdict };
    if (r.errorJson !== null) l.error = parseStoredJson(tilingErrorSchema, r.errorJson, { table: 'upload_line', rowId: `${jobId}/${r.line}`, column: 'error_json' });
    if (r.submissionId !== null) l.submissionId = r.submissionId;
    if (r.duplicateOf !== null) l.duplicateOf = r.duplicateOf;
    if (r.order !== null) Object.assign(l, { order: r.order, width: r.width ?? undefined, height: r.height ?? undefined });
    return l;
  });
  return { fileName, lines, summary: countsOf(db, jobId) };
}

function countsOf(db: DbOrTx, jobId: string): UploadReport['summary'] {
  const rows = db
    .select({ verdict: uploadLine.verdict, n: count(), created: sql<number>`sum(case when ${uploadLine.submissionId} is not null then 1 else 0 end)` })
    .from(uploadLine)
    .where(eq(uploadLine.jobId, jobId))
    .groupBy(uploadLine.verdict)
    .all();
  const out = { valid: 0, invalid: 0, duplicate: 0, created: 0 };
  for (const r of rows) {
    out[r.verdict] = r.n;
    out.created += Number(r.created ?? 0);
  }
  return out;
}

/** GET /api/submissions/uploads/:id: state, progress, counts so far; the report once the job has ended. */
export function getUpload(deps: { jobs: Jobs; db: Db }, actor: Pick<SessionUser, 'id' | 'role'>, id: string): UploadJob {
  const r = uploadJobOf(deps, actor, id);
  const p = paramsOf(r);
  const counts = countsOf(deps.db, id);
  const lines = deps.db.select({ n: count() }).from(uploadLine).where(eq(uploadLine.jobId, id)).get()?.n ?? 0;
  return {
    id: r.id,
    fileName: p.fileName,
    state: r.state,
    progress: r.progress,
    error: r.error,
    retry: r.retry,
    summary: { ...counts, lines },
    report: FINAL.includes(r.state) ? reportOf(deps.db, id, p.fileName) : null,
    createdAt: r.createdAt.toISOString(),
  };
}

/** Cancel an upload: it stops within 2 s; the lines stored so far stay. */
export function cancelUpload(deps: { jobs: Jobs; db: Db }, actor: SessionUser, id: string): UploadJob {
  const r = uploadJobOf(deps, actor, id);
  if (r.state !== 'queued' && r.state !== 'running') throw new Conflict(`upload ${id} is ${r.state}, not queued or running`);
  deps.jobs.cancel(id);
  return getUpload(deps, actor, id);
}

/** A cancelled, interrupted or failed upload again: resume skips the lines stored; restart checks every line again (still storing each once). */
export function retryUpload(deps: { jobs: Jobs; db: Db }, actor: SessionUser, id: string, how: 'resume' | 'restart'): UploadJob {
  const r = uploadJobOf(deps, actor, id);
  if (!r.retry.resume) throw new Conflict(`upload ${id} is ${r.state}; only a cancelled, interrupted or failed upload can run again`);
  deps.jobs.retry(id, how);
  return getUpload(deps, actor, id);
}
