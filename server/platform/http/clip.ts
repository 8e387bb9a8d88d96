// Error messages may quote what the caller sent ("number 123... is too large", "No API route
// GET /api/..."): a quoted value is cut to a short prefix, so an answer never echoes a 64 kB
// input back, and a whole message stays short.

const MAX_MESSAGE = 400;

/** Cut every run of more than 32 non-space characters to its first 24 and the whole text to 400. */
export function clipText(text: string): string {
  const words = text.replace(/\S{33,}/g, (w) => `${w.slice(0, 24)}... (${w.length} characters)`);
  return words.length > MAX_MESSAGE ? `${words.slice(0, MAX_MESSAGE - 3)}...` : words;
}

/** details: issue lists get their messages and paths clipped; anything else is left as it is. */
export function clipDetails(details: unknown): unknown {
  if (!Array.isArray(details)) return details;
  return details.slice(0, 50).map((d: unknown) => {
    if (d === null || typeof d !== 'object') return d;
    const out: Record<string, unknown> = { ...(d as Record<string, unknown>) };
    if (typeof out.message === 'string') out.message = clipText(out.message);
    if (typeof out.path === 'string' && out.path.length > 200) out.path = `${out.path.slice(0, 197)}...`;
    return out;
  });
}
