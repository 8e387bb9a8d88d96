import { PDFDocument, rgb, StandardFonts } from 'pdf-lib';
import { beforeAll, describe, expect, it } from 'vitest';
import type { PressSettings } from '../../../shared/contracts/press';
import { templatePressDefaults } from '../../../shared/contracts/templates';
import { rewriteContent } from '../../../server/areas/print/pdfx';
import { preflightPdf, type PreflightInput } from '../../../server/areas/print/preflight';
import { renderEditionPdf } from '../../../server/areas/print/render-edition';
import { loadPageTemplates } from '../../../server/areas/print/templates';
import { pressReadyEdition } from './fixtures/sample-edition';

// Each verdict of the preflight turned by one change to a file (or to the spec it is read
// against) that passes: the press file of a press-ready A4 edition. The Debian tools confirm
// the facts these verdicts rest on in press-file.test.ts.

const a4 = loadPageTemplates().get('a4')!;
const PT = 72 / 25.4;
const pageSizePt = { width: (a4.trim.widthMm + 2 * a4.bleedMm) * PT, height: (a4.trim.heightMm + 2 * a4.bleedMm) * PT };
const press: PressSettings = { ...templatePressDefaults(a4), profileSha256: null };
const metrics = { smallestSquareMm: 5, smallestDigitPt: 8, omittedLabels: [], illegibleGivens: [] };
let good: Buffer;

beforeAll(async () => {
  good = (await renderEditionPdf(pressReadyEdition(a4), { stamp: null })).pdf;
}, 60_000);

const run = (over: Partial<PreflightInput> = {}) => preflightPdf({ template: a4, press, pdf: good, fontsRegistered: [], pageSizePt, metrics, ...over });
const codes = async (over: Partial<PreflightInput> = {}) => (await run(over)).warnings.map((w) => w.code);

describe('preflight verdicts', () => {
  it('passes the press file as it is', async () => {
    const r = await run();
    expect(r.warnings).toEqual([]);
    expect(r.ok).toBe(true);
    expect(r.smallestTypePt).toBe(8); // the A4 template's caption size
    expect(r.thinnestLinePt).toBe(0.6); // the A4 template's line weight
  });

  it('fails under the template floors (common practice: squares 3 mm, digits 6 pt)', async () => {
    const r = await run({ metrics: { ...metrics, smallestSquareMm: 2.9, smallestDigitPt: 5.5 } });
    expect(r.ok).toBe(false);
    expect(r.warnings.map((w) => w.code)).toEqual(['error:square-small', 'error:digit-small']);
  });

  it('fails type under the spec and lines under the spec', async () => {
    expect(await codes({ press: { ...press, minTypePt: 9 } })).toEqual(['error:type-small']);
    expect(await codes({ press: { ...press, minLinePt: 0.7 } })).toEqual(['error:line-thin']);
  });

  it('fails a bleed, a trim or an output condition other than the spec and template say', async () => {
    expect(await codes({ press: { ...press, bleedMm: 5 } })).toEqual(['error:boxes']);
    expect(await codes({ template: { ...a4, trim: { widthMm: 200, heightMm: 297 } } })).toEqual(['error:page-size']);
    expect(await codes({ press: { ...press, condition: 'IFRA26' } })).toEqual(['error:output-intent']);
  });

  it('fails a PDF/X-1a file read against a PDF/X-4 spec (identification and missing profile)', async () => {
    expect(await codes({ press: { ...press, standard: 'pdfx-4' } })).toEqual(['error:pdfx-id', 'error:output-intent']);
  });

  it('finds transparency, RGB and unembedded fonts in a file pdf-lib writes plainly', async () => {
    const doc = await PDFDocument.create();
    const page = doc.addPage([pageSizePt.width, pageSizePt.height]);
    page.drawRectangle({ x: 50, y: 50, width: 100, height: 100, color: rgb(0.9, 0.2, 0.1), opacity: 0.5 });
    page.drawText('Type', { x: 50, y: 300, size: 5, font: await doc.embedFont(StandardFonts.Helvetica), color: rgb(0, 0, 0) });
    const r = await run({ pdf: Buffer.from(await doc.save()) });
    expect(r.pageReports![0]).toMatchObject({ colourSpaces: ['DeviceRGB'], transparency: true, smallestTypePt: 5, fonts: [{ name: 'Helvetica', embedded: false }] });
    const c = r.warnings.map((w) => w.code);
    for (const code of ['error:boxes', 'error:colour-space', 'error:text-not-black', 'error:transparency', 'error:fonts-not-embedded', 'error:type-small', 'error:pdfx-id', 'error:output-intent']) expect(c).toContain(code);
  });
});

describe('press colour rewrite', () => {
  it('turns the palette\'s RGB into CMYK: ink on the black plate, tints as CMYK', () => {
    const ink = [0x1c, 0x1b, 0x19].map((v) => v / 255).join(' ');
    const out = rewriteContent(`/DeviceRGB cs\n${ink} scn\n/DeviceRGB CS\n0 0 0 SCN\n0.9137254901960784 0.8862745098039215 0.8274509803921568 rg\n1 g`, new Set());
    expect(out).toBe('/DeviceCMYK cs\n0 0 0 1 scn\n/DeviceCMYK CS\n0 0 0 1 SCN\n0 0.03 0.1 0.08 k\n0 0 0 0 k');
  });

  it('refuses a colour outside the palette and painting under transparency', () => {
    expect(() => rewriteContent('0.5 0.1 0.1 rg', new Set())).toThrow(/#801a1a is not in the print palette/);
    // the renderer's empty fill under a transparent state is dropped; real painting is refused
    expect(rewriteContent('q\n/Gs2 gs\nf\nQ', new Set(['Gs2']))).toBe('q\n\n\nQ');
    expect(() => rewriteContent('q\n/Gs2 gs\n0 0 10 10 re\nf\nQ', new Set(['Gs2']))).toThrow(/transparency/);
  });
});
