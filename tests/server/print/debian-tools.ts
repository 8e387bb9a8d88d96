import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

// Independent readers of our press files, all Debian packages: qpdf (structure, objects as
// JSON), Ghostscript (tiffsep: one 8-bit plate per ink; txtwrite: the type sizes), mupdf-tools
// (mutool trace: every stroke and text run with its line width, colour and matrix) and
// poppler's pdfinfo -box (in poppler.ts). .ci/run installs them; without them (and without
// REQUIRE_BROWSER=1) the tests that need them are skipped with this reason.

const has = (cmd: string, arg: string) => spawnSync(cmd, [arg]).status === 0;
export const hasQpdf = has('qpdf', '--version');
export const hasGs = has('gs', '--version');
export const hasMutool = spawnSync('mutool', ['-v']).error === undefined;
export const pressToolsSkipReason = 'qpdf, ghostscript and mupdf-tools not installed: apt-get install -y qpdf ghostscript mupdf-tools';
export const hasPressTools = hasQpdf && hasGs && hasMutool;
if (!hasPressTools && process.env.REQUIRE_BROWSER === '1') throw new Error(`REQUIRE_BROWSER=1 but ${pressToolsSkipReason}`);

/** qpdf --check: exit status and its last words. */
export function qpdfCheck(file: string): { status: number | null; out: string } {
  const r = spawnSync('qpdf', ['--check', file], { encoding: 'utf8' });
  return { status: r.status, out: `${r.stdout}${r.stderr}` };
}

type QpdfValue = unknown;

/** qpdf --json (version 2): the trailer and every object by "obj:N G R". */
export function qpdfJson(file: string): { trailer: Record<string, QpdfValue>; objects: Record<string, QpdfValue>; pdfVersion: string } {
  const out = JSON.parse(execFileSync('qpdf', ['--json=2', '--json-key=qpdf', file], { encoding: 'utf8', maxBuffer: 64 << 20 })) as {
    qpdf: [{ pdfversion: string }, Record<string, { value?: QpdfValue; stream?: { dict: QpdfValue } }>];
  };
  const [head, objs] = out.qpdf;
  const objects: Record<string, QpdfValue> = {};
  for (const [k, v] of Object.entries(objs)) if (k.startsWith('obj:')) objects[k.slice(4)] = v.value ?? v.stream?.dict;
  return { trailer: objs.trailer?.value as Record<string, QpdfValue>, objects, pdfVersion: head.pdfversion };
}

/** Follows a qpdf JSON reference ("12 0 R") to its object. */
export function deref(j: { objects: Record<string, QpdfValue> }, v: QpdfValue): QpdfValue {
  return typeof v === 'string' && v.endsWith(' R') ? j.objects[v] : v;
}

/** A qpdf JSON string ("u:text" or "b:hex") as text. */
export function qpdfText(v: QpdfValue): string | null {
  if (typeof v !== 'string') return null;
  if (v.startsWith('u:')) return v.slice(2);
  if (v.startsWith('b:')) return Buffer.from(v.slice(2), 'hex').toString('latin1');
  return v;
}

export type Plate = { width: number; height: number; data: Uint8Array };

/** An uncompressed 8-bit single-channel TIFF (Ghostscript's tiffsep plates): value = ink, 0..255. */
export function readPlate(file: string): Plate {
  const b = readFileSync(file);
  const le = b.toString('latin1', 0, 2) === 'II';
  const u16 = (o: number) => (le ? b.readUInt16LE(o) : b.readUInt16BE(o));
  const u32 = (o: number) => (le ? b.readUInt32LE(o) : b.readUInt32BE(o));
  const ifd = u32(4);
  const tags = new Map<number, number[]>();
  for (let i = 0; i < u16(ifd); i++) {
    const e = ifd + 2 + i * 12;
    const type = u16(e + 2);
    const count = u32(e + 4);
    const size = type === 3 ? 2 : 4;
    const at = count * size <= 4 ? e + 8 : u32(e + 8);
    const vals: number[] = [];
    for (let j = 0; j < count; j++) vals.push(size === 2 ? u16(at + j * 2) : u32(at + j * 4));
    tags.set(u16(e), vals);
  }
  const width = tags.get(256)![0]!;
  const height = tags.get(257)![0]!;
  if ((tags.get(258)?.[0] ?? 1) !== 8 || (tags.get(259)?.[0] ?? 1) !== 1) throw new Error(`${file}: not an uncompressed 8-bit plate`);
  const whiteIsZero = (tags.get(262)?.[0] ?? 0) === 0;
  const data = new Uint8Array(width * height);
  let o = 0;
  const offsets = tags.get(273)!;
  const counts = tags.get(279)!;
  offsets.forEach((off, i) => {
    data.set(b.subarray(off, off + counts[i]!), o);
    o += counts[i]!;
  });
  if (!whiteIsZero) for (let i = 0; i < data.length; i++) data[i] = 255 - data[i]!;
  return { width, height, data };
}

