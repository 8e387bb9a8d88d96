// Examples for the routes whose schemas a made-up example cannot satisfy (a refinement ties
// fields together: exactly one of code or squares, a page whose margins must fit). Keyed by
// `METHOD path` as registered. The document shows one only if the route's own zod schema accepts
// it, and tests/server/platform/openapi-document.test.ts fails when a JSON body or answer has none.
// (A route can also give its own: `examples` in its route() spec.)

const a4 = {
  id: 'a4',
  name: 'A4 magazine page',
  description: 'ISO A4 page in two columns, for monthly magazines and puzzle books.',
  trim: { widthMm: 210, heightMm: 297 },
  bleedMm: 3,
  cropMarks: { offsetMm: 0.5, lengthMm: 2.5 },
  marginsMm: { top: 16, right: 15, bottom: 18, left: 15 },
  columns: 2,
  gutterMm: 6,
  type: { titlePt: 20, headingPt: 12, bodyPt: 10, captionPt: 8, digitsPt: 10, lineHeight: 1.35 },
  drawing: { maxHeightMm: 110, strokePt: 0.6 },
  minimums: { digitPt: 6, squareMm: 3, bodyPt: 7 },
  press: { standard: 'pdfx-1a', condition: 'FOGRA39', minTypePt: 6, minLinePt: 0.25 },
  maxSlots: 12,
};

const readerSettings = { slug: 'saturday-quadrant', timeZone: 'Europe/London', releaseTime: '06:00', embedOrigins: ['https://www.larkspurquill.example'] };

export const routeExamples: Record<string, { request?: unknown; response?: unknown }> = {
  'POST /api/submissions': { request: { code: '9 33 32 (18,15)(7,8)(14,4)(10,1)(9)', title: 'Harbour lights', source: 'paste' } },
  'GET /api/templates': { response: { templates: [{ template: a4, pageWidthMm: 216, pageHeightMm: 303, columnWidthMm: 87 }] } },
  'GET /api/reader/settings': { response: { items: [{ ...readerSettings, publicationId: 'pub-1', publicationTitle: 'The Saturday Quadrant', solutionRule: 'next_edition' }] } },
  'PUT /api/reader/settings/:id': {
    request: readerSettings,
    response: { ...readerSettings, publicationId: 'pub-1', publicationTitle: 'The Saturday Quadrant', solutionRule: 'next_edition' },
  },
};
