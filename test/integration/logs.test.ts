// Logging, activity files, load and the roster through the real route handlers on real PostgreSQL.
import { beforeAll, describe, expect, it } from "vitest";
import * as sessionsRoute from "@/app/api/athletes/[id]/sessions/route";
import * as weeksRoute from "@/app/api/athletes/[id]/weeks/route";
import * as testsRoute from "@/app/api/athletes/[id]/tests/route";
import * as profileRoute from "@/app/api/athletes/[id]/profile/route";
import * as logRoute from "@/app/api/sessions/[id]/log/route";
import * as logsRoute from "@/app/api/athletes/[id]/logs/route";
import * as logItemRoute from "@/app/api/logs/[id]/route";
import * as activitiesRoute from "@/app/api/athletes/[id]/activities/route";
import * as loadRoute from "@/app/api/athletes/[id]/load/route";
import * as rosterRoute from "@/app/api/roster/route";
import { encodeFit } from "@/features/activities/lib/fit-fixture";
import { makeSquad } from "../support/squad";
import { query, resetDatabase } from "../support/db";

type Squad = Awaited<ReturnType<typeof makeSquad>>;
let s: Squad;
let other: Squad;
const DAY = "2026-11-25"; // a Wednesday
const step = (kind: string, min: number, zone: number) => ({ type: "step", kind, durationS: min * 60, zone });

async function plan(date: string, structure: unknown[], title = "Session", sport = "cycling") {
  const r = await s.coach.browser.call(sessionsRoute, "POST", `/api/athletes/${s.athleteA.id}/sessions`, {
    params: { id: s.athleteA.id },
    body: { date, title, sport, structure },
  });
  expect(r.status).toBe(201);
  return r.json.id as string;
}
const logAs = (who: Squad["athleteA"]["browser"], id: string, body: unknown) =>
  who.call(logRoute, "POST", `/api/sessions/${id}/log`, { params: { id }, body });
const weeks = async () =>
  (
    await s.coach.browser.call(weeksRoute, "GET", "/api/athletes/x/weeks", {
      params: { id: s.athleteA.id },
      query: `?from=${DAY}&to=${DAY}`,
    })
  ).json;
const counts = async () =>
  (
    await query<{ logs: string; files: string }>(
      `select (select count(*) from session_log) as logs, (select count(*) from activity_file) as files`,
    )
  )[0]!;
function upload(bytes: Uint8Array, name: string, extra: Record<string, string> = {}) {
  const form = new FormData();
  form.set("file", new File([bytes as BlobPart], name));
  for (const [k, v] of Object.entries(extra)) form.set(k, v);
  return form;
}

