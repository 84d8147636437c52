import "server-only";
import { formatDay } from "@/features/platform/lib/date-format";
import { createHash, randomBytes, randomUUID } from "node:crypto";
import { and, asc, eq, inArray, isNull, sql } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { requireSquadManager, type SignedInActor } from "@/features/access/server";
import { coachedSquadIds, type Actor } from "@/features/access/lib/rules";
import { sendInvitation } from "@/features/messages/server";
import { HttpError, notFound } from "@/features/platform/server/http";
import { storedTotals } from "@/features/planning/lib/session";
import { STARTER_TEMPLATES } from "@/features/planning/lib/starter-templates";
import { ROLE_LABELS, type InviteInput } from "../schemas";

const INVITATION_DAYS = 14;

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

export async function describeMe(actor: SignedInActor) {
  const squadIds = actor.memberships.map((m) => m.squadId);
  const squads = squadIds.length
    ? await getDb()
        .select()
        .from(schema.squad)
        .where(inArray(schema.squad.id, squadIds))
        .orderBy(asc(schema.squad.name))
    : [];
  const roleOf = new Map(actor.memberships.map((m) => [m.squadId, m.role]));
  return {
    user: { id: actor.userId, name: actor.name, email: actor.email, isAdmin: actor.isAdmin },
    roles: [...new Set(actor.memberships.map((m) => m.role))],
    squads: squads.map((s) => ({ id: s.id, name: s.name, role: roleOf.get(s.id)! })),
  };
}

/** Creates a squad with the starter templates (planning/lib/starter-templates.ts); its creator becomes its head coach.
 * One transaction. */
export async function createSquad(actor: Actor, name: string, opts: { starterTemplates?: boolean } = {}) {
  const id = randomUUID();
  await getDb().transaction(async (tx) => {
    await tx.insert(schema.squad).values({ id, name });
    await tx.insert(schema.membership).values({ squadId: id, userId: actor.userId, role: "head_coach" });
    if (opts.starterTemplates !== false) {
      await tx.insert(schema.sessionTemplate).values(
        STARTER_TEMPLATES.map((t) => ({
          id: randomUUID(),
          squadId: id,
          name: t.name,
          sport: t.sport,
          description: t.description,
          structure: t.structure,
          ...storedTotals(t.structure),
          createdBy: actor.userId,
        })),
      );
    }
  });
  return { id, name };
}

/** The athletes the actor may see: as a coach, the athletes of their squads; as an athlete, themselves. */
export async function listVisibleAthletes(actor: Actor, squadId?: string) {
  const db = getDb();
  let squadIds = coachedSquadIds(actor);
  if (squadId) squadIds = squadIds.filter((s) => s === squadId);
  const athleteIds = new Set<string>();
  if (squadIds.length) {
    const rows = await db
      .select({ userId: schema.membership.userId })
      .from(schema.membership)
      .where(and(inArray(schema.membership.squadId, squadIds), eq(schema.membership.role, "athlete")));
    rows.forEach((r) => athleteIds.add(r.userId));
  }
  if (!squadId && actor.memberships.some((m) => m.role === "athlete")) athleteIds.add(actor.userId);
  if (athleteIds.size === 0) return [];
  const rows = await db
    .select({
      id: schema.user.id,
      name: schema.user.name,
      email: schema.user.email,
      sports: sql<string[]>`coalesce(${schema.athleteProfile.sports}, '{}'::text[])`,
    })
    .from(schema.user)
    .leftJoin(schema.athleteProfile, eq(schema.athleteProfile.userId, schema.user.id))
    .where(inArray(schema.user.id, [...athleteIds]))
    .orderBy(asc(schema.user.name));
  return rows;
}

export async function listMembers(actor: Actor, squadId: string) {
  requireSquadManager(actor, squadId);
  return getDb()
    .select({ userId: schema.user.id, name: schema.user.name, email: schema.user.email, role: schema.membership.role })
    .from(schema.membership)
    .innerJoin(schema.user, eq(schema.user.id, schema.membership.userId))
    .where(eq(schema.membership.squadId, squadId))
    .orderBy(asc(schema.user.name));
}

export async function listOpenInvitations(actor: Actor, squadId: string) {
  requireSquadManager(actor, squadId);
  return getDb()
    .select({
      id: schema.invitation.id,
      email: schema.invitation.email,
      role: schema.invitation.role,
      expiresAt: schema.invitation.expiresAt,
      createdAt: schema.invitation.createdAt,
    })
    .from(schema.invitation)
    .where(
      and(
        eq(schema.invitation.squadId, squadId),
        isNull(schema.invitation.acceptedAt),
        isNull(schema.invitation.revokedAt),
        sql`${schema.invitation.expiresAt} > now()`,
      ),
    )
    .orderBy(asc(schema.invitation.createdAt));
}

