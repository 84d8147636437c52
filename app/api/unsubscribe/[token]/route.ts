import { json, route } from "@/features/platform/server/http";
import { unsubscribe } from "@/features/messages/server/preferences";

/** RFC 8058 one-click unsubscribe: mail programs POST here from the List-Unsubscribe header; no sign-in. */
export const POST = route<RouteContext<"/api/unsubscribe/[token]">>(
  async (_req, ctx) => {
    const { token } = await ctx.params;
    let decoded: string;
    try {
      decoded = decodeURIComponent(token);
    } catch {
      return json({ error: "This unsubscribe link is not valid." }, { status: 404 });
    }
    const done = await unsubscribe(decoded);
    if (!done) return json({ error: "This unsubscribe link is not valid." }, { status: 404 });
    return json({ turnedOff: done.kind, message: `Turned off ${done.label} for ${done.email}.` });
  },
  // Mail programs post here from their own servers; the signed token is the only authority, no cookie is used.
  { crossSite: true },
);
