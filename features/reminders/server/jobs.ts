import "server-only";
import { createElement } from "react";
import { and, between, eq, gte, inArray, lte, ne, sql } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { CoachDigestEmail, coachDigestSubject, coachDigestText, type DigestLine } from "@/emails/coach-digest";
import { renderEmailHtml } from "@/emails/render";
import { RetestReminderEmail, retestReminderSubject, retestReminderText } from "@/emails/retest-reminder";
import {
  SessionReminderEmail,
  sessionReminderSubject,
  sessionReminderText,
  type ReminderSession,
} from "@/emails/session-reminder";
import { actorForUser } from "@/features/access/server";
import { SCREENING_QUESTIONS } from "@/features/athlete-tests/schemas";
import { unsubscribeToken, type UnsubscribableKind } from "@/features/messages/lib/unsubscribe";
import { queueMessage, queueMessages, type OutgoingMessage } from "@/features/messages/server";
import { localDate } from "@/features/platform/lib/dates";
import { dateStyleOf, formatDay } from "@/features/platform/lib/date-format";
import { SPORT_LABELS, type Sport } from "@/features/platform/lib/sports";
import { publicOrigin } from "@/features/platform/server/origin";
import { flatten, type Block } from "@/features/planning/lib/session";
import { addDays } from "@/features/platform/lib/days";
import { squadRoster } from "@/features/roster/server";
import { targetText } from "@/features/zones/lib/format";
import { withShownFloor, zonesForSession } from "@/features/zones/lib/zones";
import { zoneSetsOfMany } from "@/features/zones/server";
import type { ZoneSetView } from "@/features/zones/lib/views";
import { dayLabel, digestMonday, retestStage, sessionReminderDay } from "../lib/clock";
import { signingSecret } from "@/features/platform/server/config";
import { distanceText, type Units } from "@/features/platform/lib/units";

const STEP_LABELS = { warmup: "Warm-up", work: "Work", recovery: "Recovery", cooldown: "Cool-down" } as const;

function links(userId: string, kind: UnsubscribableKind) {
  const origin = publicOrigin();
  const token = unsubscribeToken(signingSecret(), userId, kind);
  const unsubscribeUrl = `${origin}/unsubscribe/${token}`;
  return {
    unsubscribeUrl,
    settingsUrl: `${origin}/settings`,
    // RFC 2369 and RFC 8058: mail programs offer the link, and may turn the messages off with one POST.
    headers: {
      "List-Unsubscribe": `<${origin}/api/unsubscribe/${token}>`,
      "List-Unsubscribe-Post": "List-Unsubscribe=One-Click",
    },
  };
}

async function alreadyQueued(keys: string[]): Promise<Set<string>> {
  if (!keys.length) return new Set();
  const rows = await getDb()
    .select({ key: schema.outbox.idempotencyKey })
    .from(schema.outbox)
    .where(inArray(schema.outbox.idempotencyKey, keys));
  return new Set(rows.map((r) => r.key!));
}

/** Steps of a session with each target in the athlete's own numbers on that day (consecutive equal steps merged). */
function reminderSessions(
  zoneSets: ZoneSetView[],
  sessions: { title: string; sport: string; totalS: number; notes: string; structure: unknown; date: string }[],
  units: Units = "metric",
  maxHrBpm: number | null = null,
): ReminderSession[] {
  return sessions.map((s) => {
    // No zones of the session's sport yet: heart rate from the nearest sport's zones, and the e-mail says so.
    const found = zonesForSession(zoneSets, s.sport, s.date);
    const set = found?.set;
    const steps = flatten(s.structure as Block[]);
    const lines: { label: string; target: string; count: number }[] = [];
    for (const st of steps) {
      const amount =
        st.durationS != null
          ? `${Math.round(st.durationS / 6) / 10} min`
          : distanceText(st.distanceM ?? 0, units, s.sport);
      const numbers = set ? targetText(withShownFloor(set.zones, maxHrBpm)[st.zone - 1], s.sport, units) : null;
      const target = numbers ? `zone ${st.zone}, ${numbers}` : set ? `zone ${st.zone}` : `zone ${st.zone}`;
      const label = `${STEP_LABELS[st.kind]} ${amount}`;
      const last = lines.at(-1);
      if (last && last.label === label && last.target === target) last.count++;
      else lines.push({ label, target, count: 1 });
    }
    const from = found?.fromSport;
    const label = (sport: string) => (SPORT_LABELS[sport as Sport] ?? sport).toLowerCase();
    return {
      title: s.title,
      minutes: Math.round(s.totalS / 60),
      notes: s.notes,
      zonesNote: from
        ? `No ${label(s.sport)} zones yet: heart-rate targets from your ${label(from)} zones.`
        : set
          ? null
          : "No zones yet: the targets are zones only, without numbers, until your first test.",
      steps: lines.map((l) => ({ label: l.count > 1 ? `${l.count} × ${l.label}` : l.label, target: l.target })),
    };
  });
}

