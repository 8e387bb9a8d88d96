import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { count, eq } from 'drizzle-orm';
import type { Role } from '../../../shared/contracts/common';
import { submission } from '../../../server/areas/intake/schema';
import { stock } from '../../../server/areas/stock/schema';
import { mailOutbox } from '../../../server/platform/mail/schema';
import { uploaded } from './upload-helper';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { order9Code, order9bCode } from '../../fixtures/order9';
import { order10Codes, order21Square } from '../../fixtures/intake/order10';

let t: TestApp;
const agents = new Map<string, TestAgent>();
async function as(role: Role, email?: string): Promise<TestAgent> {
  const key = email ?? role;
  let a = agents.get(key);
  if (!a) {
    a = await t.signInAs(role, email ? { email, name: `Setter ${email}` } : {});
    agents.set(key, a);
  }
  return a;
}
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const rows = () => t.db.select({ n: count() }).from(submission).get()?.n ?? 0;

describe('POST /api/submissions', () => {
  it('stores a pasted code as a pending submission with its classification', async () => {
    const setter = await as('setter');
    const res = await setter.post('/api/submissions').send({ code: order10Codes[0], title: 'First try', source: 'paste' }).expect(201);
    // squaring.net o10spsr.bkp: 57 x 55 is a simple perfect squared rectangle of order 10
    expect(res.body).toMatchObject({ status: 'pending', order: 10, width: 57, height: 55, perfect: true, simple: true, title: 'First try', duplicateOf: null });
  });

  it('accepts sketched squares (the network sketch sends these)', async () => {
    const setter = await as('setter');
    // the 33 x 32 rectangle by its placement (facts.md worked example)
    const squares = [
      [0, 0, 18], [18, 0, 15], [18, 15, 7], [25, 15, 8], [0, 18, 14], [14, 18, 4], [14, 22, 10], [24, 22, 1], [24, 23, 9],
    ].map(([x, y, size]) => ({ x: x!, y: y!, size: size! }));
    const res = await setter.post('/api/submissions').send({ squares: { width: 33, height: 32, squares }, source: 'sketch' }).expect(201);
    expect(res.body.canonicalCode).toBe('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    expect(res.body.source).toBe('sketch');
  });

  it('flags a submission equal up to symmetry to a pending one, without saying whose', async () => {
    const other = await as('setter', 'other-setter@test.squarewright.test');
    // facts.md: (15,18)(8,7)(4,14)(1,10)(9) is the mirror image of the 33 x 32
    const res = await other.post('/api/submissions').send({ code: '(15,18)(8,7)(4,14)(1,10)(9)', source: 'paste' }).expect(201);
    expect(res.body.duplicateOf).toBe('pending');
    const first = t.db.select({ setterId: submission.setterId }).from(submission).where(eq(submission.id, 1)).get()!;
    expect(res.body.setterId).not.toBe(first.setterId);
    expect(JSON.stringify(res.body)).not.toContain(first.setterId);
    expect(JSON.stringify(res.body)).not.toContain('Test setter');
  });

  it('answers a bad code with 422 and the engine’s where', async () => {
    const setter = await as('setter');
    const before = rows();
    const res = await setter.post('/api/submissions').send({ code: '9 33 32 (18,15)(7,8)(14,5)(10,1)(9)', source: 'paste' }).expect(422);
    expect(res.body.error.message).toMatch(/element 6/);
    expect(res.body.error.details).toMatchObject({ path: 'body.code', where: { element: 6 } });
    expect(rows()).toBe(before);
  });

  it('refuses malformed bodies with 400 and the field', async () => {
    const setter = await as('setter');
    const cases: [unknown, string][] = [
      [{ source: 'paste' }, 'body.code'],
      [{ code: order9Code, source: 'fax' }, 'body.source'],
      [{ code: order9Code, source: 'paste', title: 'x'.repeat(121) }, 'body.title'],
      [{ code: order9Code, source: 'paste', extra: 1 }, 'body'],
    ];
    for (const [body, where] of cases) {
      const res = await setter.post('/api/submissions').send(body as object).expect(400);
      expect(JSON.stringify(res.body.error.details)).toContain(where);
    }
  });

  it('is for setters only', async () => {
    for (const role of ['editor', 'printer'] as const) {
      await (await as(role)).post('/api/submissions').send({ code: order9bCode, source: 'paste' }).expect(403);
    }
    await request(t.app).post('/api/submissions').send({ code: order9bCode, source: 'paste' }).expect(401);
  });
});

describe('POST /api/submissions/upload', () => {
  it('gives a per-line report: valid, invalid with where, duplicates of this file and of pending ones', async () => {
    const setter = await as('setter');
    const file = [
      '# my finds', // comment: skipped
      order10Codes[1], // line 2 valid
      '', // blank: skipped
      '10 65 47 (25,17,23)(11,6)(5,24)(22,4)(19)', // line 4 invalid
      order10Codes[1], // line 5 duplicate of line 2
      order10Codes[0], // line 6 pending already (first test)
      `${order10Codes[2]} * big one`, // line 7 valid, caption as title
    ].join('\n');
    const report = await uploaded(setter, Buffer.from(file), 'finds.txt');
    const byLine = Object.fromEntries(report.lines.map((l) => [l.line, l]));
    expect(Object.keys(byLine).map(Number)).toEqual([2, 4, 5, 6, 7]);
    expect(byLine[2]).toMatchObject({ verdict: 'valid', order: 10, width: 65, height: 47 });
    expect(byLine[4]).toMatchObject({ verdict: 'invalid' });
    expect(byLine[4]!.error!.where!.line).toBe(1); // within the line; the report's line is the file line
    expect(byLine[5]).toMatchObject({ verdict: 'duplicate', duplicateOf: 'this-file' });
    expect(byLine[5]!.submissionId).toBeUndefined();
    expect(byLine[6]).toMatchObject({ verdict: 'duplicate', duplicateOf: 'pending' });
    expect(report.summary).toEqual({ valid: 2, invalid: 1, duplicate: 2, created: 3 });
    const big = await setter.get(`/api/submissions/${byLine[7]!.submissionId}`).expect(200);
    expect(big.body.title).toBe('big one');
  });

  it('refuses a file over 5 MB with 413', async () => {
    const setter = await as('setter');
    const before = rows();
    const big = Buffer.alloc(5 * 1024 * 1024 + 10, 0x23); // '#' characters
    const res = await setter.post('/api/submissions/upload').attach('file', big, 'big.txt').expect(413);
    expect(res.body.error.code).toBe('payload_too_large');
    expect(rows()).toBe(before);
  });

  it('refuses more than 20,000 lines with 422, and files that are not plain text, whatever their name', async () => {
    const setter = await as('setter');
    const many = Buffer.from(`${'#\n'.repeat(20_001)}`);
    const res = await setter.post('/api/submissions/upload').attach('file', many, 'many.bkp').expect(422);
    expect(res.body.error.message).toMatch(/20001 lines/);
    // a PDF's bytes (NUL bytes) and Latin-1 bytes that are not UTF-8 are not a code list, even named .txt
    const pdf = Buffer.concat([Buffer.from('%PDF-1.7\n'), Buffer.from([0, 1, 2, 0]), Buffer.from(order9bCode)]);
    const wrong = await setter.post('/api/submissions/upload').attach('file', pdf, 'codes.txt').expect(422);
    expect(wrong.body.error.message).toMatch(/cannot be read as a list of codes: it is not plain text/);
    const latin1 = await setter.post('/api/submissions/upload').attach('file', Buffer.from([0x4d, 0xfc, 0x6c, 0x6c, 0x65, 0x72, 0x0a]), 'list').expect(422);
    expect(latin1.body.error.message).toMatch(/not plain text in UTF-8/);
    const none = await setter.post('/api/submissions/upload').field('x', '1').expect(422);
    expect(none.body.error.message).toMatch(/field "file"/);
  });

  it('accepts a plain-text code list by its content, whatever its name (our own export is .txt)', async () => {
    const setter = await as('setter');
    // the published order-12 rectangle 112 x 99 (the tiling catalogue in tests/fixtures/puzzle), under a name no extension rule would allow
    const code = '12 112 99 (56,27,29)(25,2)(31)(17,8)(43,13)(39)(30)';
    const first = await uploaded(setter, Buffer.from(`# one code a line\n${code}\n`), 'finds.dat');
    expect(first.lines.map((l) => l.verdict)).toEqual(['valid']);
    // and without any extension: read as well (now a duplicate of the pending one)
    const again = await uploaded(setter, Buffer.from(`${code}\n`), 'codes-without-extension');
    expect(again.lines.map((l) => `${l.verdict}:${l.duplicateOf ?? ''}`)).toEqual(['duplicate:pending']);
  });

  it('is for setters only', async () => {
    await (await as('editor')).post('/api/submissions/upload').attach('file', Buffer.from(order9bCode), 'a.txt').expect(403);
    await (await as('printer')).post('/api/submissions/upload').attach('file', Buffer.from(order9bCode), 'a.txt').expect(403);
  });
});

describe('listing and reading submissions', () => {
  it('setters see only their own; editors see all and filter by status', async () => {
    const mine = await (await as('setter')).get('/api/submissions').expect(200);
    const theirs = await (await as('setter', 'other-setter@test.squarewright.test')).get('/api/submissions').expect(200);
    expect(theirs.body.total).toBe(1);
    const all = await (await as('editor')).get('/api/submissions?status=pending&pageSize=100').expect(200);
    expect(all.body.total).toBe(mine.body.total + theirs.body.total);
    expect(new Set(mine.body.items.map((s: { setterId: string }) => s.setterId)).size).toBe(1);
  });

  it('sorts and pages on the server', async () => {
    const editor = await as('editor');
    const a = await editor.get('/api/submissions?sort=order&pageSize=2&page=1').expect(200);
    const b = await editor.get('/api/submissions?sort=order&pageSize=2&page=2').expect(200);
    expect(a.body.items).toHaveLength(2);
    const orders = [...a.body.items, ...b.body.items].map((s: { order: number }) => s.order);
    expect(orders).toEqual([...orders].sort((x, y) => x - y));
    const bad = await editor.get('/api/submissions?sort=colour').expect(400);
    expect(JSON.stringify(bad.body.error.details)).toContain('query.sort');
    await editor.get('/api/submissions?pageSize=1000').expect(400);
  });

  it('a setter cannot open another setter’s submission (404, not 403: nothing is revealed)', async () => {
    const theirs = await (await as('setter', 'other-setter@test.squarewright.test')).get('/api/submissions').expect(200);
    const id = theirs.body.items[0].id;
    await (await as('setter')).get(`/api/submissions/${id}`).expect(404);
    await (await as('printer')).get(`/api/submissions/${id}`).expect(403);
    const detail = await (await as('editor')).get(`/api/submissions/${id}`).expect(200);
    // the editor sees the other pending copy of the same tiling
    expect(detail.body.duplicates.submissions.length).toBeGreaterThan(0);
    expect(detail.body.smith.nodes.length).toBe(6);
  });
});

describe('review', () => {
  it('accepting puts the tiling into the stock and mails the setter, in one go', async () => {
    const editor = await as('editor');
    const mine = await (await as('setter')).get('/api/submissions?status=pending&pageSize=100').expect(200);
    // the first 57 x 55 sent (later copies of it are pending duplicates of it; duplicateOf is read live, issue 16)
    const s = mine.body.items.filter((x: { width: number }) => x.width === 57).sort((a: { id: number }, b: { id: number }) => a.id - b.id)[0];
    const res = await editor.post(`/api/submissions/${s.id}/accept`).send({ note: 'Lovely' }).expect(200);
    expect(res.body).toMatchObject({ status: 'accepted', editorNote: 'Lovely' });
    expect(res.body.stockId).toBeGreaterThan(0);
    const inStock = t.db.select({ key: stock.canonicalKey, provenance: stock.provenance }).from(stock).where(eq(stock.id, res.body.stockId)).get();
    expect(inStock).toMatchObject({ key: s.canonicalKey, provenance: 'setter' });
    const mail = await t.mailbox.waitFor({ to: 'setter@test.squarewright.test', subject: 'Accepted into the stock' });
    expect(mail.text).toContain('Lovely');
    expect(mail.text).toContain('57 x 55');
    // accepting twice is a conflict
    await editor.post(`/api/submissions/${s.id}/accept`).send({}).expect(409);
    // the tiling is now a duplicate of the stock for anyone who checks it
    const check = await editor.post('/api/tilings/check').send({ code: order10Codes[0] }).expect(200);
    expect(check.body.duplicateOf).toBe('stock');
  });

  it('rejecting needs a note and mails it to the setter', async () => {
    const editor = await as('editor');
    const theirs = await (await as('setter', 'other-setter@test.squarewright.test')).get('/api/submissions').expect(200);
    const id = theirs.body.items[0].id;
    const missing = await editor.post(`/api/submissions/${id}/reject`).send({}).expect(400);
    expect(JSON.stringify(missing.body.error.details)).toContain('body.note');
    await editor.post(`/api/submissions/${id}/reject`).send({ note: 'Already pending from someone else' }).expect(200);
    const mail = await t.mailbox.waitFor({ to: 'other-setter@test.squarewright.test', subject: 'Not accepted' });
    expect(mail.text).toContain('Already pending from someone else');
    const after = await (await as('setter', 'other-setter@test.squarewright.test')).get(`/api/submissions/${id}`).expect(200);
    expect(after.body).toMatchObject({ status: 'rejected', editorNote: 'Already pending from someone else' });
  });

  it('refuses to accept a copy of something already in the stock (409), and writes no mail then', async () => {
    const editor = await as('editor');
    const setter = await as('setter');
    const dup = await setter.post('/api/submissions').send({ code: '(27,30)(13,11,3)(8,25)(2,17)(15)', source: 'paste' }).expect(201);
    expect(dup.body.duplicateOf).toBe('stock');
    const mails = t.db.select({ n: count() }).from(mailOutbox).get()!.n;
    const res = await editor.post(`/api/submissions/${dup.body.id}/accept`).send({}).expect(409);
    expect(res.body.error.message).toMatch(/already in the stock/);
    expect(t.db.select({ n: count() }).from(mailOutbox).get()!.n).toBe(mails);
    const still = await editor.get(`/api/submissions/${dup.body.id}`).expect(200);
    expect(still.body.status).toBe('pending');
  });

  it('bulk: accepts several and reports each', async () => {
    const editor = await as('editor');
    const pending = await editor.get('/api/submissions?status=pending&duplicate=false&pageSize=100').expect(200);
    const ids = pending.body.items.map((s: { id: number }) => s.id).slice(0, 2);
    expect(ids).toHaveLength(2);
    const res = await editor.post('/api/submissions/bulk').send({ ids: [...ids, 999999], action: 'accept' }).expect(200);
    expect(res.body.results).toEqual([
      { id: ids[0], ok: true, status: 'accepted' },
      { id: ids[1], ok: true, status: 'accepted' },
      { id: 999999, ok: false, error: 'submission 999999 does not exist' },
    ]);
    await editor.post('/api/submissions/bulk').send({ ids, action: 'reject' }).expect(400);
    await editor.post('/api/submissions/bulk').send({ ids: [], action: 'accept' }).expect(400);
  });

  it('is for editors and admins only', async () => {
    const id = t.db.select({ id: submission.id }).from(submission).where(eq(submission.status, 'pending')).limit(1).get()!.id;
    for (const role of ['setter', 'printer'] as const) {
      const a = await as(role);
      await a.post(`/api/submissions/${id}/accept`).send({}).expect(403);
      await a.post(`/api/submissions/${id}/reject`).send({ note: 'no' }).expect(403);
      await a.post('/api/submissions/bulk').send({ ids: [id], action: 'accept' }).expect(403);
    }
    await (await as('admin')).post(`/api/submissions/${id}/reject`).send({ note: 'admin may' }).expect(200);
    await (await as('editor')).post('/api/submissions/abc/accept').send({}).expect(400);
    await (await as('editor')).post('/api/submissions/424242/accept').send({}).expect(404);
  });
});

describe('searching submissions by title', () => {
  it('matches % and _ in the search text literally, not as wildcards', async () => {
    const setter = await as('setter', 'search-setter@test.squarewright.test');
    await setter.post('/api/submissions').send({ code: order10Codes[1], title: 'Harbour 50% sale', source: 'paste' }).expect(201);
    await setter.post('/api/submissions').send({ code: order10Codes[2], title: 'Harbour 50 sale', source: 'paste' }).expect(201);
    await setter.post('/api/submissions').send({ code: order10Codes[3], title: 'Harbour_quay', source: 'paste' }).expect(201);
    const titles = async (q: string) =>
      ((await setter.get(`/api/submissions?q=${encodeURIComponent(q)}`).expect(200)).body.items as { title: string }[]).map((s) => s.title).sort();
    expect(await titles('50%')).toEqual(['Harbour 50% sale']);
    expect(await titles('r_q')).toEqual(['Harbour_quay']);
    expect(await titles('Harbour')).toEqual(['Harbour 50 sale', 'Harbour 50% sale', 'Harbour_quay']);
  });
});

describe('a submission row whose squares_json does not read', () => {
  it('is an error naming the table and row id; accepting it writes nothing', async () => {
    const created = await (await as('setter')).post('/api/submissions').send({ code: order21Square, title: 'Broken later', source: 'paste' }).expect(201);
    const id: number = created.body.id;
    t.db.$client.prepare('update submission set squares_json = ? where id = ?').run('[[0,0,50],[50,0,"35"]]', id);
    const editor = await as('editor');
    const mailsBefore = t.db.select({ n: count() }).from(mailOutbox).get()!.n;
    const stockBefore = t.db.select({ n: count() }).from(stock).get()!.n;
    const spy = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const detail = await editor.get(`/api/submissions/${id}`).expect(500);
    const accept = await editor.post(`/api/submissions/${id}/accept`).send({ note: 'ok' }).expect(500);
    const logged = spy.mock.calls.flat().map(String).join(' ');
    spy.mockRestore();
    expect([detail.body.error.code, accept.body.error.code]).toEqual(['internal', 'internal']);
    expect(logged).toContain(`submission ${id}: column squares_json does not have its stored shape`);
    expect(t.db.select({ status: submission.status }).from(submission).where(eq(submission.id, id)).get()!.status).toBe('pending');
    expect(t.db.select({ n: count() }).from(stock).get()!.n).toBe(stockBefore);
    expect(t.db.select({ n: count() }).from(mailOutbox).get()!.n).toBe(mailsBefore);
  });
});
