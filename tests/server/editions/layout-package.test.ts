import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Window } from 'happy-dom';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { plainRichText } from '../../../shared/contracts/editions';
import { squareLabel } from '../../../shared/puzzle/index';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { hasPressTools, pressToolsSkipReason, qpdfCheck } from '../print/debian-tools';
import { TILING_33x32, TILING_69x61 } from '../print/fixtures/sample-edition';
import { stubPuzzles, type StubPuzzles } from '../print/fixtures/stub-puzzles';
import { hasPoppler } from '../print/poppler';
import { quadrantPublication } from './fixtures';

// The layout package unzipped by Debian's unzip and every file checked: each PDF is PDF/X
// cropped to its drawing (pdfinfo -box: TrimBox = MediaBox = BleedBox, the manifest's size;
// qpdf --check), each SVG parses (happy-dom's XML parser) with one rect per square, the text
// solution names squares that tile the rectangle exactly with the published sizes of the
// order-9 rectangles (squaring.net), and the manifest lists every file with its hash.

const PT_PER_MM = 72 / 25.4;
let t: TestApp;
let editor: request.Agent;
let puzzles: StubPuzzles;
let editionId: string;
let pubs: Record<string, string>;
let assemblyId: string;
let deductionId: string;
const instructions = 'Find the side of every square. The drawing is not to scale.';

function binary(res: request.Response, cb: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
}

beforeAll(async () => {
  t = await createTestApp();
  puzzles = stubPuzzles(t.deps);
  t.deps.puzzles = puzzles;
  const admin = await t.signInAs('admin');
  editor = await t.signInAs('editor');
  pubs = {};
  for (const [templateId, title] of [['newspaper-column', 'The Saturday Quadrant'], ['a4', 'Squared Away Monthly'], ['us-letter', 'Letter Squares']] as const) {
    pubs[templateId] = (await admin.post('/api/publications').send({ ...quadrantPublication, title, templateId }).expect(201)).body.id;
  }
  const setterId = await t.createUser('setter');
  assemblyId = puzzles.add({ tiling: TILING_69x61, kind: 'assembly', setterId }).id;
  deductionId = puzzles.add({ tiling: TILING_33x32, kind: 'deduction', setterId }).id;
  editionId = (await editor.post('/api/editions').send({ publicationId: pubs['newspaper-column'], number: 41, date: '2026-12-05', introduction: plainRichText('Welcome.') }).expect(201)).body.id;
  await editor
    .patch(`/api/editions/${editionId}`)
    .send({ slots: [{ puzzleId: assemblyId }, { puzzleId: deductionId, instructions: plainRichText(instructions) }] })
    .expect(200);
}, 60_000);
afterAll(() => t.close());

async function unzip(path: string, name: string): Promise<{ dir: string; files: string[]; res: request.Response }> {
  const res = await editor.get(path).buffer(true).parse(binary).expect(200);
  expect(res.headers['content-type']).toMatch(/^application\/zip/);
  expect(res.headers['content-disposition']).toBe(`attachment; filename="${name}"`);
  const dir = mkdtempSync(join(tmpdir(), 'sw-layout-'));
  const zip = join(dir, name);
  writeFileSync(zip, res.body as Buffer);
  // Debian's unzip tests every member's CRC, then extracts
  expect(execFileSync('unzip', ['-t', zip], { encoding: 'utf8' })).toMatch(/No errors detected/);
  execFileSync('unzip', ['-q', zip, '-d', join(dir, 'x')]);
  return { dir: join(dir, 'x'), files: readdirSync(join(dir, 'x')).sort(), res };
}

type ManifestFile = { name: string; slot: number | null; puzzleId: string; kind: string; content: string; format: string; bytes: number; sha256: string; widthMm?: number; heightMm?: number; preflightOk?: boolean };

