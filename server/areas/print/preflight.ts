import type { PagePreflight, PdfxFacts } from '../../../shared/contracts/preflight';
import { pressStandardInfo, type PressSettings } from '../../../shared/contracts/press';
import type { PageTemplate } from '../../../shared/contracts/templates';
import type { LayoutMetrics } from './edition-layout';
import { inspectPdf, type Box, type DocumentFacts, type PageFacts } from './pdf-inspect';
import type { Preflight, PreflightWarning } from './types';

// The preflight a plant would run, on the finished file: per page the boxes and their
// nesting, the colour spaces, text and lines on the black plate only, fonts and
// embedding, the smallest type and the thinnest line against the press spec; for the
// document the PDF/X identification, metadata and output intent; and the template's
// floors measured while laying out (smallest printed square and digit). Errors make `ok`
// false (a proof must not go out; see the error codes in the README, "Press files");
// warnings are for the editor to weigh.

export const PT_PER_MM = 72 / 25.4;
const TOL_PT = 0.5;

export type PreflightInput = {
  template: PageTemplate;
  press: PressSettings;
  pdf: Uint8Array;
  fontsRegistered: string[];
  /** trim + 2 x bleed, pt */
  pageSizePt: { width: number; height: number };
  metrics: LayoutMetrics;
  /** a placeable graphic (layout package) has its own trim: skip the template's page size */
  graphic?: boolean;
};

const mm = (pt: number) => Math.round((pt / PT_PER_MM) * 100) / 100;
const inside = (inner: Box, outer: Box) => inner[0] >= outer[0] - 0.01 && inner[1] >= outer[1] - 0.01 && inner[2] <= outer[2] + 0.01 && inner[3] <= outer[3] + 0.01;

const ALLOWED_SPACES: Record<PressSettings['standard'], Set<string>> = {
  // ISO 15930-4: CMYK and spot colours (and grey, which prints on the black plate)
  'pdfx-1a': new Set(['DeviceCMYK', 'DeviceGray', 'Separation', 'DeviceN']),
  // ISO 15930-7 allows device-independent colour too; device RGB still has no meaning on a CMYK press
  'pdfx-4': new Set(['DeviceCMYK', 'DeviceGray', 'Separation', 'DeviceN', 'ICCBased', 'Lab', 'CalGray']),
};

function pageReport(p: PageFacts): PagePreflight {
  const { media, bleed, trim } = p.boxes;
  const nested = media !== null && bleed !== null && trim !== null && inside(trim, bleed) && inside(bleed, media) && (p.boxes.crop === null || inside(bleed, p.boxes.crop) || inside(p.boxes.crop, media));
  return {
    page: p.page,
    boxes: p.boxes,
    boxesNested: nested,
    trimMm: trim ? { width: mm(trim[2] - trim[0]), height: mm(trim[3] - trim[1]) } : null,
    bleedMm: trim && bleed ? { left: mm(trim[0] - bleed[0]), bottom: mm(trim[1] - bleed[1]), right: mm(bleed[2] - trim[2]), top: mm(bleed[3] - trim[3]) } : null,
    colourSpaces: p.colourSpaces,
    fonts: p.fonts,
    smallestTypePt: p.smallestTypePt,
    thinnestLinePt: p.thinnestLinePt,
    offBlackPlate: p.offBlackPlate.length,
    transparency: p.transparency.length > 0,
  };
}

function pdfxFacts(d: DocumentFacts): PdfxFacts {
  const intent = d.outputIntents.find((o) => o.subtype === 'GTS_PDFX') ?? null;
  return {
    version: d.info.GTS_PDFXVersion ?? null,
    pdfVersion: d.pdfVersion,
    title: d.info.Title ?? null,
    trapped: d.info.Trapped ?? null,
    documentId: d.id?.[0] ?? null,
    xmp: d.xmp !== null,
    outputIntent: intent ? { identifier: intent.identifier, condition: intent.condition, registry: intent.registry, profileEmbedded: intent.profileBytes !== null && intent.profileBytes > 0 } : null,
  };
}

/** Pages listed briefly: "1, 2" or "1-9". */
function pagesText(pages: number[]): string {
  if (pages.length > 3 && pages[pages.length - 1]! - pages[0]! === pages.length - 1) return `${pages[0]}-${pages[pages.length - 1]}`;
  return pages.join(', ');
}

