import { and, asc, desc, eq, lte, ne } from 'drizzle-orm';
import { dueEditionsQuerySchema, dueEditionsSchema, type DueEdition } from '../../../shared/contracts/editions';
import { route, type ApiRouter } from '../../platform/http/route';
import type { EditionsDeps } from './ports';
import { publication } from './publication-schema';
import { edition, editionProof } from './schema';
import { slotPuzzle, slotsOf } from './slots';

// The editor's Home: editions due soon and what each still needs (GET /api/editions/due).

const DAY_MS = 86_400_000;
const dayNumber = (iso: string) => Math.round(Date.parse(`${iso}T00:00:00Z`) / DAY_MS);

/** Editions not yet published dated on or before today + `days` (overdue ones too), soonest first, with what each still needs. */
export function dueEditions(deps: Pick<EditionsDeps, 'db' | 'clock' | 'puzzles'>, days: number): DueEdition[] {
  const today = deps.clock.now().toISOString().slice(0, 10);
  const until = new Date(Date.parse(`${today}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
  const rows = deps.db
    .select({ e: edition, title: publication.title })
    .from(edition)
    .innerJoin(publication, eq(publication.id, edition.publicationId))
    .where(and(ne(edition.state, 'published'), lte(edition.editionDate, until)))
    .orderBy(asc(edition.editionDate), asc(edition.number))
    .all();
  return rows.map(({ e, title }) => {
    const needs: string[] = [];
    const latest = deps.db.select({ version: editionProof.version, status: editionProof.status }).from(editionProof).where(eq(editionProof.editionId, e.id)).orderBy(desc(editionProof.version)).limit(1).get();
    if (e.state === 'draft') {
      const slots = slotsOf(deps.db, e.id);
      if (slots.length === 0) needs.push('puzzles: it has none yet');
      const stale = slots.map((s) => slotPuzzle(deps.puzzles, deps.db, s)).filter((p) => p && !p.certificate?.current).length;
      if (stale > 0) needs.push(`${stale} puzzle(s) proved again (certificate out of date)`);
      if (latest?.status === 'returned') needs.push(`changes the printer asked for on proof v${latest.version}, then a new proof`);
      else needs.push('to be sent to proof');
    } else if (e.state === 'in_proof') {
      needs.push(`the printer's answer on proof v${latest?.version ?? 1}`);
    } else if (e.state === 'approved') {
      needs.push('to be marked published on its date');
    }
    return { id: e.id, publicationTitle: title, number: e.number, date: e.editionDate, daysLeft: dayNumber(e.editionDate) - dayNumber(today), state: e.state, needs };
  });
}

export function registerEditionDueRoutes(router: ApiRouter, deps: EditionsDeps) {
  route(
    router,
    { method: 'GET', path: '/api/editions/due', summary: 'Editions due within `days` (default 14) or overdue, not yet published, with what each still needs', tags: ['editions'], query: dueEditionsQuerySchema, response: dueEditionsSchema },
    ({ query }) => ({ days: query.days, items: dueEditions(deps, query.days) }),
  );
}
