import "server-only";
import { config } from "./config";

/** The site's public address, used in links inside e-mails (BETTER_AUTH_URL). */
export function publicOrigin(): string {
  return config().auth.url;
}
