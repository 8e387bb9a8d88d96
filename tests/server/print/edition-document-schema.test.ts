import { describe, expect, it } from 'vitest';
import { editionDocumentSchema } from '../../../server/areas/print/types';
import { templateSampleEdition } from '../../../server/areas/print/sample-edition';
import { loadPageTemplates } from '../../../server/areas/print/templates';
import { sampleEdition } from './fixtures/sample-edition';

// A proof stores its print document as JSON and the press file is rendered from that copy,
// so the copy is parsed through editionDocumentSchema: what was stored comes back exactly,
// and a document missing a part is refused by field.

const templates = loadPageTemplates();

describe('the stored edition document', () => {
  it('comes back from its JSON exactly, for every template and for the sample page', () => {
    for (const t of templates.values()) {
      for (const doc of [sampleEdition(t), templateSampleEdition(t)]) {
        expect(editionDocumentSchema.parse(JSON.parse(JSON.stringify(doc)))).toEqual(doc);
      }
    }
  });

  it('refuses a document missing a part, naming where', () => {
    const doc = JSON.parse(JSON.stringify(sampleEdition(templates.get('a4')!)));
    delete doc.puzzles[1].layout;
    doc.solutions[0].kind = 'jigsaw';
    const r = editionDocumentSchema.safeParse(doc);
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => i.path.join('.')).sort()).toEqual(['puzzles.1.layout', 'solutions.0.kind']);
  });
});