beforeAll(async () => {
  await resetDatabase();
  s = await makeSquad("l");
  other = await makeSquad("m");
  const meta = { sport: "cycling", protocol: "lab report", date: "2026-11-01", endedBy: "plan" };
  const t = await s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteA.id}/tests`, {
    params: { id: s.athleteA.id },
    body: { kind: "manual", meta, vt1: { hrBpm: 140, powerW: 200 }, vt2: { hrBpm: 165, powerW: 280 } },
  });
  expect(t.status).toBe(201);
  const p = await s.athleteA.browser.call(profileRoute, "PATCH", "/api/athletes/x/profile", {
    params: { id: s.athleteA.id },
    body: { timeZone: "UTC", restingHrBpm: 60, maxHrBpm: 190, sex: "male", sports: ["cycling"] },
  });
  expect(p.status).toBe(200);
});

describe("logging planned sessions", () => {
  it("a log updates the week's done minutes (planned split scaled), and a second identical submit writes nothing", async () => {
    const id = await plan(DAY, [step("warmup", 20, 1), step("work", 20, 3), step("cooldown", 20, 1)], "Threshold ride");
    const body = { status: "done", durationMin: 60, rpe: 6, distanceKm: 30, notes: "Felt good" };
    const first = await logAs(s.athleteA.browser, id, body);
    expect(first.status).toBe(201);
    expect(first.json.loggedBy).toBe(s.athleteA.id);
    const again = await logAs(s.athleteA.browser, id, body);
    expect(again.status).toBe(200);
    expect(again.json.alreadyLogged).toBe(true);
    expect(again.json.id).toBe(first.json.id);
    expect((await query(`select id from session_log where planned_session_id = $1`, [id])).length).toBe(1);
    const [w] = await weeks();
    expect(w.doneMinByZone).toEqual([40, 0, 20]);
    const sessions = (
      await s.coach.browser.call(sessionsRoute, "GET", "/api/athletes/x/sessions", {
        params: { id: s.athleteA.id },
        query: `?from=${DAY}&to=${DAY}`,
      })
    ).json;
    expect(sessions.find((x: { id: string }) => x.id === id).log.status).toBe("done");
    expect(sessions.find((x: { id: string }) => x.id === id).log.compliance).toBeCloseTo(1, 9);
  });

  it("submits racing each other still give one log", async () => {
    const id = await plan("2026-11-26", [step("work", 45, 1)]);
    const results = await Promise.all(
      [1, 2, 3].map(() => logAs(s.athleteA.browser, id, { status: "partial", durationMin: 30, rpe: 3 })),
    );
    expect(results.map((r) => r.status).sort()).toEqual([200, 200, 201]);
    expect((await query(`select id from session_log where planned_session_id = $1`, [id])).length).toBe(1);
  });

  it("a coach may log on the athlete's behalf (recorded), another athlete or another squad may not; bad input writes nothing", async () => {
    const id = await plan("2026-11-27", [step("work", 30, 1)]);
    expect((await logAs(s.athleteB.browser, id, { status: "done", durationMin: 30, rpe: 2 })).status).toBe(404);
    expect((await logAs(other.coach.browser, id, { status: "done", durationMin: 30, rpe: 2 })).status).toBe(404);
    const before = await counts();
    const bad = await logAs(s.athleteA.browser, id, { status: "done", durationMin: -5, rpe: 11 });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.json.fieldErrors)).toEqual(expect.arrayContaining(["durationMin", "rpe"]));
    const noReason = await logAs(s.athleteA.browser, id, { status: "skipped" });
    expect(noReason.status).toBe(400);
    expect(noReason.json.fieldErrors.skipReason[0]).toMatch(/why/);
    expect(await counts()).toEqual(before);
    const byCoach = await logAs(s.coach.browser, id, { status: "skipped", skipReason: "Ill with a cold" });
    expect(byCoach.status).toBe(201);
    expect(byCoach.json.loggedBy).toBe(s.coach.id);
  });

  it("a log can be edited and undone within 7 days, not after", async () => {
    const id = await plan("2026-11-24", [step("work", 50, 1)]);
    const log = (await logAs(s.athleteA.browser, id, { status: "done", durationMin: 50, rpe: 4 })).json;
    const edited = await s.athleteA.browser.call(logItemRoute, "PATCH", `/api/logs/${log.id}`, {
      params: { id: log.id },
      body: { rpe: 5, notes: "Windy" },
    });
    expect(edited.status).toBe(200);
    expect(edited.json.rpe).toBe(5);
    await query(`update session_log set created_at = now() - interval '8 days' where id = $1`, [log.id]);
    const late = await s.athleteA.browser.call(logItemRoute, "DELETE", `/api/logs/${log.id}`, {
      params: { id: log.id },
    });
    expect(late.status).toBe(409);
    expect(late.json.error).toMatch(/7 days/);
    await query(`update session_log set created_at = now() where id = $1`, [log.id]);
    expect(
      (await s.athleteA.browser.call(logItemRoute, "DELETE", `/api/logs/${log.id}`, { params: { id: log.id } })).status,
    ).toBe(204);
    expect((await query(`select id from session_log where id = $1`, [log.id])).length).toBe(0);
  });

  it("an unplanned session with a client key is logged once however often it is sent", async () => {
    const body = {
      status: "done",
      date: "2026-11-28",
      sport: "running",
      title: "Easy jog with friends",
      durationMin: 40,
      rpe: 3,
      clientKey: "7b0c4a52-3c1e-4f0e-9d61-2b7c8f1b9e11",
    };
    const a = await s.athleteA.browser.call(logsRoute, "POST", "/api/athletes/x/logs", {
      params: { id: s.athleteA.id },
      body,
    });
    const b = await s.athleteA.browser.call(logsRoute, "POST", "/api/athletes/x/logs", {
      params: { id: s.athleteA.id },
      body,
    });
    expect([a.status, b.status]).toEqual([201, 200]);
    expect(b.json.id).toBe(a.json.id);
  });
});

describe("activity files", () => {
  // 20 min at 130 bpm / 150 W, 30 min at 150 bpm / 220 W, 10 min at 175 bpm / 300 W.
  const seconds = Array.from({ length: 3600 }, (_, i) =>
    i < 1200
      ? { hrBpm: 130, powerW: 150, speedKmh: 30 }
      : i < 3000
        ? { hrBpm: 150, powerW: 220, speedKmh: 34 }
        : { hrBpm: 175, powerW: 300, speedKmh: 38 },
  );
  const fit = encodeFit({ start: new Date("2026-11-23T07:00:00Z"), sport: "cycling", seconds });

  it("a FIT file is matched to the day's planned ride (same sport, nearest duration), with time in zone by power and a TRIMP", async () => {
    const run = await plan("2026-11-23", [step("work", 60, 1)], "Easy run", "running");
    const longRide = await plan("2026-11-23", [step("work", 180, 1)], "Long ride");
    const ride = await plan("2026-11-23", [step("work", 55, 2)], "Tempo ride");
    const r = await s.athleteA.browser.call(activitiesRoute, "POST", "/api/athletes/x/activities", {
      params: { id: s.athleteA.id },
      form: upload(fit, "ride.fit"),
    });
    expect(r.status).toBe(201);
    expect(r.json.matchedSessionId).toBe(ride);
    expect([run, longRide]).not.toContain(r.json.matchedSessionId);
    // Power bounds 200 / 280 W: 20 min below, 30 min between, 10 min above (hand count).
    expect(r.json.timeInZone).toMatchObject({ measure: "powerW", minutesByZone: [20, 30, 10] });
    expect(r.json.trimp.method).toBe("banister");
    const [log] = await query<{ measured_min_by_zone: number[]; duration_min: number; trimp: number }>(
      `select * from session_log where planned_session_id = $1`,
      [ride],
    );
    expect(log!.measured_min_by_zone).toEqual([20, 30, 10]);
    expect(log!.duration_min).toBeCloseTo(60, 0);
    expect(
      (
        await query(
          `select id from activity_file where log_id = (select id from session_log where planned_session_id = $1)`,
          [ride],
        )
      ).length,
    ).toBe(1);
  });

  it("attaches to a session already marked done (keeping its RPE) and the week shows the measured minutes", async () => {
    const id = await plan("2026-11-29", [step("work", 60, 1)], "Sunday ride");
    await logAs(s.athleteA.browser, id, { status: "done", durationMin: 60, rpe: 6 });
    const f = encodeFit({ start: new Date("2026-11-29T09:00:00Z"), sport: "cycling", seconds });
    const r = await s.athleteA.browser.call(activitiesRoute, "POST", "/api/athletes/x/activities", {
      params: { id: s.athleteA.id },
      form: upload(f, "sunday.fit"),
    });
    expect(r.json.matchedSessionId).toBe(id);
    const [row] = await query<{ rpe: number; measured_min_by_zone: number[] }>(
      `select rpe, measured_min_by_zone from session_log where planned_session_id = $1`,
      [id],
    );
    expect(row!.rpe).toBe(6);
    expect(row!.measured_min_by_zone).toEqual([20, 30, 10]);
  });

  it("the same file again answers 409 with the log that holds it, one after the other and two at once; never a 500", async () => {
    const before = await counts();
    const again = await s.athleteA.browser.call(activitiesRoute, "POST", "/api/athletes/x/activities", {
      params: { id: s.athleteA.id },
      form: upload(fit, "ride-copy.fit"),
    });
    expect(again.status).toBe(409);
    expect(again.json.error).toMatch(/already imported/);
    expect(again.json.existingLog).toMatchObject({ date: "2026-11-23", title: "Tempo ride" });
    expect(await counts()).toEqual(before);
    // Two uploads of a new file at the same moment: one log, one file.
    const f = encodeFit({ start: new Date("2026-11-25T17:00:00Z"), sport: "cycling", seconds });
    const both = await Promise.all(
      [0, 1].map(() =>
        s.athleteA.browser.call(activitiesRoute, "POST", "/api/athletes/x/activities", {
          params: { id: s.athleteA.id },
          form: upload(f, "twice.fit"),
        }),
      ),
    );
    expect(both.map((r) => r.status).sort()).toEqual([201, 409]);
    expect(
      (await query(`select id from session_log where athlete_id = $1 and date = '2026-11-25'`, [s.athleteA.id])).length,
    ).toBe(1);
    // Another athlete may hold the same bytes (a shared group ride file).
    const b = await s.athleteB.browser.call(activitiesRoute, "POST", "/api/athletes/x/activities", {
      params: { id: s.athleteB.id },
      form: upload(f, "twice.fit"),
    });
    expect(b.status).toBe(201);
  });

  it("TRIMP keeps the athlete's first method (Banister here) even when the profile would now allow only Edwards; a week never sums both", async () => {
    expect(
      (
        await query<{ trimp_method: string }>(`select trimp_method from athlete_profile where user_id = $1`, [
          s.athleteA.id,
        ])
      )[0]!.trimp_method,
    ).toBe("banister");
    // Resting heart rate removed: Banister's TRIMP cannot be computed, and Edwards' is not used in its place.
    const p = await s.athleteA.browser.call(profileRoute, "PATCH", "/api/athletes/x/profile", {
      params: { id: s.athleteA.id },
      body: { restingHrBpm: null },
    });
    expect(p.status).toBe(200);
    const f = encodeFit({ start: new Date("2026-11-26T07:00:00Z"), sport: "cycling", seconds });
    const r = await s.athleteA.browser.call(activitiesRoute, "POST", "/api/athletes/x/activities", {
      params: { id: s.athleteA.id },
      form: upload(f, "thursday.fit"),
    });
    expect(r.status).toBe(201);
    expect(r.json.trimp).toBeNull();
    expect(r.json.warnings.join(" ")).toMatch(/TRIMP is Banister's, which needs resting heart rate/);
    // A log scored otherwise (written as an older version might have) is left out of the week's sum and counted.
    await query(`update session_log set trimp = 999, trimp_method = 'edwards' where id = $1`, [r.json.logId]);
    const load = await s.coach.browser.call(loadRoute, "GET", "/api/athletes/x/load", {
      params: { id: s.athleteA.id },
      query: "?from=2026-11-23&to=2026-11-29",
    });
    expect(load.json.trimpMethod).toBe("banister");
    expect(load.json.trimpOtherMethod).toBe(1);
    const banister = await query<{ s: number }>(
      `select coalesce(sum(trimp), 0)::float as s from session_log where athlete_id = $1 and date between '2026-11-23' and '2026-11-29' and trimp_method = 'banister'`,
      [s.athleteA.id],
    );
    expect(load.json.weeks[0].trimp).toBeCloseTo(banister[0]!.s, 3); // real (float4) column
    await s.athleteA.browser.call(profileRoute, "PATCH", "/api/athletes/x/profile", {
      params: { id: s.athleteA.id },
      body: { restingHrBpm: 60 },
    });
  });

  it("corrupt, empty, truncated, unsupported and other people's files write nothing", async () => {
    const before = await counts();
    const bad: [Uint8Array, string][] = [
      [new Uint8Array(), "empty.fit"],
      [fit.slice(0, 1000), "cut.fit"],
      [new TextEncoder().encode("<html>hello</html>"), "page.html"],
      [Uint8Array.from([0x50, 0x4b, 3, 4, 1, 2, 3]), "ride.zip"],
      [new TextEncoder().encode("time,cadence\n1,90\n"), "ride.csv"],
    ];
    for (const [bytes, name] of bad) {
      const r = await s.athleteA.browser.call(activitiesRoute, "POST", "/api/athletes/x/activities", {
        params: { id: s.athleteA.id },
        form: upload(bytes, name),
      });
      expect(r.status, name).toBe(400);
      expect(r.json.error, name).toMatch(/could not be used/);
    }
    const foreign = await other.coach.browser.call(activitiesRoute, "POST", "/api/athletes/x/activities", {
      params: { id: s.athleteA.id },
      form: upload(fit, "ride.fit"),
    });
    expect(foreign.status).toBe(404);
    expect(await counts()).toEqual(before);
  });
});

describe("load and roster", () => {
  it("load: session-RPE per day and week with monotony, and the roster row shows compliance and the week", async () => {
    const r = await s.coach.browser.call(loadRoute, "GET", "/api/athletes/x/load", {
      params: { id: s.athleteA.id },
      query: "?from=2026-11-23&to=2026-11-29",
    });
    expect(r.status).toBe(200);
    const day = r.json.days.find((d: { date: string }) => d.date === DAY);
    expect(day.load).toBe(360); // 60 min × RPE 6 (Foster et al. 2001)
    expect(r.json.weeks[0].load).toBeGreaterThan(0);
    const bad = await s.coach.browser.call(loadRoute, "GET", "/api/athletes/x/load", {
      params: { id: s.athleteA.id },
      query: "?from=2026-11-29&to=2026-11-01",
    });
    expect(bad.status).toBe(400);
    const roster = await s.coach.browser.call(rosterRoute, "GET", "/api/roster", { query: `?squad=${s.squadId}` });
    expect(roster.status).toBe(200);
    expect(roster.json.rows.map((x: { id: string }) => x.id).sort()).toEqual([s.athleteA.id, s.athleteB.id].sort());
    const a = roster.json.rows.find((x: { id: string }) => x.id === s.athleteA.id);
    expect(a.zoneSetAgeDays).toBeGreaterThanOrEqual(0);
    expect(a).toHaveProperty("compliance4w");
    expect(
      (await s.athleteA.browser.call(rosterRoute, "GET", "/api/roster", { query: `?squad=${s.squadId}` })).status,
    ).toBe(403);
    // Outside the squad, its existence is not told.
    expect(
      (await other.coach.browser.call(rosterRoute, "GET", "/api/roster", { query: `?squad=${s.squadId}` })).status,
    ).toBe(404);
  });

  it("the roster's stored rows follow every change to what they read, also changes made outside the app's code", async () => {
    const rowOfB = async () =>
      (await s.coach.browser.call(rosterRoute, "GET", "/api/roster", { query: `?squad=${s.squadId}` })).json.rows.find(
        (x: { id: string }) => x.id === s.athleteB.id,
      );
    const before = await rowOfB();
    expect(before.compliance4w).toBeNull();
    const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);
    const planned = await s.coach.browser.call(sessionsRoute, "POST", `/api/athletes/${s.athleteB.id}/sessions`, {
      params: { id: s.athleteB.id },
      body: { date: yesterday, title: "Steady hour", sport: "running", structure: [step("work", 60, 1)] },
    });
    expect(planned.status).toBe(201);
    expect((await rowOfB()).compliance4w).toBe(0);
    expect((await logAs(s.athleteB.browser, planned.json.id, { status: "done", durationMin: 60, rpe: 4 })).status).toBe(
      201,
    );
    expect((await rowOfB()).compliance4w).toBe(1); // 60 of 60 planned minutes (hand computation)
    await query(`update session_log set duration_min = 30 where planned_session_id = $1`, [planned.json.id]);
    expect((await rowOfB()).compliance4w).toBe(0.5); // 30 of 60 (hand computation)
    // A stored row equals the row computed afresh.
    const cached = (await s.coach.browser.call(rosterRoute, "GET", "/api/roster", { query: `?squad=${s.squadId}` }))
      .json.rows;
    await query(`delete from roster_cache`);
    const computed = (await s.coach.browser.call(rosterRoute, "GET", "/api/roster", { query: `?squad=${s.squadId}` }))
      .json.rows;
    expect(cached).toEqual(computed);
  });
});
