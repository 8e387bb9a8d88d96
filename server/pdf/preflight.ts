import type { PageTemplate } from '../../shared/contracts/templates';
import type { LayoutMetrics } from './edition-layout';
import type { Preflight, PreflightWarning } from './types';

/** Counts the page objects of a PDF (pdfkit writes page dictionaries uncompressed). */
export function countPdfPages(pdf: Buffer): number {
  const text = pdf.toString('latin1');
  return (text.match(/\/Type\s*\/Page(?![s\w])/g) ?? []).length;
}

/** Counts embedded TrueType font programs (/FontFile2 entries of font descriptors). */
export function countEmbeddedFontFiles(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/FontFile2\s+\d+\s+\d+\s+R/g) ?? []).length;
}

/** Names of fonts used without an embedded program (the PDF standard 14, e.g. Helvetica). */
export function unembeddedFontNames(pdf: Buffer): string[] {
  const text = pdf.toString('latin1');
  const names = new Set<string>();
  for (const m of text.matchAll(/\/Type\s*\/Font\s*\/Subtype\s*\/Type1\s*\/BaseFont\s*\/([A-Za-z0-9-]+)/g)) names.add(m[1] ?? '');
  for (const m of text.matchAll(/\/BaseFont\s*\/([A-Za-z0-9-]+)\s*\/Subtype\s*\/Type1/g)) names.add(m[1] ?? '');
  return [...names].filter(Boolean);
}

export type PreflightInput = {
  template: PageTemplate;
  pdf: Buffer;
  fontsRegistered: string[];
  pageSizePt: { width: number; height: number };
  metrics: LayoutMetrics;
};

/**
 * The preflight report of one PDF. Errors make `ok` false (a proof must not go out);
 * warnings are for the editor to weigh. The floors come from the template's `minimums`,
 * which in the shipped templates are common practice for print (digits >= 6 pt,
 * squares >= 3 mm).
 */
export function preflightPdf(input: PreflightInput): Preflight {
  const { template: t, pdf, metrics } = input;
  const pages = countPdfPages(pdf);
  const embeddedFontFiles = countEmbeddedFontFiles(pdf);
  const unembedded = unembeddedFontNames(pdf);
  const fontsEmbedded = embeddedFontFiles > 0 && unembedded.length === 0;
  const errors: PreflightWarning[] = [];
  const warnings: PreflightWarning[] = [];
  if (!fontsEmbedded) {
    errors.push({
      code: 'fonts-not-embedded',
      message: unembedded.length > 0 ? `fonts used without embedding: ${unembedded.join(', ')}` : 'no embedded font program found in the file',
    });
  }
  if (pages === 0) errors.push({ code: 'no-pages', message: 'the file has no pages' });
  for (const g of metrics.illegibleGivens) {
    errors.push({ code: 'given-illegible', message: `puzzle ${g.slot}: the given ${g.size} cannot be printed at ${t.minimums.digitPt} pt or more in its box` });
  }
  // common practice: squares under about 3 mm are hard to see and to cut out
  if (metrics.smallestSquareMm !== null && metrics.smallestSquareMm < t.minimums.squareMm) {
    warnings.push({ code: 'square-small', message: `smallest printed square is ${metrics.smallestSquareMm.toFixed(2)} mm, under the ${t.minimums.squareMm} mm minimum` });
  }
  // common practice: digits under about 6 pt are not legible in print
  if (metrics.smallestDigitPt !== null && metrics.smallestDigitPt < t.minimums.digitPt) {
    warnings.push({ code: 'digit-small', message: `smallest digit is ${metrics.smallestDigitPt.toFixed(1)} pt, under the ${t.minimums.digitPt} pt minimum` });
  }
  const omitted = metrics.omittedLabels;
  if (omitted.length > 0) {
    const inPuzzles = omitted.filter((o) => o.where === 'puzzle');
    const inSolutions = omitted.filter((o) => o.where === 'solution');
    const describe = (list: typeof omitted) =>
      [...new Set(list.map((o) => o.slot))].map((slot) => `puzzle ${slot} (${list.filter((o) => o.slot === slot).map((o) => o.size).join(', ')})`).join('; ');
    if (inPuzzles.length > 0) warnings.push({ code: 'labels-omitted', message: `${inPuzzles.length} piece labels left out, too small to print at ${t.minimums.digitPt} pt: ${describe(inPuzzles)}` });
    if (inSolutions.length > 0) warnings.push({ code: 'solution-labels-omitted', message: `${inSolutions.length} solution labels left out, too small to print at ${t.minimums.digitPt} pt: ${describe(inSolutions)}` });
  }
  const r1 = (v: number) => Math.round(v * 10) / 10;
  return {
    ok: errors.length === 0,
    templateId: t.id,
    pages,
    trimMm: { width: t.trim.widthMm, height: t.trim.heightMm },
    bleedMm: t.bleedMm,
    pageSizePt: { width: r1(input.pageSizePt.width), height: r1(input.pageSizePt.height) },
    fontsRegistered: input.fontsRegistered,
    embeddedFontFiles,
    fontsEmbedded,
    smallestSquareMm: metrics.smallestSquareMm === null ? null : Math.round(metrics.smallestSquareMm * 100) / 100,
    smallestDigitPt: metrics.smallestDigitPt,
    omittedLabels: omitted,
    warnings: [...errors.map((e) => ({ ...e, code: `error:${e.code}` })), ...warnings],
  };
}
