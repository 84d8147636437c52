import "server-only";
import { randomUUID } from "node:crypto";
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { anyOf, getDb, schema } from "@/db/client";
import type { Actor } from "@/features/access/lib/rules";
import { requireAthleteActionHiddenOtherwise } from "@/features/access/server";
import { notFound } from "@/features/platform/server/http";
import { publicOrigin } from "@/features/platform/server/origin";
import { signingSecret } from "@/features/platform/server/config";
import { queueMessages, type OutgoingMessage } from "@/features/messages/server";
import { unsubscribeToken } from "@/features/messages/lib/unsubscribe";
import { renderEmailHtml } from "@/emails/render";
import { ThreadMessageEmail, threadMessageSubject, threadMessageText } from "@/emails/thread-message";
import { dayLabel } from "@/features/reminders/lib/clock";
import { dateStyleOf, type DateStyle } from "@/features/platform/lib/date-format";

/** What a thread is on: a planned session or a log (each has its own). */
export type ThreadSubject = { kind: "session" | "log"; id: string };

export interface ThreadMessageView {
  id: string;
  authorId: string;
  authorName: string;
  /** The author's part: the athlete the thread belongs to, or one of their coaches. */
  authorRole: "athlete" | "coach";
  body: string;
  createdAt: string;
  /** Written by someone else after the reader last opened the thread. */
  unread: boolean;
}

export interface ThreadView {
  subject: ThreadSubject;
  athleteId: string;
  title: string;
  date: string;
  messages: ThreadMessageView[];
}

const threadKey = (s: ThreadSubject) => `${s.kind === "session" ? "s" : "l"}:${s.id}`;

/** The session or log behind a thread, with the same access as the session or log itself (404 for everyone else). */
async function loadSubject(actor: Actor, subject: ThreadSubject) {
  const db = getDb();
  const [row] =
    subject.kind === "session"
      ? await db
          .select({
            athleteId: schema.plannedSession.athleteId,
            title: schema.plannedSession.title,
            date: schema.plannedSession.date,
          })
          .from(schema.plannedSession)
          .where(eq(schema.plannedSession.id, subject.id))
      : await db
          .select({
            athleteId: schema.sessionLog.athleteId,
            title: schema.sessionLog.title,
            date: schema.sessionLog.date,
          })
          .from(schema.sessionLog)
          .where(eq(schema.sessionLog.id, subject.id));
  const what = subject.kind === "session" ? "No such session." : "No such log.";
  if (!row) throw notFound(what);
  await requireAthleteActionHiddenOtherwise(actor, row.athleteId, "view", what);
  return row;
}

const subjectColumn = (s: ThreadSubject) =>
  s.kind === "session" ? eq(schema.threadMessage.plannedSessionId, s.id) : eq(schema.threadMessage.logId, s.id);

async function markRead(userId: string, subject: ThreadSubject, at = new Date()) {
  await getDb()
    .insert(schema.threadRead)
    .values({ userId, threadKey: threadKey(subject), lastReadAt: at })
    .onConflictDoUpdate({
      target: [schema.threadRead.userId, schema.threadRead.threadKey],
      set: { lastReadAt: sql`greatest(${schema.threadRead.lastReadAt}, excluded.last_read_at)` },
    });
}

/** The thread, oldest message first; reading it marks it read for the reader (what was new is still flagged once). */
export async function readThread(actor: Actor, subject: ThreadSubject): Promise<ThreadView> {
  const row = await loadSubject(actor, subject);
  const db = getDb();
  const [read] = await db
    .select({ at: schema.threadRead.lastReadAt })
    .from(schema.threadRead)
    .where(and(eq(schema.threadRead.userId, actor.userId), eq(schema.threadRead.threadKey, threadKey(subject))));
  const messages = await db
    .select({
      id: schema.threadMessage.id,
      authorId: schema.threadMessage.authorId,
      authorName: schema.user.name,
      body: schema.threadMessage.body,
      createdAt: schema.threadMessage.createdAt,
    })
    .from(schema.threadMessage)
    .innerJoin(schema.user, eq(schema.user.id, schema.threadMessage.authorId))
    .where(subjectColumn(subject))
    .orderBy(asc(schema.threadMessage.createdAt), asc(schema.threadMessage.id));
  if (messages.length) await markRead(actor.userId, subject);
  return {
    subject,
    athleteId: row.athleteId,
    title: row.title,
    date: row.date,
    messages: messages.map((m) => ({
      id: m.id,
      authorId: m.authorId,
      authorName: m.authorName,
      authorRole: m.authorId === row.athleteId ? "athlete" : "coach",
      body: m.body,
      createdAt: m.createdAt.toISOString(),
      unread: m.authorId !== actor.userId && (!read || m.createdAt > read.at),
    })),
  };
}

