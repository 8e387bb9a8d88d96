import { createHash, randomUUID } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, isAbsolute, join, resolve } from 'node:path';
import { and, eq, isNull, or } from 'drizzle-orm';
import type { SessionUser } from '../../../shared/contracts/auth';
import { plainRichText, type Edition } from '../../../shared/contracts/editions';
import { appRoot } from '../../platform/app-root';
import type { DbOrTx } from '../../platform/db/client';
import { user as userTable } from '../../platform/auth/schema';
import { edition, editionProof, editionSlot } from './schema';
import { Conflict, NotFound, Unprocessable } from '../../platform/http/errors';
import { queueMail } from '../../platform/mail/outbox';
import { renderEditionPdf, type EditionDocument } from '../print/index';
import type { EditionsDeps } from './ports';
import { buildEditionDocument, createEdition, getEditionRow, requireState, runEditionChecks, toEdition, updateEdition, visibleToPrinter } from './editions';
import { feeFor, getPublicationRow, listPublications } from './publications';

// The proof round: send to proof (render version n, store it hashed, mail the printers),
// approve (the press file is the proof re-rendered without the stamp) or return with
// notes (mail the editor), then publish (fees into the ledger in the same transaction).

type Deps = Pick<EditionsDeps, 'db' | 'clock' | 'env' | 'mail' | 'puzzles' | 'fees'>;

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

/** Draft -> in proof: runs the checks, renders proof n with the PROOF stamp, stores and mails. */
export async function sendToProof(deps: Deps, who: SessionUser, editionId: string): Promise<Edition> {
  const r = getEditionRow(deps.db, editionId);
  requireState(r, 'draft', 'send to proof');
  const checks = await runEditionChecks(deps, editionId);
  if (!checks.ok) {
    throw new Unprocessable(
      'The edition does not pass its checks before proof.',
      checks.checks.filter((c) => !c.ok).map((c) => ({ path: c.slot ? `slots.${c.slot}` : c.code, message: c.message })),
    );
  }
  const version = nextVersion(deps.db, editionId);
  const built = buildEditionDocument(deps, editionId);
  const rendered = await renderEditionPdf(built.doc, { stamp: 'PROOF', proofVersion: version });
  const rel = proofRel(editionId, version);
  const file = join(dataDir(deps), rel);
  writeFileAtomic(file, rendered.pdf);
  const hash = sha256(rendered.pdf);
  const pub = getPublicationRow(deps.db, r.publicationId);
  try {
    deps.db.transaction((tx) => {
      const now = deps.clock.now();
      const fresh = getEditionRow(tx, editionId);
      requireState(fresh, 'draft', 'send to proof');
      tx.update(editionProof).set({ status: 'superseded' }).where(and(eq(editionProof.editionId, editionId), eq(editionProof.status, 'pending'))).run();
      tx.insert(editionProof)
        .values({ editionId, version, sha256: hash, path: rel, bytes: rendered.pdf.length, pages: rendered.pages, preflightJson: JSON.stringify(rendered.preflight), documentJson: JSON.stringify(built.doc), status: 'pending', createdBy: who.id, createdAt: now })
        .run();
      tx.update(edition).set({ state: 'in_proof', returnNotes: null, updatedAt: now }).where(eq(edition.id, editionId)).run();
      const warnings = rendered.preflight.warnings.length;
      for (const p of activeUsersWithRole(tx, 'printer')) {
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
              preflight: rendered.preflight.ok ? `passed${warnings > 0 ? ` with ${warnings} warning(s)` : ''}` : 'FAILED',
              sha256: hash,
              link: editionLink(deps, `/proofs/${editionId}`),
            },
          },
          now,
        );
      }
    });
  } catch (e) {
    rmSync(file, { force: true });
    throw e;
  }
  deps.mail.kick();
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
  if (who.role === 'printer' && !visibleToPrinter(deps.db, editionId)) throw new NotFound(`No edition ${editionId}.`);
  const p = proofRow(deps.db, editionId, version);
  const file = join(dataDir(deps), p.path);
  if (!existsSync(file)) throw new NotFound(`The file of proof ${version} is missing from the data folder.`);
  const pub = getPublicationRow(deps.db, r.publicationId);
  return { pdf: readFileSync(file), sha256: p.sha256, name: `${slug(pub.title)}-no${r.number}-proof-v${version}.pdf` };
}

