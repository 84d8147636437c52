import "server-only";
import { randomBytes } from "node:crypto";
import { and, asc, eq, gte, lte } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import type { Actor } from "@/features/access/lib/rules";
import { localDate } from "@/features/platform/lib/dates";
import { addDays } from "@/features/platform/lib/days";
import { KIND_LABELS, readUnsubscribeToken, type UnsubscribableKind } from "../lib/unsubscribe";
import { calendarIcs } from "../lib/ics";
import { signingSecret } from "@/features/platform/server/config";

export interface NotificationSettings {
  timeZone: string;
  coachDigest: boolean;
  calendarToken: string | null;
  /** An e-mail when someone writes on one of the person's threads. */
  messageEmails: boolean;
}

async function settingsRow(userId: string): Promise<NotificationSettings> {
  const [row] = await getDb()
    .select()
    .from(schema.notificationSetting)
    .where(eq(schema.notificationSetting.userId, userId));
  return {
    timeZone: row?.timeZone ?? "UTC",
    coachDigest: row?.coachDigest ?? true,
    calendarToken: row?.calendarToken ?? null,
    messageEmails: row?.messageEmails ?? true,
  };
}

export function getNotificationSettings(actor: Actor): Promise<NotificationSettings> {
  return settingsRow(actor.userId);
}

export async function updateNotificationSettings(
  actor: Actor,
  patch: { timeZone?: string; coachDigest?: boolean; messageEmails?: boolean },
): Promise<NotificationSettings> {
  await getDb()
    .insert(schema.notificationSetting)
    .values({ userId: actor.userId, ...patch })
    .onConflictDoUpdate({ target: schema.notificationSetting.userId, set: { ...patch, updatedAt: new Date() } });
  return settingsRow(actor.userId);
}

/** A new private feed address (the old one stops working at once). 32 random bytes: unguessable. */
export async function renewCalendarToken(actor: Actor): Promise<string> {
  const token = randomBytes(32).toString("base64url");
  await getDb()
    .insert(schema.notificationSetting)
    .values({ userId: actor.userId, calendarToken: token })
    .onConflictDoUpdate({
      target: schema.notificationSetting.userId,
      set: { calendarToken: token, updatedAt: new Date() },
    });
  return token;
}

export async function revokeCalendarToken(actor: Actor): Promise<void> {
  await getDb()
    .update(schema.notificationSetting)
    .set({ calendarToken: null, updatedAt: new Date() })
    .where(eq(schema.notificationSetting.userId, actor.userId));
}

/**
 * What an unsubscribe link is for and whether that kind of message is already off, or null for a token that is not ours.
 * Only reads: a mail scanner or link preview opening the link changes nothing.
 */
export async function readUnsubscribeLink(
  token: string,
): Promise<{ kind: UnsubscribableKind; label: string; email: string; alreadyOff: boolean } | null> {
  const parsed = readUnsubscribeToken(signingSecret(), token);
  if (!parsed) return null;
  const [u] = await getDb()
    .select({
      email: schema.user.email,
      remindSessions: schema.athleteProfile.remindSessions,
      remindRetests: schema.athleteProfile.remindRetests,
      coachDigest: schema.notificationSetting.coachDigest,
      messageEmails: schema.notificationSetting.messageEmails,
    })
    .from(schema.user)
    .leftJoin(schema.athleteProfile, eq(schema.athleteProfile.userId, schema.user.id))
    .leftJoin(schema.notificationSetting, eq(schema.notificationSetting.userId, schema.user.id))
    .where(eq(schema.user.id, parsed.userId));
  if (!u) return null;
  const on =
    parsed.kind === "session_reminder"
      ? u.remindSessions
      : parsed.kind === "retest_reminder"
        ? u.remindRetests
        : parsed.kind === "thread_message"
          ? u.messageEmails
          : u.coachDigest;
  return { kind: parsed.kind, label: KIND_LABELS[parsed.kind], email: u.email, alreadyOff: on === false };
}

/**
 * Turns off one kind of message for the account named in a signed token, without signing in. Returns what was turned
 * off, or null for a token that is not ours.
 */
export async function unsubscribe(
  token: string,
): Promise<{ kind: UnsubscribableKind; label: string; email: string } | null> {
  const parsed = readUnsubscribeToken(signingSecret(), token);
  if (!parsed) return null;
  const db = getDb();
  const [u] = await db.select({ email: schema.user.email }).from(schema.user).where(eq(schema.user.id, parsed.userId));
  if (!u) return null;
  await db.transaction(async (tx) => {
    if (parsed.kind === "session_reminder")
      await tx
        .update(schema.athleteProfile)
        .set({ remindSessions: false })
        .where(eq(schema.athleteProfile.userId, parsed.userId));
    else if (parsed.kind === "retest_reminder")
      await tx
        .update(schema.athleteProfile)
        .set({ remindRetests: false })
        .where(eq(schema.athleteProfile.userId, parsed.userId));
    else if (parsed.kind === "thread_message")
      await tx
        .insert(schema.notificationSetting)
        .values({ userId: parsed.userId, messageEmails: false })
        .onConflictDoUpdate({
          target: schema.notificationSetting.userId,
          set: { messageEmails: false, updatedAt: new Date() },
        });
    else
      await tx
        .insert(schema.notificationSetting)
        .values({ userId: parsed.userId, coachDigest: false })
        .onConflictDoUpdate({
          target: schema.notificationSetting.userId,
          set: { coachDigest: false, updatedAt: new Date() },
        });
  });
  return { kind: parsed.kind, label: KIND_LABELS[parsed.kind], email: u.email };
}

/** The iCalendar feed behind a private token: the athlete's sessions and retests from 60 days back to a year ahead. */
export async function calendarFeed(token: string, now = new Date()): Promise<string | null> {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
  const db = getDb();
  const [owner] = await db
    .select({
      userId: schema.notificationSetting.userId,
      name: schema.user.name,
      timeZone: schema.athleteProfile.timeZone,
    })
    .from(schema.notificationSetting)
    .innerJoin(schema.user, eq(schema.user.id, schema.notificationSetting.userId))
    .leftJoin(schema.athleteProfile, eq(schema.athleteProfile.userId, schema.notificationSetting.userId))
    .where(eq(schema.notificationSetting.calendarToken, token));
  if (!owner) return null;
  const today = localDate(now, owner.timeZone ?? "UTC");
  const sessions = await db
    .select({
      id: schema.plannedSession.id,
      date: schema.plannedSession.date,
      title: schema.plannedSession.title,
      kind: schema.plannedSession.kind,
      sport: schema.plannedSession.sport,
      totalS: schema.plannedSession.totalS,
      minutesByZone: schema.plannedSession.minutesByZone,
      notes: schema.plannedSession.notes,
    })
    .from(schema.plannedSession)
    .where(
      and(
        eq(schema.plannedSession.athleteId, owner.userId),
        gte(schema.plannedSession.date, addDays(today, -60)),
        lte(schema.plannedSession.date, addDays(today, 366)),
      ),
    )
    .orderBy(asc(schema.plannedSession.date));
  return calendarIcs({ name: `Tidemark plan: ${owner.name}`, sessions, stampedAt: now });
}
