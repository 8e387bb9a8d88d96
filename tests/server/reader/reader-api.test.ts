import { and, eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { frameImages } from '../../../shared/puzzle/index';
import { edition, editionSlot } from '../../../server/areas/editions/schema';
import { publication } from '../../../server/areas/editions/publication-schema';
import { solveEvent } from '../../../server/areas/reader/schema';
import { seeders } from '../../../server/demo-seeders';
import { createTestApp, type TestApp } from '../helpers/test-app';

// The reader edition over HTTP, on the whole demo (Larkspur & Quill Press): The Saturday
// Quadrant No. 40 is published (rule next_edition), No. 41 is in proof. Checks the public
// pages, the 404 for anything not public, the time zone of the release, the solution rule,
// that no answer and nothing private reaches a public answer, checks, reveals, events, the
// editor's statistics and calibration, grade adjustments, settings and embeds.

const CHECK_LIMIT = 40;
let t: TestApp;
let quadrantId: string;
let e40: { id: string; assembly: number; deduction: number };
let e41Id: string;

const slug = 'the-saturday-quadrant';
const api40 = (position: number) => `/api/reader/public/${slug}/40/${position}`;

function slotOf(editionId: string, position: number): number {
  const s = t.db.select({ puzzleId: editionSlot.puzzleId }).from(editionSlot).where(and(eq(editionSlot.editionId, editionId), eq(editionSlot.position, position))).get();
  if (!s) throw new Error(`no slot ${position}`);
  return s.puzzleId;
}

function solutionOf(puzzleId: number) {
  const p = t.deps.puzzles.getPuzzleForPrint(t.db, String(puzzleId));
  if (!p) throw new Error(`no puzzle ${puzzleId}`);
  return p;
}

beforeAll(async () => {
  t = await createTestApp({ demo: { seeders }, env: { READER_CHECKS_PER_MINUTE: String(CHECK_LIMIT) } });
  quadrantId = t.db.select({ id: publication.id }).from(publication).where(eq(publication.title, 'The Saturday Quadrant')).get()!.id;
  const e = t.db.select({ id: edition.id, number: edition.number, state: edition.state }).from(edition).where(eq(edition.publicationId, quadrantId)).all();
  const id40 = e.find((x) => x.number === 40)!.id;
  e41Id = e.find((x) => x.number === 41)!.id;
  expect(e.find((x) => x.number === 40)?.state).toBe('published');
  const a = slotOf(id40, 1);
  const d = slotOf(id40, 2);
  e40 = { id: id40, assembly: solutionOf(a).kind === 'assembly' ? a : d, deduction: solutionOf(a).kind === 'assembly' ? d : a };
}, 180_000);
afterAll(() => t.close());

describe('public pages', () => {
  it('show a published edition without a session: introduction, puzzles, instructions, privacy note', async () => {
    const page = await request(t.app).get(`/read/${slug}/40`).expect(200);
    expect(page.headers['content-type']).toMatch(/text\/html/);
    expect(page.text).toContain('The Saturday Quadrant No. 40');
    expect(page.text).toContain('Welcome to No. 40 of The Saturday Quadrant');
    expect(page.text).toContain('Use every piece once.');
    expect(page.text).toContain('What we keep when you play');
    expect(page.text).not.toMatch(/set-cookie/i);
    expect(page.headers['set-cookie']).toBeUndefined();
    const json = await request(t.app).get(`/api/reader/public/${slug}/40`).expect(200);
    expect(json.body.puzzles).toHaveLength(2);
    await request(t.app).get(`/read/${slug}`).expect(200);
    const index = await request(t.app).get('/read').expect(200);
    expect(index.text).toContain(`/read/${slug}`);
  });

  it('answer 404 for an unpublished edition exactly as for an address that never existed', async () => {
    const wrong = await request(t.app).get(`/read/${slug}/999`).expect(404);
    const unpublished = await request(t.app).get(`/read/${slug}/41`).expect(404);
    const noPublication = await request(t.app).get('/read/no-such-paper/40').expect(404);
    const badNumber = await request(t.app).get(`/read/${slug}/forty`).expect(404);
    expect(unpublished.text).toBe(wrong.text);
    expect(noPublication.text).toBe(wrong.text);
    expect(badNumber.text).toBe(wrong.text);
    const apiWrong = await request(t.app).get(`/api/reader/public/${slug}/999`).expect(404);
    const apiUnpublished = await request(t.app).get(`/api/reader/public/${slug}/41`).expect(404);
    expect(apiUnpublished.body).toEqual(apiWrong.body);
    await request(t.app).get(`/read/${slug}/41/1`).expect(404);
    await request(t.app).post(`/api/reader/public/${slug}/41/1/check`).send({ entries: [] }).expect(404);
    await request(t.app).get(`/read/${slug}/40/9`).expect(404);
  });

  it('keep a published edition private until its date at the release time in the publication\u2019s time zone', async () => {
    const { releasedAt, date } = (await request(t.app).get(`/api/reader/public/${slug}/40`).expect(200)).body as { releasedAt: string; date: string };
    // demo: 06:00 London; in November London is on UTC (from memory: GMT from late October to late March)
    expect(releasedAt).toBe(`${date}T06:00:00.000Z`);
    const at = new Date(releasedAt).getTime();
    try {
      // a minute before (the test clock runs on from the moment it is set)
      t.clock.set(new Date(at - 60_000));
      const before = await request(t.app).get(`/read/${slug}/40`).expect(404);
      expect(before.text).toBe((await request(t.app).get(`/read/${slug}/999`)).text);
      t.clock.set(new Date(at));
      await request(t.app).get(`/read/${slug}/40`).expect(200);
      // the same edition in New York: 06:00 there is 11:00 UTC in November (EST, UTC-5)
      const admin = await t.signInAs('admin');
      const s = (await admin.get('/api/reader/settings').expect(200)).body.items.find((x: { publicationId: string }) => x.publicationId === quadrantId);
      await admin.put(`/api/reader/settings/${quadrantId}`).send({ slug: s.slug, timeZone: 'America/New_York', releaseTime: '06:00', embedOrigins: s.embedOrigins }).expect(200);
      t.clock.set(new Date(at + 5 * 3600_000 - 60_000));
      await request(t.app).get(`/read/${slug}/40`).expect(404);
      t.clock.set(new Date(at + 5 * 3600_000));
      const after = await request(t.app).get(`/api/reader/public/${slug}/40`).expect(200);
      expect(after.body.releasedAt).toBe(`${date}T11:00:00.000Z`);
      await admin.put(`/api/reader/settings/${quadrantId}`).send({ slug: s.slug, timeZone: 'Europe/London', releaseTime: '06:00', embedOrigins: s.embedOrigins }).expect(200);
    } finally {
      t.clock.set(new Date());
    }
  });
});

describe('what a public answer holds', () => {
  const forbidden = /setter|fee|stockId|certificate|tilingKey|proof|inputHash|engineVersion|"steps"|solution"|"squares"/i;

  it('never the answer: no positions of the pieces, no sizes but the givens', async () => {
    const a = solutionOf(e40.assembly);
    const d = solutionOf(e40.deduction);
    for (const position of [1, 2]) {
      const body = (await request(t.app).get(api40(position)).expect(200)).body;
      expect(JSON.stringify(body)).not.toMatch(forbidden);
      expect(Object.keys(body.play).sort()).toEqual(body.kind === 'assembly' ? ['frame', 'kind', 'pieces', 'starters'] : ['drawing', 'frame', 'givens', 'kind', 'labels']);
      const html = (await request(t.app).get(`/read/${slug}/40/${position}`).expect(200)).text;
      const data = JSON.parse(/<script type="application\/json" id="reader-data">([\s\S]*?)<\/script>/.exec(html)![1]!) as Record<string, unknown>;
      expect(Object.keys(data).sort()).toEqual(['api', 'embed', 'play', 'solutionsPublic']);
      expect(JSON.stringify(data)).not.toMatch(forbidden);
    }
    // Assembly: the only places on the page are the starter pieces'
    const aPlay = (await request(t.app).get(api40(1)).expect(200)).body.play;
    const starters = a.assembly!.starters;
    expect(aPlay.starters).toHaveLength(starters.length);
    const placesInData = JSON.stringify(aPlay.starters);
    const hidden = a.solution.tiling.squares.filter((q) => !starters.some((s) => s.x === q.x && s.y === q.y));
    expect(hidden.length).toBeGreaterThan(0);
    for (const q of hidden) expect(placesInData).not.toContain(`"x":${q.x},"y":${q.y}`);
    // Deduction: every size in the data is a given
    const dPlay = (await request(t.app).get(api40(2)).expect(200)).body.play as { givens: { square: number; size: number }[] };
    expect(dPlay.givens.map((g) => g.size).sort()).toEqual(d.deduction!.givens.map((g) => g.size).sort());
  });

  it('has no setter, fee, proof or certificate on the edition page either', async () => {
    const page = await request(t.app).get(`/read/${slug}/40`).expect(200);
    expect(page.text).not.toMatch(/certificate|fee|setter@|proof/i);
    const json = await request(t.app).get(`/api/reader/public/${slug}/40`).expect(200);
    expect(JSON.stringify(json.body)).not.toMatch(forbidden);
  });
});

describe('checking and revealing', () => {
  it('a complete correct Assembly is solved; a misplaced piece is marked wrong', async () => {
    const p = solutionOf(e40.assembly);
    const play = (await request(t.app).get(api40(1)).expect(200)).body.play as { pieces: number[]; starters: { piece: number }[] };
    const starterPieces = new Set(play.starters.map((s) => s.piece));
    const used = new Set<number>();
    const placements = p.solution.tiling.squares.flatMap((q) => {
      const piece = play.pieces.findIndex((s, i) => s === q.s && !used.has(i) && !starterPieces.has(i));
      if (piece < 0) return [];
      used.add(piece);
      return [{ piece, x: q.x, y: q.y }];
    });
    expect(placements.length).toBe(play.pieces.length - play.starters.length);
    const right = await request(t.app).post(`${api40(1)}/check`).send({ placements }).expect(200);
    expect(right.body).toEqual({ wrong: [], solved: true });
    const partial = await request(t.app).post(`${api40(1)}/check`).send({ placements: placements.slice(0, 3) }).expect(200);
    expect(partial.body).toEqual({ wrong: [], solved: false });
    const moved = placements.map((pl, i) => (i === 0 ? { ...pl, x: 0, y: 0 } : pl)).filter((pl, i) => i === 0 || !(pl.x === 0 && pl.y === 0));
    const wrong = await request(t.app).post(`${api40(1)}/check`).send({ placements: moved.slice(0, 1) }).expect(200);
    const atOrigin = p.solution.tiling.squares.find((q) => q.x === 0 && q.y === 0)!;
    expect(wrong.body.wrong).toEqual(play.pieces[moved[0]!.piece] === atOrigin.s ? [] : [moved[0]!.piece]);
  });

  it('a Deduction with every size right is solved; wrong sizes are marked', async () => {
    const p = solutionOf(e40.deduction);
    const givens = new Set(p.deduction!.givens.map((g) => g.rect));
    const entries = p.solution.tiling.squares.flatMap((q, square) => (givens.has(square) ? [] : [{ square, size: q.s }]));
    expect((await request(t.app).post(`${api40(2)}/check`).send({ entries }).expect(200)).body).toEqual({ wrong: [], solved: true });
    const bad = entries.map((e, i) => (i < 2 ? { ...e, size: e.size + 1 } : e));
    expect((await request(t.app).post(`${api40(2)}/check`).send({ entries: bad }).expect(200)).body).toEqual({ wrong: bad.slice(0, 2).map((e) => e.square).sort((x, y) => x - y), solved: false });
    // the wrong kind of entry, a square that does not exist: 422 naming where
    const kind = await request(t.app).post(`${api40(2)}/check`).send({ placements: [] }).expect(422);
    expect(kind.body.error.code).toBe('unprocessable');
    const none = await request(t.app).post(`${api40(2)}/check`).send({ entries: [{ square: 999, size: 3 }] }).expect(422);
    expect(none.body.error.details[0].path).toBe('body.entries.0.square');
    await request(t.app).post(`${api40(2)}/check`).send({ entries: 'all' }).expect(400);
  });

  it('reveals nothing before the solutions are public (next_edition), then reveals once the next edition is', async () => {
    const refused = await request(t.app).post(`${api40(2)}/reveal`).send({ square: 0 }).expect(409);
    expect(refused.body.error.message).toMatch(/not public yet/);
    await request(t.app).get(`/read/${slug}/40/2/solution`).expect(404);
    // No. 41 goes out: its state published, and the clock past its release
    const e41 = t.db.select({ editionDate: edition.editionDate }).from(edition).where(eq(edition.id, e41Id)).get()!;
    t.db.update(edition).set({ state: 'published' }).where(eq(edition.id, e41Id)).run();
    try {
      t.clock.set(new Date(`${e41.editionDate}T07:00:00Z`));
      if (t.clock.now().getTime() < Date.now()) t.clock.set(new Date());
      const p = solutionOf(e40.deduction);
      const one = await request(t.app).post(`${api40(2)}/reveal`).send({ square: 0 }).expect(200);
      expect(one.body).toEqual({ entries: [{ square: 0, size: p.solution.tiling.squares[0]!.s }] });
      const all = await request(t.app).post(`${api40(2)}/reveal`).send({ all: true }).expect(200);
      expect(all.body.entries.map((e: { size: number }) => e.size)).toEqual(p.solution.tiling.squares.map((q) => q.s));
      const assembly = await request(t.app).post(`${api40(1)}/reveal`).send({ all: true }).expect(200);
      const a = solutionOf(e40.assembly);
      const keys = new Set(a.solution.tiling.squares.map((q) => `${q.s}@${q.x},${q.y}`));
      const play = (await request(t.app).get(api40(1))).body.play as { pieces: number[] };
      expect(assembly.body.placements.map((pl: { piece: number; x: number; y: number }) => keys.has(`${play.pieces[pl.piece]}@${pl.x},${pl.y}`))).toEqual(play.pieces.map(() => true));
      const sol = await request(t.app).get(`/read/${slug}/40/2/solution`).expect(200);
      expect(sol.text).toContain('Solution: ');
    } finally {
      t.db.update(edition).set({ state: 'in_proof' }).where(eq(edition.id, e41Id)).run();
      t.clock.set(new Date());
    }
  });

  it('accepts a mirrored Assembly as solved when no starter piece fixes the orientation', async () => {
    const { checkEntries } = await import('../../../server/areas/reader/play');
    const p = solutionOf(e40.assembly);
    // the same puzzle without its starter pieces: every image of the solution under the frame's symmetries solves it
    const bare = { ...p, assembly: { ...p.assembly!, starters: [] } };
    const pieces = bare.assembly.pieces;
    for (const img of frameImages(p.solution.tiling)) {
      const used = new Set<number>();
      const placements = img.squares.map((q) => {
        const piece = pieces.findIndex((s, i) => s === q.s && !used.has(i));
        used.add(piece);
        return { piece, x: q.x, y: q.y };
      });
      expect(checkEntries(bare, { placements })).toEqual({ wrong: [], solved: true });
    }
  });
});

describe('solve events and the editor\u2019s views', () => {
  it('records anonymous events, once per start and finish, and shows a new solve in the statistics and the calibration', async () => {
    const editor = await t.signInAs('editor');
    const before = (await editor.get('/api/reader/stats').expect(200)).body;
    const row = (b: { puzzles: { puzzleId: number; editionNumber: number; solved: number; starts: number }[] }) => b.puzzles.find((p) => p.puzzleId === e40.deduction && p.editionNumber === 40)!;
    const playId = '5b0e3c7e-8a7d-4a59-9a0e-1d2f3a4b5c6d';
    await request(t.app).post(`${api40(2)}/events`).send({ playId, kind: 'started', elapsedMs: 0 }).expect(204);
    await request(t.app).post(`${api40(2)}/events`).send({ playId, kind: 'started', elapsedMs: 0 }).expect(204);
    await request(t.app).post(`${api40(2)}/events`).send({ playId, kind: 'checked', elapsedMs: 60_000, count: 2 }).expect(204);
    await request(t.app).post(`${api40(2)}/events`).send({ playId, kind: 'finished', elapsedMs: 321_000 }).expect(204);
    await request(t.app).post(`${api40(2)}/events`).send({ playId: 'not-a-uuid', kind: 'started', elapsedMs: 0 }).expect(400);
    await request(t.app).post(`${api40(2)}/events`).send({ playId, kind: 'finished', elapsedMs: 321_000, ip: '1.2.3.4' }).expect(400);
    const rows = t.db.select().from(solveEvent).where(eq(solveEvent.playId, playId)).all();
    expect(rows.map((r) => r.kind)).toEqual(['started', 'checked', 'finished']);
    expect(rows.every((r) => r.demo === false)).toBe(true);
    // nothing about the reader is stored: the columns are the puzzle, the play and its clock
    expect(Object.keys(rows[0]!).sort()).toEqual(['at', 'count', 'demo', 'editionId', 'elapsedMs', 'id', 'kind', 'playId', 'puzzleId']);
    const after = (await editor.get('/api/reader/stats').expect(200)).body;
    expect(row(after).starts).toBe(row(before).starts + 1);
    expect(row(after).solved).toBe(row(before).solved + 1);
    expect(after.demoRecords).toBeGreaterThan(0);
    expect(after.records).toBe(before.records + 3);
    const cal = (await editor.get('/api/reader/calibration').expect(200)).body;
    const point = cal.points.find((p: { puzzleId: number }) => p.puzzleId === e40.deduction);
    expect(point.solved).toBe(row(after).solved);
    expect(cal.formula.map((f: { kind: string }) => f.kind)).toEqual(['deduction', 'assembly']);
  });

  it('keeps the statistics to editors', async () => {
    await request(t.app).get('/api/reader/stats').expect(401);
    await (await t.signInAs('setter')).get('/api/reader/calibration').expect(403);
    await (await t.signInAs('printer')).get('/api/reader/stats').expect(403);
  });

  it('lets an editor adjust the grade readers see after publication, with a note shown beside it', async () => {
    const editor = await t.signInAs('editor');
    await editor.put(`/api/reader/puzzles/${e40.deduction}/grade`).send({ grade: 4 }).expect(400);
    const r = await editor.put(`/api/reader/puzzles/${e40.deduction}/grade`).send({ grade: 4, note: 'Readers took twice as long as other grade-3 puzzles.' }).expect(200);
    expect(r.body).toMatchObject({ shownGrade: 4, note: 'Readers took twice as long as other grade-3 puzzles.' });
    const pub = (await request(t.app).get(api40(2)).expect(200)).body;
    expect(pub).toMatchObject({ grade: 4, gradeNote: 'Readers took twice as long as other grade-3 puzzles.' });
    expect((await request(t.app).get(`/read/${slug}/40/2`)).text).toContain('Grade 4 of 5 (adjusted)');
    const back = await editor.put(`/api/reader/puzzles/${e40.deduction}/grade`).send({ grade: null, note: 'Back to the engine.' }).expect(200);
    expect(back.body.shownGrade).toBe(back.body.engineGrade);
    // a puzzle in no published edition keeps the engine's grade
    const unpublished = slotOf(e41Id, 1);
    await editor.put(`/api/reader/puzzles/${unpublished}/grade`).send({ grade: 2, note: 'x' }).expect(409);
  });
});

describe('reader settings and embeds', () => {
  it('validates settings and keeps addresses unique', async () => {
    const admin = await t.signInAs('admin');
    const items = (await admin.get('/api/reader/settings').expect(200)).body.items as { publicationId: string; slug: string }[];
    const other = items.find((i) => i.publicationId !== quadrantId)!;
    const bad = await admin.put(`/api/reader/settings/${quadrantId}`).send({ slug: slug, timeZone: 'Mars/Olympus', releaseTime: '25:00', embedOrigins: ['https://x.example/path'] }).expect(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['body.embedOrigins.0', 'body.releaseTime', 'body.timeZone']);
    await admin.put(`/api/reader/settings/${quadrantId}`).send({ slug: other.slug, timeZone: 'UTC', releaseTime: '06:00', embedOrigins: [] }).expect(409);
    await (await t.signInAs('editor')).put(`/api/reader/settings/${quadrantId}`).send({ slug, timeZone: 'UTC', releaseTime: '06:00', embedOrigins: [] }).expect(403);
  });

  it('lets only the publication\u2019s origins frame the embed pages; every other page refuses framing', async () => {
    const embed = await request(t.app).get(`/embed/${slug}/40/1`).expect(200);
    expect(embed.headers['content-security-policy']).toMatch(/frame-ancestors https:\/\/www\.larkspurquill\.example(;|$)/);
    expect(embed.headers['x-frame-options']).toBeUndefined();
    expect(embed.text).toContain('reader-embed');
    const edition40 = await request(t.app).get(`/embed/${slug}/40`).expect(200);
    expect(edition40.headers['content-security-policy']).toMatch(/frame-ancestors https:\/\/www\.larkspurquill\.example/);
    const read = await request(t.app).get(`/read/${slug}/40/1`).expect(200);
    expect(read.headers['content-security-policy']).toMatch(/frame-ancestors 'none'/);
    const missing = await request(t.app).get(`/embed/${slug}/41`).expect(404);
    expect(missing.headers['content-security-policy']).toMatch(/frame-ancestors 'none'/);
  });
});

describe('rate limit', () => {
  it('answers 429 in our error shape once an address checks too often', async () => {
    let last = 200;
    let tries = 0;
    let body: { error?: { code?: string } } = {};
    let retryAfter: string | undefined;
    while (last !== 429 && tries < CHECK_LIMIT + 2) {
      const r = await request(t.app).post(`${api40(2)}/check`).send({ entries: [] });
      last = r.status;
      body = r.body;
      retryAfter = r.headers['retry-after'];
      tries++;
    }
    expect(last).toBe(429);
    expect(tries).toBeLessThanOrEqual(CHECK_LIMIT + 1);
    expect(body.error?.code).toBe('rate_limited');
    expect(Number(retryAfter)).toBeGreaterThan(0);
    // pages stay readable
    await request(t.app).get(`/read/${slug}/40/2`).expect(200);
  });
});
