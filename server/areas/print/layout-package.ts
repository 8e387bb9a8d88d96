import { createHash } from 'node:crypto';
import { zipSync } from 'fflate';
import { richTextToPlain } from '../../../shared/contracts/editions';
import type { PressSettings } from '../../../shared/contracts/press';
import type { PageTemplate } from '../../../shared/contracts/templates';
import { squareLabel } from '../../../shared/puzzle/index';
import { graphicSvg } from './graphic-svg';
import type { OutputProfile } from './render-edition';
import type { Preflight, PuzzlePrint, SolutionPrint } from './types';

// The layout package: for desks that lay pages out in their own software. Per puzzle and its
// solution a placeable vector PDF (PDF/X like the edition, the page cut to the drawing: its
// own TrimBox, no bleed) and an SVG of the same drawing, at the publication's type and line
// settings; the instructions and the solution as plain text (with the Deduction step list)
// for the web and for screen readers; and a manifest (manifest.json) of every file. One zip.

const PT_PER_MM = 72 / 25.4;

export type PackageEntry = {
  /** file name stem, e.g. "the-saturday-quadrant-no41-slot2" */
  stem: string;
  slot: number | null;
  puzzleId: string;
  puzzle: PuzzlePrint;
  solution: SolutionPrint;
};

export type PackageInput = {
  /** e.g. "The Saturday Quadrant No. 41" */
  title: string;
  template: PageTemplate;
  press: PressSettings;
  outputProfile?: OutputProfile | undefined;
  createdAt: Date;
  entries: PackageEntry[];
};

export type ManifestFile = {
  name: string;
  slot: number | null;
  puzzleId: string;
  kind: 'assembly' | 'deduction';
  content: 'puzzle' | 'solution' | 'instructions';
  format: 'pdf' | 'svg' | 'txt';
  bytes: number;
  sha256: string;
  /** the drawing's size (pdf, svg) */
  widthMm?: number;
  heightMm?: number;
  /** the PDF's preflight verdict */
  preflightOk?: boolean;
};

export type Manifest = {
  title: string;
  createdAt: string;
  template: string;
  standard: PressSettings['standard'];
  outputCondition: string;
  files: ManifestFile[];
};

/** The instructions as plain text: the slot's own, or (no text given) the standard words for the kind. */
export function instructionsText(p: PuzzlePrint): string {
  const own = richTextToPlain(p.instructions).trim();
  const head = `Puzzle${p.slot ? ` ${p.slot}` : ''}: ${p.title || (p.kind === 'assembly' ? 'Assembly' : 'Deduction')} (${p.kind === 'assembly' ? 'Assembly' : 'Deduction'}, grade ${p.grade})`;
  if (p.kind === 'assembly') {
    const pieces = [...p.pieces].sort((a, b) => b - a);
    const starters = p.starters.length > 0 ? `\nStarter pieces already placed: ${p.starters.map((s) => `${s.size} at (${s.x}, ${s.y})`).join(', ')} (from the top left corner).` : '';
    const words = own || 'Fit every square piece into the frame, with no gaps and no overlaps.';
    return `${head}\n\n${words}\n\nFrame: ${p.frame.W} by ${p.frame.H}.\nPieces (${pieces.length}): ${pieces.join(', ')}.${starters}\n`;
  }
  const words = own || 'The drawing is not to scale. Every piece is a square: find the side of each.';
  return `${head}\n\n${words}\n\nThe drawing has ${p.layout.rects.length} squares, lettered ${squareLabel(0)} to ${squareLabel(p.layout.rects.length - 1)} from the top left.\nGiven sizes: ${p.givens.map((g) => `${squareLabel(g.rect)} = ${g.size}`).join(', ')}.\n`;
}

/** The solution as plain text: size, every square with its letter and place, and the steps of a Deduction. */
export function solutionText(s: SolutionPrint): string {
  const t = s.tiling;
  const lines = [`Solution${s.caption ? ` (${s.caption})` : ` to puzzle ${s.slot}`}: a ${t.W} by ${t.H} rectangle cut into ${t.squares.length} squares.`, '', 'Squares (letter: side at x, y from the top left corner):'];
  t.squares.forEach((q, i) => lines.push(`${squareLabel(i)}: ${q.s} at ${q.x}, ${q.y}`));
  if (s.steps && s.steps.length > 0) {
    lines.push('', 'Steps:');
    s.steps.forEach((step, i) => lines.push(`${i + 1}. ${step}`));
  }
  return `${lines.join('\n')}\n`;
}

