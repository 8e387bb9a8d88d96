import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { PDFDocument, rgb, StandardFonts } from 'pdf-lib';
import { beforeAll, describe, expect, it } from 'vitest';
import { outputConditions, type PressSettings } from '../../../shared/contracts/press';
import { templatePressDefaults } from '../../../shared/contracts/templates';
import { preflightPdf } from '../../../server/areas/print/preflight';
import { renderEditionPdf } from '../../../server/areas/print/render-edition';
import { loadPageTemplates } from '../../../server/areas/print/templates';
import type { RenderResult } from '../../../server/areas/print/types';
import { deref, gsTextSizes, hasPressTools, mutoolTrace, pressToolsSkipReason, qpdfCheck, qpdfJson, qpdfText, separations } from './debian-tools';
import { pressReadyEdition } from './fixtures/sample-edition';
import { hasPoppler, popplerSkipReason, writeTemp } from './poppler';

// The proof and the press file of each shipped template, checked by our preflight and, for
// the same facts, by independent Debian tools: poppler's pdfinfo -box (boxes), qpdf --check
// and qpdf --json (structure, Info keys, ID, output intent), Ghostscript's tiffsep (what
// lands on which plate) and txtwrite (type sizes), and mupdf's mutool trace (line weights
// and the colours of every text run and stroke).

const templates = loadPageTemplates();
const PT_PER_MM = 72 / 25.4; // PDF 32000-1: 1 pt = 1/72 in; 1 in = 25.4 mm
const IDS = ['a4', 'us-letter', 'newspaper-column'] as const;
const KINDS = ['proof', 'press'] as const;
const CREATED = '2026-12-04T09:30:00.000Z';

const rendered = new Map<string, { r: RenderResult; file: string }>();
const key = (id: string, kind: string) => `${id}/${kind}`;

beforeAll(async () => {
  for (const id of IDS) {
    const doc = pressReadyEdition(templates.get(id)!);
    for (const kind of KINDS) {
      const r = await renderEditionPdf(doc, kind === 'proof' ? { stamp: 'PROOF', proofVersion: 2, createdAt: CREATED } : { stamp: null, createdAt: CREATED });
      rendered.set(key(id, kind), { r, file: writeTemp(r.pdf) });
    }
  }
}, 180_000);

function pdfinfoBoxes(file: string, pages: number) {
  const out = execFileSync('pdfinfo', ['-box', '-f', '1', '-l', String(pages), file], { encoding: 'utf8' });
  const boxes: Record<number, Record<string, number[]>> = {};
  for (const m of out.matchAll(/^Page\s+(\d+)\s+(\w+)Box:\s+([-\d.]+)\s+([-\d.]+)\s+([-\d.]+)\s+([-\d.]+)/gm)) {
    (boxes[Number(m[1])] ??= {})[m[2]!.toLowerCase()] = [m[3], m[4], m[5], m[6]].map(Number);
  }
  return { boxes, subtype: /^PDF subtype:\s+(.+)$/m.exec(out)?.[1]?.trim() ?? null };
}

