// The one print layout module: turns an EditionDocument and its page template into a
// @react-pdf/renderer tree, measuring as it goes what the preflight reports (smallest
// printed square, smallest digit, labels left out). Imported only lazily (see
// render-edition.ts): @react-pdf/renderer takes about a second to load.
import { Document, Font, G, Line, Page, Rect, Svg, Text, View } from '@react-pdf/renderer';
import type { ReactElement, ReactNode } from 'react';
import type { RichTextDoc, RichTextNode } from '../../../shared/contracts/editions';
import { HAIRLINE_PT } from '../../../shared/contracts/press';
import { templateGeometry, type PageTemplate } from '../../../shared/contracts/templates';
import { notToScaleRects, squareLabel } from '../../../shared/puzzle/index';
import { PRINT_FONTS, registerPrintFonts } from '../../platform/pdf/fonts';
import { PALETTE } from './palette';
import type { EditionDocument, Preflight, PuzzlePrint, SolutionPrint, SolvedTiling } from './types';

export const PT_PER_MM = 72 / 25.4;
// Colours only from the print palette: each has its press colour (CMYK) there, and the
// press post-processing (pdfx.ts) refuses any other.
const INK = PALETTE.ink.rgb;
const PAPER = PALETTE.paper.rgb;
const PIECE_FILL = PALETTE.pieceFill.rgb;
const STARTER_FILL = PALETTE.starterFill.rgb;
const GIVEN_FILL = PALETTE.givenFill.rgb;
const PROOF_TINT = PALETTE.proofTint.rgb;

export { Font, registerPrintFonts };

export type LayoutMetrics = Pick<Preflight, 'smallestSquareMm' | 'smallestDigitPt' | 'omittedLabels'> & {
  illegibleGivens: { slot: number; size: number }[];
};

type Ctx = { t: PageTemplate; metrics: LayoutMetrics };

const WEEKDAY = ['Sunday', 'Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'];
const MONTH = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

export function formatEditionDate(iso: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(iso);
  if (!m) return iso;
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return `${WEEKDAY[d.getUTCDay()]} ${d.getUTCDate()} ${MONTH[d.getUTCMonth()]} ${d.getUTCFullYear()}`;
}

function noteSquare(ctx: Ctx, sidePt: number) {
  const mm = sidePt / PT_PER_MM;
  if (ctx.metrics.smallestSquareMm === null || mm < ctx.metrics.smallestSquareMm) ctx.metrics.smallestSquareMm = mm;
}

function noteDigit(ctx: Ctx, fontPt: number) {
  if (ctx.metrics.smallestDigitPt === null || fontPt < ctx.metrics.smallestDigitPt) ctx.metrics.smallestDigitPt = fontPt;
}

/**
 * The font size for a size label inside a box of w x h points: as large as the template
 * allows, but small enough that the digits fit with some air (tabular digits are about
 * 0.6 em wide in IBM Plex Sans). Returns null when even the template's minimum would
 * not fit.
 */
export function labelFontPt(label: string, wPt: number, hPt: number, t: PageTemplate): number | null {
  const byWidth = (0.82 * wPt) / (0.6 * Math.max(1, label.length));
  const byHeight = 0.62 * hPt;
  const size = Math.min(t.type.digitsPt, byWidth, byHeight);
  if (size < t.minimums.digitPt) return null;
  return Math.round(size * 10) / 10;
}

// Svg <Text> reads its font from props (the published types list only x and y).
function svgTextProps(x: number, y: number, fontSize: number) {
  return { x, y, textAnchor: 'middle', fill: INK, fontFamily: PRINT_FONTS.sans, fontWeight: 600, fontSize } as unknown as { x: number; y: number };
}

function label(ctx: Ctx, text: string, x: number, y: number, w: number, h: number, key: string): ReactElement | null {
  const size = labelFontPt(text, w, h, ctx.t);
  if (size === null) return null;
  noteDigit(ctx, size);
  return (
    <Text key={key} {...svgTextProps(x + w / 2, y + h / 2 + size * 0.35, size)}>
      {text}
    </Text>
  );
}

/**
 * The square's letter (A, B, ..., AA: the names the Deduction step list uses) small in its
 * top-left corner, when there is room beside the size label.
 */
