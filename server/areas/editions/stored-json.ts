import type { z } from 'zod';
import { preflightSchema, richTextDocSchema, type PreflightReport, type RichTextDoc } from '../../../shared/contracts/editions';
import { editionDocumentSchema, type EditionDocument } from '../print/index';
import type { edition, editionProof, editionSlot } from './schema';

// The editions area's JSON columns, each read here and nowhere else, through its schema.
// A row that does not parse is an error naming the table, the row id and the column: a
// corrupt row must not print as an empty introduction or a made-up preflight.

/** A stored row whose JSON column does not have the stored shape. */
export class StoredRowError extends Error {
  constructor(
    readonly table: string,
    readonly rowId: string | number,
    readonly column: string,
    problem: string,
  ) {
    super(`${table} ${rowId}: column ${column} ${problem}`);
    this.name = 'StoredRowError';
  }
}

function parseColumn<S extends z.ZodType>(schema: S, text: string, where: { table: string; id: string | number; column: string }): z.infer<S> {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    throw new StoredRowError(where.table, where.id, where.column, `is not JSON (${(e as Error).message})`);
  }
  const r = schema.safeParse(raw);
  if (!r.success) {
    const issues = r.error.issues.map((i) => `${i.path.join('.') || '(root)'}: ${i.message}`).join('; ');
    throw new StoredRowError(where.table, where.id, where.column, `does not have the stored shape: ${issues}`);
  }
  return r.data;
}

export function introductionOf(r: Pick<typeof edition.$inferSelect, 'id' | 'introductionJson'>): RichTextDoc {
  return parseColumn(richTextDocSchema, r.introductionJson, { table: 'edition', id: r.id, column: 'introduction_json' });
}

export function instructionsOf(s: Pick<typeof editionSlot.$inferSelect, 'id' | 'instructionsJson'>): RichTextDoc {
  return parseColumn(richTextDocSchema, s.instructionsJson, { table: 'edition_slot', id: s.id, column: 'instructions_json' });
}

export function preflightOf(p: Pick<typeof editionProof.$inferSelect, 'id' | 'preflightJson'>): PreflightReport {
  return parseColumn(preflightSchema, p.preflightJson, { table: 'edition_proof', id: p.id, column: 'preflight_json' });
}

/** The print document a proof was rendered from; null for proofs made before documents were stored (migration 0008). */
export function proofDocumentOf(p: Pick<typeof editionProof.$inferSelect, 'id' | 'documentJson'>): EditionDocument | null {
  return p.documentJson === null ? null : parseColumn(editionDocumentSchema, p.documentJson, { table: 'edition_proof', id: p.id, column: 'document_json' });
}