describe.skipIf(!hasPoppler || !hasPressTools)(`press files read back by Debian tools (${!hasPoppler ? popplerSkipReason : hasPressTools ? 'present' : pressToolsSkipReason})`, () => {
  for (const id of IDS) {
    for (const kind of KINDS) {
      describe(`${id} ${kind}`, () => {
        const t = templates.get(id)!;
        const spec = templatePressDefaults(t);
        const get = () => rendered.get(key(id, kind))!;

        it('passes our preflight as PDF/X-1a with the template\'s output condition', () => {
          const { preflight } = get().r;
          expect(preflight.warnings).toEqual([]);
          expect(preflight.ok).toBe(true);
          expect(preflight.pdfx).toMatchObject({ version: 'PDF/X-1a:2003', pdfVersion: '1.4', trapped: 'False', xmp: true, outputIntent: { identifier: spec.condition, registry: 'http://www.color.org', profileEmbedded: false } });
          for (const p of preflight.pageReports!) {
            expect(p.boxesNested).toBe(true);
            expect(p.colourSpaces).toEqual(['DeviceCMYK']);
            expect(p.offBlackPlate).toBe(0);
            expect(p.transparency).toBe(false);
            expect(p.fonts.every((f) => f.embedded)).toBe(true);
          }
        });

        it('boxes: pdfinfo -box reads MediaBox = BleedBox = trim + bleed and TrimBox = the finished page, as our preflight does', () => {
          const { r, file } = get();
          const info = pdfinfoBoxes(file, r.pages);
          expect(info.subtype).toBe('PDF/X-1a:2003');
          const b = t.bleedMm * PT_PER_MM;
          const W = t.trim.widthMm * PT_PER_MM + 2 * b;
          const H = t.trim.heightMm * PT_PER_MM + 2 * b;
          for (let p = 1; p <= r.pages; p++) {
            const pb = info.boxes[p]!;
            const ours = r.preflight.pageReports![p - 1]!;
            const close = (a: number[], e: number[]) => a.forEach((v, i) => expect(v).toBeCloseTo(e[i]!, 1));
            close(pb.media!, [0, 0, W, H]);
            close(pb.bleed!, [0, 0, W, H]);
            close(pb.trim!, [b, b, W - b, H - b]);
            close(pb.media!, ours.boxes.media!);
            close(pb.bleed!, ours.boxes.bleed!);
            close(pb.trim!, ours.boxes.trim!);
            expect(ours.trimMm!.width).toBeCloseTo(t.trim.widthMm, 1);
            expect(ours.bleedMm!.left).toBeCloseTo(t.bleedMm, 1);
          }
        });

        it('structure: qpdf --check finds no errors; qpdf --json shows the ID, the Info keys and the output intent our preflight read', () => {
          const { r, file } = get();
          const check = qpdfCheck(file);
          expect(check.status, check.out).toBe(0);
          expect(check.out).toMatch(/No syntax or stream encoding errors found/);
          const j = qpdfJson(file);
          expect(j.pdfVersion).toBe(r.preflight.pdfx!.pdfVersion);
          const ids = j.trailer['/ID'] as string[];
          expect(ids).toHaveLength(2);
          expect(ids[0]).toBe(`b:${r.preflight.pdfx!.documentId}`);
          const info = deref(j, j.trailer['/Info']) as Record<string, unknown>;
          expect(qpdfText(info['/GTS_PDFXVersion'])).toBe('PDF/X-1a:2003');
          expect(info['/Trapped']).toBe('/False');
          expect(qpdfText(info['/Title'])).toBe(kind === 'proof' ? 'The Saturday Quadrant No. 41 (proof v2)' : 'The Saturday Quadrant No. 41');
          expect(qpdfText(info['/CreationDate'])).toBe("D:20261204093000+00'00'");
          expect(qpdfText(info['/ModDate'])).toBe("D:20261204093000+00'00'");
          expect(qpdfText(info['/Producer'])).toMatch(/^Squarewright/);
          const root = deref(j, j.trailer['/Root']) as Record<string, unknown>;
          expect(root['/Metadata']).toBeDefined();
          const intents = deref(j, root['/OutputIntents']) as string[];
          expect(intents).toHaveLength(1);
          const intent = deref(j, intents[0]) as Record<string, unknown>;
          expect(intent['/S']).toBe('/GTS_PDFX');
          expect(qpdfText(intent['/OutputConditionIdentifier'])).toBe(spec.condition);
          expect(qpdfText(intent['/OutputCondition'])).toBe(outputConditions[spec.condition]);
          expect(qpdfText(intent['/RegistryName'])).toBe('http://www.color.org');
          expect(intent['/DestOutputProfile']).toBeUndefined();
        });

        it('Ghostscript tiffsep: text and rules land on the black plate and nowhere else', () => {
          const { r, file } = get();
          for (let p = 1; p <= r.pages; p++) {
            const s = separations(file, p);
            let solidK = 0;
            let maxTint = 0;
            for (let i = 0; i < s.black.data.length; i++) {
              const c = s.cyan.data[i]!;
              const m = s.magenta.data[i]!;
              const y = s.yellow.data[i]!;
              maxTint = Math.max(maxTint, c, m, y);
              if (s.black.data[i]! >= 250) {
                solidK++;
                // where our ink is (100% K: type, outlines, rules), nothing on the other plates
                if (c + m + y > 0) expect.fail(`page ${p}: pixel ${i} has 100% K and C/M/Y ${c}/${m}/${y}`);
              }
            }
            expect(solidK, `page ${p} has type and rules on the black plate`).toBeGreaterThan(2000);
            // the other plates carry only the tints of the fills (palette: at most 32% of any ink)
            expect(maxTint).toBeLessThanOrEqual(Math.round(0.32 * 255) + 2);
          }
        });

        it('type sizes and line weights: Ghostscript txtwrite and mutool trace measure what our preflight measured, all in black only', () => {
          const { r, file } = get();
          const gsSizes = gsTextSizes(file);
          expect(gsSizes.length).toBeGreaterThan(10);
          expect(Math.min(...gsSizes)).toBeCloseTo(r.preflight.smallestTypePt!, 1);
          const trace = mutoolTrace(file);
          expect(Math.min(...trace.texts.map((x) => x.sizePt))).toBeCloseTo(r.preflight.smallestTypePt!, 2);
          expect(Math.min(...trace.strokes.map((x) => x.widthPt))).toBeCloseTo(r.preflight.thinnestLinePt!, 3);
          expect(r.preflight.thinnestLinePt!).toBeGreaterThanOrEqual(0.25); // hairline floor: common practice
          expect(r.preflight.smallestTypePt!).toBeGreaterThanOrEqual(spec.minTypePt);
          for (const x of [...trace.texts, ...trace.strokes]) {
            expect(x.colorspace).toBe('DeviceCMYK');
            expect(x.color.slice(0, 3)).toEqual([0, 0, 0]);
          }
          // our ink is 100% K: the text outside the PROOF watermark
          expect(trace.texts.filter((x) => x.color[3] === 1).length).toBeGreaterThan(10);
        });
      });
    }
  }

  it('the same checks catch a file in RGB: the separation shows black type on all four plates, and our preflight fails it', async () => {
    // pdf-lib writes device RGB for rgb(); a plain file as a desk's own tool might make it
    const doc = await PDFDocument.create();
    const page = doc.addPage([300, 200]);
    page.drawText('Rich black type', { x: 20, y: 100, size: 24, font: await doc.embedFont(StandardFonts.HelveticaBold), color: rgb(0, 0, 0) });
    page.drawLine({ start: { x: 20, y: 80 }, end: { x: 280, y: 80 }, thickness: 0.1, color: rgb(0, 0, 0) });
    const bytes = await doc.save();
    const s = separations(writeTemp(Buffer.from(bytes)), 1);
    let offK = 0;
    for (let i = 0; i < s.black.data.length; i++) if (s.black.data[i]! > 128 && s.cyan.data[i]! + s.magenta.data[i]! + s.yellow.data[i]! > 0) offK++;
    expect(offK).toBeGreaterThan(100);
    const a4 = templates.get('a4')!;
    const press: PressSettings = { ...templatePressDefaults(a4), profileSha256: null };
    const report = await preflightPdf({ template: a4, press, pdf: bytes, fontsRegistered: [], pageSizePt: { width: 300, height: 200 }, metrics: { smallestSquareMm: null, smallestDigitPt: null, omittedLabels: [], illegibleGivens: [] } });
    const codes = report.warnings.map((w) => w.code);
    for (const c of ['error:colour-space', 'error:text-not-black', 'error:fonts-not-embedded', 'error:line-thin', 'error:boxes', 'error:pdfx-id', 'error:output-intent']) expect(codes).toContain(c);
    expect(report.ok).toBe(false);
    expect(report.thinnestLinePt).toBeCloseTo(0.1, 3);
  });
});

