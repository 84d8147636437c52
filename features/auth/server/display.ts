import "server-only";
import { eq } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import type { Actor } from "@/features/access/lib/rules";
import type { DateStyle } from "@/features/platform/lib/date-format";
import type { Units } from "@/features/platform/lib/units";
import { forgetUserSessions } from "./session-memo";

export interface DisplaySettings {
  units: Units;
  dateStyle: DateStyle;
}

/**
 * The person's own display settings: units (metric or imperial) and how dates read. Either may be left out to keep it.
 * The remembered sessions forget the old values at once.
 */
export async function updateDisplay(
  actor: Actor & DisplaySettings,
  change: Partial<DisplaySettings>,
): Promise<DisplaySettings> {
  const next: DisplaySettings = { units: change.units ?? actor.units, dateStyle: change.dateStyle ?? actor.dateStyle };
  await getDb()
    .update(schema.user)
    .set({ ...next, updatedAt: new Date() })
    .where(eq(schema.user.id, actor.userId));
  forgetUserSessions(actor.userId);
  return next;
}
