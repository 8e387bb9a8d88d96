import { and, asc, count, desc, eq, isNotNull, isNull, sql, type SQL } from 'drizzle-orm';
import type { Role } from '../../../shared/contracts/common';
import type {
  BulkReview,
  CreateSubmission,
  Submission,
  SubmissionDetail,
  SubmissionList,
  SubmissionListQuery,
  UploadLine,
  UploadReport,
} from '../../../shared/contracts/submissions';
import { MAX_TITLE, MAX_UPLOAD_LINES } from '../../../shared/contracts/submissions';
import type { Db, DbOrTx } from '../../platform/db/client';
import { user } from '../../platform/auth/schema';
import { submission } from './schema';
import { Conflict, NotFound, Unprocessable } from '../../platform/http/errors';
import type { EventSink } from '../../platform/events';
import { queueMail } from '../../platform/mail/outbox';
import { analyseCode, analyseSquares, analyseTiling, smithDrawingOf, squaresToJson, storedTiling, type TilingAnalysis } from '../stock/index';
import type { StockPort, SubmissionHistory } from '../stock/ports';

// Setters' submissions: in by paste, sketch or file; verified and checked for duplicates on
// the way in; accepted into the stock or rejected by an editor, with a mail to the setter.

export interface Actor {
  id: string;
  role: Role;
}

/** The intake's store: its own tables, and the stock through its port. */
export type IntakeStore = { db: Db; stock: StockPort };

const isEditor = (a: Actor) => a.role === 'editor' || a.role === 'admin';

/** Is this canonical key already in the stock, or pending review? (Never says whose.) */
export function duplicateOf(stock: StockPort, db: DbOrTx, key: string): 'stock' | 'pending' | null {
  if (stock.findByKey(db, key) !== null) return 'stock';
  const p = db
    .select({ id: submission.id })
    .from(submission)
    .where(and(eq(submission.canonicalKey, key), eq(submission.status, 'pending')))
    .get();
  return p ? 'pending' : null;
}

function insertSubmission(
  tx: DbOrTx,
  actor: Actor,
  a: TilingAnalysis,
  fields: { code: string; title?: string | null; note?: string | null; source: 'paste' | 'sketch' | 'file' },
  dup: 'stock' | 'pending' | null,
): number {
  const c = a.classification;
  return tx
    .insert(submission)
    .values({
      setterId: actor.id,
      title: fields.title || null,
      note: fields.note || null,
      source: fields.source,
      code: fields.code,
      canonicalCode: a.canonicalCode,
      canonicalKey: a.canonicalKey,
      squaresJson: squaresToJson(a.tiling),
      width: a.tiling.W,
      height: a.tiling.H,
      order: c.order,
      square: c.square,
      perfect: c.perfect,
      simple: c.simple,
      duplicateOf: dup,
    })
    .returning({ id: submission.id })
    .get().id;
}

/** POST /api/submissions: one tiling by paste or sketch. A bad tiling is a 422 with the engine's what-and-where. */
export function createSubmission(deps: IntakeStore, actor: Actor, input: CreateSubmission): Submission {
  const { db } = deps;
  const r = input.code !== undefined ? analyseCode(input.code) : analyseSquares(input.squares!);
  if (!r.ok) throw new Unprocessable(r.error.message, { code: r.error.code, where: r.error.where, path: input.code !== undefined ? 'body.code' : 'body.squares' });
  const a = r.analysis;
  const code = input.code ?? a.bouwkamp;
  const id = db.transaction((tx) => {
    const dup = duplicateOf(deps.stock, tx, a.canonicalKey);
    return insertSubmission(tx, actor, a, { code, title: input.title, note: input.note, source: input.source }, dup);
  });
  return getSubmission(db, actor, id);
}

export interface UploadHooks {
  /** called before each line's row is written, inside the transaction (tests inject a crash here) */
  beforeWrite?(line: number): void;
}