/** The preflight report of one finished PDF (see the head of this file). */
export async function preflightPdf(input: PreflightInput): Promise<Preflight> {
  const { template: t, press, metrics } = input;
  const facts = await inspectPdf(input.pdf);
  const std = pressStandardInfo[press.standard];
  const pages = facts.pages.map(pageReport);
  const errors: PreflightWarning[] = [];
  const warnings: PreflightWarning[] = [];
  const err = (code: string, message: string) => errors.push({ code, message });
  const where = (list: PagePreflight[]) => `page ${pagesText(list.map((p) => p.page))}`;

  if (pages.length === 0) err('no-pages', 'the file has no pages');

  // boxes: present and nested; the trim is the template's page and the bleed the spec's
  const unnested = pages.filter((p) => !p.boxesNested);
  if (unnested.length > 0) err('boxes', `${where(unnested)}: needs MediaBox, BleedBox and TrimBox with TrimBox inside BleedBox inside MediaBox`);
  if (!input.graphic) {
    const wrongTrim = pages.filter((p) => p.trimMm && (Math.abs(p.trimMm.width - t.trim.widthMm) > TOL_PT / PT_PER_MM || Math.abs(p.trimMm.height - t.trim.heightMm) > TOL_PT / PT_PER_MM));
    if (wrongTrim.length > 0) err('page-size', `${where(wrongTrim)}: TrimBox is ${wrongTrim[0]!.trimMm!.width} x ${wrongTrim[0]!.trimMm!.height} mm, not the template's ${t.trim.widthMm} x ${t.trim.heightMm} mm`);
    const wrongMedia = pages.filter((p) => {
      const m = p.boxes.media;
      return m && (Math.abs(m[2] - m[0] - input.pageSizePt.width) > TOL_PT || Math.abs(m[3] - m[1] - input.pageSizePt.height) > TOL_PT);
    });
    if (wrongMedia.length > 0) {
      const m = wrongMedia[0]!.boxes.media!;
      err('page-size', `${where(wrongMedia)}: MediaBox is ${(m[2] - m[0]).toFixed(1)} x ${(m[3] - m[1]).toFixed(1)} pt, not trim + bleed (${input.pageSizePt.width.toFixed(1)} x ${input.pageSizePt.height.toFixed(1)} pt)`);
    }
  }
  const tolMm = TOL_PT / PT_PER_MM;
  const wrongBleed = pages.filter((p) => p.bleedMm && Object.values(p.bleedMm).some((b) => Math.abs(b - press.bleedMm) > tolMm));
  if (wrongBleed.length > 0) err('boxes', `${where(wrongBleed)}: the bleed is not ${press.bleedMm} mm on every side (BleedBox beyond TrimBox: ${Object.values(wrongBleed[0]!.bleedMm!).join(', ')} mm)`);

  // colour: the standard's colour spaces only; text and lines on the black plate only
  const allowed = ALLOWED_SPACES[press.standard];
  for (const p of pages) {
    const bad = p.colourSpaces.filter((s) => !allowed.has(s));
    if (bad.length > 0) err('colour-space', `page ${p.page}: ${bad.join(', ')} not allowed in ${std.gtsVersion}`);
  }
  for (const p of facts.pages) {
    if (p.offBlackPlate.length === 0) continue;
    const kinds = [...new Set(p.offBlackPlate.map((o) => `${o.what} in ${o.colour}`))];
    err('text-not-black', `page ${p.page}: ${p.offBlackPlate.length} text runs or lines print off the black plate (${kinds.slice(0, 3).join('; ')})`);
  }
  if (press.standard === 'pdfx-1a') {
    const tr = pages.filter((p) => p.transparency);
    if (tr.length > 0) err('transparency', `${where(tr)}: transparency, which PDF/X-1a does not allow`);
  }

  // fonts
  const fonts = new Map<string, boolean>();
  for (const p of pages) for (const f of p.fonts) fonts.set(f.name, (fonts.get(f.name) ?? true) && f.embedded);
  const unembedded = [...fonts].filter(([, e]) => !e).map(([n]) => n);
  if (unembedded.length > 0) err('fonts-not-embedded', `fonts used without embedding: ${unembedded.join(', ')}`);

  // smallest type and thinnest line against the spec
  const types = pages.map((p) => p.smallestTypePt).filter((v): v is number => v !== null);
  const lines = pages.map((p) => p.thinnestLinePt).filter((v): v is number => v !== null);
  const smallestTypePt = types.length > 0 ? Math.min(...types) : null;
  const thinnestLinePt = lines.length > 0 ? Math.min(...lines) : null;
  if (smallestTypePt !== null && smallestTypePt < press.minTypePt - 0.005) {
    err('type-small', `${where(pages.filter((p) => p.smallestTypePt !== null && p.smallestTypePt < press.minTypePt - 0.005))}: type of ${smallestTypePt} pt, under the press spec's ${press.minTypePt} pt`);
  }
  if (thinnestLinePt !== null && thinnestLinePt < press.minLinePt - 0.0005) {
    err('line-thin', `${where(pages.filter((p) => p.thinnestLinePt !== null && p.thinnestLinePt < press.minLinePt - 0.0005))}: a line of ${thinnestLinePt} pt, under the press spec's ${press.minLinePt} pt (hairlines under 0.25 pt may not print: common practice)`);
  }

  // PDF/X identification and output intent
  const pdfx = pdfxFacts(facts);
  const idProblems: string[] = [];
  if (pdfx.version !== std.gtsVersion) idProblems.push(`Info GTS_PDFXVersion is ${pdfx.version === null ? 'missing' : `"${pdfx.version}"`}, not "${std.gtsVersion}"`);
  if (Number(pdfx.pdfVersion) > Number(std.pdfVersion) || pdfx.pdfVersion === '?') idProblems.push(`PDF ${pdfx.pdfVersion} is newer than ${std.gtsVersion} allows (${std.pdfVersion})`);
  if (pdfx.trapped !== 'True' && pdfx.trapped !== 'False') idProblems.push('Info Trapped must be True or False');
  if (!pdfx.title) idProblems.push('no Title in Info');
  if (!facts.info.CreationDate || !facts.info.ModDate) idProblems.push('Info needs CreationDate and ModDate');
  if (!pdfx.documentId) idProblems.push('the trailer has no ID');
  if (press.standard === 'pdfx-4' && !(facts.xmp ?? '').includes(`<pdfxid:GTS_PDFXVersion>${std.gtsVersion}</pdfxid:GTS_PDFXVersion>`)) idProblems.push('the XMP metadata does not name PDF/X-4 (pdfxid:GTS_PDFXVersion)');
  if (facts.encrypted) idProblems.push('the file is encrypted');
  if (idProblems.length > 0) err('pdfx-id', `${std.gtsVersion}: ${idProblems.join('; ')}`);
  const intents = facts.outputIntents.filter((o) => o.subtype === 'GTS_PDFX');
  const intent = intents[0];
  if (!intent) err('output-intent', 'no GTS_PDFX output intent');
  else if (intents.length > 1) err('output-intent', `${intents.length} GTS_PDFX output intents; PDF/X allows one`);
  else if (!intent.identifier) err('output-intent', 'the output intent has no OutputConditionIdentifier');
  else if (std.needsProfile && (intent.profileBytes === null || intent.profileComponents !== 4)) err('output-intent', `${std.gtsVersion} needs the CMYK output profile embedded in the output intent`);
  else if (!std.needsProfile && intent.profileBytes === null && !intent.registry) err('output-intent', `the output condition "${intent.identifier}" is neither embedded nor named in a registry`);
  else if (intent.identifier !== press.condition) err('output-intent', `the output condition is "${intent.identifier}", but the press spec says "${press.condition}"`);

  // the template's floors, measured while laying out
  for (const g of metrics.illegibleGivens) err('given-illegible', `puzzle ${g.slot}: the given ${g.size} cannot be printed at ${t.minimums.digitPt} pt or more in its box`);
  // common practice: squares under about 3 mm are hard to see and to cut out
  if (metrics.smallestSquareMm !== null && metrics.smallestSquareMm < t.minimums.squareMm) {
    err('square-small', `smallest printed square is ${metrics.smallestSquareMm.toFixed(2)} mm, under the ${t.minimums.squareMm} mm minimum`);
  }
  // common practice: digits under about 6 pt are not legible in print
  if (metrics.smallestDigitPt !== null && metrics.smallestDigitPt < t.minimums.digitPt) {
    err('digit-small', `smallest digit is ${metrics.smallestDigitPt.toFixed(1)} pt, under the ${t.minimums.digitPt} pt minimum`);
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
    pages: pages.length,
    trimMm: { width: t.trim.widthMm, height: t.trim.heightMm },
    bleedMm: press.bleedMm,
    pageSizePt: { width: r1(input.pageSizePt.width), height: r1(input.pageSizePt.height) },
    fontsRegistered: input.fontsRegistered,
    embeddedFontFiles: [...fonts.values()].filter(Boolean).length,
    fontsEmbedded: fonts.size > 0 && unembedded.length === 0,
    smallestSquareMm: metrics.smallestSquareMm === null ? null : Math.round(metrics.smallestSquareMm * 100) / 100,
    smallestDigitPt: metrics.smallestDigitPt,
    omittedLabels: omitted,
    warnings: [...errors.map((e) => ({ ...e, code: `error:${e.code}` })), ...warnings],
    spec: press,
    pdfx,
    smallestTypePt,
    thinnestLinePt,
    pageReports: pages,
  };
}
