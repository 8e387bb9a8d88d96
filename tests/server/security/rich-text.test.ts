import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getSchema } from '@tiptap/core';
import StarterKit from '@tiptap/starter-kit';
import { MAX_RICH_TEXT_DEPTH, plainRichText, RICH_TEXT_MARK_TYPES, RICH_TEXT_NODE_TYPES, richTextDocSchema } from '../../../shared/contracts/editions';
import { errorBodySchema } from '../../../shared/contracts/common';
import { richTextProblems, richTextSchema } from '../../../shared/rich-text/editor-schema';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { quadrantPublication } from '../editions/fixtures';

// Rich text is checked on the server against the editor's own ProseMirror schema, built by
// tiptap's getSchema from the editor's extensions (the reference: tiptap/ProseMirror itself,
// Node.fromJSON + check()).

describe("the editor's schema", () => {
  it("has exactly the contract's node and mark types (and is StarterKit's, less what we switched off)", () => {
    const s = richTextSchema();
    expect(Object.keys(s.nodes).sort()).toEqual([...RICH_TEXT_NODE_TYPES].sort());
    expect(Object.keys(s.marks).sort()).toEqual([...RICH_TEXT_MARK_TYPES].sort());
    // the full StarterKit has more: what we allow is a subset of it
    const full = getSchema([StarterKit]);
    for (const n of Object.keys(s.nodes)) expect(Object.keys(full.nodes)).toContain(n);
  });

  it.each([
    ['a doc inside a paragraph', { type: 'doc', content: [{ type: 'paragraph', content: [{ type: 'doc' }] }] }, 'body.x.content.0.content.0'],
    ['a paragraph straight inside a list', { type: 'doc', content: [{ type: 'bulletList', content: [{ type: 'paragraph' }] }] }, 'body.x.content.0'],
    ['text at the top level', { type: 'doc', content: [{ type: 'text', text: 'loose' }] }, 'body.x'],
    ['an empty text node', { type: 'doc', content: [{ type: 'paragraph', content: [{ type: 'text', text: '' }] }] }, 'body.x.content.0.content.0'],
    ['a heading of level 5', { type: 'doc', content: [{ type: 'heading', attrs: { level: 5 }, content: [{ type: 'text', text: 'x' }] }] }, 'body.x.content.0.attrs.level'],
    ['a numbered list starting at -3', { type: 'doc', content: [{ type: 'orderedList', attrs: { start: -3 }, content: [{ type: 'listItem', content: [{ type: 'paragraph' }] }] }] }, 'body.x.content.0.attrs.start'],
  ])('refuses %s, naming where', (_what, doc, path) => {
    const problems = richTextProblems(doc, 'body.x');
    expect(problems.length).toBeGreaterThan(0);
    expect(problems.map((p) => p.path)).toContain(path);
  });

  it.each([
    ['the empty document (the default)', { type: 'doc', content: [] }],
    ['plain paragraphs', plainRichText('Fill the frame with the pieces.', '', 'No piece may turn.')],
    ['a heading, bold and italic, lists within lists and a hard break', {
      type: 'doc',
      content: [
        { type: 'heading', attrs: { level: 2 }, content: [{ type: 'text', text: 'How to play' }] },
        { type: 'paragraph', content: [{ type: 'text', text: 'Bold', marks: [{ type: 'bold' }] }, { type: 'hardBreak' }, { type: 'text', text: 'italic', marks: [{ type: 'italic' }] }] },
        { type: 'orderedList', attrs: { start: 3 }, content: [{ type: 'listItem', content: [{ type: 'paragraph', content: [{ type: 'text', text: 'one' }] }, { type: 'bulletList', content: [{ type: 'listItem', content: [{ type: 'paragraph', content: [{ type: 'text', text: 'inner' }] }] }] }] }] },
      ],
    }],
  ])('accepts %s', (_what, doc) => {
    expect(richTextProblems(doc, 'body.x')).toEqual([]);
  });

  it(`refuses nesting deeper than ${MAX_RICH_TEXT_DEPTH} levels in the contract, as an unprocessable (422) issue with the path`, () => {
    let node: Record<string, unknown> = { type: 'paragraph', content: [{ type: 'text', text: 'deep' }] };
    for (let i = 0; i < 20; i += 1) node = i % 2 === 0 ? { type: 'listItem', content: [node] } : { type: 'bulletList', content: [node] };
    const r = richTextDocSchema.safeParse({ type: 'doc', content: [node] });
    expect(r.success).toBe(false);
    const issue = r.error!.issues.find((i) => i.code === 'custom');
    expect(issue?.path.slice(0, 2)).toEqual(['content', 0]);
    expect((issue as { params?: { status?: number } }).params?.status).toBe(422);
  });
});

describe('over the API', () => {
  let t: TestApp;
  let editionId: string;
  beforeAll(async () => {
    t = await createTestApp();
    const admin = await t.signInAs('admin');
    const publicationId = (await admin.post('/api/publications').send(quadrantPublication).expect(201)).body.id;
    editionId = (await (await t.signInAs('editor')).post('/api/editions').send({ publicationId, number: 1, date: '2026-03-07' }).expect(201)).body.id;
  });
  afterAll(() => t.close());

  it('a document the editor cannot hold is a 422 naming where, and the stored introduction is unchanged', async () => {
    const editor = await t.signInAs('editor');
    const good = plainRichText('Welcome to the Saturday Quadrant.');
    await editor.patch(`/api/editions/${editionId}`).send({ introduction: good }).expect(200);
    const res = await editor.patch(`/api/editions/${editionId}`).send({ introduction: { type: 'doc', content: [{ type: 'bulletList', content: [{ type: 'text', text: 'loose' }] }] } }).expect(422);
    const err = errorBodySchema.parse(res.body).error;
    expect(err.code).toBe('unprocessable');
    expect(err.details).toEqual([expect.objectContaining({ path: 'body.introduction.content.0' })]);
    expect((await editor.get(`/api/editions/${editionId}`).expect(200)).body.introduction).toEqual(good);
  });

  it('too deep rich text is a 422 with the path inside the document', async () => {
    const editor = await t.signInAs('editor');
    let node: Record<string, unknown> = { type: 'paragraph', content: [{ type: 'text', text: 'deep' }] };
    for (let i = 0; i < 20; i += 1) node = i % 2 === 0 ? { type: 'listItem', content: [node] } : { type: 'bulletList', content: [node] };
    const res = await editor.patch(`/api/editions/${editionId}`).send({ introduction: { type: 'doc', content: [node] } }).expect(422);
    expect(errorBodySchema.parse(res.body).error.details).toEqual(expect.arrayContaining([expect.objectContaining({ path: expect.stringMatching(/^body\.introduction\.content\.0\.content\.0/) })]));
  });
});
