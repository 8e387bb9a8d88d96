import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { user } from '../../platform/auth/schema';
import { puzzle } from '../puzzles/schema';
import { publication } from './publication-schema';

// Editions (dated issues of a publication), their slots, proofs and press files.

const nowMs = sql`(cast(unixepoch('subsecond') * 1000 as integer))`;

export const edition = sqliteTable(
  'edition',
  {
    id: text('id').primaryKey(),
    publicationId: text('publication_id')
      .notNull()
      .references(() => publication.id, { onDelete: 'restrict' }),
    number: integer('number').notNull(),
    /** YYYY-MM-DD */
    editionDate: text('edition_date').notNull(),
    state: text('state', { enum: ['draft', 'in_proof', 'approved', 'published'] }).notNull().default('draft'),
    /** tiptap JSON */
    introductionJson: text('introduction_json').notNull(),
    /** the printer's notes of the last returned proof */
    returnNotes: text('return_notes'),
    /** the press file (the approved proof re-rendered without the stamp) */
    pressVersion: integer('press_version'),
    pressSha256: text('press_sha256'),
    pressPath: text('press_path'),
    pressBytes: integer('press_bytes'),
    pressPages: integer('press_pages'),
    pressCreatedAt: integer('press_created_at', { mode: 'timestamp_ms' }),
    publishedAt: integer('published_at', { mode: 'timestamp_ms' }),
    publishedBy: text('published_by').references(() => user.id, { onDelete: 'set null' }),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
    updatedAt: integer('updated_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
  },
  (t) => [uniqueIndex('edition_publication_number_idx').on(t.publicationId, t.number), index('edition_date_idx').on(t.editionDate), index('edition_state_idx').on(t.state)],
);

export const editionSlot = sqliteTable(
  'edition_slot',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    editionId: text('edition_id')
      .notNull()
      .references(() => edition.id, { onDelete: 'cascade' }),
    /** 1-based place in the edition */
    position: integer('position').notNull(),
    /** the puzzle printed here; a puzzle in an edition cannot be deleted (the API spells the id as its digits) */
    puzzleId: integer('puzzle_id')
      .notNull()
      .references(() => puzzle.id, { onDelete: 'restrict' }),
    instructionsJson: text('instructions_json').notNull(),
  },
  (t) => [uniqueIndex('edition_slot_position_idx').on(t.editionId, t.position), uniqueIndex('edition_slot_puzzle_idx').on(t.editionId, t.puzzleId), index('edition_slot_puzzle_lookup_idx').on(t.puzzleId)],
);

export const editionProof = sqliteTable(
  'edition_proof',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    editionId: text('edition_id')
      .notNull()
      .references(() => edition.id, { onDelete: 'cascade' }),
    version: integer('version').notNull(),
    sha256: text('sha256').notNull(),
    /** path under DATA_DIR */
    path: text('path').notNull(),
    bytes: integer('bytes').notNull(),
    pages: integer('pages').notNull(),
    preflightJson: text('preflight_json').notNull(),
    /** the EditionDocument this proof was rendered from (JSON): the press file is rendered from it */
    documentJson: text('document_json'),
    status: text('status', { enum: ['pending', 'approved', 'returned', 'superseded'] }).notNull().default('pending'),
    notes: text('notes'),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
    decidedBy: text('decided_by').references(() => user.id, { onDelete: 'set null' }),
    decidedAt: integer('decided_at', { mode: 'timestamp_ms' }),
  },
  (t) => [uniqueIndex('edition_proof_version_idx').on(t.editionId, t.version)],
);

/**
 * A guard someone went past, with their reason: a proof sent despite preflight errors (the
 * editor), an edition published before its date or ahead of an earlier unpublished edition
 * of its publication (an admin). Kept for the record; never changed.
 */
export const editionOverride = sqliteTable(
  'edition_override',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    editionId: text('edition_id')
      .notNull()
      .references(() => edition.id, { onDelete: 'cascade' }),
    kind: text('kind', { enum: ['preflight', 'publish-early', 'publish-out-of-order'] }).notNull(),
    reason: text('reason').notNull(),
    /** what the guard said when it refused */
    refused: text('refused').notNull(),
    /** the proof sent with the override (preflight) */
    proofVersion: integer('proof_version'),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
  },
  (t) => [index('edition_override_edition_idx').on(t.editionId, t.createdAt)],
);