/** Invites someone into the squad; the invitation e-mail is written in the same transaction. */
export async function inviteToSquad(actor: SignedInActor, squadId: string, input: InviteInput, origin: string) {
  requireSquadManager(actor, squadId);
  const db = getDb();
  const [squadRow] = await db.select().from(schema.squad).where(eq(schema.squad.id, squadId));
  if (!squadRow) throw notFound("No such squad.");
  const existing = await db
    .select({ role: schema.membership.role })
    .from(schema.membership)
    .innerJoin(schema.user, eq(schema.user.id, schema.membership.userId))
    .where(and(eq(schema.membership.squadId, squadId), eq(sql`lower(${schema.user.email})`, input.email)));
  if (existing.length) {
    throw new HttpError(409, `${input.email} is already a member of ${squadRow.name}.`, {
      fieldErrors: { email: ["This person is already a member of the squad."] },
    });
  }
  const token = randomBytes(32).toString("base64url");
  const id = randomUUID();
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 24 * 3600 * 1000);
  const url = `${origin}/invite/${token}`;
  await db.transaction(async (tx) => {
    await tx.insert(schema.invitation).values({
      id,
      squadId,
      email: input.email,
      role: input.role,
      tokenHash: hashToken(token),
      invitedBy: actor.userId,
      expiresAt,
    });
    await sendInvitation(tx, {
      to: input.email,
      invitationId: id,
      inviterName: actor.name,
      squadName: squadRow.name,
      roleLabel: `${ROLE_LABELS[input.role] === "athlete" ? "an" : "a"} ${ROLE_LABELS[input.role]}`,
      url,
      // The invited person has no settings yet: the date reads as the inviting coach writes dates.
      expiresOn: formatDay(expiresAt.toISOString().slice(0, 10), actor.dateStyle),
    });
  });
  return { id, email: input.email, role: input.role, expiresAt };
}

/** The head coach withdraws an invitation that is still open (not used, not withdrawn, not expired). */
export async function withdrawInvitation(actor: Actor, squadId: string, invitationId: string): Promise<void> {
  requireSquadManager(actor, squadId);
  const rows = await getDb()
    .update(schema.invitation)
    .set({ revokedAt: new Date() })
    .where(
      and(
        eq(schema.invitation.id, invitationId),
        eq(schema.invitation.squadId, squadId),
        isNull(schema.invitation.acceptedAt),
        isNull(schema.invitation.revokedAt),
        sql`${schema.invitation.expiresAt} > now()`,
      ),
    )
    .returning({ id: schema.invitation.id });
  if (!rows.length) throw notFound("No open invitation with that id: it may have been used, withdrawn or expired.");
}

export type InvitationState = "open" | "expired" | "accepted" | "revoked";

/** What an invitation link shows, without needing to be signed in. Unknown tokens are null. */
export async function lookupInvitation(token: string) {
  const [row] = await getDb()
    .select({
      id: schema.invitation.id,
      email: schema.invitation.email,
      role: schema.invitation.role,
      expiresAt: schema.invitation.expiresAt,
      acceptedAt: schema.invitation.acceptedAt,
      revokedAt: schema.invitation.revokedAt,
      squadName: schema.squad.name,
      squadId: schema.squad.id,
    })
    .from(schema.invitation)
    .innerJoin(schema.squad, eq(schema.squad.id, schema.invitation.squadId))
    .where(eq(schema.invitation.tokenHash, hashToken(token)));
  if (!row) return null;
  const state: InvitationState = row.acceptedAt
    ? "accepted"
    : row.revokedAt
      ? "revoked"
      : row.expiresAt.getTime() <= Date.now()
        ? "expired"
        : "open";
  return { ...row, state };
}

const STATE_MESSAGES: Record<Exclude<InvitationState, "open">, string> = {
  accepted: "This invitation has already been used.",
  expired: "This invitation has expired. Ask your coach for a new one.",
  revoked: "This invitation was withdrawn. Ask your coach for a new one.",
};

/** The signed-in invitee joins the squad with the invited role; one transaction, and a link works once. */
export async function acceptInvitation(actor: SignedInActor, token: string) {
  const db = getDb();
  return db.transaction(async (tx) => {
    const [inv] = await tx
      .select()
      .from(schema.invitation)
      .where(eq(schema.invitation.tokenHash, hashToken(token)))
      .for("update");
    if (!inv) throw notFound("This invitation link is not valid.");
    if (inv.acceptedAt) throw new HttpError(410, STATE_MESSAGES.accepted);
    if (inv.revokedAt) throw new HttpError(410, STATE_MESSAGES.revoked);
    if (inv.expiresAt.getTime() <= Date.now()) throw new HttpError(410, STATE_MESSAGES.expired);
    if (inv.email.toLowerCase() !== actor.email.toLowerCase()) {
      throw new HttpError(403, `This invitation is for ${inv.email}. Sign in with that address to accept it.`);
    }
    const already = await tx
      .select()
      .from(schema.membership)
      .where(and(eq(schema.membership.squadId, inv.squadId), eq(schema.membership.userId, actor.userId)));
    if (already.length) throw new HttpError(409, "You are already a member of this squad.");
    await tx.insert(schema.membership).values({ squadId: inv.squadId, userId: actor.userId, role: inv.role });
    if (inv.role === "athlete") {
      await tx.insert(schema.athleteProfile).values({ userId: actor.userId }).onConflictDoNothing();
    }
    await tx
      .update(schema.invitation)
      .set({ acceptedAt: new Date(), acceptedBy: actor.userId })
      .where(eq(schema.invitation.id, inv.id));
    return { squadId: inv.squadId, role: inv.role };
  });
}

/** The head coach removes a member (not themselves, so a squad always keeps a head coach). */
export async function removeMember(actor: Actor, squadId: string, userId: string) {
  requireSquadManager(actor, squadId);
  if (userId === actor.userId) throw new HttpError(400, "A head coach cannot remove themselves from the squad.");
  const removed = await getDb()
    .delete(schema.membership)
    .where(and(eq(schema.membership.squadId, squadId), eq(schema.membership.userId, userId)))
    .returning();
  if (!removed.length) throw notFound("No such member.");
}

/** Whether an account already uses this address (the invitation page offers sign-in instead of sign-up). */
export async function accountExists(email: string): Promise<boolean> {
  const rows = await getDb()
    .select({ id: schema.user.id })
    .from(schema.user)
    .where(eq(sql`lower(${schema.user.email})`, email.toLowerCase()));
  return rows.length > 0;
}
