import type { Play, PublicEdition, PublicEditionList, PublicPuzzle } from '../../../shared/contracts/reader';
import { readerPaths } from '../../../shared/contracts/reader';
import type { SolvedTiling } from '../print/index';
import { html, jsonForScript, raw, richTextHtml, type Raw } from './html';
import type { ReaderAssets } from './page-assets';

// The readers' pages as HTML, rendered on the server: the first paint needs no script (a
// reader on a slow link, or without JavaScript, sees the puzzle to solve on paper). The
// puzzle page hands its play data to the small play script in a JSON block; the script
// replaces the static drawing with the board. Embed pages are the same pages without the
// site's header and footer, for an <iframe> on a publisher's own site.

export type PageMode = { embed: boolean; assets: ReaderAssets };

const dateFormat = new Intl.DateTimeFormat('en-GB', { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });
/** '2026-11-28' -> 'Saturday 28 November 2026' */
export function longDate(isoDay: string): string {
  return dateFormat.format(new Date(`${isoDay}T12:00:00Z`));
}

function whenText(iso: string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-GB', { weekday: 'long', day: 'numeric', month: 'long', hour: '2-digit', minute: '2-digit', timeZone, timeZoneName: 'short' }).format(new Date(iso));
}

const kindName = { assembly: 'Assembly', deduction: 'Deduction' } as const;

/** What readers' data we keep: on every public page (the usual caution for public pages). */
export function privacyNote(): Raw {
  return html`<aside aria-label="What we keep when you play" class="mt-8 rounded-md border border-rule bg-surface px-4 py-3 text-sm text-ink-soft">
  <p class="font-semibold text-ink">What we keep when you play</p>
  <p class="mt-1">Your progress and timer stay in this browser (its local storage), so you can come back to a puzzle; clear your browser's site data to remove them. To learn how hard our puzzles really are, the page sends anonymous events: started, checked, revealed and finished, with the time played and a random play number made in your browser. No cookies, no account, and no name, address, device or location details are stored. To stop floods of checks, your network address is held in memory for one minute and never written down.</p>
</aside>`;
}

function layout(mode: PageMode, o: { title: string; description: string; main: Raw; data?: unknown; scripts: ('play' | 'embed')[]; canonical?: string | undefined }): string {
  const scripts = mode.embed ? [...new Set<'play' | 'embed'>([...o.scripts, 'embed'])] : o.scripts;
  const header = mode.embed
    ? ''
    : html`<header class="border-b border-rule bg-surface"><div class="mx-auto flex max-w-3xl items-center gap-3 px-4 py-3"><a href="/read" class="flex items-center gap-2 font-semibold text-ink no-underline">${markSvg()}<span>Squarewright puzzles</span></a></div></header>`;
  const footer = mode.embed
    ? ''
    : html`<footer class="mx-auto max-w-3xl px-4 pb-10 text-xs text-ink-muted"><p>Puzzles built on squared rectangles: every puzzle has exactly one solution, checked by our engine.</p></footer>`;
  const page = html`<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${o.title}</title>
<meta name="description" content="${o.description}">
<link rel="icon" type="image/svg+xml" href="/favicon.svg">
${o.canonical ? html`<link rel="canonical" href="${o.canonical}">` : ''}
${mode.assets.tags(scripts)}
</head>
<body class="${mode.embed ? 'reader-embed bg-surface' : 'bg-paper'} text-ink">
${header}
<main id="main" class="mx-auto max-w-3xl px-4 ${mode.embed ? 'py-3' : 'py-6'}">${o.main}</main>
${footer}
${o.data === undefined ? '' : html`<script type="application/json" id="reader-data">${jsonForScript(o.data)}</script>`}
</body>
</html>`;
  return page.text;
}

function markSvg(): Raw {
  // our mark: a small squared rectangle (3 x 2 cut into a 2, and two 1s)
  return raw('<svg aria-hidden="true" width="28" height="19" viewBox="0 0 3 2"><rect x="0" y="0" width="2" height="2" fill="#b5522b"/><rect x="2" y="0" width="1" height="1" fill="#1f2328"/><rect x="2" y="1" width="1" height="1" fill="#c4baa8"/></svg>');
}

