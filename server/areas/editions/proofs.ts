import { createHash, randomUUID } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, isAbsolute, join, resolve } from 'node:path';
import { and, eq, inArray, isNull, or } from 'drizzle-orm';
import type { SessionUser } from '../../../shared/contracts/auth';
import type { Edition, PublishCheck, PublishRequest, SendProof } from '../../../shared/contracts/editions';
import { appRoot } from '../../platform/app-root';
import type { DbOrTx } from '../../platform/db/client';
import { user as userTable } from '../../platform/auth/schema';
import { editionProof } from './schema';
import { Conflict, NotFound } from '../../platform/http/errors';
import { queueMail } from '../../platform/mail/outbox';
import { renderOnWorker } from '../print/index';
import type { EditionsDeps } from './ports';
import { checkEdition, printsPuzzlesOrSolutions } from './edition-checks';
import { loadEditionDocument } from './edition-document';
import { moveEdition, publishBlockers, publishGuard, recordOverride, requireMove, requireSavedState, sendGuard } from './edition-states';
import { getEditionRow, toEdition } from './editions';
import { renderOptionsFor } from './press-spec';
import { printersOf, requirePrinterMaySee } from './printers';
import { feeFor, getPublicationRow } from './publications';
import { slotPuzzle, slotsOf } from './slots';
import { proofDocumentOf } from './stored-json';

// The proof round: send to proof (render version n once, check that very file, store it
// hashed, mail the printers), approve (the press file is the proof's stored document
// re-rendered without the stamp) or return with notes (mail the editor), then publish
// (fees into the ledger in the same transaction). Every state change is a move of
// ./edition-states.ts.

type Deps = Pick<EditionsDeps, 'db' | 'clock' | 'env' | 'mail' | 'puzzles' | 'fees' | 'events' | 'jobs'>;

export function dataDir(deps: Pick<EditionsDeps, 'env'>): string {
  return isAbsolute(deps.env.DATA_DIR) ? deps.env.DATA_DIR : resolve(appRoot(), deps.env.DATA_DIR);
}

export function sha256(buf: Buffer): string {
  return createHash('sha256').update(buf).digest('hex');
}

/** Writes under a temporary name in the same folder, then renames: never a half-written file. */
export function writeFileAtomic(file: string, data: Buffer): void {
  mkdirSync(dirname(file), { recursive: true });
  const tmp = `${file}.${randomUUID()}.tmp`;
  try {
    writeFileSync(tmp, data);
    renameSync(tmp, file);
  } catch (e) {
    rmSync(tmp, { force: true });
    throw e;
  }
}

/**
 * Stores a rendered PDF under DATA_DIR at `rel`, then runs `record` (the transaction that
 * points the database at it, given the file's SHA-256); if that fails, the file goes again.
 */
function storeThenRecord(deps: Pick<EditionsDeps, 'env'>, rel: string, pdf: Buffer, record: (hash: string) => void): void {
  const file = join(dataDir(deps), rel);
  writeFileAtomic(file, pdf);
  try {
    record(sha256(pdf));
  } catch (e) {
    rmSync(file, { force: true });
    throw e;
  }
}

// A random part in each name: two racing requests never write (or clean up) the same file;
// the loser's transaction fails and removes only its own.
const tag = () => randomUUID().slice(0, 8);
const proofRel = (editionId: string, version: number) => join('proofs', editionId, `proof-v${version}-${tag()}.pdf`);
const pressRel = (editionId: string, version: number) => join('proofs', editionId, `press-v${version}-${tag()}.pdf`);

function activeUsersWithRole(db: DbOrTx, role: string) {
  return db
    .select({ id: userTable.id, name: userTable.name, email: userTable.email })
    .from(userTable)
    .where(and(eq(userTable.role, role), or(isNull(userTable.banned), eq(userTable.banned, false))))
    .all();
}

function editionLink(deps: Pick<EditionsDeps, 'env'>, path: string) {
  return `${deps.env.PUBLIC_URL}${path}`;
}

function nextVersion(db: DbOrTx, editionId: string): number {
  const rows = db.select({ v: editionProof.version }).from(editionProof).where(eq(editionProof.editionId, editionId)).all();
  return rows.reduce((m, r) => Math.max(m, r.v), 0) + 1;
}

