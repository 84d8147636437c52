import { json, route } from "@/features/platform/server/http";
import { unsubscribe } from "@/features/messages/server/preferences";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ token: string }> };

/** RFC 8058 one-click unsubscribe: mail programs POST here from the List-Unsubscribe header; no sign-in. */
export const POST = route<Ctx>(async (_req, ctx) => {
  const { token } = await ctx.params;
  const done = await unsubscribe(decodeURIComponent(token));
  if (!done) return json({ error: "This unsubscribe link is not valid." }, { status: 404 });
  return json({ turnedOff: done.kind, message: `Turned off ${done.label} for ${done.email}.` });
});
