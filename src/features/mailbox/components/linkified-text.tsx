import type { ReactNode } from 'react';

const urlPattern = /\bhttps?:\/\/[^\s<>"')\]]+/g;

/**
 * Plain mail text with every http(s) URL turned into a link. The text is never parsed
 * as HTML, so a caught mail cannot inject markup into the page.
 */
export function LinkifiedText({ text }: { text: string }) {
  const parts: ReactNode[] = [];
  let last = 0;
  for (const match of text.matchAll(urlPattern)) {
    const start = match.index;
    const url = match[0].replace(/[.,;:!?]+$/, '');
    if (start > last) parts.push(text.slice(last, start));
    parts.push(
      <a key={`${start}-${url}`} href={url} className="break-all underline">
        {url}
      </a>,
    );
    last = start + url.length;
  }
  if (last < text.length) parts.push(text.slice(last));
  return <div className="font-serif text-[0.98rem] leading-relaxed whitespace-pre-wrap text-ink">{parts}</div>;
}
