// Reminders and e-mail against the local fake of the e-mail API, through the Resend SDK, on real PostgreSQL. Clock
// check values from the IANA time-zone database in Node's Intl (Oslo UTC+1 in winter, UTC+2 in summer).
import ICAL from "ical.js";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { resetConfig } from "@/features/platform/server/config";
import * as sessionsRoute from "@/app/api/athletes/[id]/sessions/route";
import * as testsRoute from "@/app/api/athletes/[id]/tests/route";
import * as calendarRoute from "@/app/api/calendar/[feed]/route";
import * as feedRoute from "@/app/api/me/calendar-feed/route";
import * as notificationsRoute from "@/app/api/me/notifications/route";
import * as unsubscribeRoute from "@/app/api/unsubscribe/[token]/route";
import { getDb } from "@/db/client";
import { deliverPending } from "@/features/messages/server/deliver";
import { queueMessages } from "@/features/messages/server/outbox";
import { queueCoachDigests, queueRetestReminders, queueSessionReminders } from "@/features/reminders/server/jobs";
import { startFakeEmail, type FakeEmail } from "../../scripts/fake-email";
import { Browser } from "../support/api";
import { query, resetDatabase } from "../support/db";
import { makeSquad } from "../support/squad";

type Squad = Awaited<ReturnType<typeof makeSquad>>;
let s: Squad;
let fake: FakeEmail;

const step = (kind: string, min: number, zone: number) => ({ type: "step", kind, durationS: min * 60, zone });
const plan = (date: string, title: string, kind: "training" | "retest" = "training") =>
  s.coach.browser.call(sessionsRoute, "POST", `/api/athletes/${s.athleteA.id}/sessions`, {
    params: { id: s.athleteA.id },
    body: {
      date,
      title,
      sport: "running",
      kind,
      structure: [step("warmup", 10, 1), step("work", 30, 2), step("cooldown", 10, 1)],
    },
  });
const received = (kind: string, to = s.athleteA.email) =>
  fake.messages.filter((m) => m.kind === kind && m.to.includes(to));

beforeAll(async () => {
  await resetDatabase();
  fake = await startFakeEmail({ quiet: true });
  process.env.RESEND_BASE_URL = fake.url;
  delete process.env.RESEND_API_KEY;
  delete process.env.TIDEMARK_EMAIL_TRANSPORT;
  resetConfig();
  s = await makeSquad("mail");
  await query(
    `insert into athlete_profile (user_id, time_zone, reminder_timing, reminder_time) values ($1, 'Europe/Oslo', 'morning_of', '07:00')
     on conflict (user_id) do update set time_zone = 'Europe/Oslo', reminder_timing = 'morning_of', reminder_time = '07:00', remind_sessions = true, remind_retests = true`,
    [s.athleteA.id],
  );
  // This athlete reads dates day before month (Settings → Units and dates); e-mails follow the reader's choice.
  await query(`update "user" set date_style = 'day-month' where id = $1`, [s.athleteA.id]);
  for (const [d, t] of [
    ["2027-01-15", "Winter tempo"],
    ["2027-01-16", "Winter long run"],
    ["2027-06-15", "Summer tempo"],
  ] as const)
    expect((await plan(d, t)).status).toBe(201);
  await deliverPending(new Date()); // the invitations of the squad
});

afterAll(async () => {
  await fake.stop();
});

