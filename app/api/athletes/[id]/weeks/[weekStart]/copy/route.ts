import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { copyWeekSchema, isoDate } from "@/features/planning/schemas";
import { copyWeek } from "@/features/planning/server";

/** POST /api/athletes/:id/weeks/:weekStart/copy: the athlete's week (training sessions) into later weeks of their plan. */
export const POST = route<RouteContext<"/api/athletes/[id]/weeks/[weekStart]/copy">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id, weekStart } = parseParams(
    await ctx.params,
    z.object({
      id: z.string().min(1).max(100),
      weekStart: isoDate.refine((d) => new Date(`${d}T00:00:00Z`).getUTCDay() === 1, "Give the Monday of the week."),
    }),
  );
  const answer = await copyWeek(actor, id, weekStart, await readJson(req, copyWeekSchema));
  return json(answer, { status: answer.preview ? 200 : 201 });
});
