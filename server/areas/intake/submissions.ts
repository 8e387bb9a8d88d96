import { and, asc, count, desc, eq, isNull, sql, type SQL } from 'drizzle-orm';
import { connectionOf, prepared } from '../../platform/db/statements';
import type { Role } from '../../../shared/contracts/common';
import type {
  BulkReview,
  CreateSubmission,
  Submission,
  SubmissionDetail,
  SubmissionList,
  SubmissionListQuery,
} from '../../../shared/contracts/submissions';
import { submissionTitle } from '../../../shared/contracts/submissions';
import type { Db, DbOrTx } from '../../platform/db/client';
import { user } from '../../platform/auth/schema';
import { submission } from './schema';
import { Conflict, NotFound, Unprocessable } from '../../platform/http/errors';
import type { EventSink } from '../../platform/events';
import { queueMail } from '../../platform/mail/outbox';
import { analyseCode, analyseSquares, analyseTiling, gcdOfKey, smithDrawingOf, squaresToJson, stock, storedTiling, type TilingAnalysis } from '../stock/index';
import { scaleText } from '../../../shared/contracts/tilings';
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

/** The same tiling in the stock (exactly, or at another scale), and other pending submissions of it. */
export type Duplicates = { stock: { id: number; scale: string } | null; pending: number[] };

/**
 * Where else this tiling is, up to symmetry and scale (same reduced key): the stock row
 * (with the scale of this tiling against it, "1x" when the same) and other pending
 * submissions. Read live, so the queue's badge and the drawer always agree.
 * `except` leaves out the submission itself and the stock row it was accepted into.
 */
export function duplicatesOf(stock: StockPort, db: DbOrTx, t: { reducedKey: string; gcd: number }, except: { submissionId?: number; stockId?: number | null } = {}): Duplicates {
  const s = stock.findByReducedKey(db, t.reducedKey);
  const inStock = s && s.id !== except.stockId ? { id: s.id, scale: scaleText(t.gcd, gcdOfKey(s.canonicalKey)) } : null;
  const pending = db
    .select({ id: submission.id })
    .from(submission)
    .where(and(eq(submission.reducedKey, t.reducedKey), eq(submission.status, 'pending')))
    .orderBy(asc(submission.id))
    .all()
    .map((r) => r.id)
    .filter((id) => id !== except.submissionId);
  return { stock: inStock, pending };
}

/**
 * Fills reduced_key for submissions stored before migration 0017 (run once at start-up).
 * Returns how many rows it filled.
 */
export function fillSubmissionReducedKeys(db: DbOrTx): number {
  const rows = db
    .select({ id: submission.id, canonicalKey: submission.canonicalKey, squaresJson: submission.squaresJson, width: submission.width, height: submission.height })
    .from(submission)
    .where(isNull(submission.reducedKey))
    .all();
  for (const r of rows) {
    const reducedKey = gcdOfKey(r.canonicalKey) === 1 ? r.canonicalKey : analyseTiling(storedTiling('submission', r)).reducedKey;
    db.update(submission).set({ reducedKey }).where(eq(submission.id, r.id)).run();
  }
  return rows.length;
}

/** Is this tiling (at any scale) already in the stock, or pending review? (Never says whose.) */
export function duplicateOf(stock: StockPort, db: DbOrTx, t: { reducedKey: string; gcd: number }): 'stock' | 'pending' | null {
  const d = duplicatesOf(stock, db, t);
  return d.stock ? 'stock' : d.pending.length > 0 ? 'pending' : null;
}

/** What a submission row stores of a checked tiling (a TilingAnalysis, or an upload line checked on a job worker). */
export type SubmissionFacts = Pick<TilingAnalysis, 'canonicalCode' | 'canonicalKey' | 'reducedKey' | 'tiling'> & {
  classification: Pick<TilingAnalysis['classification'], 'order' | 'square' | 'perfect' | 'simple'>;
};

export function insertSubmission(
  tx: DbOrTx,
  actor: Pick<Actor, 'id'>,
  a: SubmissionFacts,
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
      reducedKey: a.reducedKey,
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
    const dup = duplicateOf(deps.stock, tx, a);
    return insertSubmission(tx, actor, a, { code, title: input.title, note: input.note, source: input.source }, dup);
  });
  return getSubmission(deps, actor, id);
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
  reducedKey: submission.reducedKey,
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

type Row = Omit<Submission, 'createdAt' | 'reviewedAt' | 'setterName' | 'duplicateOf' | 'sameAs'> & {
  setterName: string | null;
  reducedKey: string | null;
  duplicateOf: 'stock' | 'pending' | null;
  createdAt: Date;
  reviewedAt: Date | null;
};

/** The row's duplicates now (live; the stored duplicate_of is what was true when it came in). */
function liveDuplicates(stock: StockPort, db: DbOrTx, r: Pick<Row, 'id' | 'canonicalKey' | 'reducedKey' | 'stockId'>): Duplicates {
  return duplicatesOf(stock, db, { reducedKey: r.reducedKey ?? r.canonicalKey, gcd: gcdOfKey(r.canonicalKey) }, { submissionId: r.id, stockId: r.stockId });
}