function cornerLetter(ctx: Ctx, i: number, x: number, y: number, w: number, h: number, key: string): ReactElement | null {
  const size = Math.max(ctx.t.minimums.digitPt, Math.min(ctx.t.type.captionPt, Math.min(w, h) * 0.22));
  const text = squareLabel(i);
  if (Math.min(w, h) < size * 2.6 || w < size * (0.7 * text.length + 0.8)) return null;
  const props = { x: x + size * 0.35, y: y + size * 1.05, textAnchor: 'start', fill: INK, fontFamily: PRINT_FONTS.sans, fontWeight: 400, fontSize: size } as unknown as { x: number; y: number };
  return (
    <Text key={key} {...props}>
      {text}
    </Text>
  );
}

/**
 * A square of side `side` pt at (x, y) with its size label: noted for the preflight, the
 * label left out (and reported) when it cannot be printed legibly.
 */
function labelledSquare(
  ctx: Ctx,
  sq: { x: number; y: number; side: number; size: number; fill: string; key: string },
  omitted: { slot: number; where: 'puzzle' | 'solution' },
): ReactElement[] {
  noteSquare(ctx, sq.side);
  const out = [<Rect key={`${sq.key}r`} x={sq.x} y={sq.y} width={sq.side} height={sq.side} fill={sq.fill} stroke={INK} strokeWidth={ctx.t.drawing.strokePt} />];
  const l = label(ctx, String(sq.size), sq.x, sq.y, sq.side, sq.side, `${sq.key}l`);
  if (l) out.push(l);
  else ctx.metrics.omittedLabels.push({ ...omitted, size: sq.size });
  return out;
}

type Box = { widthPt: number; maxHeightPt: number };

function fitScale(W: number, H: number, box: Box) {
  return Math.min(box.widthPt / W, box.maxHeightPt / H);
}

// ---- the solution drawing -----------------------------------------------------------------
// A solution is drawn to scale when every square can then be printed at the template's
// floor with its size inside. Otherwise, and always for a Deduction (whose step list names
// the squares by letter), it is drawn not to scale: the same monotone remapping of the
// coordinates as the Deduction puzzle (notToScaleRects), every square labelled with its
// letter (Deduction) and its size. A square too small for its label even so gets a callout:
// a leader line from the square to the label in a column beside the drawing.

type SolutionCell = { x: number; y: number; w: number; h: number; size: number; letter: string | null };
type InsideLabel = { lines: string[]; fontPt: number };

/** The label inside a cell of w x h pt: letter over size on two lines, or "C 11" on one, at the largest size the cell allows; null when neither fits at the floor. */
function insideLabel(t: PageTemplate, cell: Pick<SolutionCell, 'w' | 'h' | 'size' | 'letter'>): InsideLabel | null {
  const size = String(cell.size);
  if (cell.letter === null) {
    const f = labelFontPt(size, cell.w, cell.h, t);
    return f === null ? null : { lines: [size], fontPt: f };
  }
  const longest = Math.max(size.length, cell.letter.length);
  const two = Math.min(t.type.digitsPt, (0.82 * cell.w) / (0.6 * longest), (0.8 * cell.h) / 2.3);
  if (two >= t.minimums.digitPt) return { lines: [cell.letter, size], fontPt: Math.round(two * 10) / 10 };
  const one = labelFontPt(`${cell.letter} ${size}`, cell.w, cell.h, t);
  return one === null ? null : { lines: [`${cell.letter} ${size}`], fontPt: one };
}

function solutionCells(tiling: SolvedTiling, k: number, notToScale: boolean, letters: boolean): SolutionCell[] {
  const letterOf = (i: number) => (letters ? squareLabel(i) : null);
  if (!notToScale) return tiling.squares.map((q, i) => ({ x: q.x * k, y: q.y * k, w: q.s * k, h: q.s * k, size: q.s, letter: letterOf(i) }));
  const layout = notToScaleRects({ W: tiling.W, H: tiling.H, squares: tiling.squares });
  return layout.rects.map((r, i) => ({ x: r.x * k, y: r.y * k, w: r.w * k, h: r.h * k, size: tiling.squares[i]!.s, letter: letterOf(i) }));
}

/** Whether a to-scale drawing of the tiling in the box keeps every square at the floor with its size inside. */
function fitsToScale(t: PageTemplate, tiling: SolvedTiling, box: Box): boolean {
  const k = fitScale(tiling.W, tiling.H, box);
  return tiling.squares.every((q) => q.s * k >= t.minimums.squareMm * PT_PER_MM && labelFontPt(String(q.s), q.s * k, q.s * k, t) !== null);
}

