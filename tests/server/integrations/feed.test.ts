import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { feedEditionSchema, feedPageSchema } from '../../../shared/contracts/integrations';
import { edition } from '../../../server/areas/editions/schema';
import { publication } from '../../../server/areas/editions/publication-schema';
import { seeders } from '../../../server/demo-seeders';
import { createTestApp, type TestApp } from '../helpers/test-app';

// The published-content feed (issue 18) on the whole demo (Larkspur & Quill Press): The
// Saturday Quadrant No. 40 is published (solution rule next_edition), No. 41 is not. Read with
// an editions:read key; solutions only once the rule allows; ETag and 304.

let t: TestApp;
let key: string;
let e40: string;
let e41: string;
const auth = () => ({ Authorization: `Bearer ${key}` });

beforeAll(async () => {
  t = await createTestApp({ demo: { seeders } });
  const editor = await t.signInAs('editor');
  key = (await editor.post('/api/api-keys').send({ name: 'web team', scopes: ['editions:read'], expiresInDays: 30 }).expect(201)).body.secret;
  const quadrant = t.db.select({ id: publication.id }).from(publication).where(eq(publication.title, 'The Saturday Quadrant')).get()!.id;
  const rows = t.db.select({ id: edition.id, number: edition.number, state: edition.state }).from(edition).where(eq(edition.publicationId, quadrant)).all();
  e40 = rows.find((r) => r.number === 40)!.id;
  e41 = rows.find((r) => r.number === 41)!.id;
  expect(rows.find((r) => r.number === 41)!.state).not.toBe('published');
}, 180_000);
afterAll(() => t.close());

describe('the feed', () => {
  it('lists the published editions readers may see, with their puzzles and no solutions before the rule allows', async () => {
    const res = await request(t.app).get('/api/feed/editions').set(auth()).expect(200);
    const page = feedPageSchema.parse(res.body);
    const ids = page.items.map((e) => e.id);
    expect(ids).toContain(e40);
    expect(ids).not.toContain(e41);
    const no40 = page.items.find((e) => e.id === e40)!;
    expect(no40).toMatchObject({ publicationTitle: 'The Saturday Quadrant', number: 40, solutionsPublic: false, solutionsReleasedAt: null });
    expect(no40.puzzles.length).toBeGreaterThan(0);
    for (const p of no40.puzzles) {
      expect(p.id).toBe(`${e40}-${p.position}`);
      expect(p.solution).toBeNull();
    }
    // nothing of the solution leaks in the play data: an Assembly lists pieces, never placed squares
    expect(JSON.stringify(no40)).not.toMatch(/"squares"/);
  });

  it('answers 404 for an edition not public yet exactly as for an unknown id', async () => {
    const unknown = await request(t.app).get('/api/feed/editions/no-such-edition').set(auth()).expect(404);
    const unpublished = await request(t.app).get(`/api/feed/editions/${e41}`).set(auth()).expect(404);
    expect(unpublished.body.error.code).toBe(unknown.body.error.code);
  });

  it('pages', async () => {
    const all = feedPageSchema.parse((await request(t.app).get('/api/feed/editions?pageSize=100').set(auth()).expect(200)).body);
    const first = feedPageSchema.parse((await request(t.app).get('/api/feed/editions?pageSize=1&page=1').set(auth()).expect(200)).body);
    expect(first.total).toBe(all.total);
    expect(first.items.map((e) => e.id)).toEqual(all.items.slice(0, 1).map((e) => e.id));
    await request(t.app).get('/api/feed/editions?pageSize=1000').set(auth()).expect(400);
  });

  it('is cacheable: the same answer keeps its ETag and If-None-Match gets 304 without a body', async () => {
    const a = await request(t.app).get(`/api/feed/editions/${e40}`).set(auth()).expect(200);
    const etag = a.headers.etag as string;
    expect(etag).toMatch(/^"[\w-]+"$/);
    const b = await request(t.app).get(`/api/feed/editions/${e40}`).set(auth()).expect(200);
    expect(b.headers.etag).toBe(etag);
    const c = await request(t.app).get(`/api/feed/editions/${e40}`).set({ ...auth(), 'If-None-Match': etag }).expect(304);
    expect(c.text ?? '').toBe('');
    await request(t.app).get(`/api/feed/editions/${e40}`).set({ ...auth(), 'If-None-Match': '"something-else"' }).expect(200);
  });

  it('shows the solutions once the next edition is public (next_edition), and the ETag changes', async () => {
    const before = await request(t.app).get(`/api/feed/editions/${e40}`).set(auth()).expect(200);
    const d41 = t.db.select({ date: edition.editionDate }).from(edition).where(eq(edition.id, e41)).get()!.date;
    t.db.update(edition).set({ state: 'published', publishedAt: new Date() }).where(eq(edition.id, e41)).run();
    t.clock.set(new Date(Date.parse(`${d41}T00:00:00Z`) + 2 * 86_400_000));
    const after = await request(t.app).get(`/api/feed/editions/${e40}`).set({ ...auth(), 'If-None-Match': before.headers.etag as string }).expect(200);
    expect(after.headers.etag).not.toBe(before.headers.etag);
    const e = feedEditionSchema.parse(after.body);
    expect(e.solutionsPublic).toBe(true);
    for (const p of e.puzzles) {
      const s = p.solution!;
      // a solution is a tiling of its frame: the squares' areas add up to W x H (arithmetic)
      expect(s.squares.reduce((sum, q) => sum + q.size * q.size, 0)).toBe(s.W * s.H);
      if (p.play.kind === 'assembly') {
        // the pieces a reader places are exactly the solution's squares
        expect([...p.play.pieces].sort((x, y) => x - y)).toEqual(s.squares.map((q) => q.size).sort((x, y) => x - y));
        expect({ W: p.play.frame.W, H: p.play.frame.H }).toEqual({ W: s.W, H: s.H });
      }
    }
  });

  it('is open to editions:read keys and editors only', async () => {
    const editor = await t.signInAs('editor');
    const stockKey = (await editor.post('/api/api-keys').send({ name: 'stock only', scopes: ['stock:read'], expiresInDays: 1 }).expect(201)).body.secret;
    await request(t.app).get('/api/feed/editions').set({ Authorization: `Bearer ${stockKey}` }).expect(403);
    await request(t.app).get('/api/feed/editions').expect(401);
    await (await t.signInAs('setter')).get('/api/feed/editions').expect(403);
    await editor.get('/api/feed/editions').expect(200);
  });
});
