/** 497314 -> '8 min 17 s'; under a minute '42 s'; an hour or more '1 h 05 min'. */
export function durationText(ms: number): string {
  const s = Math.round(ms / 1000);
  if (s < 60) return `${s} s`;
  const m = Math.floor(s / 60);
  if (m < 60) return `${m} min ${String(s % 60).padStart(2, '0')} s`;
  return `${Math.floor(m / 60)} h ${String(m % 60).padStart(2, '0')} min`;
}

/** 0.128 -> '13%'; null -> '–' */
export function percentText(v: number | null): string {
  return v === null ? '\u2013' : `${Math.round(v * 100)}%`;
}

/** The snippet a publisher pastes: the embed page in an iframe and the height script. */
export function embedSnippet(origin: string, embedPath: string, title: string): string {
  return `<iframe data-squarewright src="${origin}${embedPath}" title="${title.replace(/"/g, '&quot;')}" width="100%" height="640" style="border:0" loading="lazy"></iframe>\n<script src="${origin}/embed/frame.js" async></script>`;
}