/** The solution drawing of one puzzle (see above); `letters` for a Deduction. */
function solutionDrawing(ctx: Ctx, tiling: SolvedTiling, box: Box, letters: boolean): { element: ReactElement; notToScale: boolean } {
  const t = ctx.t;
  const stroke = t.drawing.strokePt;
  const notToScale = letters || !fitsToScale(t, tiling, box);
  const digitPt = Math.max(t.minimums.digitPt, Math.min(t.type.digitsPt, t.type.captionPt));
  const box0 = notToScale ? notToScaleRects({ W: tiling.W, H: tiling.H, squares: tiling.squares }) : { W: tiling.W, H: tiling.H };
  // First pass on the whole width; when some cells need callouts, make room for their column and lay out again.
  let calloutW = 0;
  let k = 0;
  let cells: SolutionCell[] = [];
  let labels: (InsideLabel | null)[] = [];
  for (let pass = 0; pass < 3; pass++) {
    k = fitScale(box0.W, box0.H, { widthPt: box.widthPt - calloutW, maxHeightPt: box.maxHeightPt });
    cells = solutionCells(tiling, k, notToScale, letters);
    labels = cells.map((c) => insideLabel(t, c));
    const out = cells.filter((_, i) => labels[i] === null);
    const need = out.length === 0 ? 0 : Math.max(...out.map((c) => (c.letter ? `${c.letter} = ${c.size}` : String(c.size)).length)) * 0.6 * digitPt + 4 * PT_PER_MM;
    if (need <= calloutW) break;
    calloutW = Math.min(need, box.widthPt * 0.45);
  }
  const children: ReactNode[] = [];
  const w = box0.W * k;
  const h = box0.H * k;
  cells.forEach((c, i) => {
    noteSquare(ctx, Math.min(c.w, c.h));
    children.push(<Rect key={`sr${i}`} x={c.x} y={c.y} width={c.w} height={c.h} fill={PIECE_FILL} stroke={INK} strokeWidth={stroke} />);
    const l = labels[i];
    if (!l) return;
    noteDigit(ctx, l.fontPt);
    const lineH = l.fontPt * 1.15;
    const top = c.y + c.h / 2 - (lineH * l.lines.length) / 2 + l.fontPt * 0.85;
    l.lines.forEach((line, j) => {
      const props = { ...svgTextProps(c.x + c.w / 2, top + j * lineH, l.fontPt), fontWeight: j === l.lines.length - 1 ? 600 : 400 } as unknown as { x: number; y: number };
      children.push(
        <Text key={`sl${i}-${j}`} {...props}>
          {line}
        </Text>,
      );
    });
  });
  // Callouts: labels in a column right of the drawing, each at its cell's height where
  // there is room (pushed down past the one above), joined to the cell by a leader line.
  const callouts = cells.map((c, i) => ({ c, i })).filter(({ i }) => labels[i] === null).sort((a, b) => a.c.y + a.c.h / 2 - (b.c.y + b.c.h / 2));
  const lineH = digitPt * 1.25;
  let nextY = digitPt;
  let bottom = h;
  const labelX = w + 3 * PT_PER_MM;
  for (const { c, i } of callouts) {
    const cy = c.y + c.h / 2;
    const y = Math.max(cy + digitPt * 0.35, nextY);
    nextY = y + lineH;
    bottom = Math.max(bottom, y + digitPt * 0.4);
    noteDigit(ctx, digitPt);
    children.push(<Line key={`sc${i}`} x1={c.x + c.w / 2} y1={cy} x2={labelX - 0.8 * PT_PER_MM} y2={y - digitPt * 0.35} stroke={INK} strokeWidth={Math.max(0.3, stroke * 0.6)} />);
    const props = { x: labelX, y, textAnchor: 'start', fill: INK, fontFamily: PRINT_FONTS.sans, fontWeight: 600, fontSize: digitPt } as unknown as { x: number; y: number };
    children.push(
      <Text key={`st${i}`} {...props}>
        {c.letter ? `${c.letter} = ${c.size}` : String(c.size)}
      </Text>,
    );
  }
  const width = callouts.length > 0 ? box.widthPt : w + stroke;
  const height = bottom + stroke;
  const element = (
    <Svg width={width} height={height} viewBox={`${-stroke / 2} ${-stroke / 2} ${width} ${height}`}>
      <G>{children}</G>
    </Svg>
  );
  return { element, notToScale };
}

