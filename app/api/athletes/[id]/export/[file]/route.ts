import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { EXPORT_FILES, exportCsv } from "@/features/exports/server/exports";
import { isoDate } from "@/features/platform/lib/date-schema";
import { parseParams, parseQuery, route } from "@/features/platform/server/http";

const params = z.object({ id: z.string().min(1).max(100), file: z.enum(EXPORT_FILES) });
const query = z.object({ from: isoDate.optional(), to: isoDate.optional() }).strict();

/** GET /api/athletes/:id/export/plan.csv | logs.csv | zones.csv [?from&to]: a download for the athlete and their coaches. */
export const GET = route<RouteContext<"/api/athletes/[id]/export/[file]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id, file } = parseParams(await ctx.params, params);
  const range = parseQuery(req, query, "Give ?from=YYYY-MM-DD&to=YYYY-MM-DD, or neither.");
  const { filename, csv } = await exportCsv(actor, id, file, new Date().toISOString().slice(0, 10), range);
  // A byte-order mark so that spreadsheet programs read the file as UTF-8.
  return new Response(`\uFEFF${csv}\r\n`, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${filename}"`,
      "cache-control": "private, no-store",
    },
  });
});
