/**
 * Managed profiles: athletes a coach set up without an e-mail address. Their placeholder address is at a `.invalid`
 * domain, which RFC 2606 reserves so that it can never exist: nothing can be delivered there by mistake.
 */
export const PLACEHOLDER_DOMAIN = "athletes.invalid";

export const placeholderEmail = (id: string) => `managed-${id}@${PLACEHOLDER_DOMAIN}`;

export function isPlaceholderEmail(email: string): boolean {
  return email.toLowerCase().endsWith(`@${PLACEHOLDER_DOMAIN}`);
}

/** The address as people read it: a placeholder reads as what it means. */
export function shownEmail(email: string): string {
  return isPlaceholderEmail(email) ? "no e-mail yet (profile kept by the coach)" : email;
}