function toSubmission(stock: StockPort, db: DbOrTx, actor: Actor, r: Row): Submission {
  const { reducedKey: _k, ...rest } = r;
  const d = liveDuplicates(stock, db, r);
  return {
    ...rest,
    duplicateOf: d.stock ? 'stock' : d.pending.length > 0 ? 'pending' : null,
    // which stock tiling and at what scale: for editors' eyes only
    sameAs: d.stock && isEditor(actor) ? { stockId: d.stock.id, scale: d.stock.scale } : null,
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

/** The same tiling at any scale is in the stock (other than the row it was accepted into), or pending in another submission: live, as the drawer reads it. */
const liveDuplicateSql = sql`(exists (select 1 from ${stock} s where s.reduced_key = coalesce(${submission.reducedKey}, ${submission.canonicalKey}) and s.id is not ${submission.stockId})
  or exists (select 1 from ${submission} o where o.reduced_key = coalesce(${submission.reducedKey}, ${submission.canonicalKey}) and o.status = 'pending' and o.id <> ${submission.id}))`;

/** GET /api/submissions: setters see only their own; editors see all, filtered. */
export function listSubmissions(deps: IntakeStore, actor: Actor, q: SubmissionListQuery): SubmissionList {
  const { db } = deps;
  const w: SQL[] = [];
  if (!isEditor(actor)) w.push(eq(submission.setterId, actor.id));
  if (q.status) w.push(eq(submission.status, q.status));
  // the search text is matched literally: % _ and \ are escaped, which SQLite honours only with ESCAPE
  if (q.q) w.push(sql`${submission.title} like ${`%${q.q.replace(/[%_\\]/g, (m) => `\\${m}`)}%`} escape '\\'`);
  if (q.duplicate === 'true') w.push(liveDuplicateSql);
  if (q.duplicate === 'false') w.push(sql`not ${liveDuplicateSql}`);
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
  return { items: rows.map((r) => toSubmission(deps.stock, db, actor, r)), total, page: q.page, pageSize: q.pageSize };
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

export function getSubmission(deps: IntakeStore, actor: Actor, id: number): Submission {
  const { squaresJson: _s, ...r } = rowOf(deps.db, actor, id);
  return toSubmission(deps.stock, deps.db, actor, r);
}

export function getSubmissionDetail(deps: IntakeStore, actor: Actor, id: number): SubmissionDetail {
  const { db } = deps;
  const { squaresJson, ...r } = rowOf(db, actor, id);
  const tiling = storedTiling('submission', { ...r, squaresJson });
  const a = analyseTiling(tiling);
  const duplicates = isEditor(actor) ? sameTilingAs(deps.stock, db, r) : { stockId: null, scale: null, submissions: [] };
  return { ...toSubmission(deps.stock, db, actor, r), tiling, smith: smithDrawingOf(tiling), classification: a.classification, bouwkamp: a.bouwkamp, duplicates };
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
        source: submission.source,
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
        const at = added.scale ? ` at ${added.scale}` : '';
        throw new Conflict(`this tiling is already in the stock: it is stock tiling ${added.id}${at}; reject "${submissionTitle(r.title, r.source)}" as a duplicate instead`, {
          stockId: added.id,
          ...(added.scale ? { scale: added.scale } : {}),
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
        title: submissionTitle(r.title, r.source),
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
  return getSubmission(deps, reviewer, id);
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

/** Other submissions of the same tiling (up to symmetry and scale) and its stock row with the scale: for editors' eyes only. */
export function sameTilingAs(stock: StockPort, db: DbOrTx, r: Pick<Row, 'id' | 'canonicalKey' | 'reducedKey' | 'stockId'>): SubmissionDetail['duplicates'] {
  const key = r.reducedKey ?? r.canonicalKey;
  const subs = db
    .select({ id: submission.id, status: submission.status })
    .from(submission)
    .where(eq(submission.reducedKey, key))
    .orderBy(asc(submission.id))
    .all()
    .filter((s) => s.id !== r.id);
  const d = liveDuplicates(stock, db, r);
  return { stockId: d.stock?.id ?? null, scale: d.stock?.scale ?? null, submissions: subs };
}

/** Accepted submissions of a stock tiling, oldest first: the stock's history (see SubmissionHistory in ../stock/ports.ts). */
export const submissionHistory: SubmissionHistory = {
  // a prepared statement: this runs for every stock detail (issue 14)
  acceptedFor: (db, stockId) =>
    (prepared(connectionOf(db), "select id as submissionId, created_at as submittedAt, reviewed_at as acceptedAt from submission where stock_id = ? and status = 'accepted' order by created_at asc").all(stockId) as { submissionId: number; submittedAt: number; acceptedAt: number | null }[])
      .map((r) => ({ submissionId: r.submissionId, submittedAt: new Date(r.submittedAt), acceptedAt: r.acceptedAt === null ? null : new Date(r.acceptedAt) })),
};
