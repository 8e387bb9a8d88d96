import { createHash } from 'node:crypto';
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
} from 'pdf-lib';
import { OUTPUT_CONDITION_REGISTRY, outputConditions, pressStandardInfo, type PressSettings } from '../../../shared/contracts/press';
import { contentText, parseContent, type ContentOp } from './pdf-content';
import { pressColourOf, pressGreyOf, type Cmyk } from './palette';

// The press post-processing: @react-pdf/renderer writes device RGB, one box and no PDF/X
// identification; this turns its file into PDF/X (ISO 15930-4 PDF/X-1a:2003 or ISO 15930-7
// PDF/X-4) with pdf-lib: colour operators rewritten to DeviceCMYK from the print palette
// (our ink on the black plate only), no transparency, MediaBox = BleedBox = trim + bleed,
// TrimBox = the finished page, Info and XMP metadata (title, dates, producer,
// GTS_PDFXVersion, Trapped), a document ID, and the output intent naming the characterized
// output condition (with the plant's ICC profile embedded for PDF/X-4).

export const PT_PER_MM = 72 / 25.4;
export const PRODUCER = 'Squarewright (press files by @react-pdf/renderer and pdf-lib)';

export type PdfxOptions = {
  press: PressSettings;
  /** the finished page in points, and the bleed on every side in points */
  trimPt: { width: number; height: number };
  bleedPt: number;
  title: string;
  createdAt: Date;
  /** the output profile for PDF/X-4 (ICC bytes) */
  profile?: { bytes: Uint8Array; description: string } | undefined;
};

const f = (v: number) => String(Math.round(v * 10000) / 10000);
const cmykText = (c: Cmyk) => c.map(f).join(' ');

type Space = 'rgb' | 'cmyk' | 'gray' | 'other';

function spaceOfName(name: string): Space {
  if (name === 'DeviceRGB') return 'rgb';
  if (name === 'DeviceCMYK') return 'cmyk';
  if (name === 'DeviceGray') return 'gray';
  return 'other';
}

const PATH_OPS = new Set(['m', 'l', 'c', 'v', 'y', 'h', 're']);
const PAINT_OPS = new Set(['S', 's', 'f', 'F', 'f*', 'B', 'B*', 'b', 'b*', 'n']);

/**
 * Rewrites one content stream: RGB and grey colour operators become DeviceCMYK from the
 * palette; `gs` of a transparent graphics state is dropped when nothing is painted under
 * it (the renderer writes an empty `f` so), and is an error otherwise.
 */