/** Everyone who reads the athlete's threads: the athlete and the coaches of their squads. */
async function threadReaders(athleteId: string) {
  const db = getDb();
  const squads = db
    .select({ squadId: schema.membership.squadId })
    .from(schema.membership)
    .where(and(eq(schema.membership.userId, athleteId), eq(schema.membership.role, "athlete")));
  const coaches = await db
    .selectDistinct({ userId: schema.membership.userId })
    .from(schema.membership)
    .where(and(inArray(schema.membership.squadId, squads), inArray(schema.membership.role, ["head_coach", "coach"])));
  return [athleteId, ...coaches.map((c) => c.userId).filter((id) => id !== athleteId)];
}

/**
 * Writes a message on the thread and, in the same transaction, queues an e-mail to every other reader of it who has not
 * turned such e-mails off (once per message and recipient).
 */
export async function postMessage(actor: Actor, subject: ThreadSubject, body: string): Promise<ThreadMessageView> {
  const row = await loadSubject(actor, subject);
  const db = getDb();
  const id = randomUUID();
  const readers = (await threadReaders(row.athleteId)).filter((r) => r !== actor.userId);
  const people = await db
    .select({
      id: schema.user.id,
      name: schema.user.name,
      email: schema.user.email,
      messageEmails: schema.notificationSetting.messageEmails,
      dateStyle: schema.user.dateStyle,
    })
    .from(schema.user)
    .leftJoin(schema.notificationSetting, eq(schema.notificationSetting.userId, schema.user.id))
    .where(inArray(schema.user.id, [...readers, actor.userId]));
  const author = people.find((p) => p.id === actor.userId);
  const authorName = author?.name ?? "Someone";
  const origin = publicOrigin();
  // The day is written in each reader's own date style.
  const subjectLine = (style: DateStyle) =>
    subject.kind === "session"
      ? `${row.title}, ${dayLabel(row.date, style)}`
      : `the log "${row.title}", ${dayLabel(row.date, style)}`;
  const mails: OutgoingMessage[] = [];
  for (const p of people) {
    if (p.id === actor.userId || p.messageEmails === false) continue;
    const token = unsubscribeToken(signingSecret(), p.id, "thread_message");
    const props = {
      name: p.name,
      authorName,
      subjectLine: subjectLine(dateStyleOf(p.dateStyle)),
      body,
      // The athlete's page lists every conversation, a log's too (the plan shows planned sessions only).
      url: `${origin}/athletes/${row.athleteId}#messages`,
      unsubscribeUrl: `${origin}/unsubscribe/${token}`,
      settingsUrl: `${origin}/settings`,
    };
    mails.push({
      kind: "thread_message",
      to: p.email,
      userId: p.id,
      subject: threadMessageSubject(props),
      text: threadMessageText(props),
      html: await renderEmailHtml(ThreadMessageEmail(props)),
      idempotencyKey: `thread_message:${id}:${p.id}`,
      headers: {
        "List-Unsubscribe": `<${origin}/api/unsubscribe/${token}>`,
        "List-Unsubscribe-Post": "List-Unsubscribe=One-Click",
      },
    });
  }
  const createdAt = await db.transaction(async (tx) => {
    const [made] = await tx
      .insert(schema.threadMessage)
      .values({
        id,
        athleteId: row.athleteId,
        plannedSessionId: subject.kind === "session" ? subject.id : null,
        logId: subject.kind === "log" ? subject.id : null,
        authorId: actor.userId,
        body,
      })
      .returning({ createdAt: schema.threadMessage.createdAt });
    await tx
      .insert(schema.threadRead)
      .values({ userId: actor.userId, threadKey: threadKey(subject), lastReadAt: made!.createdAt })
      .onConflictDoUpdate({
        target: [schema.threadRead.userId, schema.threadRead.threadKey],
        set: { lastReadAt: made!.createdAt },
      });
    if (mails.length) await queueMessages(tx, mails);
    return made!.createdAt;
  });
  return {
    id,
    authorId: actor.userId,
    authorName,
    authorRole: actor.userId === row.athleteId ? "athlete" : "coach",
    body,
    createdAt: createdAt.toISOString(),
    unread: false,
  };
}

