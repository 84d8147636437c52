import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { json, readJson, route } from "@/features/platform/server/http";
import { getNotificationSettings, updateNotificationSettings } from "@/features/messages/server/preferences";
import { timeZoneSchema } from "@/features/platform/lib/time-zones";

export const GET = route(async (req) => json(await getNotificationSettings(await requireActor(req.headers))));

/** PATCH {timeZone?, coachDigest?, messageEmails?}: the coach digest, the time zone it follows, and e-mails about new
 * messages on the person's threads. */
export const PATCH = route(async (req) => {
  const actor = await requireActor(req.headers);
  const body = await readJson(
    req,
    z
      .object({
        timeZone: timeZoneSchema.optional(),
        coachDigest: z.boolean({ error: "coachDigest is true or false." }).optional(),
        messageEmails: z.boolean({ error: "messageEmails is true or false." }).optional(),
      })
      .strict()
      .refine((b) => Object.keys(b).length > 0, { message: "Nothing to change." }),
  );
  return json(await updateNotificationSettings(actor, body));
});