async function graphicFiles(input: PackageInput, what: { puzzle: PuzzlePrint } | { solution: SolutionPrint }, title: string): Promise<{ pdf: Buffer; svg: string; widthPt: number; heightPt: number; preflight: Preflight }> {
  const [layout, renderer, { toPdfX }, { preflightPdf }] = await Promise.all([import('./edition-layout'), import('@react-pdf/renderer'), import('./pdfx'), import('./preflight')]);
  const g = layout.buildGraphic(input.template, what, title);
  const raw = await renderer.renderToBuffer(g.element as Parameters<typeof renderer.renderToBuffer>[0]);
  // a placeable graphic has no bleed: MediaBox = BleedBox = TrimBox = the drawing
  const press = { ...input.press, bleedMm: 0 };
  const pdf = await toPdfX(raw, {
    press,
    trimPt: { width: g.widthPt, height: g.heightPt },
    bleedPt: 0,
    title,
    createdAt: input.createdAt,
    profile: input.outputProfile ? { bytes: Buffer.from(input.outputProfile.base64, 'base64'), description: input.outputProfile.description } : undefined,
  });
  const preflight = await preflightPdf({ template: input.template, press, pdf, fontsRegistered: g.fonts, pageSizePt: { width: g.widthPt, height: g.heightPt }, metrics: g.metrics, graphic: true });
  return { pdf, svg: graphicSvg(g.parts, g.widthPt, g.heightPt, title), widthPt: g.widthPt, heightPt: g.heightPt, preflight };
}

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');
const mm = (pt: number) => Math.round((pt / PT_PER_MM) * 100) / 100;

/** Builds the layout package: the zip's bytes and its manifest. */
export async function buildLayoutPackage(input: PackageInput): Promise<{ zip: Buffer; manifest: Manifest }> {
  const files: Record<string, Uint8Array> = {};
  const manifest: Manifest = { title: input.title, createdAt: input.createdAt.toISOString(), template: input.template.id, standard: input.press.standard, outputCondition: input.press.condition, files: [] };
  const add = (name: string, bytes: Uint8Array, meta: Omit<ManifestFile, 'name' | 'bytes' | 'sha256'>) => {
    if (files[name]) throw new Error(`layout package: two files named ${name}`);
    files[name] = bytes;
    manifest.files.push({ name, ...meta, bytes: bytes.length, sha256: sha(bytes) });
  };
  for (const e of input.entries) {
    const base = { slot: e.slot, puzzleId: e.puzzleId, kind: e.puzzle.kind };
    for (const content of ['puzzle', 'solution'] as const) {
      const label = content === 'puzzle' ? `${input.title}, ${e.slot ? `puzzle ${e.slot}` : `puzzle ${e.puzzleId}`}` : `${input.title}, solution to ${e.slot ? `puzzle ${e.slot}` : `puzzle ${e.puzzleId}`}`;
      const g = await graphicFiles(input, content === 'puzzle' ? { puzzle: e.puzzle } : { solution: e.solution }, label);
      const size = { widthMm: mm(g.widthPt), heightMm: mm(g.heightPt) };
      add(`${e.stem}-${content}.pdf`, g.pdf, { ...base, content, format: 'pdf', ...size, preflightOk: g.preflight.ok });
      add(`${e.stem}-${content}.svg`, Buffer.from(g.svg, 'utf8'), { ...base, content, format: 'svg', ...size });
    }
    add(`${e.stem}-instructions.txt`, Buffer.from(instructionsText(e.puzzle), 'utf8'), { ...base, content: 'instructions', format: 'txt' });
    add(`${e.stem}-solution.txt`, Buffer.from(solutionText(e.solution), 'utf8'), { ...base, content: 'solution', format: 'txt' });
  }
  const manifestBytes = Buffer.from(`${JSON.stringify(manifest, null, 2)}\n`, 'utf8');
  const mtime = input.createdAt;
  const zip = zipSync({ 'manifest.json': [manifestBytes, { mtime }], ...Object.fromEntries(Object.entries(files).map(([k, v]) => [k, [v, { mtime }]])) }, { level: 6 });
  return { zip: Buffer.from(zip), manifest };
}
