// Conversations on sessions and logs, through the route handlers on real PostgreSQL: both sides write, the same access
// as the session or log, unread counts on the roster and in the digest, an e-mail per message unless turned off.
import { beforeAll, describe, expect, it } from "vitest";
import * as sessionsRoute from "@/app/api/athletes/[id]/sessions/route";
import * as logsRoute from "@/app/api/athletes/[id]/logs/route";
import * as sessionMessagesRoute from "@/app/api/sessions/[id]/messages/route";
import * as logMessagesRoute from "@/app/api/logs/[id]/messages/route";
import * as rosterRoute from "@/app/api/roster/route";
import * as notificationsRoute from "@/app/api/me/notifications/route";
import * as unsubscribeRoute from "@/app/api/unsubscribe/[token]/route";
import { Browser } from "../support/api";
import { query, resetDatabase } from "../support/db";
import { makeSquad } from "../support/squad";

type Squad = Awaited<ReturnType<typeof makeSquad>>;
let s: Squad;
let other: Squad;
let sessionId = "";

const thread = (who: Browser, id = sessionId) =>
  who.call(sessionMessagesRoute, "GET", `/api/sessions/${id}/messages`, { params: { id } });
const write = (who: Browser, body: unknown, id = sessionId) =>
  who.call(sessionMessagesRoute, "POST", `/api/sessions/${id}/messages`, { params: { id }, body });
const mailsTo = (email: string) =>
  query<{ subject: string; text_body: string }>(
    `select subject, text_body from outbox where kind = 'thread_message' and to_address = $1 order by created_at`,
    [email],
  );
const unreadOnRoster = async (who: Browser, athleteId: string) => {
  const r = await who.call(rosterRoute, "GET", "/api/roster", { query: `?squad=${s.squadId}` });
  expect(r.status).toBe(200);
  return (r.json.rows as { id: string; unreadMessages: number }[]).find((x) => x.id === athleteId)!.unreadMessages;
};

beforeAll(async () => {
  await resetDatabase();
  s = await makeSquad("thr");
  other = await makeSquad("thr-other");
  // The head coach reads dates day before month; the other coach keeps the default (ISO 8601).
  await query(`update "user" set date_style = 'day-month' where id = $1`, [s.head.id]);
  const made = await s.coach.browser.call(sessionsRoute, "POST", `/api/athletes/${s.athleteA.id}/sessions`, {
    params: { id: s.athleteA.id },
    body: {
      date: "2027-04-06",
      title: "Hill repeats",
      sport: "running",
      structure: [{ type: "step", kind: "work", durationS: 2400, zone: 2 }],
    },
  });
  expect(made.status).toBe(201);
  sessionId = made.json.id;
});

