import "server-only";
import { eq, inArray } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import type { Actor } from "@/features/access/lib/rules";
import type { Units } from "@/features/platform/lib/units";
import { forgetUserSessions } from "./session-memo";

/** The person's own units (metric or imperial). The remembered sessions forget the old value at once. */
export async function updateUnits(actor: Actor, units: Units): Promise<{ units: Units }> {
  await getDb().update(schema.user).set({ units, updatedAt: new Date() }).where(eq(schema.user.id, actor.userId));
  forgetUserSessions(actor.userId);
  return { units };
}

/** The units of several people at once (e-mails to many recipients), metric for anyone unknown. */
export async function unitsOf(userIds: string[]): Promise<Map<string, Units>> {
  if (!userIds.length) return new Map();
  const rows = await getDb()
    .select({ id: schema.user.id, units: schema.user.units })
    .from(schema.user)
    .where(inArray(schema.user.id, userIds));
  return new Map(rows.map((r) => [r.id, r.units === "imperial" ? "imperial" : "metric"]));
}
