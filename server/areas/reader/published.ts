import { asc, eq } from 'drizzle-orm';
import { readerPaths } from '../../../shared/contracts/reader';
import type { DbOrTx } from '../../platform/db/client';
import { edition } from '../editions/index';
import type { PublicEditionRelease, PublishedContent } from './ports';
import { releasesOf, type Release } from './release';
import { publicationById, publicationsForReader, type PublicationForReader } from './settings';

// Published content as readers may see it: the release rule (./release.ts) applied to the
// editions in the database. PublishedContent is the port other areas use (the integrations'
// feed); the reader's own pages use editionsWithRelease/findPublicEdition below.

export type EditionRef = { id: string; number: number; editionDate: string; state: 'draft' | 'in_proof' | 'approved' | 'published' };
export type EditionWithRelease = EditionRef & { release: Release };

/** Every edition of a publication with its release at `now`, by number. */
export function editionsWithRelease(db: DbOrTx, pub: PublicationForReader, now: Date): EditionWithRelease[] {
  const rows = db
    .select({ id: edition.id, number: edition.number, editionDate: edition.editionDate, state: edition.state })
    .from(edition)
    .where(eq(edition.publicationId, pub.id))
    .orderBy(asc(edition.number))
    .all();
  const releases = releasesOf(rows, pub, now);
  return rows.map((r) => ({ ...r, release: releases.get(r.number)! }));
}

function toRelease(pub: PublicationForReader, e: EditionWithRelease): PublicEditionRelease {
  return {
    editionId: e.id,
    publicationId: pub.id,
    publicationSlug: pub.slug,
    publicationTitle: pub.title,
    number: e.number,
    editionDate: e.editionDate,
    releasedAt: e.release.releasedAt,
    solutionsPublic: e.release.solutionsPublic,
    solutionsReleasedAt: e.release.solutionsFrom,
    path: readerPaths.edition(pub.slug, e.number),
  };
}

/** The public editions of one publication at `now`, newest release first. */
export function publicEditionsOf(db: DbOrTx, pub: PublicationForReader, now: Date): EditionWithRelease[] {
  return editionsWithRelease(db, pub, now)
    .filter((e) => e.release.public)
    .sort((a, b) => b.release.releasedAt.getTime() - a.release.releasedAt.getTime() || b.number - a.number);
}

export const publishedContent: PublishedContent = {
  publicEditions(db, now, filter = {}) {
    const pubs = publicationsForReader(db).filter((p) => filter.publicationId === undefined || p.id === filter.publicationId);
    return pubs
      .flatMap((pub) => publicEditionsOf(db, pub, now).map((e) => toRelease(pub, e)))
      .sort((a, b) => b.releasedAt.getTime() - a.releasedAt.getTime() || a.publicationTitle.localeCompare(b.publicationTitle) || b.number - a.number);
  },
  editionRelease(db, editionId, now) {
    const row = db.select({ publicationId: edition.publicationId }).from(edition).where(eq(edition.id, editionId)).get();
    if (!row) return null;
    const pub = publicationById(db, row.publicationId);
    if (!pub) return null;
    const e = editionsWithRelease(db, pub, now).find((x) => x.id === editionId);
    return e && e.release.public ? toRelease(pub, e) : null;
  },
};