/** Athletes whose reminders are gathered, rendered and written together (each group: three queries and one insert). */
const REMINDER_GROUP = 1000;

/**
 * Session reminders: for each athlete whose chosen local time has come, the day's sessions, once per athlete and day.
 * Set-based, so that ten thousand reminders cost a few queries per thousand athletes: the sessions of every due athlete's
 * day and their zone sets are read in one query each, and the messages are written in bulk (idempotency keys keep it to
 * one message per athlete and day, also when two runs overlap).
 */
export async function queueSessionReminders(now: Date): Promise<number> {
  const db = getDb();
  const local = sql`(${now.toISOString()}::timestamptz at time zone ${schema.athleteProfile.timeZone})`;
  const athletes = await db
    .select({
      id: schema.user.id,
      name: schema.user.name,
      email: schema.user.email,
      units: schema.user.units,
      dateStyle: schema.user.dateStyle,
      maxHrBpm: schema.athleteProfile.maxHrBpm,
      timeZone: schema.athleteProfile.timeZone,
      timing: schema.athleteProfile.reminderTiming,
      time: schema.athleteProfile.reminderTime,
    })
    .from(schema.athleteProfile)
    .innerJoin(schema.user, eq(schema.user.id, schema.athleteProfile.userId))
    .where(
      and(
        eq(schema.athleteProfile.remindSessions, true),
        ne(schema.athleteProfile.reminderTiming, "off"),
        // Only athletes whose reminder time has come today in their own time zone, and not yet reminded for the day:
        // the database narrows the platform's athletes to those due (the clock's rule below decides).
        sql`(${local}::time >= ${schema.athleteProfile.reminderTime}::time)`,
        sql`not exists (select 1 from outbox o where o.idempotency_key = 'session_reminder:' || ${schema.user.id} || ':' ||
          to_char(${local}::date + case when ${schema.athleteProfile.reminderTiming} = 'morning_of' then 0 else 1 end,
            'YYYY-MM-DD'))`,
      ),
    );
  const due = athletes.flatMap((a) => {
    const day = sessionReminderDay(now, a.timeZone, a.timing, a.time);
    return day ? [{ ...a, day, key: `session_reminder:${a.id}:${day}` }] : [];
  });
  const origin = publicOrigin();
  let queued = 0;
  for (let g = 0; g < due.length; g += REMINDER_GROUP) {
    const group = due.slice(g, g + REMINDER_GROUP);
    const done = await alreadyQueued(group.map((d) => d.key));
    const open = group.filter((d) => !done.has(d.key));
    if (!open.length) continue;
    const wanted = JSON.stringify(open.map((a) => ({ id: a.id, day: a.day })));
    const sessions = await db.execute<{
      athleteId: string;
      date: string;
      title: string;
      sport: string;
      totalS: number;
      notes: string;
      structure: unknown;
    }>(sql`
      select p.athlete_id as "athleteId", p.date, p.title, p.sport, p.total_s as "totalS", p.notes, p.structure
      from json_to_recordset(${wanted}::json) as w(id text, day text)
      join planned_session p on p.athlete_id = w.id and p.date = w.day
      where p.kind <> 'retest'
      order by p.athlete_id, p.created_at, p.id`);
    const byAthlete = new Map<string, (typeof sessions)[number][]>();
    for (const s of sessions) {
      const list = byAthlete.get(s.athleteId);
      if (list) list.push(s);
      else byAthlete.set(s.athleteId, [s]);
    }
    const zoneSets = await zoneSetsOfMany([...byAthlete.keys()]);
    const messages: OutgoingMessage[] = [];
    for (const a of open) {
      const own = byAthlete.get(a.id);
      if (!own) continue;
      const when = a.day === localDate(now, a.timeZone) ? "today" : "tomorrow";
      const l = links(a.id, "session_reminder");
      const props = {
        name: a.name,
        dayLabel: dayLabel(a.day, dateStyleOf(a.dateStyle)),
        when,
        sessions: reminderSessions(
          zoneSets.get(a.id) ?? [],
          own,
          a.units === "imperial" ? "imperial" : "metric",
          a.maxHrBpm,
        ),
        todayUrl: `${origin}/today`,
        unsubscribeUrl: l.unsubscribeUrl,
        settingsUrl: l.settingsUrl,
      } as const;
      messages.push({
        kind: "session_reminder",
        to: a.email,
        userId: a.id,
        subject: sessionReminderSubject(props),
        text: sessionReminderText(props),
        html: await renderEmailHtml(createElement(SessionReminderEmail, props)),
        headers: l.headers,
        idempotencyKey: a.key,
        meta: { date: a.day },
      });
    }
    queued += (await queueMessages(db, messages)).length;
  }
  return queued;
}

