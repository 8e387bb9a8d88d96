/** Only same-site paths are followed after sign-in ("/stock?x=1" yes; "//evil", "/\\evil" or "https://..." no). */
export function safeNextPath(next: string | null | undefined): string | undefined {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return undefined;
  return next;
}