export function rewriteContent(text: string, transparentStates: Set<string>): string {
  const ops = parseContent(text);
  const out: string[] = [];
  let last = 0;
  let fill: Space = 'gray';
  let stroke: Space = 'gray';
  let pathOpen = false;
  let dropNextEmptyPaint = false;
  const stack: { fill: Space; stroke: Space }[] = [];
  const emit = (op: ContentOp, text2: string | null) => {
    out.push(text.slice(last, op.start));
    if (text2 !== null) out.push(text2);
    last = op.end;
  };
  const comps = (op: ContentOp) => op.operands.map((o) => (o.t === 'num' ? o.v : NaN));
  for (const op of ops) {
    const keep = () => emit(op, text.slice(op.start, op.end));
    switch (op.op) {
      case 'q':
        stack.push({ fill, stroke });
        keep();
        break;
      case 'Q': {
        const s = stack.pop();
        if (s) ({ fill, stroke } = s);
        keep();
        break;
      }
      case 'cs':
      case 'CS': {
        const n = op.operands[0];
        const space = n && n.t === 'name' ? spaceOfName(n.v) : 'other';
        if (space === 'other') throw new Error(`print: colour space ${n?.raw ?? '?'} in a content stream: only device colours are expected from the layout`);
        if (op.op === 'cs') fill = space;
        else stroke = space;
        emit(op, space === 'cmyk' ? text.slice(op.start, op.end) : `/DeviceCMYK ${op.op}`);
        break;
      }
      case 'sc':
      case 'scn':
      case 'SC':
      case 'SCN': {
        const space = op.op === 'sc' || op.op === 'scn' ? fill : stroke;
        const v = comps(op);
        const cmyk = space === 'rgb' ? pressColourOf(v[0]!, v[1]!, v[2]!) : space === 'gray' ? pressGreyOf(v[0]!) : null;
        emit(op, cmyk ? `${cmykText(cmyk)} ${op.op}` : text.slice(op.start, op.end));
        break;
      }
      case 'rg':
      case 'RG': {
        const v = comps(op);
        if (op.op === 'rg') fill = 'cmyk';
        else stroke = 'cmyk';
        emit(op, `${cmykText(pressColourOf(v[0]!, v[1]!, v[2]!))} ${op.op === 'rg' ? 'k' : 'K'}`);
        break;
      }
      case 'g':
      case 'G': {
        const v = comps(op);
        if (op.op === 'g') fill = 'cmyk';
        else stroke = 'cmyk';
        emit(op, `${cmykText(pressGreyOf(v[0]!))} ${op.op === 'g' ? 'k' : 'K'}`);
        break;
      }
      case 'k':
        fill = 'cmyk';
        keep();
        break;
      case 'K':
        stroke = 'cmyk';
        keep();
        break;
      case 'gs': {
        const n = op.operands[0];
        if (n && n.t === 'name' && transparentStates.has(n.v)) {
          dropNextEmptyPaint = true;
          emit(op, null);
        } else keep();
        break;
      }
      case 'BI':
        throw new Error('print: an inline image in a content stream; the layout draws no images');
      default:
        if (PATH_OPS.has(op.op)) {
          pathOpen = true;
          keep();
        } else if (PAINT_OPS.has(op.op)) {
          if (dropNextEmptyPaint) {
            if (pathOpen) throw new Error('print: something is painted with transparency; PDF/X-1a allows none (drop the opacity in the layout)');
            emit(op, null);
          } else keep();
          pathOpen = false;
        } else if (op.op === 'Tj' || op.op === 'TJ' || op.op === "'" || op.op === '"') {
          if (dropNextEmptyPaint) throw new Error('print: text is shown with transparency; PDF/X-1a allows none (drop the opacity in the layout)');
          keep();
        } else keep();
    }
    if (op.op === 'Q') dropNextEmptyPaint = false;
  }
  out.push(text.slice(last));
  return out.join('');
}

function asDict(doc: PDFDocument, o: unknown): PDFDict | undefined {
  const v = o instanceof PDFRef ? doc.context.lookup(o) : o;
  return v instanceof PDFDict ? v : undefined;
}

function streamBytes(stream: PDFStream): Uint8Array {
  if (stream instanceof PDFRawStream) return decodePDFRawStream(stream).decode();
  return stream.getContents();
}

const pdfDate = (d: Date) => {
  const p = (n: number) => String(n).padStart(2, '0');
  return `D:${d.getUTCFullYear()}${p(d.getUTCMonth() + 1)}${p(d.getUTCDate())}${p(d.getUTCHours())}${p(d.getUTCMinutes())}${p(d.getUTCSeconds())}+00'00'`;
};
const xmpDate = (d: Date) => `${d.toISOString().slice(0, 19)}+00:00`;
const xmlText = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

function uuidOf(hex: string): string {
  return `uuid:${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20, 32)}`;
}

