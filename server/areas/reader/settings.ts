import { asc, eq } from 'drizzle-orm';
import { z } from 'zod';
import { embedOriginSchema, type ReaderSettings, type ReaderSettingsInput } from '../../../shared/contracts/reader';
import type { SolutionRule } from '../../../shared/contracts/publications';
import type { DbOrTx } from '../../platform/db/client';
import { parseStoredJson } from '../../platform/db/stored-json';
import type { PlatformDeps } from '../../platform/deps';
import { Conflict, NotFound } from '../../platform/http/errors';
import { publication } from '../editions/index';
import { readerPublication } from './schema';

// A publication's reader settings: its public address (slug), the time zone and time of day
// its editions are released in, and the origins allowed to embed its pages. Every publication
// has a row: one is made with defaults (slug from the title, UTC, 00:00, no origins) the first
// time the reader area looks at a publication without one, so an address never changes by
// itself once given (a later title change keeps the slug).

export type PublicationForReader = {
  id: string;
  title: string;
  publisher: string;
  solutionRule: SolutionRule;
  slug: string;
  timeZone: string;
  releaseTime: string;
  embedOrigins: string[];
};

const originListSchema = z.array(embedOriginSchema);

function originsOf(r: Pick<typeof readerPublication.$inferSelect, 'publicationId' | 'embedOriginsJson'>): string[] {
  return parseStoredJson(originListSchema, r.embedOriginsJson, { table: 'reader_publication', rowId: r.publicationId, column: 'embed_origins_json' });
}

/** 'The Saturday Quadrant' -> 'the-saturday-quadrant' (letters and digits kept, accents dropped). */
export function slugify(title: string): string {
  const s = title
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/&/g, ' and ')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60)
    .replace(/-+$/g, '');
  return s || 'publication';
}

/** Give every publication without reader settings its defaults (idempotent). */
export function ensureReaderSettings(db: DbOrTx): void {
  const missing = db
    .select({ id: publication.id, title: publication.title, has: readerPublication.publicationId })
    .from(publication)
    .leftJoin(readerPublication, eq(readerPublication.publicationId, publication.id))
    .orderBy(asc(publication.createdAt), asc(publication.id))
    .all()
    .filter((r) => r.has === null);
  if (missing.length === 0) return;
  const taken = new Set(db.select({ slug: readerPublication.slug }).from(readerPublication).all().map((r) => r.slug));
  for (const p of missing) {
    const base = slugify(p.title);
    let slug = base;
    for (let n = 2; taken.has(slug); n++) slug = `${base}-${n}`;
    taken.add(slug);
    db.insert(readerPublication).values({ publicationId: p.id, slug }).onConflictDoNothing().run();
  }
}

const columns = {
  id: publication.id,
  title: publication.title,
  publisher: publication.publisher,
  solutionRule: publication.solutionRule,
  slug: readerPublication.slug,
  timeZone: readerPublication.timeZone,
  releaseTime: readerPublication.releaseTime,
  embedOriginsJson: readerPublication.embedOriginsJson,
};

type Joined = { id: string; title: string; publisher: string; solutionRule: SolutionRule; slug: string; timeZone: string; releaseTime: string; embedOriginsJson: string };

function toPublication(r: Joined): PublicationForReader {
  const { embedOriginsJson, ...rest } = r;
  return { ...rest, embedOrigins: originsOf({ publicationId: r.id, embedOriginsJson }) };
}

/** Every publication with its reader settings, by title. */
export function publicationsForReader(db: DbOrTx): PublicationForReader[] {
  ensureReaderSettings(db);
  return db.select(columns).from(publication).innerJoin(readerPublication, eq(readerPublication.publicationId, publication.id)).orderBy(asc(publication.title)).all().map(toPublication);
}

export function publicationBySlug(db: DbOrTx, slug: string): PublicationForReader | null {
  ensureReaderSettings(db);
  const r = db.select(columns).from(publication).innerJoin(readerPublication, eq(readerPublication.publicationId, publication.id)).where(eq(readerPublication.slug, slug)).get();
  return r ? toPublication(r) : null;
}

export function publicationById(db: DbOrTx, id: string): PublicationForReader | null {
  ensureReaderSettings(db);
  const r = db.select(columns).from(publication).innerJoin(readerPublication, eq(readerPublication.publicationId, publication.id)).where(eq(publication.id, id)).get();
  return r ? toPublication(r) : null;
}

export function toReaderSettings(p: PublicationForReader): ReaderSettings {
  return { publicationId: p.id, publicationTitle: p.title, solutionRule: p.solutionRule, slug: p.slug, timeZone: p.timeZone, releaseTime: p.releaseTime, embedOrigins: p.embedOrigins };
}

export function updateReaderSettings(deps: Pick<PlatformDeps, 'db' | 'clock'>, publicationId: string, input: ReaderSettingsInput): ReaderSettings {
  return deps.db.transaction((tx) => {
    const current = publicationById(tx, publicationId);
    if (!current) throw new NotFound(`No publication ${publicationId}.`);
    const other = tx.select({ id: readerPublication.publicationId }).from(readerPublication).where(eq(readerPublication.slug, input.slug)).get();
    if (other && other.id !== publicationId) throw new Conflict(`Another publication already has the address /read/${input.slug}.`, [{ path: 'body.slug', message: 'is taken' }]);
    tx.update(readerPublication)
      .set({ slug: input.slug, timeZone: input.timeZone, releaseTime: input.releaseTime, embedOriginsJson: JSON.stringify([...new Set(input.embedOrigins)]), updatedAt: deps.clock.now() })
      .where(eq(readerPublication.publicationId, publicationId))
      .run();
    const after = publicationById(tx, publicationId);
    if (!after) throw new NotFound(`No publication ${publicationId}.`);
    return toReaderSettings(after);
  });
}