/**
 * Messages the viewer has not read yet, per athlete: written by someone else on any of the athletes' threads after the
 * viewer last opened that thread. One query for a whole roster.
 */
export async function unreadByAthlete(viewerId: string, athleteIds: string[]): Promise<Map<string, number>> {
  if (!athleteIds.length) return new Map();
  const rows = await getDb().execute<{ athleteId: string; n: number }>(sql`
    select m.athlete_id as "athleteId", count(*)::int as n
    from thread_message m
    left join thread_read r on r.user_id = ${viewerId}
      and r.thread_key = case when m.planned_session_id is not null then 's:' || m.planned_session_id else 'l:' || m.log_id end
    where m.athlete_id = ${anyOf(athleteIds)} and m.author_id <> ${viewerId}
      and (r.last_read_at is null or m.created_at > r.last_read_at)
    group by m.athlete_id`);
  return new Map([...rows].map((r) => [r.athleteId, r.n]));
}

export interface ThreadSummary {
  subject: ThreadSubject;
  title: string;
  date: string;
  messages: number;
  unread: number;
  lastAt: string;
  lastAuthorName: string;
  lastBody: string;
}

/** The athlete's threads with messages, newest first (at most `limit`), with what the viewer has not read. */
export async function athleteThreads(actor: Actor, athleteId: string, limit = 20): Promise<ThreadSummary[]> {
  await requireAthleteActionHiddenOtherwise(actor, athleteId, "view");
  const rows = await getDb().execute<{
    sessionId: string | null;
    logId: string | null;
    title: string;
    date: string;
    messages: number;
    unread: number;
    lastAt: Date;
    lastAuthorName: string;
    lastBody: string;
  }>(sql`
    with t as (
      select m.planned_session_id as "sessionId", m.log_id as "logId",
        count(*)::int as messages,
        count(*) filter (where m.author_id <> ${actor.userId} and (r.last_read_at is null or m.created_at > r.last_read_at))::int as unread,
        max(m.created_at) as "lastAt"
      from thread_message m
      left join thread_read r on r.user_id = ${actor.userId}
        and r.thread_key = case when m.planned_session_id is not null then 's:' || m.planned_session_id else 'l:' || m.log_id end
      where m.athlete_id = ${athleteId}
      group by m.planned_session_id, m.log_id
      order by "lastAt" desc
      limit ${limit}
    )
    select t.*, coalesce(p.title, l.title) as title, coalesce(p.date, l.date) as date,
      last.name as "lastAuthorName", last.body as "lastBody"
    from t
    left join planned_session p on p.id = t."sessionId"
    left join session_log l on l.id = t."logId"
    cross join lateral (
      select u.name, m.body from thread_message m join "user" u on u.id = m.author_id
      where (m.planned_session_id = t."sessionId" or m.log_id = t."logId")
      order by m.created_at desc limit 1
    ) last
    order by t."lastAt" desc`);
  return [...rows].map((r) => ({
    subject: r.sessionId ? { kind: "session" as const, id: r.sessionId } : { kind: "log" as const, id: r.logId! },
    title: r.title,
    date: r.date,
    messages: r.messages,
    unread: r.unread,
    lastAt: new Date(r.lastAt).toISOString(),
    lastAuthorName: r.lastAuthorName,
    lastBody: r.lastBody,
  }));
}
