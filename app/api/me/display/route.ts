import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { updateDisplay } from "@/features/auth/server";
import { DATE_STYLES } from "@/features/platform/lib/date-format";
import { UNIT_SYSTEMS } from "@/features/platform/lib/units";
import { json, readJson, route } from "@/features/platform/server/http";

/** GET: the person's display settings ({units, dateStyle}). */
export const GET = route(async (req) => {
  const actor = await requireActor(req.headers);
  return json({ units: actor.units, dateStyle: actor.dateStyle });
});

/**
 * PATCH {units?, dateStyle?}: metric or imperial, and how dates read ("iso", "day-month", "month-day"), for everything
 * this person reads (pages and e-mails; downloads follow the units but keep ISO dates, which spreadsheets read as dates).
 */
export const PATCH = route(async (req) => {
  const actor = await requireActor(req.headers);
  const body = await readJson(
    req,
    z
      .object({
        units: z.enum(UNIT_SYSTEMS, { error: "Choose metric or imperial." }).optional(),
        dateStyle: z
          .enum(DATE_STYLES, { error: 'Choose how dates read: "iso", "day-month" or "month-day".' })
          .optional(),
      })
      .strict()
      .refine((b) => b.units !== undefined || b.dateStyle !== undefined, {
        error: "Send units, dateStyle or both.",
      }),
  );
  return json(await updateDisplay(actor, body));
});