// Ghostscript's CMYK profile (Debian libgs-common) stands in for a plant's ICC profile in the
// PDF/X-4 test; it is read from the system, never copied into the repository (AGPL).
const GS_CMYK = '/usr/share/color/icc/ghostscript/default_cmyk.icc';

describe.skipIf(!hasPoppler || !hasPressTools || !existsSync(GS_CMYK))('PDF/X-4 with the plant\'s output profile', () => {
  it('embeds the profile in the output intent, says PDF/X-4 in Info and XMP, and passes our preflight and qpdf', async () => {
    const t = templates.get('a4')!;
    const icc = readFileSync(GS_CMYK);
    const sha = createHash('sha256').update(icc).digest('hex');
    const doc = pressReadyEdition(t, { press: { ...templatePressDefaults(t), standard: 'pdfx-4', profileSha256: sha } });
    const r = await renderEditionPdf(doc, { stamp: null, outputProfile: { base64: icc.toString('base64'), description: 'Ghostscript default CMYK (test stand-in)' } });
    expect(r.preflight.warnings).toEqual([]);
    expect(r.preflight.pdfx).toMatchObject({ version: 'PDF/X-4', pdfVersion: '1.6', outputIntent: { profileEmbedded: true } });
    const file = writeTemp(r.pdf);
    expect(pdfinfoBoxes(file, 1).subtype).toBe('PDF/X-4');
    expect(qpdfCheck(file).status).toBe(0);
    const j = qpdfJson(file);
    const root = deref(j, j.trailer['/Root']) as Record<string, unknown>;
    const intent = deref(j, (deref(j, root['/OutputIntents']) as string[])[0]) as Record<string, unknown>;
    const profile = deref(j, intent['/DestOutputProfile']) as Record<string, unknown>;
    expect(profile['/N']).toBe(4);
    expect(r.pdf.toString('latin1')).toContain('<pdfxid:GTS_PDFXVersion>PDF/X-4</pdfxid:GTS_PDFXVersion>');
  });

  it('refuses to make PDF/X-4 without a profile', async () => {
    const t = templates.get('a4')!;
    const doc = pressReadyEdition(t, { press: { ...templatePressDefaults(t), standard: 'pdfx-4', profileSha256: null } });
    await expect(renderEditionPdf(doc, { stamp: null })).rejects.toThrow(/needs the output profile/);
  });
});
