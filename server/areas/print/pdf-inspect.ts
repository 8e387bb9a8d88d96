import {
  decodePDFRawStream,
  PDFArray,
  PDFDict,
  PDFDocument,
  PDFHexString,
  PDFName,
  PDFNumber,
  PDFRawStream,
  PDFRef,
  PDFStream,
  PDFString,
  type PDFObject,
} from 'pdf-lib';
import { contentText, IDENTITY, multiply, num, parseContent, scaleAlong, type Matrix } from './pdf-content';

// Reads a finished PDF the way a plant's preflight does: the document's PDF/X
// identification, metadata and output intent, and per page its boxes, the colour spaces
// and colours its content paints with, its fonts, the smallest type size and the thinnest
// stroked line (each in points on the page, through every transformation). The preflight
// (preflight.ts) turns these facts into verdicts; the tests check the facts against
// poppler, qpdf and Ghostscript.

export type Box = [number, number, number, number];

export type FontFact = { name: string; subtype: string; embedded: boolean };

export type PageFacts = {
  page: number;
  boxes: { media: Box | null; crop: Box | null; bleed: Box | null; trim: Box | null; art: Box | null };
  /** colour spaces painted with (DeviceCMYK, DeviceGray, DeviceRGB, ICCBased, Separation, ...) */
  colourSpaces: string[];
  fonts: FontFact[];
  smallestTypePt: number | null;
  thinnestLinePt: number | null;
  /** text shown or lines stroked in a colour that is not black-plate only (C = M = Y = 0) */
  offBlackPlate: { what: 'text' | 'line'; colour: string }[];
  /** graphics states with transparency (CA/ca below 1, a soft mask, a blend mode other than Normal) */
  transparency: string[];
};

export type DocumentFacts = {
  pdfVersion: string;
  pages: PageFacts[];
  info: Record<string, string>;
  xmp: string | null;
  /** the first two entries of the trailer's ID, as hex */
  id: string[] | null;
  outputIntents: { subtype: string; identifier: string | null; condition: string | null; registry: string | null; info: string | null; profileBytes: number | null; profileComponents: number | null }[];
  encrypted: boolean;
};

function look(doc: PDFDocument, o: PDFObject | undefined): PDFObject | undefined {
  return o instanceof PDFRef ? doc.context.lookup(o) : o;
}

function dictOf(doc: PDFDocument, o: PDFObject | undefined): PDFDict | undefined {
  const v = look(doc, o);
  if (v instanceof PDFDict) return v;
  if (v instanceof PDFStream) return v.dict;
  return undefined;
}

function textOf(o: PDFObject | undefined): string | null {
  if (o instanceof PDFString || o instanceof PDFHexString) return o.decodeText();
  if (o instanceof PDFName) return o.decodeText();
  if (o instanceof PDFNumber) return String(o.asNumber());
  return null;
}

function boxOf(doc: PDFDocument, o: PDFObject | undefined): Box | null {
  const v = look(doc, o);
  if (!(v instanceof PDFArray) || v.size() !== 4) return null;
  const n = v.asArray().map((x) => look(doc, x));
  if (!n.every((x) => x instanceof PDFNumber)) return null;
  const [a, b, c, d] = n.map((x) => (x as PDFNumber).asNumber()) as [number, number, number, number];
  return [Math.min(a, c), Math.min(b, d), Math.max(a, c), Math.max(b, d)];
}

function bytesOf(stream: PDFStream): Uint8Array {
  return stream instanceof PDFRawStream ? decodePDFRawStream(stream).decode() : stream.getContents();
}

function inherited(doc: PDFDocument, node: PDFDict, key: string): PDFObject | undefined {
  let d: PDFDict | undefined = node;
  for (let i = 0; d && i < 64; i++) {
    const v = d.get(PDFName.of(key));
    if (v !== undefined) return v;
    d = dictOf(doc, d.get(PDFName.of('Parent')));
  }
  return undefined;
}

