import "server-only";
import { randomUUID } from "node:crypto";
import { and, eq, ne, sql } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { isCoachOf, type Actor } from "@/features/access/lib/rules";
import { requireAthleteAccessOrNotFound } from "@/features/access/server";
import { getAuth } from "@/features/auth/server";
import { forbidden, HttpError, notFound } from "@/features/platform/server/http";
import { placeholderEmail } from "../lib/managed";

/**
 * A coach of the squad adds an athlete who has no e-mail address yet: a profile that cannot sign in and gets no e-mail,
 * so that a test can be recorded and a plan made at once. One transaction.
 */
export async function addManagedAthlete(
  actor: Actor,
  squadId: string,
  input: { name: string; sports: string[] },
): Promise<{ id: string; name: string }> {
  if (!isCoachOf(actor, squadId)) {
    if (actor.memberships.some((m) => m.squadId === squadId)) throw forbidden("Only the squad's coaches add athletes.");
    throw notFound("No such squad.");
  }
  const id = randomUUID();
  await getDb().transaction(async (tx) => {
    await tx.insert(schema.user).values({
      id,
      name: input.name,
      email: placeholderEmail(id),
      emailVerified: false,
      managed: true,
    });
    await tx.insert(schema.membership).values({ squadId, userId: id, role: "athlete" });
    await tx.insert(schema.athleteProfile).values({
      userId: id,
      sports: input.sports,
      // Nothing is sent to a profile without an address.
      remindSessions: false,
      remindRetests: false,
    });
  });
  return { id, name: input.name };
}

/**
 * A coach hands a managed profile over to the athlete: the profile takes the athlete's address and a link to choose a
 * password goes there. Once the athlete has chosen one (which shows the address is theirs), the profile is theirs and
 * signs in like any account (auth.ts, onPasswordReset). Until then the coach may send it again or to another address.
 */
export async function handOverManagedAthlete(
  actor: Actor,
  athleteId: string,
  email: string,
): Promise<{ email: string }> {
  await requireAthleteAccessOrNotFound(actor, athleteId, "coach");
  const db = getDb();
  const [person] = await db
    .select({ managed: schema.user.managed })
    .from(schema.user)
    .where(eq(schema.user.id, athleteId));
  if (!person) throw notFound("No such athlete.");
  if (!person.managed)
    throw new HttpError(409, "This athlete already has their own account; they change their address themselves.");
  const [taken] = await db
    .select({ id: schema.user.id })
    .from(schema.user)
    .where(and(eq(sql`lower(${schema.user.email})`, email), ne(schema.user.id, athleteId)));
  if (taken)
    throw new HttpError(409, "This address already has a Tidemark account.", {
      fieldErrors: {
        email: ["This address already has an account: invite it from the roster, or use another address."],
      },
    });
  await db.update(schema.user).set({ email, updatedAt: new Date() }).where(eq(schema.user.id, athleteId));
  // better-auth's own reset flow makes the link; auth.ts words it as a hand-over for a managed profile.
  await getAuth().api.requestPasswordReset({ body: { email, redirectTo: "/reset-password" } });
  return { email };
}
