import { createHash } from 'node:crypto';
import { asc, eq } from 'drizzle-orm';
import type { z } from 'zod';
import type { FeedEdition, FeedPuzzle, feedQuerySchema } from '../../../shared/contracts/integrations';
import { NotFound } from '../../platform/http/errors';
import { editionSlot } from '../editions/index';
import type { PublicEditionRelease } from '../reader/ports';
import { puzzle } from '../puzzles/index';
import { playOf } from '../reader/index';
import type { IntegrationsDeps } from './ports';

// The published-content feed for a desk's web team: the editions readers may see now, with
// their puzzles as printed, and the solutions only once the publication's rule makes them
// public. The rule is the reader area's (PublishedContent, the same one the public pages use);
// an edition not public yet is a 404 exactly like an unknown id.

type FeedDeps = Pick<IntegrationsDeps, 'db' | 'clock' | 'puzzles' | 'publishedContent'>;

function puzzlesOf(deps: FeedDeps, release: PublicEditionRelease): FeedPuzzle[] {
  const slots = deps.db
    .select({ position: editionSlot.position, puzzleId: editionSlot.puzzleId, showFrame: puzzle.showFrame })
    .from(editionSlot)
    .innerJoin(puzzle, eq(puzzle.id, editionSlot.puzzleId))
    .where(eq(editionSlot.editionId, release.editionId))
    .orderBy(asc(editionSlot.position))
    .all();
  return slots.flatMap((s) => {
    const p = deps.puzzles.getPuzzleForPrint(deps.db, String(s.puzzleId));
    if (!p) return [];
    const t = p.solution.tiling;
    return [
      {
        id: `${release.editionId}-${s.position}`,
        position: s.position,
        kind: p.kind,
        title: p.title,
        grade: p.grade,
        // the frame's size only where the printed puzzle shows it (as the reader pages do)
        play: playOf(p, s.showFrame),
        solution: release.solutionsPublic ? { W: t.W, H: t.H, squares: t.squares.map((q) => ({ x: q.x, y: q.y, size: q.s })) } : null,
      },
    ];
  });
}

function feedEditionOf(deps: FeedDeps, r: PublicEditionRelease): FeedEdition {
  return {
    id: r.editionId,
    publicationId: r.publicationId,
    publicationTitle: r.publicationTitle,
    number: r.number,
    editionDate: r.editionDate,
    releasedAt: r.releasedAt.toISOString(),
    solutionsPublic: r.solutionsPublic,
    solutionsReleasedAt: r.solutionsReleasedAt ? r.solutionsReleasedAt.toISOString() : null,
    path: r.path,
    puzzles: puzzlesOf(deps, r),
  };
}

export function feedPage(deps: FeedDeps, q: z.infer<typeof feedQuerySchema>) {
  const all = deps.publishedContent.publicEditions(deps.db, deps.clock.now(), q.publicationId ? { publicationId: q.publicationId } : undefined);
  const page = all.slice((q.page - 1) * q.pageSize, q.page * q.pageSize);
  return { items: page.map((r) => feedEditionOf(deps, r)), total: all.length, page: q.page, pageSize: q.pageSize };
}

export function feedEdition(deps: FeedDeps, editionId: string): FeedEdition {
  const r = deps.publishedContent.editionRelease(deps.db, editionId, deps.clock.now());
  if (!r) throw new NotFound(`No published edition ${editionId}.`);
  return feedEditionOf(deps, r);
}

/** A strong validator of the answer's JSON: it changes exactly when the answer does. */
export function etagOf(body: unknown): string {
  return `"${createHash('sha256').update(JSON.stringify(body)).digest('base64url').slice(0, 27)}"`;
}

/** True when the client's If-None-Match holds the current ETag (answer 304 then). */
export function notModified(ifNoneMatch: string | undefined, etag: string): boolean {
  if (!ifNoneMatch) return false;
  const weakless = (t: string) => t.trim().replace(/^W\//, '');
  return ifNoneMatch.trim() === '*' || ifNoneMatch.split(',').some((t) => weakless(t) === weakless(etag));
}