function fontFacts(doc: PDFDocument, res: PDFDict | undefined): FontFact[] {
  const fonts = dictOf(doc, res?.get(PDFName.of('Font')));
  if (!fonts) return [];
  const out: FontFact[] = [];
  for (const [, ref] of fonts.entries()) {
    const font = dictOf(doc, ref);
    if (!font) continue;
    const subtype = textOf(font.get(PDFName.of('Subtype'))) ?? '?';
    const name = textOf(font.get(PDFName.of('BaseFont'))) ?? '?';
    let descriptorHolder: PDFDict | undefined = font;
    if (subtype === 'Type0') {
      const desc = look(doc, font.get(PDFName.of('DescendantFonts')));
      descriptorHolder = desc instanceof PDFArray ? dictOf(doc, desc.get(0)) : undefined;
    }
    const fd = dictOf(doc, descriptorHolder?.get(PDFName.of('FontDescriptor')));
    const embedded = subtype === 'Type3' || (fd !== undefined && ['FontFile', 'FontFile2', 'FontFile3'].some((k) => fd.get(PDFName.of(k)) !== undefined));
    out.push({ name, subtype, embedded });
  }
  return out;
}

type Colour = { space: string; comps: number[] };
type GState = { ctm: Matrix; lineWidth: number; fill: Colour; stroke: Colour; font: string | null; fontSize: number; tm: Matrix; tlm: Matrix; render: number };

const initialColour = (space: string): Colour => ({ space, comps: space === 'DeviceCMYK' ? [0, 0, 0, 1] : space === 'DeviceRGB' ? [0, 0, 0] : [0] });

function colourText(c: Colour): string {
  return `${c.space}(${c.comps.map((v) => Math.round(v * 1000) / 1000).join(' ')})`;
}

/** Black plate only: CMYK with C = M = Y = 0, or grey (which prints on K). */
export function onBlackPlateOnly(c: { space: string; comps: number[] }): boolean {
  if (c.space === 'DeviceGray') return true;
  if (c.space === 'DeviceCMYK') return c.comps[0] === 0 && c.comps[1] === 0 && c.comps[2] === 0;
  return false;
}

function colourSpaceName(doc: PDFDocument, res: PDFDict | undefined, name: string): string {
  if (['DeviceRGB', 'DeviceCMYK', 'DeviceGray', 'Pattern'].includes(name)) return name;
  const cs = look(doc, dictOf(doc, res?.get(PDFName.of('ColorSpace')))?.get(PDFName.of(name)));
  if (cs instanceof PDFName) return cs.decodeText();
  if (cs instanceof PDFArray) return textOf(look(doc, cs.get(0))) ?? name;
  return name;
}

type Walk = { spaces: Set<string>; fonts: FontFact[]; minType: number | null; minLine: number | null; off: PageFacts['offBlackPlate']; transparency: Set<string> };