function gradeBadge(grade: number, note: string | null): Raw {
  return html`<span class="inline-flex items-center rounded border border-rule-strong px-1.5 py-0.5 text-xs font-semibold text-ink-soft" title="${note ? `Grade adjusted by the editor: ${note}` : 'Grade 1 (gentle) to 5 (fiendish)'}">Grade ${grade} of 5${note ? ' (adjusted)' : ''}</span>`;
}

function link(mode: PageMode, path: string): string {
  return mode.embed ? path.replace(/^\/read\//, '/embed/') : path;
}

function solutionsText(e: Pick<PublicEdition, 'solutionsPublic' | 'solutionsFrom' | 'solutionRule' | 'publication'>): string {
  if (e.solutionsPublic) return 'The solutions are public: each puzzle has its solution page, and Reveal works on every puzzle.';
  if (e.solutionsFrom) return `The solutions appear on ${whenText(e.solutionsFrom, e.publication.timeZone)}. Until then, Check tells you which entries are wrong.`;
  return e.solutionRule === 'next_edition'
    ? 'The solutions appear with the next edition. Until then, Check tells you which entries are wrong.'
    : 'The solutions appear with this edition.';
}

// ---- pages ----------------------------------------------------------------------------------

export function notFoundPage(mode: PageMode): string {
  return layout(mode, {
    title: 'No such page \u2013 Squarewright puzzles',
    description: 'There is no such page.',
    scripts: [],
    main: html`<h1 class="font-serif text-2xl font-semibold">There is no such page</h1><p class="mt-3 text-ink-soft">Check the address. Puzzles appear here when their edition is published.</p>`,
  });
}

export function indexPage(mode: PageMode, pubs: { slug: string; title: string; publisher: string }[]): string {
  return layout(mode, {
    title: 'Squarewright puzzles',
    description: 'Puzzles built on squared rectangles, from the publications that print them.',
    scripts: [],
    main: html`<h1 class="font-serif text-3xl font-semibold">Puzzles to play</h1>
${pubs.length === 0
  ? html`<p class="mt-4 text-ink-soft">No edition is out yet.</p>`
  : html`<ul class="mt-5 divide-y divide-rule rounded-md border border-rule bg-surface">${pubs.map(
      (p) => html`<li><a class="flex flex-wrap items-baseline justify-between gap-2 px-4 py-3" href="${readerPaths.publication(p.slug)}"><span class="font-semibold">${p.title}</span><span class="text-sm text-ink-soft">${p.publisher}</span></a></li>`,
    )}</ul>`}
${privacyNote()}`,
  });
}

export function publicationPage(mode: PageMode, list: PublicEditionList): string {
  const p = list.publication;
  return layout(mode, {
    title: `${p.title} \u2013 puzzles`,
    description: `Play the puzzles of ${p.title} from ${p.publisher}.`,
    scripts: [],
    main: html`<p class="text-sm text-ink-muted">${p.publisher}</p>
<h1 class="font-serif text-3xl font-semibold">${p.title}</h1>
${list.editions.length === 0
  ? html`<p class="mt-4 text-ink-soft">No edition is out yet.</p>`
  : html`<ul class="mt-5 divide-y divide-rule rounded-md border border-rule bg-surface">${list.editions.map(
      (e) => html`<li><a class="flex flex-wrap items-baseline justify-between gap-2 px-4 py-3" href="${link(mode, e.path)}"><span class="font-semibold">No. ${e.number}</span><span class="text-sm text-ink-soft">${longDate(e.date)} \u00b7 ${e.puzzles} puzzle${e.puzzles === 1 ? '' : 's'}</span></a></li>`,
    )}</ul>`}
${privacyNote()}`,
  });
}

export function editionPage(mode: PageMode, e: PublicEdition): string {
  const p = e.publication;
  return layout(mode, {
    title: `${p.title} No. ${e.number} \u2013 puzzles`,
    description: `${e.puzzles.length} puzzles from ${p.title} No. ${e.number}, ${longDate(e.date)}.`,
    scripts: [],
    main: html`<nav aria-label="Where you are" class="text-sm text-ink-muted"><a href="${link(mode, readerPaths.publication(p.slug))}">${p.title}</a></nav>
<h1 class="mt-1 font-serif text-3xl font-semibold">${p.title} No. ${e.number}</h1>
<p class="text-sm text-ink-muted">${longDate(e.date)} \u00b7 ${p.publisher}</p>
<div class="prose-reader mt-4 font-serif text-lg leading-relaxed">${richTextHtml(e.introduction, 2)}</div>
<p class="mt-3 text-sm text-ink-soft">${solutionsText(e)}</p>
<h2 class="mt-6 text-lg font-semibold">Puzzles</h2>
<ol class="mt-2 space-y-3">${e.puzzles.map(
      (z) => html`<li class="rounded-md border border-rule bg-surface p-4">
<div class="flex flex-wrap items-baseline justify-between gap-2"><h3 class="font-serif text-xl font-semibold"><a href="${link(mode, z.path)}">${z.position}. ${z.title}</a></h3>${gradeBadge(z.grade, z.gradeNote)}</div>
<p class="text-sm text-ink-muted">${kindName[z.kind]} \u00b7 ${z.sizeText}</p>
<div class="mt-2 text-ink-soft">${richTextHtml(z.instructions)}</div>
<p class="mt-3 flex flex-wrap gap-4"><a class="font-semibold" href="${link(mode, z.path)}">Play ${z.title}</a>${e.solutionsPublic ? html`<a href="${link(mode, `${z.path}/solution`)}">Solution</a>` : ''}</p>
</li>`,
    )}</ol>
${privacyNote()}`,
  });
}

/** The puzzle as printed (no answer): the first paint, and what a reader without scripts gets. */
export function staticBoard(play: Play): Raw {
  if (play.kind === 'assembly') {
    const { W, H } = play.frame;
    const starters = play.starters.map((s) => {
      const size = play.pieces[s.piece]!;
      return html`<rect x="${s.x}" y="${s.y}" width="${size}" height="${size}" fill="#efeae0" stroke="#1f2328" vector-effect="non-scaling-stroke"/><text x="${s.x + size / 2}" y="${s.y + size / 2}" font-size="${Math.max(1, size * 0.45)}" text-anchor="middle" dominant-baseline="central" fill="#1f2328">${size}</text>`;
    });
    return html`<figure class="rounded-md border border-rule bg-surface p-3"><svg role="img" aria-label="The frame, ${W} by ${H}${play.starters.length > 0 ? `, with ${play.starters.length} starter piece${play.starters.length === 1 ? '' : 's'} in place` : ''}" viewBox="-0.5 -0.5 ${W + 1} ${H + 1}" class="mx-auto block h-auto w-full max-w-xl"><rect x="0" y="0" width="${W}" height="${H}" fill="#fffdf9" stroke="#1f2328" stroke-width="2" vector-effect="non-scaling-stroke"/>${starters}</svg>
<figcaption class="mt-2 text-sm text-ink-soft">Frame ${W} \u00d7 ${H}. Pieces: ${play.pieces.join(', ')}.</figcaption></figure>`;
  }
  const d = play.drawing;
  const givens = new Map(play.givens.map((g) => [g.square, g.size]));
  const cells = d.rects.map((r, i) => {
    const g = givens.get(i);
    return html`<rect x="${r.x}" y="${r.y}" width="${r.w}" height="${r.h}" fill="#fffdf9" stroke="#1f2328" vector-effect="non-scaling-stroke"/>${g === undefined ? '' : html`<text x="${r.x + r.w / 2}" y="${r.y + r.h / 2}" font-size="${Math.min(r.w, r.h) * 0.4}" text-anchor="middle" dominant-baseline="central" fill="#1f2328" font-weight="600">${g}</text>`}`;
  });
  return html`<figure class="rounded-md border border-rule bg-surface p-3"><svg role="img" aria-label="The drawing: ${d.rects.length} squares, not to scale, ${play.givens.length} sizes given" viewBox="0 0 ${d.W} ${d.H}" class="mx-auto block h-auto w-full max-w-xl">${cells}</svg>
<figcaption class="mt-2 text-sm text-ink-soft">Not to scale.${play.frame ? ` The frame is ${play.frame.W} \u00d7 ${play.frame.H}.` : ''}</figcaption></figure>`;
}

export function puzzlePage(mode: PageMode, z: PublicPuzzle, api: string): string {
  const e = z.edition;
  const p = e.publication;
  return layout(mode, {
    title: `${z.title} \u2013 ${p.title} No. ${e.number}`,
    description: `${kindName[z.kind]} puzzle, grade ${z.grade} of 5, from ${p.title} No. ${e.number}.`,
    scripts: ['play'],
    data: { api, play: z.play, solutionsPublic: e.solutionsPublic, embed: mode.embed },
    main: html`<nav aria-label="Where you are" class="text-sm text-ink-muted"><a href="${link(mode, e.path)}">${p.title} No. ${e.number}</a></nav>
<div class="mt-1 flex flex-wrap items-baseline justify-between gap-2"><h1 class="font-serif text-2xl font-semibold sm:text-3xl">${z.title}</h1>${gradeBadge(z.grade, z.gradeNote)}</div>
<p class="text-sm text-ink-muted">${kindName[z.kind]} \u00b7 ${z.sizeText}</p>
${z.gradeNote ? html`<p class="mt-1 text-sm text-ink-soft">Editor\u2019s note on the grade: ${z.gradeNote}</p>` : ''}
<div class="mt-3 text-ink-soft">${richTextHtml(z.instructions)}</div>
<div id="play" class="mt-4">${staticBoard(z.play)}<noscript><p class="mt-2 text-sm">Playing here needs JavaScript; the puzzle above can be solved on paper.</p></noscript></div>
<p class="mt-3 text-sm text-ink-soft">${solutionsText(e)}</p>
<nav aria-label="Other puzzles in this edition" class="mt-4 flex justify-between text-sm">${z.previousPath ? html`<a href="${link(mode, z.previousPath)}">Previous puzzle</a>` : html`<span></span>`}${z.nextPath ? html`<a href="${link(mode, z.nextPath)}">Next puzzle</a>` : html`<span></span>`}</nav>
${privacyNote()}`,
  });
}

function solvedSvg(t: SolvedTiling, title: string): Raw {
  const cells = t.squares.map(
    (q) => html`<rect x="${q.x}" y="${q.y}" width="${q.s}" height="${q.s}" fill="#fffdf9" stroke="#1f2328" vector-effect="non-scaling-stroke"/><text x="${q.x + q.s / 2}" y="${q.y + q.s / 2}" font-size="${Math.max(0.8, q.s * 0.42)}" text-anchor="middle" dominant-baseline="central" fill="#1f2328">${q.s}</text>`,
  );
  return html`<svg role="img" aria-label="${title}" viewBox="-0.5 -0.5 ${t.W + 1} ${t.H + 1}" class="mx-auto block h-auto w-full max-w-xl">${cells}</svg>`;
}

export function solutionPage(mode: PageMode, z: PublicPuzzle, solution: { tiling: SolvedTiling; steps: string[] }): string {
  const e = z.edition;
  const p = e.publication;
  return layout(mode, {
    title: `Solution: ${z.title} \u2013 ${p.title} No. ${e.number}`,
    description: `The solution of ${z.title} from ${p.title} No. ${e.number}.`,
    scripts: [],
    main: html`<nav aria-label="Where you are" class="text-sm text-ink-muted"><a href="${link(mode, e.path)}">${p.title} No. ${e.number}</a> \u00b7 <a href="${link(mode, z.path)}">${z.title}</a></nav>
<h1 class="mt-1 font-serif text-2xl font-semibold">Solution: ${z.title}</h1>
<figure class="mt-4 rounded-md border border-rule bg-surface p-3">${solvedSvg(solution.tiling, `The solved ${solution.tiling.W} by ${solution.tiling.H} rectangle with every square's size`)}<figcaption class="mt-2 text-sm text-ink-soft">${solution.tiling.W} \u00d7 ${solution.tiling.H}, ${solution.tiling.squares.length} squares.</figcaption></figure>
${solution.steps.length > 0 ? html`<h2 class="mt-5 text-lg font-semibold">One way to deduce it</h2><ol class="mt-2 list-decimal space-y-1 pl-6 text-ink-soft">${solution.steps.map((s) => html`<li>${s}</li>`)}</ol>` : ''}
${privacyNote()}`,
  });
}