function checkManifest(dir: string, files: string[]): ManifestFile[] {
  const m = JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8')) as { files: ManifestFile[]; standard: string };
  expect(m.files.map((f) => f.name).sort()).toEqual(files.filter((f) => f !== 'manifest.json'));
  for (const f of m.files) {
    const bytes = readFileSync(join(dir, f.name));
    expect(bytes.length).toBe(f.bytes);
    expect(createHash('sha256').update(bytes).digest('hex')).toBe(f.sha256);
  }
  return m.files;
}

function checkPdf(file: string, f: ManifestFile) {
  const out = execFileSync('pdfinfo', ['-box', file], { encoding: 'utf8' });
  const box = (name: string) => (new RegExp(`^${name}:\\s+([-\\d.]+)\\s+([-\\d.]+)\\s+([-\\d.]+)\\s+([-\\d.]+)`, 'm').exec(out) ?? []).slice(1).map(Number);
  const media = box('MediaBox');
  expect(box('TrimBox')).toEqual(media);
  expect(box('BleedBox')).toEqual(media);
  expect(media[2]! - media[0]!).toBeCloseTo(f.widthMm! * PT_PER_MM, 0);
  expect(media[3]! - media[1]!).toBeCloseTo(f.heightMm! * PT_PER_MM, 0);
  expect(out).toMatch(/^PDF subtype:\s+PDF\/X-1a:2003$/m);
  expect(qpdfCheck(file).status).toBe(0);
}

function svgRects(file: string): { rects: number; texts: string[] } {
  const w = new Window();
  const doc = new w.DOMParser().parseFromString(readFileSync(file, 'utf8'), 'image/svg+xml');
  expect(doc.documentElement.tagName.toLowerCase()).toBe('svg');
  expect(doc.querySelector('parsererror')).toBeNull();
  return { rects: doc.querySelectorAll('rect').length, texts: [...doc.querySelectorAll('text')].map((e) => e.textContent ?? '') };
}

/** Reads "A: 18 at 0, 0" lines and checks the squares cover W x H exactly once. */
function solutionSquares(text: string): { W: number; H: number; sizes: number[] } {
  const head = /a (\d+) by (\d+) rectangle cut into (\d+) squares/.exec(text)!;
  const W = Number(head[1]);
  const H = Number(head[2]);
  const sq = [...text.matchAll(/^([A-Z]+): (\d+) at (\d+), (\d+)$/gm)].map((m) => ({ letter: m[1]!, s: Number(m[2]), x: Number(m[3]), y: Number(m[4]) }));
  expect(sq).toHaveLength(Number(head[3]));
  sq.forEach((q, i) => expect(q.letter).toBe(squareLabel(i)));
  const grid = new Uint8Array(W * H);
  for (const q of sq) for (let y = q.y; y < q.y + q.s; y++) for (let x = q.x; x < q.x + q.s; x++) grid[y * W + x]! += 1;
  expect(grid.every((v) => v === 1)).toBe(true);
  return { W, H, sizes: sq.map((q) => q.s).sort((a, b) => b - a) };
}