function assemblyDrawing(ctx: Ctx, p: Extract<PuzzlePrint, { kind: 'assembly' }>, box: Box): ReactElement {
  const k = fitScale(p.frame.W, p.frame.H, box);
  const stroke = ctx.t.drawing.strokePt;
  const w = p.frame.W * k;
  const h = p.frame.H * k;
  const children: ReactNode[] = [<Rect key="frame" x={0} y={0} width={w} height={h} fill={PAPER} stroke={INK} strokeWidth={stroke * 1.6} />];
  p.starters.forEach((st, i) => {
    children.push(...labelledSquare(ctx, { x: st.x * k, y: st.y * k, side: st.size * k, size: st.size, fill: STARTER_FILL, key: `s${i}` }, { slot: p.slot, where: 'puzzle' }));
  });
  return (
    <Svg width={w + 2 * stroke} height={h + 2 * stroke} viewBox={`${-stroke} ${-stroke} ${w + 2 * stroke} ${h + 2 * stroke}`}>
      <G>{children}</G>
    </Svg>
  );
}

/** The loose pieces at half the frame's scale, in rows wrapped to the column. */
function piecesDrawing(ctx: Ctx, p: Extract<PuzzlePrint, { kind: 'assembly' }>, box: Box): ReactElement {
  const k = fitScale(p.frame.W, p.frame.H, box) / 2;
  const stroke = ctx.t.drawing.strokePt;
  const gap = 2 * PT_PER_MM;
  const placed = new Map<number, number>();
  for (const st of p.starters) placed.set(st.size, (placed.get(st.size) ?? 0) + 1);
  const loose: number[] = [];
  for (const s of [...p.pieces].sort((a, b) => b - a)) {
    const n = placed.get(s) ?? 0;
    if (n > 0) placed.set(s, n - 1);
    else loose.push(s);
  }
  const children: ReactNode[] = [];
  let x = 0;
  let y = 0;
  let rowH = 0;
  loose.forEach((s, i) => {
    const side = s * k;
    if (x > 0 && x + side > box.widthPt) {
      x = 0;
      y += rowH + gap;
      rowH = 0;
    }
    children.push(...labelledSquare(ctx, { x, y, side, size: s, fill: PIECE_FILL, key: `p${i}` }, { slot: p.slot, where: 'puzzle' }));
    x += side + gap;
    rowH = Math.max(rowH, side);
  });
  const h = y + rowH;
  return (
    <Svg width={box.widthPt} height={h + stroke} viewBox={`${-stroke / 2} ${-stroke / 2} ${box.widthPt} ${h + stroke}`}>
      <G>{children}</G>
    </Svg>
  );
}

function deductionDrawing(ctx: Ctx, p: Extract<PuzzlePrint, { kind: 'deduction' }>, box: Box): ReactElement {
  const k = fitScale(p.layout.W, p.layout.H, box);
  const stroke = ctx.t.drawing.strokePt;
  const givens = new Map(p.givens.map((g) => [g.rect, g.size]));
  const children: ReactNode[] = [];
  p.layout.rects.forEach((r, i) => {
    const given = givens.get(i);
    const wPt = r.w * k;
    const hPt = r.h * k;
    noteSquare(ctx, Math.min(wPt, hPt));
    children.push(<Rect key={`d${i}`} x={r.x * k} y={r.y * k} width={wPt} height={hPt} fill={given === undefined ? PAPER : GIVEN_FILL} stroke={INK} strokeWidth={stroke} />);
    const letter = cornerLetter(ctx, i, r.x * k, r.y * k, wPt, hPt, `dc${i}`);
    if (letter) children.push(letter);
    if (given !== undefined) {
      const l = label(ctx, String(given), r.x * k, r.y * k, wPt, hPt, `g${i}`);
      if (l) children.push(l);
      else ctx.metrics.illegibleGivens.push({ slot: p.slot, size: given });
    }
  });
  const w = p.layout.W * k;
  const h = p.layout.H * k;
  return (
    <Svg width={w + stroke} height={h + stroke} viewBox={`${-stroke / 2} ${-stroke / 2} ${w + stroke} ${h + stroke}`}>
      <G>{children}</G>
    </Svg>
  );
}

// ---- rich text -----------------------------------------------------------------------

