import { sql } from 'drizzle-orm';
import { check, index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { user } from '../../platform/auth/schema';
import { edition } from '../editions/schema';
import { publication } from '../editions/publication-schema';
import { puzzle } from '../puzzles/schema';

// The reader edition's tables: a publication's reader settings (its public address, time
// zone and release time, the origins allowed to embed it), the editor's adjustments of the
// grade shown to readers, and the anonymous solve events readers' browsers send.

const nowMs = sql`(cast(unixepoch('subsecond') * 1000 as integer))`;

export const readerPublication = sqliteTable('reader_publication', {
  publicationId: text('publication_id')
    .primaryKey()
    .references(() => publication.id, { onDelete: 'cascade' }),
  /** the readable address part: /read/<slug> */
  slug: text('slug').notNull().unique(),
  /** IANA time zone the edition dates and the release time are read in */
  timeZone: text('time_zone').notNull().default('UTC'),
  /** 'HH:MM' on the edition date when an edition becomes public */
  releaseTime: text('release_time').notNull().default('00:00'),
  /** JSON array of origins allowed to frame the embed pages */
  embedOriginsJson: text('embed_origins_json').notNull().default('[]'),
  updatedAt: integer('updated_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
});

export const readerGrade = sqliteTable('reader_grade', {
  puzzleId: integer('puzzle_id')
    .primaryKey()
    .references(() => puzzle.id, { onDelete: 'cascade' }),
  /** the grade readers see instead of the engine's; null = the engine's again (the note stays as history) */
  grade: integer('grade'),
  note: text('note').notNull(),
  adjustedBy: text('adjusted_by').references(() => user.id, { onDelete: 'set null' }),
  adjustedAt: integer('adjusted_at', { mode: 'timestamp_ms' }).notNull(),
}, (t) => [check('reader_grade_range', sql`${t.grade} is null or (${t.grade} between 1 and 5)`)]);

export const solveEvent = sqliteTable(
  'solve_event',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    puzzleId: integer('puzzle_id')
      .notNull()
      .references(() => puzzle.id, { onDelete: 'cascade' }),
    editionId: text('edition_id')
      .notNull()
      .references(() => edition.id, { onDelete: 'cascade' }),
    /** a random id made in the reader's browser for one play of one puzzle; nothing else identifies a reader */
    playId: text('play_id').notNull(),
    kind: text('kind', { enum: ['started', 'checked', 'revealed', 'finished'] }).notNull(),
    /** time played when the event happened, pauses excluded */
    elapsedMs: integer('elapsed_ms').notNull(),
    /** checked: wrong entries; revealed: squares or pieces revealed */
    count: integer('count'),
    /** true for the generated demo records (seeded), never for a reader's */
    demo: integer('demo', { mode: 'boolean' }).notNull().default(false),
    at: integer('at', { mode: 'timestamp_ms' }).notNull(),
  },
  (t) => [
    index('solve_event_puzzle_idx').on(t.puzzleId, t.kind),
    index('solve_event_edition_idx').on(t.editionId),
    // one start and one finish per play
    uniqueIndex('solve_event_once_idx').on(t.puzzleId, t.playId, t.kind).where(sql`${t.kind} in ('started', 'finished')`),
  ],
);
