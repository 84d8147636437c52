import "server-only";

/** The site's public address, used in links inside e-mails. */
export function publicOrigin(): string {
  return (process.env.BETTER_AUTH_URL ?? "http://127.0.0.1:3000").replace(/\/$/, "");
}