function inline(nodes: RichTextNode[] | undefined, keyBase: string): ReactNode[] {
  return (nodes ?? []).map((n, i) => {
    const key = `${keyBase}-${i}`;
    if (n.type === 'hardBreak') return '\n';
    if (n.type !== 'text') return <Text key={key}>{inline(n.content, key)}</Text>;
    const marks = new Set((n.marks ?? []).map((m) => m.type));
    if (marks.size === 0) return n.text ?? '';
    return (
      <Text key={key} style={{ fontWeight: marks.has('bold') ? 700 : 400, fontStyle: marks.has('italic') ? 'italic' : 'normal' }}>
        {n.text ?? ''}
      </Text>
    );
  });
}

function blocks(ctx: Ctx, nodes: RichTextNode[] | undefined, keyBase: string, sizePt: number): ReactNode[] {
  const t = ctx.t;
  const gap = sizePt * 0.45;
  return (nodes ?? []).map((n, i) => {
    const key = `${keyBase}-${i}`;
    switch (n.type) {
      case 'heading': {
        const level = typeof n.attrs?.level === 'number' ? n.attrs.level : 2;
        const size = level <= 1 ? t.type.headingPt * 1.2 : level === 2 ? t.type.headingPt : Math.max(t.type.bodyPt, t.type.headingPt * 0.9);
        return (
          <Text key={key} style={{ fontFamily: PRINT_FONTS.sans, fontWeight: 600, fontSize: size, marginTop: gap, marginBottom: gap * 0.6 }}>
            {inline(n.content, key)}
          </Text>
        );
      }
      case 'bulletList':
      case 'orderedList': {
        const start = typeof n.attrs?.start === 'number' ? n.attrs.start : 1;
        return (
          <View key={key} style={{ marginBottom: gap }}>
            {(n.content ?? []).map((item, j) => (
              <View key={`${key}-${j}`} style={{ flexDirection: 'row' }} wrap={false}>
                <Text style={{ width: sizePt * 1.6, fontSize: sizePt }}>{n.type === 'orderedList' ? `${start + j}.` : '\u2022'}</Text>
                <View style={{ flex: 1 }}>{blocks(ctx, item.content, `${key}-${j}`, sizePt)}</View>
              </View>
            ))}
          </View>
        );
      }
      case 'listItem':
        return <View key={key}>{blocks(ctx, n.content, key, sizePt)}</View>;
      case 'paragraph':
      default:
        return (
          <Text key={key} style={{ fontSize: sizePt, marginBottom: gap }}>
            {inline(n.content, key)}
          </Text>
        );
    }
  });
}

function richText(ctx: Ctx, doc: RichTextDoc, key: string, sizePt: number): ReactElement {
  return <View key={key}>{blocks(ctx, doc.content, key, sizePt)}</View>;
}

// ---- page furniture --------------------------------------------------------------------

/**
 * Crop marks, on proofs only: the press file's MediaBox is its BleedBox, and marks inside the
 * bleed are the plant's business (its imposition sets its own). Left out when the bleed of
 * the press spec is too narrow for them.
 */
function cropMarks(t: PageTemplate, pageW: number, pageH: number): ReactElement | null {
  if (t.cropMarks.offsetMm + t.cropMarks.lengthMm > t.bleedMm) return null;
  const b = t.bleedMm * PT_PER_MM;
  const off = t.cropMarks.offsetMm * PT_PER_MM;
  const len = t.cropMarks.lengthMm * PT_PER_MM;
  const xs = [b, pageW - b];
  const ys = [b, pageH - b];
  const lines: ReactNode[] = [];
  for (const [xi, x] of xs.entries()) {
    for (const [yi, y] of ys.entries()) {
      const dx = xi === 0 ? -1 : 1;
      const dy = yi === 0 ? -1 : 1;
      lines.push(<Line key={`h${xi}${yi}`} x1={x + dx * off} y1={y} x2={x + dx * (off + len)} y2={y} stroke={INK} strokeWidth={HAIRLINE_PT} />);
      lines.push(<Line key={`v${xi}${yi}`} x1={x} y1={y + dy * off} x2={x} y2={y + dy * (off + len)} stroke={INK} strokeWidth={HAIRLINE_PT} />);
    }
  }
  return (
    <View fixed style={{ position: 'absolute', top: 0, left: 0, width: pageW, height: pageH }}>
      <Svg width={pageW} height={pageH}>
        {lines}
      </Svg>
    </View>
  );
}

/**
 * The PROOF watermark (a light tint of black, drawn first so the page prints over it: no
 * transparency, which PDF/X-1a forbids) and the slug line in the top margin. Proofs only.
 */
