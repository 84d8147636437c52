/** Text put into a sentence of an e-mail, ending with one full stop: none added when it already ends a sentence. */
export function sentence(text: string): string {
  const t = text.trim();
  return /[.!?…]$/.test(t) ? t : `${t}.`;
}
