import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { squadWeekCsv } from "@/features/exports/lib/csv";
import { json, parseParams, parseQuery, route } from "@/features/platform/server/http";
import { isoDate } from "@/features/planning/schemas";
import { squadWeek } from "@/features/planning/server";
import { idParam } from "@/features/platform/lib/params";
import { mondayOf } from "@/features/platform/lib/days";

const query = z.object({ week: isoDate, format: z.enum(["json", "csv"]).default("json") }).strict();

/**
 * GET /api/squads/:id/week?week=YYYY-MM-DD: every athlete's sessions and budget state in that ISO week; `&format=csv`
 * downloads it as a spreadsheet (coaches of the squad only, as the JSON).
 */
export const GET = route<RouteContext<"/api/squads/[id]/week">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const { week, format } = parseQuery(req, query, "Give ?week=YYYY-MM-DD, and format=csv for a download.");
  const rows = await squadWeek(actor, id, week);
  if (format === "json") return json(rows);
  const monday = mondayOf(week);
  // A byte-order mark so that spreadsheet programs read the file as UTF-8.
  return new Response(`\uFEFF${squadWeekCsv(monday, rows)}\r\n`, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="squad-week-${monday}.csv"`,
      "cache-control": "private, no-store",
    },
  });
});
