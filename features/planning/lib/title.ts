/** A session's title with its length: "Long run 90 min" is not followed by "· 90 min" again; another title gets it. */
export function titleWithLength(title: string, minutes: number): string {
  const t = title.trim();
  return new RegExp(`\\b${minutes}\\s*min\\.?$`).test(t) ? t : `${t} · ${minutes} min`;
}