/** The preflight's verdict in words, for mails and lists: never "passed" beside an error. */
export function preflightWords(p: { ok: boolean; warnings: { code: string }[] }, overridden: boolean): string {
  const errors = p.warnings.filter((w) => w.code.startsWith('error:') || w.code === 'square-small' || w.code === 'digit-small').length;
  const warnings = p.warnings.length - errors;
  if (errors === 0 && p.ok) return `passed${warnings > 0 ? ` with ${warnings} warning(s)` : ''}`;
  return `FAILED with ${errors || 1} error(s)${overridden ? ' (sent anyway by the editor, with a reason)' : ''}`;
}

/**
 * Draft -> in proof: renders proof n with the PROOF stamp (once), runs the checks on that
 * very file's preflight, then stores it and mails the printers. Only the saved state the
 * editor saw goes out (`updatedAt`), with at least one puzzle and every check passed; the
 * preflight's floor errors go through only with the editor's reason, which is recorded.
 */
export async function sendToProof(deps: Deps, who: SessionUser, editionId: string, request: SendProof = {}): Promise<Edition> {
  const r = getEditionRow(deps.db, editionId);
  requireMove(r, 'sendToProof');
  requireSavedState(r, request.updatedAt);
  const version = nextVersion(deps.db, editionId);
  const built = loadEditionDocument(deps, editionId);
  const rendered = await renderOnWorker(deps.jobs, built.doc, renderOptionsFor(deps.db, built.doc, { stamp: 'PROOF', proofVersion: version }));
  const checks = checkEdition(deps, r, built, printsPuzzlesOrSolutions(built) ? rendered.preflight : null);
  const overridden = sendGuard(checks, request.override);
  const rel = proofRel(editionId, version);
  const pub = getPublicationRow(deps.db, r.publicationId);
  storeThenRecord(deps, rel, rendered.pdf, (hash) =>
    deps.db.transaction((tx) => {
      const now = deps.clock.now();
      const fresh = getEditionRow(tx, editionId);
      requireMove(fresh, 'sendToProof');
      requireSavedState(fresh, r.updatedAt.toISOString());
      if (overridden && request.override) recordOverride(tx, editionId, { kind: 'preflight', reason: request.override.reason, refused: overridden.refused, proofVersion: version, by: who.id, at: now });
      tx.update(editionProof).set({ status: 'superseded' }).where(and(eq(editionProof.editionId, editionId), eq(editionProof.status, 'pending'))).run();
      tx.insert(editionProof)
        .values({ editionId, version, sha256: hash, path: rel, bytes: rendered.pdf.length, pages: rendered.pages, preflightJson: JSON.stringify(rendered.preflight), documentJson: JSON.stringify(built.doc), status: 'pending', createdBy: who.id, createdAt: now })
        .run();
      moveEdition(tx, fresh, 'sendToProof', { returnNotes: null, updatedAt: now });
      deps.events.emit(tx, 'edition.proof_sent', { edition: eventEdition(fresh, pub.title, 'in_proof'), proofVersion: version });
      // the proof mail goes to the publication's printers only
      for (const p of printersOf(tx, fresh.publicationId)) {
        queueMail(
          tx,
          {
            to: p.email,
            template: 'proof-ready',
            data: {
              name: p.name,
              publication: pub.title,
              number: String(r.number),
              date: r.editionDate,
              version: String(version),
              pages: String(rendered.pages),
              preflight: preflightWords(rendered.preflight, overridden !== null),
              sha256: hash,
              link: editionLink(deps, `/proofs/${editionId}`),
            },
          },
          now,
        );
      }
    }),
  );
  deps.mail.kick();
  deps.events.kick();
  return toEdition(deps, getEditionRow(deps.db, editionId));
}

function proofRow(db: DbOrTx, editionId: string, version: number) {
  const row = db
    .select()
    .from(editionProof)
    .where(and(eq(editionProof.editionId, editionId), eq(editionProof.version, version)))
    .get();
  if (!row) throw new NotFound(`Edition ${editionId} has no proof version ${version}.`);
  return row;
}

/** The stored proof file (printers only for editions sent to them). */
export function readProofFile(deps: Pick<EditionsDeps, 'db' | 'env'>, who: SessionUser, editionId: string, version: number): { pdf: Buffer; sha256: string; name: string } {
  const r = getEditionRow(deps.db, editionId);
  requirePrinterMaySee(deps.db, who, r);
  const p = proofRow(deps.db, editionId, version);
  const file = join(dataDir(deps), p.path);
  if (!existsSync(file)) throw new NotFound(`The file of proof ${version} is missing from the data folder.`);
  const pub = getPublicationRow(deps.db, r.publicationId);
  return { pdf: readFileSync(file), sha256: p.sha256, name: `${slug(pub.title)}-no${r.number}-proof-v${version}.pdf` };
}