function walkContent(doc: PDFDocument, text: string, res: PDFDict | undefined, start: Matrix, w: Walk, depth: number): void {
  if (depth > 8) return;
  let g: GState = { ctm: start, lineWidth: 1, fill: initialColour('DeviceGray'), stroke: initialColour('DeviceGray'), font: null, fontSize: 0, tm: IDENTITY, tlm: IDENTITY, render: 0 };
  const stack: GState[] = [];
  let pathOpen = false;
  const noteColour = (c: Colour) => w.spaces.add(c.space);
  const showText = () => {
    if (g.render === 3 || g.render === 7) return;
    // the text's size on the page: the font size through the text and current matrices, vertically
    const m = multiply(g.tm, g.ctm);
    const size = g.fontSize * scaleAlong(m, 0, 1);
    if (size > 0 && (w.minType === null || size < w.minType)) w.minType = size;
    const filled = g.render === 0 || g.render === 2 || g.render === 4 || g.render === 6;
    const stroked = g.render === 1 || g.render === 2 || g.render === 5 || g.render === 6;
    if (filled) {
      noteColour(g.fill);
      if (!onBlackPlateOnly(g.fill)) w.off.push({ what: 'text', colour: colourText(g.fill) });
    }
    if (stroked) {
      noteColour(g.stroke);
      if (!onBlackPlateOnly(g.stroke)) w.off.push({ what: 'text', colour: colourText(g.stroke) });
    }
  };
  const stroke = () => {
    // the thinner of the two axes' scales: what the line is at its narrowest on the page
    const width = g.lineWidth * Math.min(scaleAlong(g.ctm, 1, 0), scaleAlong(g.ctm, 0, 1));
    if (w.minLine === null || width < w.minLine) w.minLine = width;
    noteColour(g.stroke);
    if (!onBlackPlateOnly(g.stroke)) w.off.push({ what: 'line', colour: colourText(g.stroke) });
  };
  for (const op of parseContent(text)) {
    const o = op.operands;
    switch (op.op) {
      case 'q':
        stack.push({ ...g });
        break;
      case 'Q':
        g = stack.pop() ?? g;
        break;
      case 'cm':
        g.ctm = multiply([num(o[0]), num(o[1]), num(o[2]), num(o[3]), num(o[4]), num(o[5])], g.ctm);
        break;
      case 'w':
        g.lineWidth = num(o[0]);
        break;
      case 'cs':
      case 'CS': {
        const n = o[0];
        const space = n && n.t === 'name' ? colourSpaceName(doc, res, n.v) : '?';
        if (op.op === 'cs') g.fill = initialColour(space);
        else g.stroke = initialColour(space);
        break;
      }
      case 'sc':
      case 'scn':
      case 'SC':
      case 'SCN': {
        const comps = o.filter((x) => x.t === 'num').map((x) => (x.t === 'num' ? x.v : 0));
        if (op.op === 'sc' || op.op === 'scn') g.fill = { space: g.fill.space, comps };
        else g.stroke = { space: g.stroke.space, comps };
        break;
      }
      case 'g':
        g.fill = { space: 'DeviceGray', comps: [num(o[0])] };
        break;
      case 'G':
        g.stroke = { space: 'DeviceGray', comps: [num(o[0])] };
        break;
      case 'rg':
        g.fill = { space: 'DeviceRGB', comps: [num(o[0]), num(o[1]), num(o[2])] };
        break;
      case 'RG':
        g.stroke = { space: 'DeviceRGB', comps: [num(o[0]), num(o[1]), num(o[2])] };
        break;
      case 'k':
        g.fill = { space: 'DeviceCMYK', comps: [num(o[0]), num(o[1]), num(o[2]), num(o[3])] };
        break;
      case 'K':
        g.stroke = { space: 'DeviceCMYK', comps: [num(o[0]), num(o[1]), num(o[2]), num(o[3])] };
        break;
      case 'gs': {
        const n = o[0];
        if (n && n.t === 'name') {
          const gs = dictOf(doc, dictOf(doc, res?.get(PDFName.of('ExtGState')))?.get(PDFName.of(n.v)));
          if (gs) {
            const lw = look(doc, gs.get(PDFName.of('LW')));
            if (lw instanceof PDFNumber) g.lineWidth = lw.asNumber();
            const alpha = ['CA', 'ca'].map((k) => look(doc, gs.get(PDFName.of(k)))).map((v) => (v instanceof PDFNumber ? v.asNumber() : 1));
            const smask = look(doc, gs.get(PDFName.of('SMask')));
            const bm = textOf(look(doc, gs.get(PDFName.of('BM'))));
            if (alpha.some((a) => a < 1) || (smask !== undefined && textOf(smask) !== 'None') || (bm !== null && bm !== 'Normal' && bm !== 'Compatible')) w.transparency.add(n.v);
          }
        }
        break;
      }
      case 'BT':
        g.tm = IDENTITY;
        g.tlm = IDENTITY;
        break;
      case 'Tf': {
        const n = o[0];
        g.font = n && n.t === 'name' ? n.v : null;
        g.fontSize = num(o[1]);
        break;
      }
      case 'Tr':
        g.render = num(o[0]);
        break;
      case 'Tm':
        g.tm = [num(o[0]), num(o[1]), num(o[2]), num(o[3]), num(o[4]), num(o[5])];
        g.tlm = g.tm;
        break;
      case 'Td':
      case 'TD':
        g.tlm = multiply([1, 0, 0, 1, num(o[0]), num(o[1])], g.tlm);
        g.tm = g.tlm;
        break;
      case 'Tj':
      case 'TJ':
      case "'":
      case '"':
        showText();
        break;
      case 'm':
      case 'l':
      case 'c':
      case 'v':
      case 'y':
      case 'h':
      case 're':
        pathOpen = true;
        break;
      case 'S':
      case 's':
        if (pathOpen) stroke();
        pathOpen = false;
        break;
      case 'B':
      case 'B*':
      case 'b':
      case 'b*':
        if (pathOpen) {
          stroke();
          noteColour(g.fill);
        }
        pathOpen = false;
        break;
      case 'f':
      case 'F':
      case 'f*':
        if (pathOpen) noteColour(g.fill);
        pathOpen = false;
        break;
      case 'n':
        pathOpen = false;
        break;
      case 'sh': {
        const n = o[0];
        const sh = n && n.t === 'name' ? dictOf(doc, dictOf(doc, res?.get(PDFName.of('Shading')))?.get(PDFName.of(n.v))) : undefined;
        const cs = look(doc, sh?.get(PDFName.of('ColorSpace')));
        w.spaces.add(cs instanceof PDFName ? cs.decodeText() : cs instanceof PDFArray ? (textOf(look(doc, cs.get(0))) ?? '?') : '?');
        break;
      }
      case 'BI':
        w.spaces.add('inline image');
        break;
      case 'Do': {
        const n = o[0];
        if (!n || n.t !== 'name') break;
        const xo = look(doc, dictOf(doc, res?.get(PDFName.of('XObject')))?.get(PDFName.of(n.v)));
        if (!(xo instanceof PDFStream)) break;
        const sub = textOf(xo.dict.get(PDFName.of('Subtype')));
        if (sub === 'Image') {
          const cs = look(doc, xo.dict.get(PDFName.of('ColorSpace')));
          w.spaces.add(cs instanceof PDFName ? cs.decodeText() : cs instanceof PDFArray ? (textOf(look(doc, cs.get(0))) ?? '?') : 'image mask');
        } else if (sub === 'Form') {
          const mo = look(doc, xo.dict.get(PDFName.of('Matrix')));
          const m: Matrix = mo instanceof PDFArray && mo.size() === 6 ? (mo.asArray().map((x) => (look(doc, x) as PDFNumber).asNumber()) as Matrix) : IDENTITY;
          const formRes = dictOf(doc, xo.dict.get(PDFName.of('Resources'))) ?? res;
          w.fonts.push(...fontFacts(doc, formRes));
          walkContent(doc, contentText(bytesOf(xo)), formRes, multiply(m, g.ctm), w, depth + 1);
        }
        break;
      }
      default:
        break;
    }
  }
}

