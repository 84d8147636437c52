import "server-only";

/**
 * The secret that signs sessions (better-auth) and unsubscribe links: required, at least 32 characters. `npm start` makes
 * one per checkout (.data/auth-secret); anything else must set BETTER_AUTH_SECRET. Without it nothing is signed with an
 * empty key: the request fails with this message instead.
 */
export function signingSecret(): string {
  const secret = process.env.BETTER_AUTH_SECRET ?? "";
  if (secret.length < 32) {
    throw new Error("BETTER_AUTH_SECRET is not set (or shorter than 32 characters): set it to a long random value, for example `openssl rand -base64 32`. `npm start` sets one for a local installation.");
  }
  return secret;
}
