import type { DbOrTx } from '../../platform/db/client';
import type { PlatformDeps } from '../../platform/deps';
import type { PuzzleSource } from '../editions/ports';

// The reader area's ports. It needs the puzzle store's view of a puzzle (PuzzleSource, the
// same one print reads, implemented by the puzzles area); it reads the editions' and
// publications' tables read-only through the editions area's index.ts. What it offers others
// is PublishedContent: THE release rule of published content, as one port (interfaces.md,
// 2026-12-04), used by its public pages and by the integrations' feed. Wired in server/compose.ts.

/** One edition readers may see, with whether its solutions are public yet. */
export type PublicEditionRelease = {
  editionId: string;
  publicationId: string;
  publicationSlug: string;
  publicationTitle: string;
  number: number;
  /** YYYY-MM-DD */
  editionDate: string;
  releasedAt: Date;
  solutionsPublic: boolean;
  solutionsReleasedAt: Date | null;
  /** '/read/<slug>/<number>': the public page */
  path: string;
};

/** Published content as readers may see it at a moment (implemented in ./published.ts). */
export interface PublishedContent {
  /** every edition readers may see at `now`, newest release first */
  publicEditions(db: DbOrTx, now: Date, filter?: { publicationId?: string }): PublicEditionRelease[];
  /** one edition's release, or null when it is not public at `now` (answer 404 then) */
  editionRelease(db: DbOrTx, editionId: string, now: Date): PublicEditionRelease | null;
}

export type ReaderDeps = PlatformDeps & { puzzles: PuzzleSource; publishedContent: PublishedContent };
