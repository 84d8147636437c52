import "server-only";
import { eq } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { getAuth } from "@/features/auth/server";
import { recallSession, rememberSession, sessionCookieKey } from "@/features/auth/server";
import { HttpError, notFound, unauthenticated, forbidden } from "@/features/platform/server/http";
import { dateStyleOf, type DateStyle } from "@/features/platform/lib/date-format";
import type { Units } from "@/features/platform/lib/units";
import {
  canCoachAthlete,
  canEditAthlete,
  canManageSquad,
  canViewAthlete,
  canViewRoster,
  type Actor,
  type AthleteTarget,
  type Membership,
} from "../lib/rules";

export type { Actor } from "../lib/rules";

export interface SignedInActor extends Actor {
  name: string;
  email: string;
  /** The units every number this person reads is shown in. */
  units: Units;
  /** How every date this person reads is written (platform/lib/date-format.ts). */
  dateStyle: DateStyle;
}

async function membershipsOf(userId: string): Promise<Membership[]> {
  return getDb()
    .select({ squadId: schema.membership.squadId, role: schema.membership.role })
    .from(schema.membership)
    .where(eq(schema.membership.userId, userId));
}

/** The signed-in user with their memberships, or null. */
export async function findActor(headers: Headers): Promise<SignedInActor | null> {
  type Session = Awaited<ReturnType<ReturnType<typeof getAuth>["api"]["getSession"]>>;
  const key = sessionCookieKey(headers);
  let result = key ? recallSession<Session>(key) : undefined;
  if (!result) {
    const startedAt = Date.now();
    result = await getAuth().api.getSession({ headers });
    if (!result) return null;
    if (key)
      rememberSession(
        key,
        result,
        { userId: result.user.id, token: result.session.token, expiresAt: result.session.expiresAt },
        startedAt,
      );
  }
  const u = result.user as typeof result.user & { isAdmin?: boolean; units?: string; dateStyle?: string };
  // An account works only once its address is confirmed (a session from before confirmation was required counts as none).
  if (!u.emailVerified) return null;
  return {
    userId: u.id,
    name: u.name,
    email: u.email,
    isAdmin: Boolean(u.isAdmin),
    units: u.units === "imperial" ? "imperial" : "metric",
    dateStyle: dateStyleOf(u.dateStyle),
    memberships: await membershipsOf(u.id),
  };
}

/**
 * Like requireAthleteAccess, but any refusal reads as "not found" (for resources reached by their own id, whose existence
 * must not leak). Other errors, such as the database being unavailable, pass through unchanged.
 */
export async function requireAthleteAccessOrNotFound(
  actor: Actor,
  athleteId: string,
  action: "view" | "edit" | "coach",
  message?: string,
): Promise<void> {
  try {
    await requireAthleteAccess(actor, athleteId, action);
  } catch (e) {
    if (e instanceof HttpError && (e.status === 403 || e.status === 404)) throw notFound(message);
    throw e;
  }
}

/**
 * One read of the athlete's memberships for two checks: who may not even view the athlete gets 404 with `message`; who may
 * view but not `action` gets the usual refusal (403).
 */
export async function requireAthleteActionHiddenOtherwise(
  actor: Actor,
  athleteId: string,
  action: "view" | "edit" | "coach",
  message?: string,
): Promise<void> {
  const target = await loadTarget(athleteId);
  try {
    checkAthleteAccess(actor, target, "view");
  } catch (e) {
    if (e instanceof HttpError && (e.status === 403 || e.status === 404)) throw notFound(message);
    throw e;
  }
  if (action !== "view") checkAthleteAccess(actor, target, action);
}

/** An account as an actor, for background jobs that act with that account's rights (e.g. a coach's weekly digest). */
export async function actorForUser(userId: string): Promise<Actor> {
  return { userId, isAdmin: false, memberships: await membershipsOf(userId) };
}

/** The signed-in user; 401 otherwise. Every route handler calls this (or findActor) first. */
export async function requireActor(headers: Headers): Promise<SignedInActor> {
  const actor = await findActor(headers);
  if (!actor) throw unauthenticated();
  return actor;
}

/** The memberships of an athlete, for pages that decide what to offer with the pure rules. */
export async function membershipsOfAthlete(athleteId: string): Promise<Membership[]> {
  return membershipsOf(athleteId);
}

async function loadTarget(athleteId: string): Promise<AthleteTarget> {
  return { userId: athleteId, memberships: await membershipsOf(athleteId) };
}

/**
 * May this actor see (or edit) this athlete? A forbidden athlete answers 404, so that the existence of athletes outside
 * the actor's squads is not revealed.
 */
export async function requireAthleteAccess(
  actor: Actor,
  athleteId: string,
  action: "view" | "edit" | "coach",
): Promise<void> {
  checkAthleteAccess(actor, await loadTarget(athleteId), action);
}

/** requireAthleteAccess for a caller that has already read the athlete's memberships (with other data, in one query). */
export function checkAthleteAccess(actor: Actor, target: AthleteTarget, action: "view" | "edit" | "coach"): void {
  if (!canViewAthlete(actor, target)) throw notFound("No such athlete.");
  if (action === "edit" && !canEditAthlete(actor, target)) throw forbidden();
  if (action === "coach" && !canCoachAthlete(actor, target)) throw forbidden("Only the athlete's coaches may do this.");
}

export function requireSquadManager(actor: Actor, squadId: string): void {
  if (!canManageSquad(actor, squadId)) {
    if (actor.memberships.some((m) => m.squadId === squadId))
      throw forbidden("Only the squad's head coach may do this.");
    throw notFound("No such squad.");
  }
}

export function requireRosterAccess(actor: Actor, squadId: string): void {
  if (!canViewRoster(actor, squadId)) throw new HttpError(404, "No such squad.");
}