export function readPressFile(deps: Pick<EditionsDeps, 'db' | 'env'>, who: SessionUser, editionId: string): { pdf: Buffer; sha256: string; name: string } {
  const r = getEditionRow(deps.db, editionId);
  requirePrinterMaySee(deps.db, who, r);
  if (!r.pressPath || !r.pressSha256) throw new NotFound(`Edition No. ${r.number} has no press file yet.`);
  const file = join(dataDir(deps), r.pressPath);
  if (!existsSync(file)) throw new NotFound('The press file is missing from the data folder.');
  const pub = getPublicationRow(deps.db, r.publicationId);
  return { pdf: readFileSync(file), sha256: r.pressSha256, name: `${slug(pub.title)}-no${r.number}-press.pdf` };
}

function slug(s: string) {
  return s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '');
}

function decidable(db: DbOrTx, who: SessionUser, editionId: string, version: number, move: 'approveProof' | 'returnProof') {
  const r = getEditionRow(db, editionId);
  requirePrinterMaySee(db, who, r);
  requireMove(r, move);
  const p = proofRow(db, editionId, version);
  if (p.status !== 'pending') throw new Conflict(`Proof ${version} is ${p.status}; only the pending proof can be approved or returned.`, { status: p.status });
  return { r, p };
}

function mailEditor(tx: DbOrTx, deps: Deps, createdBy: string | null, template: 'proof-approved' | 'proof-returned', data: Record<string, string>, now: Date) {
  const sender = createdBy ? tx.select({ name: userTable.name, email: userTable.email }).from(userTable).where(eq(userTable.id, createdBy)).get() : undefined;
  const to = sender ? [sender] : activeUsersWithRole(tx, 'editor');
  for (const u of to) queueMail(tx, { to: u.email, template, data: { ...data, name: u.name } }, now);
}

/** In proof -> approved: the press file is rendered without the stamp, hashed and stored. */
export async function approveProof(deps: Deps, who: SessionUser, editionId: string, version: number): Promise<void> {
  const { r, p: proof } = decidable(deps.db, who, editionId, version, 'approveProof');
  // The press file is the approved proof's own document without the stamp (a later change
  // to a puzzle cannot slip into it).
  const doc = proofDocumentOf(proof) ?? loadEditionDocument(deps, editionId).doc;
  const press = await renderOnWorker(deps.jobs, doc, renderOptionsFor(deps.db, doc, { stamp: null }));
  const rel = pressRel(editionId, version);
  const pub = getPublicationRow(deps.db, r.publicationId);
  storeThenRecord(deps, rel, press.pdf, (hash) =>
    deps.db.transaction((tx) => {
      const now = deps.clock.now();
      const { r: fresh, p } = decidable(tx, who, editionId, version, 'approveProof');
      tx.update(editionProof).set({ status: 'approved', decidedBy: who.id, decidedAt: now }).where(eq(editionProof.id, p.id)).run();
      moveEdition(tx, fresh, 'approveProof', { pressVersion: version, pressSha256: hash, pressPath: rel, pressBytes: press.pdf.length, pressPages: press.pages, pressCreatedAt: now, updatedAt: now });
      mailEditor(tx, deps, p.createdBy, 'proof-approved', { publication: pub.title, number: String(r.number), version: String(version), printer: who.name, sha256: hash, link: editionLink(deps, `/editions/${editionId}`) }, now);
      deps.events.emit(tx, 'edition.approved', { edition: eventEdition(fresh, pub.title, 'approved'), proofVersion: version });
    }),
  );
  deps.mail.kick();
  deps.events.kick();
}

/** In proof -> draft, with the printer's notes. */
export function returnProof(deps: Deps, who: SessionUser, editionId: string, version: number, notes: string): void {
  deps.db.transaction((tx) => {
    const now = deps.clock.now();
    const { r, p } = decidable(tx, who, editionId, version, 'returnProof');
    const pub = getPublicationRow(tx, r.publicationId);
    tx.update(editionProof).set({ status: 'returned', notes, decidedBy: who.id, decidedAt: now }).where(eq(editionProof.id, p.id)).run();
    moveEdition(tx, r, 'returnProof', { returnNotes: notes, updatedAt: now });
    mailEditor(tx, deps, p.createdBy, 'proof-returned', { publication: pub.title, number: String(r.number), version: String(version), printer: who.name, notes, link: editionLink(deps, `/editions/${editionId}`) }, now);
    deps.events.emit(tx, 'edition.proof_returned', { edition: eventEdition(r, pub.title, 'draft'), proofVersion: version, notes });
  });
  deps.mail.kick();
  deps.events.kick();
}