function proofStamp(t: PageTemplate, pageW: number, pageH: number, version: number | undefined): ReactElement[] {
  const size = Math.min(96, (pageW - 2 * t.bleedMm * PT_PER_MM) / 4);
  const b = t.bleedMm * PT_PER_MM;
  return [
    <Text
      key="stamp"
      fixed
      style={{
        position: 'absolute',
        top: pageH / 2 - size / 2,
        left: 0,
        width: pageW,
        textAlign: 'center',
        fontFamily: PRINT_FONTS.sans,
        fontWeight: 700,
        fontSize: size,
        color: PROOF_TINT,
        transform: 'rotate(-30deg)',
        letterSpacing: size * 0.08,
      }}
    >
      PROOF
    </Text>,
    <Text
      key="slug"
      fixed
      style={{
        position: 'absolute',
        top: b + 1.2 * PT_PER_MM,
        left: b + t.marginsMm.left * PT_PER_MM,
        right: b + t.marginsMm.right * PT_PER_MM,
        fontFamily: PRINT_FONTS.sans,
        fontWeight: 600,
        fontSize: Math.max(t.minimums.bodyPt, 6),
        color: INK,
      }}
    >
      {`PROOF${version ? ` v${version}` : ''} \u2013 check every proof before it goes to press`}
    </Text>,
  ];
}

// ---- the document ---------------------------------------------------------------------

function puzzleBlock(ctx: Ctx, p: PuzzlePrint, colW: number): ReactElement {
  const t = ctx.t;
  const box = { widthPt: colW, maxHeightPt: t.drawing.maxHeightMm * PT_PER_MM };
  const kindLabel = p.kind === 'assembly' ? 'Assembly' : 'Deduction';
  const drawing = p.kind === 'assembly' ? assemblyDrawing(ctx, p, box) : deductionDrawing(ctx, p, box);
  const detail =
    p.kind === 'assembly'
      ? `Frame ${p.frame.W} \u00d7 ${p.frame.H}. Pieces: ${[...p.pieces].sort((a, b) => b - a).join(', ')}.${p.starters.length > 0 ? ` Starter pieces placed: ${p.starters.map((s) => s.size).join(', ')}.` : ''}`
      : `Givens: ${p.givens.map((g) => g.size).join(', ')}. Drawing not to scale.`;
  return (
    <View key={`p${p.slot}`} style={{ width: colW, marginBottom: 5 * PT_PER_MM }} wrap={false}>
      <Text style={{ fontFamily: PRINT_FONTS.sans, fontWeight: 600, fontSize: t.type.headingPt }}>{`Puzzle ${p.slot}${p.title ? `: ${p.title}` : ''}`}</Text>
      <Text style={{ fontFamily: PRINT_FONTS.sans, fontSize: t.type.captionPt, marginBottom: t.type.captionPt * 0.6 }}>{`${kindLabel} \u00b7 Grade ${p.grade}`}</Text>
      {richText(ctx, p.instructions, `i${p.slot}`, t.type.bodyPt)}
      <View style={{ marginTop: 1.5 * PT_PER_MM, marginBottom: 1.5 * PT_PER_MM }}>{drawing}</View>
      {p.kind === 'assembly' ? (
        <View style={{ marginBottom: 1.5 * PT_PER_MM }}>
          <Text style={{ fontFamily: PRINT_FONTS.sans, fontSize: t.type.captionPt }}>Pieces (half scale)</Text>
          {piecesDrawing(ctx, p, box)}
        </View>
      ) : null}
      <Text style={{ fontSize: t.type.captionPt }}>{detail}</Text>
    </View>
  );
}

function solutionBlock(ctx: Ctx, s: SolutionPrint, colW: number): ReactElement {
  const t = ctx.t;
  const box = { widthPt: colW, maxHeightPt: t.drawing.maxHeightMm * PT_PER_MM * 0.75 };
  const sizes = [...s.tiling.squares].map((q) => q.s).sort((a, b) => b - a);
  const drawing = solutionDrawing(ctx, s.tiling, box, s.kind === 'deduction');
  return (
    <View key={`s${s.slot}`} style={{ width: colW, marginBottom: 5 * PT_PER_MM }} wrap={false}>
      <Text style={{ fontFamily: PRINT_FONTS.sans, fontWeight: 600, fontSize: t.type.headingPt * 0.9 }}>{s.caption ?? `Puzzle ${s.slot}`}</Text>
      <View style={{ marginTop: 1.5 * PT_PER_MM, marginBottom: 1.5 * PT_PER_MM }}>{drawing.element}</View>
      <Text style={{ fontSize: t.type.captionPt }}>{`${s.tiling.W} \u00d7 ${s.tiling.H}: ${sizes.join(', ')}.${drawing.notToScale ? ' Drawing not to scale.' : ''}`}</Text>
      {s.steps && s.steps.length > 0 ? (
        <View style={{ marginTop: 1 * PT_PER_MM }}>
          {s.steps.map((step, i) => (
            <View key={i} style={{ flexDirection: 'row' }}>
              <Text style={{ width: t.type.captionPt * 2, fontSize: t.type.captionPt }}>{`${i + 1}.`}</Text>
              <Text style={{ flex: 1, fontSize: t.type.captionPt }}>{step}</Text>
            </View>
          ))}
        </View>
      ) : null}
    </View>
  );
}

