import { json, route } from "@/features/platform/server/http";
import { calendarFeed } from "@/features/messages/server/preferences";

/** GET /api/calendar/<token>.ics: the private iCalendar feed of an athlete's plan. No sign-in: the token is the key. */
export const GET = route<RouteContext<"/api/calendar/[feed]">>(async (_req, ctx) => {
  const { feed } = await ctx.params;
  const token = feed.endsWith(".ics") ? feed.slice(0, -4) : "";
  const ics = token ? await calendarFeed(token) : null;
  if (!ics) return json({ error: "No such calendar feed. It may have been renewed or switched off." }, { status: 404 });
  return new Response(ics, {
    headers: { "content-type": "text/calendar; charset=utf-8", "cache-control": "private, max-age=300" },
  });
});