export function readPressFile(deps: Pick<EditionsDeps, 'db' | 'env'>, editionId: string): { pdf: Buffer; sha256: string; name: string } {
  const r = getEditionRow(deps.db, editionId);
  if (!r.pressPath || !r.pressSha256) throw new NotFound(`Edition No. ${r.number} has no press file yet.`);
  const file = join(dataDir(deps), r.pressPath);
  if (!existsSync(file)) throw new NotFound('The press file is missing from the data folder.');
  const pub = getPublicationRow(deps.db, r.publicationId);
  return { pdf: readFileSync(file), sha256: r.pressSha256, name: `${slug(pub.title)}-no${r.number}-press.pdf` };
}

function slug(s: string) {
  return s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '');
}

function decidable(db: DbOrTx, editionId: string, version: number) {
  const r = getEditionRow(db, editionId);
  requireState(r, 'in_proof', 'decide on a proof');
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
  const { r, p: proof } = decidable(deps.db, editionId, version);
  // The press file is the approved proof's own document without the stamp (a later change
  // to a puzzle cannot slip into it).
  const doc = proof.documentJson ? (JSON.parse(proof.documentJson) as EditionDocument) : buildEditionDocument(deps, editionId).doc;
  const press = await renderEditionPdf(doc, { stamp: null });
  const rel = pressRel(editionId, version);
  const file = join(dataDir(deps), rel);
  writeFileAtomic(file, press.pdf);
  const hash = sha256(press.pdf);
  const pub = getPublicationRow(deps.db, r.publicationId);
  try {
    deps.db.transaction((tx) => {
      const now = deps.clock.now();
      const { p } = decidable(tx, editionId, version);
      tx.update(editionProof).set({ status: 'approved', decidedBy: who.id, decidedAt: now }).where(eq(editionProof.id, p.id)).run();
      tx.update(edition)
        .set({ state: 'approved', pressVersion: version, pressSha256: hash, pressPath: rel, pressBytes: press.pdf.length, pressPages: press.pages, pressCreatedAt: now, updatedAt: now })
        .where(eq(edition.id, editionId))
        .run();
      mailEditor(tx, deps, p.createdBy, 'proof-approved', { publication: pub.title, number: String(r.number), version: String(version), printer: who.name, sha256: hash, link: editionLink(deps, `/editions/${editionId}`) }, now);
    });
  } catch (e) {
    rmSync(file, { force: true });
    throw e;
  }
  deps.mail.kick();
}

/** In proof -> draft, with the printer's notes. */
export function returnProof(deps: Deps, who: SessionUser, editionId: string, version: number, notes: string): void {
  deps.db.transaction((tx) => {
    const now = deps.clock.now();
    const { r, p } = decidable(tx, editionId, version);
    const pub = getPublicationRow(tx, r.publicationId);
    tx.update(editionProof).set({ status: 'returned', notes, decidedBy: who.id, decidedAt: now }).where(eq(editionProof.id, p.id)).run();
    tx.update(edition).set({ state: 'draft', returnNotes: notes, updatedAt: now }).where(eq(edition.id, editionId)).run();
    mailEditor(tx, deps, p.createdBy, 'proof-returned', { publication: pub.title, number: String(r.number), version: String(version), printer: who.name, notes, link: editionLink(deps, `/editions/${editionId}`) }, now);
  });
  deps.mail.kick();
}

/**
 * Approved -> published. Records, per printed puzzle with a setter, the setter and the
 * publication's fee for its kind in the ledger, in the same transaction.
 */
export function publishEdition(deps: Deps, who: SessionUser, editionId: string): Edition {
  const source = deps.puzzles;
  deps.db.transaction((tx) => {
    const r = getEditionRow(tx, editionId);
    requireState(r, 'approved', 'publish');
    const pub = getPublicationRow(tx, r.publicationId);
    const slots = tx.select({ puzzleId: editionSlot.puzzleId }).from(editionSlot).where(eq(editionSlot.editionId, editionId)).all();
    const entries = [];
    for (const s of slots) {
      const p = source.getPuzzleForPrint(tx, s.puzzleId);
      if (!p || !p.setterId) continue;
      entries.push({ puzzleId: p.id, setterId: p.setterId, kind: p.kind, ...feeFor(pub, p.kind) });
    }
    if (entries.length > 0) deps.fees.recordPublicationFees(tx, { editionId, publicationId: pub.id, date: r.editionDate, entries });
    const now = deps.clock.now();
    tx.update(edition).set({ state: 'published', publishedAt: now, publishedBy: who.id, updatedAt: now }).where(eq(edition.id, editionId)).run();
  });
  return toEdition(deps, getEditionRow(deps.db, editionId));
}

