import { requireActor } from "@/features/access/server/permissions";
import { json, route } from "@/features/platform/server/http";
import { publicOrigin } from "@/features/platform/server/origin";
import { renewCalendarToken, revokeCalendarToken } from "@/features/messages/server/preferences";

/** POST: a new private feed address (any old one stops working). */
export const POST = route(async (req) => {
  const actor = await requireActor(req.headers);
  const token = await renewCalendarToken(actor);
  return json({ url: `${publicOrigin()}/api/calendar/${token}.ics` }, { status: 201 });
});

/** DELETE: the feed is switched off. */
export const DELETE = route(async (req) => {
  await revokeCalendarToken(await requireActor(req.headers));
  return new Response(null, { status: 204 });
});