describe("session reminders", () => {
  it("07:00 in Oslo: sent at 06:00 UTC in winter and 05:00 UTC in summer, with the day's session", async () => {
    expect(await queueSessionReminders(new Date("2027-01-15T05:59:00Z"))).toBe(0);
    expect(await queueSessionReminders(new Date("2027-01-15T06:00:00Z"))).toBe(1);
    await deliverPending(new Date("2027-01-15T06:00:00Z"));
    expect(received("session_reminder").map((m) => m.subject)).toEqual(["Today: Winter tempo"]);
    const m = received("session_reminder")[0]!;
    expect(m.text).toMatch(/Friday 15 January 2027/);
    expect(m.headers["List-Unsubscribe"]).toMatch(/\/api\/unsubscribe\//);
    // Month before day from the next e-mail on (the long US form, CLDR en-US).
    await query(`update "user" set date_style = 'month-day' where id = $1`, [s.athleteA.id]);

    expect(await queueSessionReminders(new Date("2027-06-15T04:59:00Z"))).toBe(0);
    expect(await queueSessionReminders(new Date("2027-06-15T05:00:00Z"))).toBe(1);
    await deliverPending(new Date("2027-06-15T05:00:00Z"));
    expect(
      received("session_reminder")
        .map((m) => m.subject)
        .sort(),
    ).toEqual(["Summer tempo", "Winter tempo"].map((t) => `Today: ${t}`).sort());
    expect(received("session_reminder").find((x) => x.subject === "Today: Summer tempo")!.text).toMatch(
      /Tuesday, June 15, 2027/,
    );
    await query(`update "user" set date_style = 'day-month' where id = $1`, [s.athleteA.id]);
  });

  it("running the job twice sends once", async () => {
    expect(await queueSessionReminders(new Date("2027-01-15T06:30:00Z"))).toBe(0);
    expect(await queueSessionReminders(new Date("2027-01-15T09:00:00Z"))).toBe(0);
    await deliverPending(new Date("2027-01-15T09:00:00Z"));
    expect(received("session_reminder").filter((m) => m.subject === "Today: Winter tempo")).toHaveLength(1);
  });

  it("with the e-mail service down for a while, the reminder arrives once after it returns", async () => {
    await fetch(`${fake.url}/_fake/fail`, { method: "POST", body: JSON.stringify({ status: 503 }) });
    const t0 = new Date("2027-01-16T06:00:00Z");
    expect(await queueSessionReminders(t0)).toBe(1);
    expect(await deliverPending(t0)).toMatchObject({ sent: 0, retrying: 1 });
    // Still down a little later, then rate-limited once: each attempt waits longer (backoff), nothing is sent twice.
    expect(await deliverPending(new Date(t0.getTime() + 60_000))).toMatchObject({ sent: 0, retrying: 1 });
    await fetch(`${fake.url}/_fake/fail`, { method: "POST", body: JSON.stringify({ status: 429, count: 1 }) });
    expect(await deliverPending(new Date(t0.getTime() + 10 * 60_000))).toMatchObject({ sent: 0, retrying: 1 });
    expect(received("session_reminder").filter((m) => m.subject === "Today: Winter long run")).toHaveLength(0);
    // Back: the next due attempt delivers it, and later runs do not send it again.
    expect(await deliverPending(new Date(t0.getTime() + 30 * 60_000))).toMatchObject({ sent: 1 });
    expect(await deliverPending(new Date(t0.getTime() + 60 * 60_000))).toMatchObject({ sent: 0, retrying: 0 });
    expect(await queueSessionReminders(new Date(t0.getTime() + 60 * 60_000))).toBe(0);
    expect(received("session_reminder").filter((m) => m.subject === "Today: Winter long run")).toHaveLength(1);
    const [row] = await query<{ attempts: number; status: string }>(
      `select attempts, status from outbox where idempotency_key = $1`,
      [`session_reminder:${s.athleteA.id}:2027-01-16`],
    );
    expect(row).toEqual({ attempts: 4, status: "sent" });
  });

  it("an unsubscribed kind sends nothing; the link works without signing in and says what it turned off", async () => {
    const link = received("session_reminder")[0]!.headers["List-Unsubscribe"]!.slice(1, -1);
    const token = decodeURIComponent(link.split("/api/unsubscribe/")[1]!);
    const r = await new Browser().call(unsubscribeRoute, "POST", `/api/unsubscribe/${token}`, { params: { token } });
    expect(r.status).toBe(200);
    expect(r.json.message).toMatch(/Turned off session reminders/);
    expect(
      (await new Browser().call(unsubscribeRoute, "POST", `/api/unsubscribe/x`, { params: { token: `${token}x` } }))
        .status,
    ).toBe(404);
    await plan("2027-01-18", "After unsubscribing");
    expect(await queueSessionReminders(new Date("2027-01-18T06:00:00Z"))).toBe(0);
    await deliverPending(new Date("2027-01-18T06:00:00Z"));
    expect(received("session_reminder").some((m) => m.subject.includes("After unsubscribing"))).toBe(false);
  });

  it("a reminder reads in the athlete's units: miles and pace per mile for an imperial runner", async () => {
    // Athlete B: running zones with speeds (VT1 12 km/h, VT2 14.4 km/h) and imperial units.
    await query(
      `insert into athlete_profile (user_id, time_zone, reminder_timing, reminder_time) values ($1, 'UTC', 'morning_of', '07:00')
       on conflict (user_id) do update set time_zone = 'UTC', reminder_timing = 'morning_of', reminder_time = '07:00'`,
      [s.athleteB.id],
    );
    await query(`update "user" set units = 'imperial' where id = $1`, [s.athleteB.id]);
    const test = await s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteB.id}/tests`, {
      params: { id: s.athleteB.id },
      body: {
        kind: "manual",
        meta: { sport: "running", protocol: "lab report", date: "2027-03-01", endedBy: "plan" },
        vt1: { hrBpm: 150, speedKmh: 12 },
        vt2: { hrBpm: 172, speedKmh: 14.4 },
      },
    });
    expect(test.status).toBe(201);
    const made = await s.coach.browser.call(sessionsRoute, "POST", `/api/athletes/${s.athleteB.id}/sessions`, {
      params: { id: s.athleteB.id },
      body: {
        date: "2027-03-10",
        title: "Steady miles",
        sport: "running",
        structure: [{ type: "step", kind: "work", distanceM: 8046.72, zone: 2 }],
      },
    });
    expect(made.status).toBe(201);
    expect(await queueSessionReminders(new Date("2027-03-10T07:00:00Z"))).toBe(1);
    await deliverPending(new Date("2027-03-10T07:00:00Z"));
    const m = received("session_reminder", s.athleteB.email).find((x) => x.subject === "Today: Steady miles")!;
    // 8046.72 m = 5 mi; zone 2 = 12.0–14.4 km/h = 8:03–6:43 per mile (hand-worked in platform/lib/units.test.ts).
    expect(m.text).toContain("5 mi");
    expect(m.text).toContain("6:43 /mi – 8:03 /mi");
    expect(m.text).not.toContain("/km");
  });
});

describe("retest reminders, the coach digest and the calendar feed", () => {
  it("a retest is reminded seven days and one day before, each once, with its date and the readiness questions", async () => {
    expect((await plan("2027-02-10", "Retest: threshold test", "retest")).status).toBe(201);
    expect(await queueRetestReminders(new Date("2027-02-03T06:00:00Z"))).toBe(1);
    expect(await queueRetestReminders(new Date("2027-02-04T06:00:00Z"))).toBe(0);
    expect(await queueRetestReminders(new Date("2027-02-09T06:00:00Z"))).toBe(1);
    await deliverPending(new Date("2027-02-09T06:00:00Z"));
    const subjects = received("retest_reminder").map((m) => m.subject);
    expect(subjects).toEqual(
      expect.arrayContaining([
        "Retest in a week: Wednesday 10 February 2027",
        "Retest tomorrow, Wednesday 10 February 2027",
      ]),
    );
    expect(received("retest_reminder")[0]!.text).toMatch(/heart condition/);
  });

  it("the coach digest comes on Monday from 07:00 in the coach's time zone, once", async () => {
    const set = await s.coach.browser.call(notificationsRoute, "PATCH", "/api/me/notifications", {
      body: { timeZone: "Europe/Oslo" },
    });
    expect(set.status).toBe(200);
    expect(
      (
        await s.coach.browser.call(notificationsRoute, "PATCH", "/api/me/notifications", {
          body: { timeZone: "Mars/Olympus" },
        })
      ).status,
    ).toBe(400);
    // The coach is in Oslo (07:00 = 06:00 UTC); the head coach kept the default UTC (07:00 UTC).
    expect(await queueCoachDigests(new Date("2027-01-04T05:59:00Z"))).toBe(0);
    expect(await queueCoachDigests(new Date("2027-01-04T06:00:00Z"))).toBe(1);
    expect(await queueCoachDigests(new Date("2027-01-04T07:00:00Z"))).toBe(1);
    expect(await queueCoachDigests(new Date("2027-01-04T09:00:00Z"))).toBe(0);
    expect(await queueCoachDigests(new Date("2027-01-05T07:00:00Z"))).toBe(0); // Tuesday
    await deliverPending(new Date("2027-01-04T09:00:00Z"));
    expect(received("coach_digest", s.coach.email)).toHaveLength(1);
    expect(received("coach_digest", s.head.email)).toHaveLength(1);
    expect(received("coach_digest", s.coach.email)[0]!.text).toMatch(/Sessions missed last week/);
  });

  it("the calendar feed lists the athlete's sessions (parsed back with ical.js); renewing or revoking the token ends the old address", async () => {
    const on = await s.athleteA.browser.call(feedRoute, "POST", "/api/me/calendar-feed");
    expect(on.status).toBe(201);
    const file = (on.json.url as string).split("/api/calendar/")[1]!;
    const get = async (f: string) => {
      const res = await calendarRoute.GET(new Request(`http://127.0.0.1:3999/api/calendar/${f}`), {
        params: Promise.resolve({ feed: f }),
      });
      return { status: res.status, text: await res.text(), type: res.headers.get("content-type") };
    };
    const feed = await get(file);
    expect(feed.status).toBe(200);
    expect(feed.type).toMatch(/text\/calendar/);
    const events = new ICAL.Component(ICAL.parse(feed.text))
      .getAllSubcomponents("vevent")
      .map((e) => new ICAL.Event(e));
    const planned = await query<{ date: string }>(
      `select date from planned_session where athlete_id = $1 and date >= $2 order by date`,
      [s.athleteA.id, "2026-10-01"],
    );
    expect(events.map((e) => e.startDate.toString()).sort()).toEqual(planned.map((p) => p.date).sort());
    expect(events.some((e) => e.summary.startsWith("Retest: "))).toBe(true);
    const renewed = await s.athleteA.browser.call(feedRoute, "POST", "/api/me/calendar-feed");
    expect((await get(file)).status).toBe(404);
    const file2 = (renewed.json.url as string).split("/api/calendar/")[1]!;
    expect((await get(file2)).status).toBe(200);
    expect((await s.athleteA.browser.call(feedRoute, "DELETE", "/api/me/calendar-feed")).status).toBe(204);
    expect((await get(file2)).status).toBe(404);
    expect(file2.replace(".ics", "")).toMatch(/^[A-Za-z0-9_-]{43}$/); // 32 random bytes
  });

  it("the SMTP alternative: with TIDEMARK_EMAIL_TRANSPORT=smtp the same outbox message goes through nodemailer to the catcher", async () => {
    process.env.TIDEMARK_EMAIL_TRANSPORT = "smtp";
    process.env.SMTP_HOST = "127.0.0.1";
    process.env.SMTP_PORT = String(fake.smtpPort);
    resetConfig();
    try {
      await query(`update athlete_profile set remind_retests = true where user_id = $1`, [s.athleteA.id]);
      expect((await plan("2027-03-10", "Retest: threshold test", "retest")).status).toBe(201);
      // A week before the new retest, and the February retest is now overdue (no test since): two reminders, once each.
      expect(await queueRetestReminders(new Date("2027-03-03T06:00:00Z"))).toBe(2);
      expect(await queueRetestReminders(new Date("2027-03-03T07:00:00Z"))).toBe(0);
      expect(await deliverPending(new Date("2027-03-03T06:00:00Z"))).toMatchObject({ sent: 2 });
      const viaSmtp = fake.messages.filter((m) => m.via === "smtp").sort((a, b) => a.subject.localeCompare(b.subject));
      expect(viaSmtp.map((m) => m.subject)).toEqual([
        "Retest in a week: Wednesday 10 March 2027",
        "Your retest of Wednesday 10 February 2027 is still to do",
      ]);
      expect(viaSmtp[0]!.kind).toBe("retest_reminder");
      expect(viaSmtp[0]!.text).toMatch(/readiness questions/);
      expect(viaSmtp[0]!.headers["list-unsubscribe"] ?? viaSmtp[0]!.headers["List-Unsubscribe"]).toMatch(
        /\/api\/unsubscribe\//,
      );
    } finally {
      delete process.env.TIDEMARK_EMAIL_TRANSPORT;
      resetConfig();
    }
  });
});

