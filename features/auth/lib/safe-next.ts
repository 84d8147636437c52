/**
 * Where to go after signing in: `next` resolved against this site, and only when it stays on it. Browsers read `/\host`
 * and `/<tab>/host` as another site, so a prefix check on the text is not enough.
 */
export function safeNext(next: string | undefined, origin: string): string {
  if (!next) return "/home";
  try {
    const url = new URL(next, origin);
    if (url.origin !== origin || url.pathname.startsWith("//")) return "/home";
    return `${url.pathname}${url.search}${url.hash}`;
  } catch {
    return "/home";
  }
}