/** Retest reminders: seven days and one day before each retest, and once when it is overdue. */
export async function queueRetestReminders(now: Date): Promise<number> {
  const db = getDb();
  const utcToday = localDate(now, "UTC");
  const retests = await db
    .select({
      athleteId: schema.plannedSession.athleteId,
      date: schema.plannedSession.date,
      title: schema.plannedSession.title,
      notes: schema.plannedSession.notes,
      sport: schema.plannedSession.sport,
      name: schema.user.name,
      email: schema.user.email,
      dateStyle: schema.user.dateStyle,
      timeZone: schema.athleteProfile.timeZone,
      time: schema.athleteProfile.reminderTime,
    })
    .from(schema.plannedSession)
    .innerJoin(schema.athleteProfile, eq(schema.athleteProfile.userId, schema.plannedSession.athleteId))
    .innerJoin(schema.user, eq(schema.user.id, schema.plannedSession.athleteId))
    .where(
      and(
        eq(schema.plannedSession.kind, "retest"),
        eq(schema.athleteProfile.remindRetests, true),
        between(schema.plannedSession.date, addDays(utcToday, -28), addDays(utcToday, 8)),
      ),
    );
  if (!retests.length) return 0;
  const tests = await db
    .select({ athleteId: schema.athleteTest.athleteId, date: schema.athleteTest.testDate })
    .from(schema.athleteTest)
    .where(
      and(
        inArray(schema.athleteTest.athleteId, [...new Set(retests.map((r) => r.athleteId))]),
        gte(schema.athleteTest.testDate, addDays(utcToday, -28)),
      ),
    );
  const due = retests.flatMap((r) => {
    const stage = retestStage(
      now,
      r.timeZone,
      r.time,
      r.date,
      tests.some((t) => t.athleteId === r.athleteId && t.date >= r.date),
    );
    return stage ? [{ ...r, stage, key: `retest_reminder:${stage}:${r.athleteId}:${r.date}` }] : [];
  });
  const done = await alreadyQueued(due.map((d) => d.key));
  let queued = 0;
  for (const r of due.filter((d) => !done.has(d.key))) {
    const l = links(r.athleteId, "retest_reminder");
    const props = {
      name: r.name,
      stage: r.stage,
      date: r.date,
      dateLabel: dayLabel(r.date, dateStyleOf(r.dateStyle)),
      protocol: `${r.title} (${r.sport})${r.notes ? ` — ${r.notes}` : ""}`,
      questions: SCREENING_QUESTIONS.map((q) => q.text),
      screeningUrl: `${publicOrigin()}/athletes/${r.athleteId}/screening`,
      unsubscribeUrl: l.unsubscribeUrl,
      settingsUrl: l.settingsUrl,
    };
    const id = await queueMessage(db, {
      kind: "retest_reminder",
      to: r.email,
      userId: r.athleteId,
      subject: retestReminderSubject(props),
      text: retestReminderText(props),
      html: await renderEmailHtml(createElement(RetestReminderEmail, props)),
      headers: l.headers,
      idempotencyKey: r.key,
      meta: { date: r.date, stage: r.stage },
    });
    if (id) queued++;
  }
  return queued;
}