export function xmpPacket(o: { title: string; createdAt: Date; gtsVersion: string; documentId: string; standard: PressSettings['standard'] }): string {
  const d = xmpDate(o.createdAt);
  return `<?xpacket begin="\uFEFF" id="W5M0MpCehiHzreSzNTczkc9d"?>
<x:xmpmeta xmlns:x="adobe:ns:meta/">
 <rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#">
  <rdf:Description rdf:about=""
    xmlns:dc="http://purl.org/dc/elements/1.1/"
    xmlns:xmp="http://ns.adobe.com/xap/1.0/"
    xmlns:pdf="http://ns.adobe.com/pdf/1.3/"
    xmlns:xmpMM="http://ns.adobe.com/xap/1.0/mm/"
    xmlns:pdfx="http://ns.adobe.com/pdfx/1.3/"
    xmlns:pdfxid="http://www.npes.org/pdfx/ns/id/">
   <dc:format>application/pdf</dc:format>
   <dc:title><rdf:Alt><rdf:li xml:lang="x-default">${xmlText(o.title)}</rdf:li></rdf:Alt></dc:title>
   <dc:creator><rdf:Seq><rdf:li>Squarewright</rdf:li></rdf:Seq></dc:creator>
   <xmp:CreateDate>${d}</xmp:CreateDate>
   <xmp:ModifyDate>${d}</xmp:ModifyDate>
   <xmp:MetadataDate>${d}</xmp:MetadataDate>
   <xmp:CreatorTool>Squarewright</xmp:CreatorTool>
   <pdf:Producer>${xmlText(PRODUCER)}</pdf:Producer>
   <pdf:Trapped>False</pdf:Trapped>
   <xmpMM:DocumentID>${o.documentId}</xmpMM:DocumentID>
   <xmpMM:InstanceID>${o.documentId}</xmpMM:InstanceID>
   <xmpMM:VersionID>1</xmpMM:VersionID>
   <xmpMM:RenditionClass>default</xmpMM:RenditionClass>
   <pdfx:GTS_PDFXVersion>${o.gtsVersion}</pdfx:GTS_PDFXVersion>
   <pdfxid:GTS_PDFXVersion>${o.gtsVersion}</pdfxid:GTS_PDFXVersion>
  </rdf:Description>
 </rdf:RDF>
</x:xmpmeta>
<?xpacket end="w"?>`;
}