/** Split an upload into numbered code lines; blank lines and `#` comments are skipped. */
export function codeLines(text: string): { line: number; code: string }[] {
  const out: { line: number; code: string }[] = [];
  const lines = text.split(/\r\n|\r|\n/);
  if (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
  if (lines.length > MAX_UPLOAD_LINES) {
    throw new Unprocessable(`the file has ${lines.length} lines; at most ${MAX_UPLOAD_LINES} are read in one upload`, {
      path: 'file',
      lines: lines.length,
      limit: MAX_UPLOAD_LINES,
    });
  }
  lines.forEach((raw, i) => {
    const code = raw.trim();
    if (code === '' || code.startsWith('#')) return;
    out.push({ line: i + 1, code });
  });
  return out;
}

function captionOf(code: string): string | null {
  const i = code.indexOf('*');
  if (i < 0) return null;
  const t = code.slice(i + 1).trim().slice(0, MAX_TITLE);
  return t || null;
}

/**
 * POST /api/submissions/upload: a text file of codes, one a line. Every line is checked
 * first (no database work); then ONE transaction writes all valid lines, so a failure
 * half-way leaves nothing written.
 */
export function uploadSubmissions(deps: IntakeStore, actor: Actor, fileName: string, buf: Buffer, hooks: UploadHooks = {}): UploadReport {
  const { db } = deps;
  if (!/\.(txt|bkp)$/i.test(fileName)) {
    throw new Unprocessable(`"${fileName}" is not a .txt or .bkp file`, { path: 'file', fileName });
  }
  if (buf.includes(0)) throw new Unprocessable(`"${fileName}" is not a text file (it contains NUL bytes)`, { path: 'file' });
  const text = new TextDecoder('utf-8', { fatal: false }).decode(buf).replace(/^\uFEFF/, '');
  const entries = codeLines(text);
  const checked = entries.map((e) => ({ ...e, r: analyseCode(e.code) }));
  const lines: UploadLine[] = db.transaction((tx) => {
    const seen = new Set<string>();
    const report: UploadLine[] = [];
    for (const e of checked) {
      if (!e.r.ok) {
        report.push({ line: e.line, verdict: 'invalid', error: e.r.error });
        continue;
      }
      const a = e.r.analysis;
      const size = { order: a.classification.order, width: a.tiling.W, height: a.tiling.H };
      if (seen.has(a.canonicalKey)) {
        report.push({ line: e.line, verdict: 'duplicate', duplicateOf: 'this-file', ...size });
        continue;
      }
      seen.add(a.canonicalKey);
      const dup = duplicateOf(deps.stock, tx, a.canonicalKey);
      hooks.beforeWrite?.(e.line);
      const id = insertSubmission(tx, actor, a, { code: e.code, title: captionOf(e.code), source: 'file' }, dup);
      report.push(
        dup
          ? { line: e.line, verdict: 'duplicate', duplicateOf: dup, submissionId: id, ...size }
          : { line: e.line, verdict: 'valid', submissionId: id, ...size },
      );
    }
    return report;
  });
  const summary = { valid: 0, invalid: 0, duplicate: 0, created: 0 };
  for (const l of lines) {
    summary[l.verdict] += 1;
    if (l.submissionId !== undefined) summary.created += 1;
  }
  return { fileName, lines, summary };
}

const columns = {
  id: submission.id,
  setterId: submission.setterId,
  setterName: user.name,
  title: submission.title,
  note: submission.note,
  source: submission.source,
  code: submission.code,
  canonicalCode: submission.canonicalCode,
  canonicalKey: submission.canonicalKey,
  width: submission.width,
  height: submission.height,
  order: submission.order,
  square: submission.square,
  perfect: submission.perfect,
  simple: submission.simple,
  status: submission.status,
  duplicateOf: submission.duplicateOf,
  editorNote: submission.editorNote,
  stockId: submission.stockId,
  createdAt: submission.createdAt,
  reviewedAt: submission.reviewedAt,
};

type Row = Omit<Submission, 'createdAt' | 'reviewedAt' | 'setterName' | 'duplicateOf'> & {
  setterName: string | null;
  duplicateOf: 'stock' | 'pending' | null;
  createdAt: Date;
  reviewedAt: Date | null;
};
function toSubmission(r: Row): Submission {
  return {
    ...r,
    createdAt: r.createdAt.toISOString(),
    reviewedAt: r.reviewedAt ? r.reviewedAt.toISOString() : null,
  };
}

const sorts = {
  createdAt: submission.createdAt,
  title: submission.title,
  order: submission.order,
  width: submission.width,
  height: submission.height,
  status: submission.status,
} as const;

/** GET /api/submissions: setters see only their own; editors see all, filtered. */
export function listSubmissions(db: DbOrTx, actor: Actor, q: SubmissionListQuery): SubmissionList {
  const w: SQL[] = [];
  if (!isEditor(actor)) w.push(eq(submission.setterId, actor.id));
  if (q.status) w.push(eq(submission.status, q.status));
  // the search text is matched literally: % _ and \ are escaped, which SQLite honours only with ESCAPE
  if (q.q) w.push(sql`${submission.title} like ${`%${q.q.replace(/[%_\\]/g, (m) => `\\${m}`)}%`} escape '\\'`);
  if (q.duplicate === 'true') w.push(isNotNull(submission.duplicateOf));
  if (q.duplicate === 'false') w.push(isNull(submission.duplicateOf));
  const where = w.length ? and(...w) : undefined;
  const dir = q.sort.desc ? desc : asc;
  const rows = db
    .select(columns)
    .from(submission)
    .leftJoin(user, eq(user.id, submission.setterId))
    .where(where)
    .orderBy(dir(sorts[q.sort.key]), dir(submission.id))
    .limit(q.pageSize)
    .offset((q.page - 1) * q.pageSize)
    .all();
  const total = db.select({ n: count() }).from(submission).where(where).get()?.n ?? 0;
  return { items: rows.map(toSubmission), total, page: q.page, pageSize: q.pageSize };
}

function rowOf(db: DbOrTx, actor: Actor, id: number): Row & { squaresJson: string } {
  const r = db
    .select({ ...columns, squaresJson: submission.squaresJson })
    .from(submission)
    .leftJoin(user, eq(user.id, submission.setterId))
    .where(eq(submission.id, id))
    .get();
  // a setter asking for someone else's submission learns nothing, not even that it exists
  if (!r || (!isEditor(actor) && r.setterId !== actor.id)) throw new NotFound(`submission ${id} does not exist`);
  return r;
}

export function getSubmission(db: DbOrTx, actor: Actor, id: number): Submission {
  const { squaresJson: _s, ...r } = rowOf(db, actor, id);
  return toSubmission(r);
}

export function getSubmissionDetail(deps: IntakeStore, actor: Actor, id: number): SubmissionDetail {
  const { db } = deps;
  const { squaresJson, ...r } = rowOf(db, actor, id);
  const tiling = storedTiling('submission', { ...r, squaresJson });
  const a = analyseTiling(tiling);
  const duplicates = isEditor(actor) ? sameTilingAs(deps.stock, db, r.canonicalKey, id) : { stockId: null, submissions: [] };
  return { ...toSubmission(r), tiling, smith: smithDrawingOf(tiling), classification: a.classification, bouwkamp: a.bouwkamp, duplicates };
}

export interface ReviewOptions {
  publicUrl: string;
  now?: () => Date;
}

/**
 * Accept a pending submission into the stock, or reject it with a note; in the same
 * transaction the setter's mail is queued in the outbox.
 */
export function reviewSubmission(
  deps: IntakeStore & { events: EventSink },
  reviewer: Actor,
  id: number,
  action: 'accept' | 'reject',
  note: string | undefined,
  opts: ReviewOptions,
): Submission {
  const { db } = deps;
  const now = (opts.now ?? (() => new Date()))();
  db.transaction((tx) => {
    const r = tx
      .select({
        status: submission.status,
        setterId: submission.setterId,
        title: submission.title,
        width: submission.width,
        height: submission.height,
        order: submission.order,
        squaresJson: submission.squaresJson,
        email: user.email,
        name: user.name,
      })
      .from(submission)
      .innerJoin(user, eq(user.id, submission.setterId))
      .where(eq(submission.id, id))
      .get();
    if (!r) throw new NotFound(`submission ${id} does not exist`);
    if (r.status !== 'pending') throw new Conflict(`submission ${id} was already ${r.status}`, { status: r.status });
    let stockId: number | null = null;
    if (action === 'accept') {
      const added = deps.stock.add(tx, {
        tiling: storedTiling('submission', { id, ...r }),
        provenance: 'setter',
        setterId: r.setterId,
        params: { submissionId: id },
        acceptedAt: now,
      });
      if (!added.created) {
        throw new Conflict(`this tiling is already in the stock (stock ${added.id}); reject submission ${id} as a duplicate instead`, {
          stockId: added.id,
        });
      }
      stockId = added.id;
    }
    tx.update(submission)
      .set({ status: action === 'accept' ? 'accepted' : 'rejected', editorNote: note || null, reviewedBy: reviewer.id, reviewedAt: now, stockId })
      .where(eq(submission.id, id))
      .run();
    queueMail(tx, {
      to: r.email,
      template: action === 'accept' ? 'submission-accepted' : 'submission-rejected',
      data: {
        name: r.name,
        title: r.title ?? `submission ${id}`,
        size: `${r.width} x ${r.height}`,
        order: String(r.order),
        note: note || '(no note)',
        link: `${opts.publicUrl.replace(/\/$/, '')}/submissions`,
      },
    });
    deps.events.emit(tx, 'submission.reviewed', {
      submission: { id: String(id), status: action === 'accept' ? 'accepted' : 'rejected', stockId: stockId === null ? null : String(stockId), order: r.order },
    });
  });
  return getSubmission(db, reviewer, id);
}

export function bulkReview(deps: IntakeStore & { events: EventSink }, reviewer: Actor, input: BulkReview, opts: ReviewOptions) {
  const results = input.ids.map((id) => {
    try {
      const s = reviewSubmission(deps, reviewer, id, input.action, input.note, opts);
      return { id, ok: true, status: s.status };
    } catch (e) {
      if (e instanceof NotFound || e instanceof Conflict || e instanceof Unprocessable) return { id, ok: false, error: e.message };
      throw e;
    }
  });
  return { results };
}

/** Other submissions of the same tiling (up to symmetry) and its stock row: for editors' eyes only. */
export function sameTilingAs(stock: StockPort, db: DbOrTx, key: string, exceptId: number): SubmissionDetail['duplicates'] {
  const subs = db
    .select({ id: submission.id, status: submission.status })
    .from(submission)
    .where(eq(submission.canonicalKey, key))
    .orderBy(asc(submission.id))
    .all()
    .filter((s) => s.id !== exceptId);
  return { stockId: stock.findByKey(db, key), submissions: subs };
}

/** Accepted submissions of a stock tiling, oldest first: the stock's history (see SubmissionHistory in ../stock/ports.ts). */
export const submissionHistory: SubmissionHistory = {
  acceptedFor: (db, stockId) =>
    db
      .select({ submissionId: submission.id, submittedAt: submission.createdAt, acceptedAt: submission.reviewedAt })
      .from(submission)
      .where(and(eq(submission.stockId, stockId), eq(submission.status, 'accepted')))
      .orderBy(asc(submission.createdAt))
      .all(),
};
