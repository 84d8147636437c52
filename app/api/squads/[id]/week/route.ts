import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { squadWeekTable } from "@/features/exports/lib/csv";
import { asDownload, downloadResponse } from "@/features/exports/server/exports";
import { json, parseParams, parseQuery, route } from "@/features/platform/server/http";
import { isoDate } from "@/features/planning/schemas";
import { squadWeek } from "@/features/planning/server";
import { idParam } from "@/features/platform/lib/params";
import { mondayOf } from "@/features/platform/lib/days";

const query = z.object({ week: isoDate, format: z.enum(["json", "csv", "xlsx"]).default("json") }).strict();

/**
 * GET /api/squads/:id/week?week=YYYY-MM-DD: every athlete's sessions and budget state in that ISO week; `&format=csv` or
 * `&format=xlsx` downloads it as a spreadsheet (coaches of the squad only, as the JSON).
 */
export const GET = route<RouteContext<"/api/squads/[id]/week">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const { week, format } = parseQuery(
    req,
    query,
    "Give ?week=YYYY-MM-DD, and format=csv or format=xlsx for a download.",
  );
  const rows = await squadWeek(actor, id, week);
  if (format === "json") return json(rows);
  const monday = mondayOf(week);
  return downloadResponse(
    await asDownload(`squad-week-${monday}`, `Week of ${monday}`, squadWeekTable(monday, rows), format),
  );
});