describe("delivery in batches, exactly once", () => {
  const message = (n: number, to = `batch${n}@mail.test`) => ({
    kind: "batch_check",
    to,
    subject: `Batch check ${n}`,
    text: `Message ${n}.`,
    html: `<p>Message ${n}.</p>`,
    idempotencyKey: `batch_check:${n}:${to}`,
  });
  const arrived = () => fake.messages.filter((m) => m.kind === "batch_check");

  it("a batch whose answer is lost is sent again as the same batch, and the service keeps one copy of each message", async () => {
    await fetch(`${fake.url}/_fake/reset`, { method: "POST" });
    const t0 = new Date("2027-04-01T06:00:00Z");
    expect(await deliverPending(t0)).toMatchObject({ sent: 0, retrying: 0 });
    expect(
      await queueMessages(
        getDb(),
        [1, 2, 3].map((n) => message(n)),
      ),
    ).toHaveLength(3);
    // The service takes the batch, but its answer does not come back.
    await fetch(`${fake.url}/_fake/fail`, {
      method: "POST",
      body: JSON.stringify({ status: 503, count: 1, afterSending: true }),
    });
    expect(await deliverPending(t0)).toMatchObject({ sent: 0, retrying: 3 });
    expect(arrived()).toHaveLength(3);
    // The retry is the same request under the same key: answered with the same ids, nothing sent twice.
    expect(await deliverPending(new Date(t0.getTime() + 60_000))).toMatchObject({ sent: 3, retrying: 0 });
    expect(arrived()).toHaveLength(3);
    const rows = await query<{ provider_id: string; batch_key: string }>(
      `select provider_id, batch_key from outbox where kind = 'batch_check' order by subject`,
    );
    expect(rows.map((r) => r.provider_id).sort()).toEqual(
      arrived()
        .map((m) => m.id)
        .sort(),
    );
    expect(new Set(rows.map((r) => r.batch_key)).size).toBe(1);
  });

  it("a batch the service refuses is sent one message at a time: the good ones arrive, the bad one is marked failed", async () => {
    await fetch(`${fake.url}/_fake/reset`, { method: "POST" });
    await queueMessages(getDb(), [message(4), message(5, "not an address"), message(6)]);
    const t0 = new Date("2027-04-02T06:00:00Z");
    expect(await deliverPending(t0)).toMatchObject({ sent: 2, failed: 1 });
    expect(
      arrived()
        .map((m) => m.subject)
        .sort(),
    ).toEqual(["Batch check 4", "Batch check 6"]);
    expect(await deliverPending(new Date(t0.getTime() + 60_000))).toMatchObject({ sent: 0, failed: 0 });
  });

  it("a batch key the service already knows with other content is not sent again, nor one by one: marked failed", async () => {
    await fetch(`${fake.url}/_fake/reset`, { method: "POST" });
    // Another request under the same key reached the service before (say, the batch as it was then).
    const earlier = await fetch(`${fake.url}/emails/batch`, {
      method: "POST",
      headers: {
        "content-type": "application/json",
        authorization: "Bearer re_local_fake_key",
        "idempotency-key": "batch-known-key",
      },
      body: JSON.stringify([
        { from: "Tidemark <no-reply@tidemark.test>", to: ["batch8@mail.test"], subject: "Earlier", text: "Earlier." },
      ]),
    });
    expect(earlier.status).toBe(200);
    await queueMessages(getDb(), [message(8), message(9)]);
    await query(`update outbox set batch_key = 'batch-known-key' where kind = 'batch_check' and status = 'pending'`);
    const t0 = new Date("2027-04-04T06:00:00Z");
    expect(await deliverPending(t0)).toMatchObject({ sent: 0, failed: 2 });
    expect(arrived()).toHaveLength(0);
    expect(fake.messages.map((m) => m.subject)).toEqual(["Earlier"]);
  });

  it("messages a worker claimed but never finished are sent once the worker's hold has passed", async () => {
    await fetch(`${fake.url}/_fake/reset`, { method: "POST" });
    await queueMessages(getDb(), [message(7)]);
    const t0 = new Date("2027-04-03T06:00:00Z");
    // A worker claimed the message (batch key and a five-minute hold) and stopped before sending.
    await query(
      `update outbox set batch_key = 'batch-stopped-worker', next_attempt_at = $1 where kind = 'batch_check' and status = 'pending'`,
      [new Date(t0.getTime() + 300_000).toISOString()],
    );
    expect(await deliverPending(t0)).toMatchObject({ sent: 0 });
    expect(await deliverPending(new Date(t0.getTime() + 301_000))).toMatchObject({ sent: 1 });
    expect(arrived().map((m) => m.subject)).toEqual(["Batch check 7"]);
  });
});