describe("session threads", () => {
  it("the athlete writes, the coaches read it as new once, answer, and each side gets an e-mail", async () => {
    const posted = await write(s.athleteA.browser, {
      body: "  The last hill hurt my knee.\nShould I skip Thursday?  ",
    });
    expect(posted.status).toBe(201);
    expect(posted.json).toMatchObject({
      body: "The last hill hurt my knee.\nShould I skip Thursday?",
      authorRole: "athlete",
    });
    expect(await unreadOnRoster(s.head.browser, s.athleteA.id)).toBe(1);
    const first = await thread(s.head.browser);
    expect(first.status).toBe(200);
    expect(first.json.messages).toHaveLength(1);
    expect(first.json.messages[0]).toMatchObject({ unread: true, authorRole: "athlete" });
    // Read once: no longer new for this coach, still new for the other coach.
    expect((await thread(s.head.browser)).json.messages[0].unread).toBe(false);
    expect(await unreadOnRoster(s.head.browser, s.athleteA.id)).toBe(0);
    expect(await unreadOnRoster(s.coach.browser, s.athleteA.id)).toBe(1);
    // Both coaches were told by e-mail, the athlete (the author) was not.
    expect((await mailsTo(s.head.email))[0]!.subject).toMatch(/wrote about Hill repeats, Tuesday 6 April 2027/);
    expect((await mailsTo(s.head.email))[0]!.text_body).toContain("> Should I skip Thursday?");
    // The link opens the athlete's page at its conversations (a log's thread is not on the plan).
    expect((await mailsTo(s.head.email))[0]!.text_body).toContain(`/athletes/${s.athleteA.id}#messages`);
    expect(await mailsTo(s.coach.email)).toHaveLength(1);
    expect((await mailsTo(s.coach.email))[0]!.subject).toMatch(/wrote about Hill repeats, Tuesday 2027-04-06/);
    expect(await mailsTo(s.athleteA.email)).toHaveLength(0);

    const answer = await write(s.head.browser, { body: "Yes, swap it for an easy spin." });
    expect(answer.status).toBe(201);
    expect(answer.json.authorRole).toBe("coach");
    expect(await mailsTo(s.athleteA.email)).toHaveLength(1);
    const seen = await thread(s.athleteA.browser);
    expect(seen.json.messages.map((m: { body: string }) => m.body)).toEqual([
      "The last hill hurt my knee.\nShould I skip Thursday?",
      "Yes, swap it for an easy spin.",
    ]);
    expect(seen.json.messages.map((m: { unread: boolean }) => m.unread)).toEqual([false, true]);
  });

  it("nobody else reads or writes it: a squad mate and another squad's coach get 404, and nothing is written", async () => {
    for (const who of [s.athleteB.browser, other.head.browser]) {
      expect((await thread(who)).status).toBe(404);
      expect((await write(who, { body: "hello" })).status).toBe(404);
    }
    expect((await thread(s.head.browser, "no-such-session")).status).toBe(404);
    const [n] = await query<{ n: number }>(
      `select count(*)::int as n from thread_message where planned_session_id = $1`,
      [sessionId],
    );
    expect(n!.n).toBe(2);
  });

  it("bad messages are refused with a clear reason", async () => {
    for (const [body, reason] of [
      [{ body: "   " }, "Write a message."],
      [{ body: "x".repeat(1001) }, "Keep a message under 1000 characters."],
      [{ body: "bell \u0007" }, "A message holds text and line breaks only."],
      [{ body: "ok", extra: 1 }, ""],
      [{}, "Write a message."],
    ] as const) {
      const r = await write(s.athleteA.browser, body);
      expect(r.status).toBe(400);
      if (reason) expect(JSON.stringify(r.json)).toContain(reason);
    }
  });

  it("a person who turned message e-mails off gets none; the e-mail's unsubscribe link does the same", async () => {
    const off = await s.athleteA.browser.call(notificationsRoute, "PATCH", "/api/me/notifications", {
      body: { messageEmails: false },
    });
    expect(off.status).toBe(200);
    expect(off.json.messageEmails).toBe(false);
    await write(s.coach.browser, { body: "Ice it tonight." });
    expect(await mailsTo(s.athleteA.email)).toHaveLength(1);
    // The coach turns them off with the link in the e-mail they received.
    const [mail] = await query<{ headers: Record<string, string> }>(
      `select headers from outbox where kind = 'thread_message' and to_address = $1 limit 1`,
      [s.head.email],
    );
    const token = decodeURIComponent(mail!.headers["List-Unsubscribe"]!.slice(1, -1).split("/api/unsubscribe/")[1]!);
    const r = await new Browser().call(unsubscribeRoute, "POST", `/api/unsubscribe/${token}`, { params: { token } });
    expect(r.status).toBe(200);
    expect(r.json.message).toMatch(/e-mails about new messages/);
    const before = (await mailsTo(s.head.email)).length;
    await write(s.athleteA.browser, { body: "Will do." });
    expect(await mailsTo(s.head.email)).toHaveLength(before);
  });
});

describe("log threads", () => {
  it("an unplanned log has its own thread with the same access", async () => {
    const log = await s.athleteA.browser.call(logsRoute, "POST", `/api/athletes/${s.athleteA.id}/logs`, {
      params: { id: s.athleteA.id },
      body: { status: "done", date: "2027-04-07", sport: "cycling", title: "Easy spin", durationMin: 40, rpe: 2 },
    });
    expect(log.status).toBe(201);
    const id = log.json.log?.id ?? log.json.id;
    const post = (who: Browser, body: string) =>
      who.call(logMessagesRoute, "POST", `/api/logs/${id}/messages`, { params: { id }, body: { body } });
    expect((await post(s.athleteA.browser, "Knee fine on the bike.")).status).toBe(201);
    expect((await post(s.coach.browser, "Good. Run again on Saturday.")).status).toBe(201);
    expect((await post(s.athleteB.browser, "hi")).status).toBe(404);
    const r = await s.head.browser.call(logMessagesRoute, "GET", `/api/logs/${id}/messages`, { params: { id } });
    expect(r.json.messages.map((m: { authorRole: string }) => m.authorRole)).toEqual(["athlete", "coach"]);
    expect(r.json.title).toBe("Easy spin");
  });
});