/** Ghostscript's separation device on one page: the four process plates. */
export function separations(file: string, page: number, dpi = 100): { cyan: Plate; magenta: Plate; yellow: Plate; black: Plate } {
  const dir = mkdtempSync(join(tmpdir(), 'sw-sep-'));
  execFileSync('gs', ['-q', '-dNOPAUSE', '-dBATCH', '-dSAFER', '-sDEVICE=tiffsep', '-sCompression=none', `-r${dpi}`, `-dFirstPage=${page}`, `-dLastPage=${page}`, `-sOutputFile=${join(dir, 'p%d.tif')}`, file]);
  const names = readdirSync(dir);
  const plate = (ink: string) => {
    const f = names.find((n) => n.includes(`(${ink})`));
    if (!f) throw new Error(`gs tiffsep wrote no ${ink} plate (${names.join(', ')})`);
    return readPlate(join(dir, f));
  };
  return { cyan: plate('Cyan'), magenta: plate('Magenta'), yellow: plate('Yellow'), black: plate('Black') };
}

/** Ghostscript's text extraction (txtwrite, XML): the size of every text span, pt. */
export function gsTextSizes(file: string): number[] {
  const out = execFileSync('gs', ['-q', '-dNOPAUSE', '-dBATCH', '-dSAFER', '-sDEVICE=txtwrite', '-dTextFormat=0', '-sOutputFile=-', file], { encoding: 'utf8', maxBuffer: 64 << 20 });
  return [...out.matchAll(/<span [^>]*size="([\d.]+)"/g)].map((m) => Number(m[1]));
}

export type TraceStroke = { widthPt: number; colorspace: string; color: number[] };
export type TraceText = { sizePt: number; colorspace: string; color: number[] };

/** mutool trace: every stroked path (line width through its matrix) and every text run (size from its text matrix), with their colours. */
export function mutoolTrace(file: string): { strokes: TraceStroke[]; texts: TraceText[] } {
  const out = execFileSync('mutool', ['trace', file], { encoding: 'utf8', maxBuffer: 256 << 20 });
  const nums = (s: string) => s.trim().split(/[\s,]+/).map(Number);
  const strokes: TraceStroke[] = [];
  for (const m of out.matchAll(/<stroke_path linewidth="([^"]*)"[^>]*colorspace="([^"]*)" color="([^"]*)"[^>]*transform="([^"]*)"/g)) {
    const [a, b, c, d] = nums(m[4]!) as [number, number, number, number];
    // the narrower of the two axes' scales, as our preflight measures
    const scale = Math.min(Math.hypot(a, b), Math.hypot(c, d));
    strokes.push({ widthPt: Number(m[1]) * scale, colorspace: m[2]!, color: nums(m[3]!) });
  }
  const texts: TraceText[] = [];
  for (const m of out.matchAll(/<fill_text colorspace="([^"]*)" color="([^"]*)"[^>]*transform="([^"]*)">\s*<span [^>]*trm="([^"]*)"/g)) {
    // the span's matrix (font size and text matrix) through the page's transform, vertically
    const [A, B, C, D] = nums(m[3]!) as [number, number, number, number];
    const [, , c, d] = nums(m[4]!) as [number, number, number, number];
    texts.push({ sizePt: Math.hypot(c * A + d * C, c * B + d * D), colorspace: m[1]!, color: nums(m[2]!) });
  }
  return { strokes, texts };
}
