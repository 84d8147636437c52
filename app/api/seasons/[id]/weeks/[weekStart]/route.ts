import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { isoDate, seasonWeekPatchSchema } from "@/features/planning/schemas";
import { updateSeasonWeek } from "@/features/planning/server";

/** PATCH one generated week of a season: block, role, volume target, budget preset, retest. */
export const PATCH = route<RouteContext<"/api/seasons/[id]/weeks/[weekStart]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id, weekStart } = parseParams(
    await ctx.params,
    z.object({ id: z.string().min(1).max(100), weekStart: isoDate }),
  );
  return json(await updateSeasonWeek(actor, id, weekStart, await readJson(req, seasonWeekPatchSchema)));
});