describe.skipIf(!hasPoppler || !hasPressTools)(`the layout package (${hasPressTools ? 'Debian tools present' : pressToolsSkipReason})`, () => {
  it('packs an edition: every slot\'s puzzle and solution as PDF/X and SVG, the texts and a manifest', async () => {
    const { dir, files } = await unzip(`/api/editions/${editionId}/layout-package.zip`, 'the-saturday-quadrant-no41-layout-package.zip');
    const stems = ['the-saturday-quadrant-no41-slot1', 'the-saturday-quadrant-no41-slot2'];
    expect(files).toEqual(['manifest.json', ...stems.flatMap((s) => ['instructions.txt', 'puzzle.pdf', 'puzzle.svg', 'solution.pdf', 'solution.svg', 'solution.txt'].map((x) => `${s}-${x}`))].sort());
    const manifest = checkManifest(dir, files);
    for (const f of manifest.filter((x) => x.format === 'pdf')) checkPdf(join(dir, f.name), f);
    // the Deduction's drawings hold every square at the floors; its PDFs pass our preflight
    expect(manifest.filter((f) => f.slot === 2 && f.format === 'pdf').map((f) => f.preflightOk)).toEqual([true, true]);

    // Assembly (69 x 61): the frame, the starter and the 8 loose pieces; the solution's 9 squares
    expect(svgRects(join(dir, `${stems[0]}-puzzle.svg`)).rects).toBe(1 + 9);
    expect(svgRects(join(dir, `${stems[0]}-solution.svg`)).rects).toBe(9);
    // Deduction (33 x 32): 9 squares drawn, the givens among the labels
    const dPuzzle = svgRects(join(dir, `${stems[1]}-puzzle.svg`));
    expect(dPuzzle.rects).toBe(9);
    for (const g of puzzles.get(deductionId).deduction!.givens) expect(dPuzzle.texts).toContain(String(g.size));
    expect(svgRects(join(dir, `${stems[1]}-solution.svg`)).rects).toBe(9);

    // the published sizes of the two order-9 rectangles (squaring.net)
    const a = solutionSquares(readFileSync(join(dir, `${stems[0]}-solution.txt`), 'utf8'));
    expect(a).toEqual({ W: 69, H: 61, sizes: [36, 33, 28, 25, 16, 9, 7, 5, 2] });
    const dText = readFileSync(join(dir, `${stems[1]}-solution.txt`), 'utf8');
    expect(solutionSquares(dText)).toEqual({ W: 33, H: 32, sizes: [18, 15, 14, 10, 9, 8, 7, 4, 1] });
    expect(dText).toMatch(/Steps:\n1\. 18 \+ 15 = 33\./);
    const dInstr = readFileSync(join(dir, `${stems[1]}-instructions.txt`), 'utf8');
    expect(dInstr).toContain(instructions);
    expect(dInstr).toMatch(/Given sizes: A = 18, B = 15, E = 14\./);
    expect(readFileSync(join(dir, `${stems[0]}-instructions.txt`), 'utf8')).toMatch(/Pieces \(9\): 36, 33, 28, 25, 16, 9, 7, 5, 2\./);
  }, 120_000);

  for (const templateId of ['a4', 'us-letter'] as const) {
    it(`packs one puzzle from the puzzle page at the ${templateId} publication's settings`, async () => {
      const pub = pubs[templateId]!;
      const name = templateId === 'a4' ? 'squared-away-monthly' : 'letter-squares';
      const { dir, files } = await unzip(`/api/puzzles/${deductionId}/layout-package.zip?publicationId=${pub}`, `${name}-puzzle${deductionId}-layout-package.zip`);
      const manifest = checkManifest(dir, files);
      expect(manifest.map((f) => `${f.content}.${f.format}`).sort()).toEqual(['instructions.txt', 'puzzle.pdf', 'puzzle.svg', 'solution.pdf', 'solution.svg', 'solution.txt']);
      for (const f of manifest.filter((x) => x.format === 'pdf')) {
        checkPdf(join(dir, f.name), f);
        expect(f.preflightOk).toBe(true);
        // the drawing is a column of the publication's template wide at most
        expect(f.widthMm!).toBeLessThanOrEqual(templateId === 'a4' ? (210 - 30 - 6) / 2 + 0.5 : (215.9 - 32 - 6) / 2 + 0.5);
      }
      expect(solutionSquares(readFileSync(join(dir, `${name}-puzzle${deductionId}-solution.txt`), 'utf8')).sizes).toEqual([18, 15, 14, 10, 9, 8, 7, 4, 1]);
    }, 60_000);
  }

  it('answers 404 for an unknown puzzle and 400 without a publication', async () => {
    await editor.get(`/api/puzzles/999999/layout-package.zip?publicationId=${pubs.a4}`).expect(404);
    await editor.get(`/api/puzzles/${deductionId}/layout-package.zip`).expect(400);
  });
});
