import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { downloadResponse, EXPORT_FILES, exportFile } from "@/features/exports/server/exports";
import { isoDate } from "@/features/platform/lib/date-schema";
import { parseParams, parseQuery, route } from "@/features/platform/server/http";

const params = z.object({
  id: z.string().min(1).max(100),
  file: z.enum(EXPORT_FILES, { error: `Ask for one of ${EXPORT_FILES.join(", ")}.` }),
});
const query = z.object({ from: isoDate.optional(), to: isoDate.optional() }).strict();

/**
 * GET /api/athletes/:id/export/{plan,logs,zones}.{csv,xlsx} [?from&to]: a download for the athlete and their coaches.
 */
export const GET = route<RouteContext<"/api/athletes/[id]/export/[file]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id, file } = parseParams(await ctx.params, params);
  const range = parseQuery(req, query, "Give ?from=YYYY-MM-DD&to=YYYY-MM-DD, or neither.");
  return downloadResponse(await exportFile(actor, id, file, new Date().toISOString().slice(0, 10), range, actor.units));
});