export type LayoutOptions = { stamp: 'PROOF' | null; proofVersion?: number | undefined };

/** Lays the edition out as a @react-pdf/renderer document tree; metrics are filled in while laying out. */
export function buildEditionLayout(doc: EditionDocument, opts: LayoutOptions): { element: ReactElement; metrics: LayoutMetrics; fonts: string[]; pageSizePt: { width: number; height: number } } {
  const fonts = registerPrintFonts(Font);
  const t = doc.template;
  const g = templateGeometry(t);
  const pageW = g.pageWidthMm * PT_PER_MM;
  const pageH = g.pageHeightMm * PT_PER_MM;
  const b = t.bleedMm * PT_PER_MM;
  const colW = g.columnWidthMm * PT_PER_MM;
  const gutter = t.gutterMm * PT_PER_MM;
  const metrics: LayoutMetrics = { smallestSquareMm: null, smallestDigitPt: null, omittedLabels: [], illegibleGivens: [] };
  const ctx: Ctx = { t, metrics };
  const footerPt = t.type.captionPt * 2.2;
  const heading = `${doc.publicationTitle} \u00b7 No. ${doc.editionNumber} \u00b7 ${formatEditionDate(doc.editionDate)}`;

  const pageStyle = {
    paddingTop: b + t.marginsMm.top * PT_PER_MM,
    paddingBottom: b + t.marginsMm.bottom * PT_PER_MM + footerPt,
    paddingLeft: b + t.marginsMm.left * PT_PER_MM,
    paddingRight: b + t.marginsMm.right * PT_PER_MM,
    fontFamily: PRINT_FONTS.serif,
    fontSize: t.type.bodyPt,
    lineHeight: t.type.lineHeight,
    color: INK,
  };
  const proof = opts.stamp === 'PROOF';
  // the watermark goes first (under everything); the crop marks and the slug on top
  const watermark = proof ? proofStamp(t, pageW, pageH, opts.proofVersion)[0] : null;
  const furniture = (
    <>
      {proof ? cropMarks(t, pageW, pageH) : null}
      <Text
        fixed
        style={{
          position: 'absolute',
          top: pageH - b - t.marginsMm.bottom * PT_PER_MM * 0.5 - t.type.captionPt,
          left: b + t.marginsMm.left * PT_PER_MM,
          right: b + t.marginsMm.right * PT_PER_MM,
          fontFamily: PRINT_FONTS.sans,
          fontSize: t.type.captionPt,
          textAlign: 'center',
        }}
        render={({ pageNumber, totalPages }) => `${doc.publicationTitle} No. ${doc.editionNumber} \u00b7 Page ${pageNumber} of ${totalPages}`}
      />
      {proof ? proofStamp(t, pageW, pageH, opts.proofVersion)[1] : null}
    </>
  );
  // Blocks go into rows of `columns`, each row kept whole on one page (react-pdf's own
  // pagination of wrapped flex rows is unreliable).
  const rows = (items: ReactElement[], key: string) => {
    const out: ReactElement[] = [];
    for (let i = 0; i < items.length; i += t.columns) {
      out.push(
        <View key={`${key}${i}`} style={{ flexDirection: 'row', columnGap: gutter }} wrap={false}>
          {items.slice(i, i + t.columns)}
        </View>,
      );
    }
    return out;
  };

  const element = (
    <Document title={`${doc.publicationTitle} No. ${doc.editionNumber}`} author="Squarewright" creator="Squarewright" producer="Squarewright" language="en">
      <Page size={[pageW, pageH]} style={pageStyle} wrap>
        {watermark}
        <Text style={{ fontFamily: PRINT_FONTS.sans, fontWeight: 700, fontSize: t.type.titlePt, lineHeight: 1.1 }}>{doc.publicationTitle}</Text>
        <Text style={{ fontFamily: PRINT_FONTS.sans, fontSize: t.type.captionPt + 1, marginBottom: 4 * PT_PER_MM }}>{heading.slice(doc.publicationTitle.length + 3)}</Text>
        {richText(ctx, doc.introduction, 'intro', t.type.bodyPt)}
        <View style={{ marginTop: 3 * PT_PER_MM }}>{rows(doc.puzzles.map((p) => puzzleBlock(ctx, p, colW)), 'pr')}</View>
        {furniture}
      </Page>
      {doc.solutions.length > 0 ? (
        <Page size={[pageW, pageH]} style={pageStyle} wrap>
          {watermark}
          <Text style={{ fontFamily: PRINT_FONTS.sans, fontWeight: 700, fontSize: t.type.headingPt * 1.3, marginBottom: 3 * PT_PER_MM }}>Solutions</Text>
          <View>{rows(doc.solutions.map((s) => solutionBlock(ctx, s, colW)), 'sr')}</View>
          {furniture}
        </Page>
      ) : null}
    </Document>
  );
  return { element, metrics, fonts, pageSizePt: { width: pageW, height: pageH } };
}

