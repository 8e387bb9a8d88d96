import { describe, expect, it } from 'vitest';
import { countEmbeddedFontFiles, countPdfPages, pageSizes, preflightPdf, unembeddedFontNames } from '../../../server/areas/print/preflight';
import { loadPageTemplates } from '../../../server/areas/print/templates';

// Hand-made PDF object text in the shapes PDF 32000-1 defines: a page tree with a MediaBox
// (7.7.3.3), a standard Type 1 font dictionary without a font program (9.6.2.2), and a
// TrueType font descriptor with an embedded /FontFile2 (9.8.1, table 126).
const a4 = loadPageTemplates().get('a4')!;
const PT = 72 / 25.4;
const pageW = (a4.trim.widthMm + 2 * a4.bleedMm) * PT;
const pageH = (a4.trim.heightMm + 2 * a4.bleedMm) * PT;

function pdf(parts: { mediaBox: [number, number]; helvetica?: boolean; embedded?: boolean }): Buffer {
  const objs = [
    '1 0 obj\n<< /Type /Catalog /Pages 2 0 R >>\nendobj',
    '2 0 obj\n<< /Type /Pages /Kids [3 0 R] /Count 1 >>\nendobj',
    `3 0 obj\n<<\n/Type /Page\n/Parent 2 0 R\n/MediaBox [0 0 ${parts.mediaBox[0]} ${parts.mediaBox[1]}]\n>>\nendobj`,
  ];
  if (parts.helvetica) objs.push('4 0 obj\n<<\n/Type /Font\n/BaseFont /Helvetica\n/Subtype /Type1\n/Encoding /WinAnsiEncoding\n>>\nendobj');
  if (parts.embedded) objs.push('5 0 obj\n<<\n/Type /FontDescriptor\n/FontName /ABCDEF+SourceSerif4-Regular\n/FontFile2 6 0 R\n>>\nendobj');
  return Buffer.from(`%PDF-1.3\n${objs.join('\n')}\n%%EOF\n`, 'latin1');
}

const metrics = { smallestSquareMm: 5, smallestDigitPt: 8, omittedLabels: [], illegibleGivens: [] };

describe('preflight of PDF bytes', () => {
  it('reads pages, page sizes and embedded font programs', () => {
    const bytes = pdf({ mediaBox: [pageW, pageH], embedded: true });
    expect(countPdfPages(bytes)).toBe(1);
    expect(pageSizes(bytes)[0]!.width).toBeCloseTo(pageW, 3);
    expect(countEmbeddedFontFiles(bytes)).toBe(1);
    expect(unembeddedFontNames(bytes)).toEqual([]);
    const r = preflightPdf({ template: a4, pdf: bytes, fontsRegistered: ['Source Serif 4'], pageSizePt: { width: pageW, height: pageH }, metrics });
    expect(r.ok).toBe(true);
    expect(r.warnings).toEqual([]);
  });

  it('fails a file that uses a standard font without embedding it', () => {
    const bytes = pdf({ mediaBox: [pageW, pageH], helvetica: true, embedded: true });
    expect(unembeddedFontNames(bytes)).toEqual(['Helvetica']);
    const r = preflightPdf({ template: a4, pdf: bytes, fontsRegistered: [], pageSizePt: { width: pageW, height: pageH }, metrics });
    expect(r.ok).toBe(false);
    expect(r.fontsEmbedded).toBe(false);
    expect(r.warnings).toContainEqual({ code: 'error:fonts-not-embedded', message: 'fonts used without embedding: Helvetica' });
  });

  it('fails a page that is not trim + 2 x bleed', () => {
    // A4 trim without bleed: 595.28 x 841.89 pt (ISO 216, 210 x 297 mm)
    const bytes = pdf({ mediaBox: [595.28, 841.89], embedded: true });
    const r = preflightPdf({ template: a4, pdf: bytes, fontsRegistered: [], pageSizePt: { width: pageW, height: pageH }, metrics });
    expect(r.ok).toBe(false);
    expect(r.warnings.map((w) => w.code)).toContain('error:page-size');
  });

  it('fails under the template floors (common practice: squares 3 mm, digits 6 pt)', () => {
    const bytes = pdf({ mediaBox: [pageW, pageH], embedded: true });
    const r = preflightPdf({ template: a4, pdf: bytes, fontsRegistered: [], pageSizePt: { width: pageW, height: pageH }, metrics: { ...metrics, smallestSquareMm: 2.9, smallestDigitPt: 5.5 } });
    expect(r.ok).toBe(false);
    expect(r.warnings.map((w) => w.code)).toEqual(['error:square-small', 'error:digit-small']);
  });
});
