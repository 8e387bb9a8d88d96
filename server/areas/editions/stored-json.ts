import { parseStoredJson } from '../../platform/db/stored-json';
import { preflightSchema, richTextDocSchema, type PreflightReport, type RichTextDoc } from '../../../shared/contracts/editions';
import { editionDocumentSchema, type EditionDocument } from '../print/index';
import type { edition, editionProof, editionSlot } from './schema';

// The editions area's JSON columns, each read here and nowhere else, through its schema.
// A row that does not parse is an error naming the table, the row id and the column: a
// corrupt row must not print as an empty introduction or a made-up preflight.

export { StoredRowError } from '../../platform/db/stored-json';

export function introductionOf(r: Pick<typeof edition.$inferSelect, 'id' | 'introductionJson'>): RichTextDoc {
  return parseStoredJson(richTextDocSchema, r.introductionJson, { table: 'edition', rowId: r.id, column: 'introduction_json' });
}

export function instructionsOf(s: Pick<typeof editionSlot.$inferSelect, 'id' | 'instructionsJson'>): RichTextDoc {
  return parseStoredJson(richTextDocSchema, s.instructionsJson, { table: 'edition_slot', rowId: s.id, column: 'instructions_json' });
}

export function preflightOf(p: Pick<typeof editionProof.$inferSelect, 'id' | 'preflightJson'>): PreflightReport {
  return parseStoredJson(preflightSchema, p.preflightJson, { table: 'edition_proof', rowId: p.id, column: 'preflight_json' });
}

/** The print document a proof was rendered from; null for proofs made before documents were stored (migration 0008). */
export function proofDocumentOf(p: Pick<typeof editionProof.$inferSelect, 'id' | 'documentJson'>): EditionDocument | null {
  return p.documentJson === null ? null : parseStoredJson(editionDocumentSchema, p.documentJson, { table: 'edition_proof', rowId: p.id, column: 'document_json' });
}