/** Turns the renderer's PDF into a PDF/X press file as the spec says (see the head of this file). */
export async function toPdfX(input: Uint8Array, o: PdfxOptions): Promise<Buffer> {
  const std = pressStandardInfo[o.press.standard];
  if (std.needsProfile && !o.profile) throw new Error(`print: ${std.gtsVersion} needs the output profile (ICC) of the plant; none was given`);
  const doc = await PDFDocument.load(input, { updateMetadata: false });
  const ctx = doc.context;
  const W = o.trimPt.width + 2 * o.bleedPt;
  const H = o.trimPt.height + 2 * o.bleedPt;
  const rect = (x0: number, y0: number, x1: number, y1: number) => ctx.obj([x0, y0, x1, y1].map((v) => Math.round(v * 1000) / 1000));

  for (const page of doc.getPages()) {
    const node = page.node;
    const res = asDict(doc, node.Resources());
    // transparent graphics states (PDF/X-1a: CA and ca must be 1, no soft mask)
    const transparent = new Set<string>();
    const gsDict = res ? asDict(doc, res.get(PDFName.of('ExtGState'))) : undefined;
    if (gsDict) {
      for (const [name, ref] of gsDict.entries()) {
        const gs = asDict(doc, ref);
        if (!gs) continue;
        const alpha = [gs.get(PDFName.of('CA')), gs.get(PDFName.of('ca'))].map((v) => (v instanceof PDFNumber ? v.asNumber() : 1));
        const smask = gs.get(PDFName.of('SMask'));
        if (alpha.some((a) => a < 1) || (smask !== undefined && !(smask instanceof PDFName && smask.asString() === '/None'))) transparent.add(name.decodeText());
      }
    }
    const contents = node.Contents();
    const refs: PDFRef[] = [];
    const raw = node.get(PDFName.of('Contents'));
    if (raw instanceof PDFRef) {
      const v = ctx.lookup(raw);
      if (v instanceof PDFArray) refs.push(...v.asArray().filter((x): x is PDFRef => x instanceof PDFRef));
      else refs.push(raw);
    } else if (raw instanceof PDFArray) refs.push(...raw.asArray().filter((x): x is PDFRef => x instanceof PDFRef));
    if (!contents || refs.length === 0) throw new Error('print: a page without content streams');
    // the streams of one page form one content (PDF 32000-1, 7.8.2): rewrite them as one
    const text = refs.map((r) => contentText(streamBytes(ctx.lookup(r, PDFStream)))).join('\n');
    const rewritten = rewriteContent(text, transparent);
    const stream = ctx.flateStream(Buffer.from(rewritten, 'latin1'));
    node.set(PDFName.of('Contents'), ctx.register(stream));
    if (gsDict) for (const name of transparent) gsDict.delete(PDFName.of(name));
    node.delete(PDFName.of('Group'));

    node.set(PDFName.of('MediaBox'), rect(0, 0, W, H));
    node.set(PDFName.of('BleedBox'), rect(0, 0, W, H));
    node.set(PDFName.of('TrimBox'), rect(o.bleedPt, o.bleedPt, W - o.bleedPt, H - o.bleedPt));
    node.delete(PDFName.of('CropBox'));
    node.delete(PDFName.of('ArtBox'));
  }

  // Info and XMP say the same (ISO 15930-7, 6.7.2): title, dates, producer, Trapped, version.
  const seed = createHash('sha256').update(input).update(o.title).update(o.createdAt.toISOString()).digest('hex');
  const documentId = uuidOf(seed);
  doc.setTitle(o.title);
  doc.setAuthor('Squarewright');
  doc.setCreator('Squarewright');
  doc.setProducer(PRODUCER);
  doc.setCreationDate(o.createdAt);
  doc.setModificationDate(o.createdAt);
  const info = ctx.lookup(ctx.trailerInfo.Info, PDFDict);
  info.set(PDFName.of('CreationDate'), PDFString.of(pdfDate(o.createdAt)));
  info.set(PDFName.of('ModDate'), PDFString.of(pdfDate(o.createdAt)));
  info.set(PDFName.of('Trapped'), PDFName.of('False'));
  info.set(PDFName.of('GTS_PDFXVersion'), PDFString.of(std.gtsVersion));
  info.delete(PDFName.of('Keywords'));
  info.delete(PDFName.of('Subject'));

  const xmp = ctx.stream(xmpPacket({ title: o.title, createdAt: o.createdAt, gtsVersion: std.gtsVersion, documentId, standard: o.press.standard }), {
    Type: 'Metadata',
    Subtype: 'XML',
  });
  doc.catalog.set(PDFName.of('Metadata'), ctx.register(xmp));

  const intent = ctx.obj({
    Type: 'OutputIntent',
    S: 'GTS_PDFX',
    OutputConditionIdentifier: PDFString.of(o.press.condition),
    OutputCondition: PDFString.of(outputConditions[o.press.condition]),
    RegistryName: PDFString.of(OUTPUT_CONDITION_REGISTRY),
    Info: PDFString.of(o.profile ? o.profile.description : outputConditions[o.press.condition]),
  });
  if (std.needsProfile && o.profile) {
    const icc = ctx.flateStream(o.profile.bytes, { N: 4 });
    intent.set(PDFName.of('DestOutputProfile'), ctx.register(icc));
  }
  doc.catalog.set(PDFName.of('OutputIntents'), ctx.obj([ctx.register(intent)]));
  doc.catalog.delete(PDFName.of('Lang'));
  doc.catalog.set(PDFName.of('Lang'), PDFString.of('en'));

  const id = PDFHexString.of(seed.slice(0, 32));
  ctx.trailerInfo.ID = ctx.obj([id, id]);
  // no object streams: PDF/X-1a:2003 is PDF 1.4, which has none
  const out = Buffer.from(await doc.save({ useObjectStreams: false, addDefaultPage: false, updateFieldAppearances: false }));
  // pdf-lib always writes "%PDF-1.7"; the header of the standard has the same length, so no offset moves
  const head = `%PDF-${std.pdfVersion}`;
  if (out.toString('latin1', 0, 5) !== '%PDF-' || head.length !== 8) throw new Error('print: unexpected PDF header from pdf-lib');
  out.write(head, 0, 'latin1');
  return out;
}
