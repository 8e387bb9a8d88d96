import { eq } from 'drizzle-orm';
import type { SessionUser } from '../../../shared/contracts/auth';
import { plainRichText } from '../../../shared/contracts/editions';
import { user as userTable } from '../../platform/auth/schema';
import type { DbOrTx } from '../../platform/db/client';
import { createEdition, updateEdition } from './editions';
import type { EditionsDeps } from './ports';
import { approveProof, publishEdition, sendToProof } from './proofs';
import { listPublications } from './publications';

// The editions' demo data, driven through the real services.

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

/** The Saturday on or before a date (UTC): this week's edition of a Saturday column. */
export function saturdayOnOrBefore(d: Date): Date {
  const out = new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate()));
  out.setUTCDate(out.getUTCDate() - ((out.getUTCDay() + 1) % 7));
  return out;
}

/**
 * Demo editions of Larkspur & Quill Press: The Saturday Quadrant No. 39 (two weeks ago,
 * published, when six puzzles are printable), No. 40 (last week's, published), No. 41 (this week's, dated the Saturday on or before today, in proof: it may
 * be published once approved), No. 42 (next week's, draft, due within 7 days) and Squared
 * Away Monthly No. 12 (draft). The round is
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
  const next = saturdayOnOrBefore(deps.clock.now());
  const day = (offset: number) => isoDay(new Date(next.getTime() + offset * 86_400_000));
  const intro = (n: number) =>
    plainRichText(`Welcome to No. ${n} of The Saturday Quadrant from Larkspur & Quill Press.`, 'Every rectangle below is cut into squares of whole-number sides. Solutions appear in next week\u2019s column.');
  // No. 39 (two weeks ago, published before No. 40) only when there are puzzles for it: readers then
  // have three weeks of editions to play, and its solutions are public (No. 40 is out)
  const printable = deps.puzzles.listPrintablePuzzleIds(deps.db);
  const e39 = printable.length >= 6 ? createEdition(deps, editorUser, { publicationId: quadrant.id, number: 39, date: day(-14), introduction: intro(39) }) : null;
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
  // The Assembly pieces print at half scale, and the smallest are under the column's 3 mm
  // floor: the demo desk sends them past the preflight with a recorded reason.
  const send = { override: { reason: 'Demo: the smallest pieces are cut from card at the press; agreed with the printer.' } };
  try {
    if (e39) {
      updateEdition(deps, e39.id, { slots: [{ puzzleId: ids[4]!, instructions: instr }, { puzzleId: ids[5]!, instructions: instr }] });
      await sendToProof(deps, editorUser, e39.id, send);
      await approveProof(deps, printerUser, e39.id, 1);
      publishEdition(deps, editorUser, e39.id);
    }
    updateEdition(deps, e40.id, { slots: [{ puzzleId: ids[0]!, instructions: instr }, { puzzleId: ids[1]!, instructions: instr }] });
    updateEdition(deps, e41.id, { slots: [{ puzzleId: ids[2]!, instructions: instr }, { puzzleId: ids[3]!, instructions: instr }] });
    await sendToProof(deps, editorUser, e40.id, send);
    await approveProof(deps, printerUser, e40.id, 1);
    publishEdition(deps, editorUser, e40.id);
    await sendToProof(deps, editorUser, e41.id, send);
  } catch (e) {
    deps.log.warn(`demo editions: the proof round stopped early: ${(e as Error).message}`);
  }
}