/** Everything the preflight needs to know about a PDF, read from its bytes. */
export async function inspectPdf(pdf: Uint8Array): Promise<DocumentFacts> {
  const header = /^%PDF-(\d\.\d)/.exec(Buffer.from(pdf.subarray(0, 16)).toString('latin1'));
  const doc = await PDFDocument.load(pdf, { updateMetadata: false, ignoreEncryption: true });
  const trailer = doc.context.trailerInfo;
  const info: Record<string, string> = {};
  const infoDict = dictOf(doc, trailer.Info);
  if (infoDict) for (const [k, v] of infoDict.entries()) info[k.decodeText()] = textOf(look(doc, v)) ?? '';
  const metaStream = look(doc, doc.catalog.get(PDFName.of('Metadata')));
  const xmp = metaStream instanceof PDFStream ? Buffer.from(bytesOf(metaStream)).toString('utf8') : null;
  const idArr = look(doc, trailer.ID);
  const id = idArr instanceof PDFArray ? idArr.asArray().map((x) => (x instanceof PDFHexString ? x.asString() : x instanceof PDFString ? Buffer.from(x.asString(), 'latin1').toString('hex') : '')) : null;
  const intentsArr = look(doc, doc.catalog.get(PDFName.of('OutputIntents')));
  const outputIntents: DocumentFacts['outputIntents'] = [];
  if (intentsArr instanceof PDFArray) {
    for (const x of intentsArr.asArray()) {
      const d = dictOf(doc, x);
      if (!d) continue;
      const prof = look(doc, d.get(PDFName.of('DestOutputProfile')));
      const n = prof instanceof PDFStream ? look(doc, prof.dict.get(PDFName.of('N'))) : undefined;
      outputIntents.push({
        subtype: textOf(d.get(PDFName.of('S'))) ?? '',
        identifier: textOf(look(doc, d.get(PDFName.of('OutputConditionIdentifier')))),
        condition: textOf(look(doc, d.get(PDFName.of('OutputCondition')))),
        registry: textOf(look(doc, d.get(PDFName.of('RegistryName')))),
        info: textOf(look(doc, d.get(PDFName.of('Info')))),
        profileBytes: prof instanceof PDFStream ? bytesOf(prof).length : null,
        profileComponents: n instanceof PDFNumber ? n.asNumber() : null,
      });
    }
  }
  const pages: PageFacts[] = doc.getPages().map((page, i) => {
    const node = page.node;
    const res = dictOf(doc, inherited(doc, node, 'Resources'));
    const w: Walk = { spaces: new Set(), fonts: fontFacts(doc, res), minType: null, minLine: null, off: [], transparency: new Set() };
    const contents = look(doc, node.get(PDFName.of('Contents')));
    const streams = contents instanceof PDFArray ? contents.asArray().map((x) => look(doc, x)) : [contents];
    const text = streams
      .filter((s): s is PDFStream => s instanceof PDFStream)
      .map((s) => contentText(bytesOf(s)))
      .join('\n');
    walkContent(doc, text, res, IDENTITY, w, 0);
    const group = dictOf(doc, node.get(PDFName.of('Group')));
    if (group && textOf(group.get(PDFName.of('S'))) === 'Transparency') w.transparency.add('page transparency group');
    const seen = new Set<string>();
    return {
      page: i + 1,
      boxes: {
        media: boxOf(doc, inherited(doc, node, 'MediaBox')),
        crop: boxOf(doc, inherited(doc, node, 'CropBox')),
        bleed: boxOf(doc, node.get(PDFName.of('BleedBox'))),
        trim: boxOf(doc, node.get(PDFName.of('TrimBox'))),
        art: boxOf(doc, node.get(PDFName.of('ArtBox'))),
      },
      colourSpaces: [...w.spaces].sort(),
      fonts: w.fonts.filter((f) => (seen.has(f.name) ? false : (seen.add(f.name), true))),
      smallestTypePt: w.minType === null ? null : Math.round(w.minType * 1000) / 1000,
      thinnestLinePt: w.minLine === null ? null : Math.round(w.minLine * 1000) / 1000,
      offBlackPlate: w.off,
      transparency: [...w.transparency],
    };
  });
  return { pdfVersion: header?.[1] ?? '?', pages, info, xmp, id, outputIntents, encrypted: trailer.Encrypt !== undefined };
}