/** The weekly digest for coaches, per squad, on Mondays from 07:00 in the coach's time zone. */
export async function queueCoachDigests(now: Date): Promise<number> {
  const db = getDb();
  const coaches = await db
    .select({
      userId: schema.membership.userId,
      squadId: schema.membership.squadId,
      squad: schema.squad.name,
      name: schema.user.name,
      email: schema.user.email,
      dateStyle: schema.user.dateStyle,
      timeZone: schema.notificationSetting.timeZone,
      digest: schema.notificationSetting.coachDigest,
    })
    .from(schema.membership)
    .innerJoin(schema.user, eq(schema.user.id, schema.membership.userId))
    .innerJoin(schema.squad, eq(schema.squad.id, schema.membership.squadId))
    .leftJoin(schema.notificationSetting, eq(schema.notificationSetting.userId, schema.membership.userId))
    .where(inArray(schema.membership.role, ["head_coach", "coach"]));
  const due = coaches.flatMap((c) => {
    if (c.digest === false) return [];
    const monday = digestMonday(now, c.timeZone ?? "UTC");
    return monday ? [{ ...c, monday, key: `coach_digest:${c.userId}:${c.squadId}:${monday}` }] : [];
  });
  const done = await alreadyQueued(due.map((d) => d.key));
  let queued = 0;
  for (const c of due.filter((d) => !done.has(d.key))) {
    const { rows } = await squadRoster(await actorForUser(c.userId), c.squadId, now);
    const ids = rows.map((r) => r.id);
    const lastWeek = [addDays(c.monday, -7), addDays(c.monday, -1)] as const;
    const missedRows = ids.length
      ? await db
          .select({
            athleteId: schema.plannedSession.athleteId,
            id: schema.plannedSession.id,
            date: schema.plannedSession.date,
            title: schema.plannedSession.title,
            status: schema.sessionLog.status,
          })
          .from(schema.plannedSession)
          .leftJoin(schema.sessionLog, eq(schema.sessionLog.plannedSessionId, schema.plannedSession.id))
          .where(
            and(
              inArray(schema.plannedSession.athleteId, ids),
              gte(schema.plannedSession.date, lastWeek[0]),
              lte(schema.plannedSession.date, lastWeek[1]),
            ),
          )
      : [];
    const nameOf = new Map(rows.map((r) => [r.id, r.name]));
    const missed: DigestLine[] = missedRows
      .filter((m) => !m.status || m.status === "skipped")
      .map((m) => ({
        athlete: nameOf.get(m.athleteId) ?? "",
        detail: `${m.title} on ${formatDay(m.date, dateStyleOf(c.dateStyle))} ${m.status === "skipped" ? "was skipped" : "has no log"}`,
      }));
    const l = links(c.userId, "coach_digest");
    const props = {
      name: c.name,
      squad: c.squad,
      weekLabel: dayLabel(c.monday, dateStyleOf(c.dateStyle)),
      overBudget: rows
        .filter((r) => r.week.overBudget)
        .map((r) => ({ athlete: r.name, detail: r.week.flags.join(" ") })),
      overdueRetests: rows
        .filter((r) => r.retestOverdue)
        .map((r) => ({ athlete: r.name, detail: r.retestNote ?? "retest overdue" })),
      loadFlags: rows
        .filter((r) => r.loadFlag)
        .map((r) => ({
          athlete: r.name,
          detail: `acute:chronic ratio ${r.acwr?.toFixed(2) ?? "–"} (${r.loadFlag === "high" ? "above" : "below"} the usual band)`,
        })),
      missed,
      unread: rows
        .filter((r) => r.unreadMessages)
        .map((r) => ({
          athlete: r.name,
          detail: `${r.unreadMessages} new ${r.unreadMessages === 1 ? "message" : "messages"} on their sessions and logs`,
        })),
      rosterUrl: `${publicOrigin()}/roster?squad=${c.squadId}`,
      unsubscribeUrl: l.unsubscribeUrl,
      settingsUrl: l.settingsUrl,
    };
    const id = await queueMessage(db, {
      kind: "coach_digest",
      to: c.email,
      userId: c.userId,
      subject: coachDigestSubject(props),
      text: coachDigestText(props),
      html: await renderEmailHtml(createElement(CoachDigestEmail, props)),
      headers: l.headers,
      idempotencyKey: c.key,
      meta: { week: c.monday, squadId: c.squadId },
    });
    if (id) queued++;
  }
  return queued;
}