function todayOf(deps: Pick<EditionsDeps, 'clock'>): string {
  return deps.clock.now().toISOString().slice(0, 10);
}

/** What publishing would do now (fees it makes payable) and what stands in its way (GET /api/editions/:id/publish-check). */
export function publishCheck(deps: Pick<EditionsDeps, 'db' | 'clock' | 'puzzles'>, editionId: string): PublishCheck {
  const r = getEditionRow(deps.db, editionId);
  const pub = getPublicationRow(deps.db, r.publicationId);
  const entries = feeEntries(deps, deps.db, editionId, pub);
  const setterIds = [...new Set(entries.map((e) => e.setterId))];
  const setters = new Map(setterIds.length === 0 ? [] : deps.db.select({ id: userTable.id, name: userTable.name }).from(userTable).where(inArray(userTable.id, setterIds)).all().map((u) => [u.id, u.name]));
  const today = todayOf(deps);
  return {
    date: r.editionDate,
    today,
    blockers: publishBlockers(deps.db, r, today),
    fees: {
      currency: pub.currency,
      totalMinor: entries.reduce((sum, e) => sum + e.amountMinor, 0),
      entries: entries.map((e) => ({ slot: e.slot, title: e.title, kind: e.kind, setterName: setters.get(e.setterId) ?? null, amountMinor: e.amountMinor })),
    },
  };
}

/** One fee per printed puzzle with a setter, at the publication's rate for its kind. */
function feeEntries(deps: Pick<EditionsDeps, 'puzzles'>, db: DbOrTx, editionId: string, pub: ReturnType<typeof getPublicationRow>) {
  const out = [];
  for (const s of slotsOf(db, editionId)) {
    const p = slotPuzzle(deps.puzzles, db, s);
    if (!p || !p.setterId) continue;
    out.push({ slot: s.position, title: p.title, puzzleId: p.id, setterId: p.setterId, kind: p.kind, ...feeFor(pub, p.kind) });
  }
  return out;
}

/**
 * Approved -> published. Records, per printed puzzle with a setter, the setter and the
 * publication's fee for its kind in the ledger, in the same transaction. Refused before
 * the edition's date and ahead of an earlier unpublished edition of the publication,
 * unless an admin overrides with a reason (recorded in the same transaction).
 */
export function publishEdition(deps: Deps, who: SessionUser, editionId: string, request: PublishRequest = {}): Edition {
  deps.db.transaction((tx) => {
    const r = getEditionRow(tx, editionId);
    requireMove(r, 'publish');
    const now = deps.clock.now();
    const passed = publishGuard(publishBlockers(tx, r, todayOf(deps)), who, request.override);
    for (const b of passed) recordOverride(tx, editionId, { kind: b.code, reason: request.override!.reason, refused: b.message, by: who.id, at: now });
    const pub = getPublicationRow(tx, r.publicationId);
    const entries = feeEntries(deps, tx, editionId, pub).map(({ puzzleId, setterId, kind, amountMinor, currency }) => ({ puzzleId, setterId, kind, amountMinor, currency }));
    if (entries.length > 0) deps.fees.recordPublicationFees(tx, { editionId, publicationId: pub.id, date: r.editionDate, entries });
    moveEdition(tx, r, 'publish', { publishedAt: now, publishedBy: who.id, updatedAt: now });
    deps.events.emit(tx, 'edition.published', { edition: eventEdition(r, pub.title, 'published'), publishedAt: now.toISOString() });
  });
  deps.events.kick();
  return toEdition(deps, getEditionRow(deps.db, editionId));
}

/** The edition as outgoing events name it (shared/contracts/integrations.ts). */
function eventEdition(r: { id: string; publicationId: string; number: number; editionDate: string }, publicationTitle: string, state: 'draft' | 'in_proof' | 'approved' | 'published') {
  return { id: r.id, publicationId: r.publicationId, publicationTitle, number: r.number, editionDate: r.editionDate, state };
}