// ---- demo -------------------------------------------------------------------------------

function demoUser(db: DbOrTx, email: string): SessionUser | null {
  const u = db.select({ id: userTable.id, name: userTable.name, email: userTable.email, role: userTable.role }).from(userTable).where(eq(userTable.email, email)).get();
  if (!u || (u.role !== 'editor' && u.role !== 'printer' && u.role !== 'admin' && u.role !== 'setter')) return null;
  return { id: u.id, name: u.name, email: u.email, role: u.role };
}

function isoDay(d: Date): string {
  return d.toISOString().slice(0, 10);
}

/** The Saturday on or after a date (UTC). */
export function saturdayOnOrAfter(d: Date): Date {
  const out = new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate()));
  out.setUTCDate(out.getUTCDate() + ((6 - out.getUTCDay() + 7) % 7));
  return out;
}

/**
 * Demo editions of Larkspur & Quill Press: The Saturday Quadrant No. 40 (published),
 * No. 41 (in proof), No. 42 (draft) and Squared Away Monthly No. 12 (draft). The round is
 * driven through the real services when the puzzle store offers printable puzzles;
 * otherwise the editions stay empty drafts.
 */
export async function seedDemoEditions(deps: EditionsDeps): Promise<void> {
  const pubs = new Map(listPublications(deps.db).map((p) => [p.title, p]));
  const quadrant = pubs.get('The Saturday Quadrant');
  const monthly = pubs.get('Squared Away Monthly');
  const editorUser = demoUser(deps.db, 'editor@demo.squarewright.test');
  const printerUser = demoUser(deps.db, 'printer@demo.squarewright.test');
  if (!quadrant || !monthly || !editorUser || !printerUser) return;
  const next = saturdayOnOrAfter(deps.clock.now());
  const day = (offset: number) => isoDay(new Date(next.getTime() + offset * 86_400_000));
  const intro = (n: number) =>
    plainRichText(`Welcome to No. ${n} of The Saturday Quadrant from Larkspur & Quill Press.`, 'Every rectangle below is cut into squares of whole-number sides. Solutions appear in next week\u2019s column.');
  const e40 = createEdition(deps, editorUser, { publicationId: quadrant.id, number: 40, date: day(-7), introduction: intro(40) });
  const e41 = createEdition(deps, editorUser, { publicationId: quadrant.id, number: 41, date: day(0), introduction: intro(41) });
  createEdition(deps, editorUser, { publicationId: quadrant.id, number: 42, date: day(7), introduction: intro(42) });
  const firstOfNext = new Date(Date.UTC(next.getUTCFullYear(), next.getUTCMonth() + 1, 1));
  createEdition(deps, editorUser, { publicationId: monthly.id, number: 12, date: isoDay(firstOfNext), introduction: plainRichText('Squared Away Monthly: this month\u2019s squared rectangles, with full solutions at the back.') });

  const ids = deps.puzzles.listPrintablePuzzleIds(deps.db);
  if (ids.length < 4) {
    deps.log.info(`demo editions: ${ids.length} printable puzzle(s) found, so the demo editions stay drafts`);
    return;
  }
  const instr = plainRichText('Use every piece once.');
  try {
    updateEdition(deps, e40.id, { slots: [{ puzzleId: ids[0]!, instructions: instr }, { puzzleId: ids[1]!, instructions: instr }] });
    updateEdition(deps, e41.id, { slots: [{ puzzleId: ids[2]!, instructions: instr }, { puzzleId: ids[3]!, instructions: instr }] });
    await sendToProof(deps, editorUser, e40.id);
    await approveProof(deps, printerUser, e40.id, 1);
    publishEdition(deps, editorUser, e40.id);
    await sendToProof(deps, editorUser, e41.id);
  } catch (e) {
    deps.log.warn(`demo editions: the proof round stopped early: ${(e as Error).message}`);
  }
}