// ---- one drawing alone (layout package) ----------------------------------------------------

/** One drawing of the package: its parts (each a drawing of the layout above) stacked on a page cut to them. */
export type Graphic = { element: ReactElement; parts: { svg: ReactElement; y: number }[]; widthPt: number; heightPt: number; metrics: LayoutMetrics; fonts: string[] };

const svgSize = (e: ReactElement) => {
  const p = e.props as { width?: number; height?: number };
  return { w: Number(p.width ?? 0), h: Number(p.height ?? 0) };
};

/**
 * A puzzle's drawing (Assembly: the frame, then the loose pieces at half scale) or its
 * solution's, as the edition prints it at the template's column width, type and line
 * settings, alone on a page cut to it: the layout package's placeable graphic.
 */
export function buildGraphic(t: PageTemplate, what: { puzzle: PuzzlePrint } | { solution: SolutionPrint }, title: string): Graphic {
  const fonts = registerPrintFonts(Font);
  const metrics: LayoutMetrics = { smallestSquareMm: null, smallestDigitPt: null, omittedLabels: [], illegibleGivens: [] };
  const ctx: Ctx = { t, metrics };
  const colW = templateGeometry(t).columnWidthMm * PT_PER_MM;
  let svgs: ReactElement[];
  if ('puzzle' in what) {
    const p = what.puzzle;
    const box = { widthPt: colW, maxHeightPt: t.drawing.maxHeightMm * PT_PER_MM };
    svgs = p.kind === 'assembly' ? [assemblyDrawing(ctx, p, box), piecesDrawing(ctx, p, box)] : [deductionDrawing(ctx, p, box)];
  } else {
    const s = what.solution;
    const box = { widthPt: colW, maxHeightPt: t.drawing.maxHeightMm * PT_PER_MM * 0.75 };
    svgs = [solutionDrawing(ctx, s.tiling, box, s.kind === 'deduction').element];
  }
  const gap = 3 * PT_PER_MM;
  const parts: Graphic['parts'] = [];
  let y = 0;
  let widthPt = 0;
  for (const svg of svgs) {
    const { w, h } = svgSize(svg);
    parts.push({ svg, y });
    y += h + gap;
    widthPt = Math.max(widthPt, w);
  }
  const heightPt = y - gap;
  const element = (
    <Document title={title} author="Squarewright" creator="Squarewright" producer="Squarewright" language="en">
      <Page size={[widthPt, heightPt]} style={{ padding: 0, fontFamily: PRINT_FONTS.sans, color: INK }}>
        {/* react-pdf loads a face only for the page's own text, not for the drawing's labels:
            a space in each face the labels use has it loaded (the edition's headings do this there) */}
        {[400, 600].map((w) => (
          <Text key={`f${w}`} style={{ position: 'absolute', left: 0, top: 0, fontFamily: PRINT_FONTS.sans, fontWeight: w, fontSize: t.type.digitsPt }}>
            {' '}
          </Text>
        ))}
        {parts.map((p, i) => (
          <View key={`g${i}`} style={{ position: 'absolute', left: 0, top: p.y }}>
            {p.svg}
          </View>
        ))}
      </Page>
    </Document>
  );
  return { element, parts, widthPt, heightPt, metrics, fonts };
}
