// Planning through the real route handlers on real PostgreSQL.
import { beforeAll, describe, expect, it } from "vitest";
import * as templatesRoute from "@/app/api/templates/route";
import * as templateRoute from "@/app/api/templates/[id]/route";
import * as sessionsRoute from "@/app/api/athletes/[id]/sessions/route";
import * as sessionRoute from "@/app/api/sessions/[id]/route";
import * as weeksRoute from "@/app/api/athletes/[id]/weeks/route";
import * as seasonsRoute from "@/app/api/athletes/[id]/seasons/route";
import * as testsRoute from "@/app/api/athletes/[id]/tests/route";
import * as seasonWeekRoute from "@/app/api/seasons/[id]/weeks/[weekStart]/route";
import ExcelJS from "exceljs";
import Papa from "papaparse";
import * as squadWeekRoute from "@/app/api/squads/[id]/week/route";
import * as workoutRoute from "@/app/api/sessions/[id]/workout/route";
import { Decoder, Stream } from "@garmin/fitsdk";
import * as squadPlanRoute from "@/app/api/squads/[id]/plan/route";
import * as copyWeekRoute from "@/app/api/athletes/[id]/weeks/[weekStart]/copy/route";
import { makeSquad } from "../support/squad";
import { query, resetDatabase } from "../support/db";
import * as profileRoute from "@/app/api/athletes/[id]/profile/route";
import { addDays } from "@/features/platform/lib/days";
import { weekSummariesJson } from "@/features/planning/server";
import { actorForUser } from "@/features/access/server/permissions";

type Squad = Awaited<ReturnType<typeof makeSquad>>;
let s: Squad;
let other: Squad;
let intervalsId = "";
let easyId = "";

const step = (kind: string, min: number, zone: number) => ({ type: "step", kind, durationS: min * 60, zone });

beforeAll(async () => {
  await resetDatabase();
  s = await makeSquad("p");
  other = await makeSquad("q");
  const t1 = await s.coach.browser.call(templatesRoute, "POST", "/api/templates", {
    body: {
      squadId: s.squadId,
      name: "5 × 4 min",
      sport: "running",
      structure: [
        step("warmup", 15, 1),
        { type: "repeat", times: 5, steps: [step("work", 4, 3), step("recovery", 3, 1)] },
        step("cooldown", 10, 1),
      ],
    },
  });
  expect(t1.status).toBe(201);
  expect(t1.json.minutesByZone).toEqual([40, 0, 20]);
  intervalsId = t1.json.id;
  easyId = (
    await s.coach.browser.call(templatesRoute, "POST", "/api/templates", {
      body: { squadId: s.squadId, name: "Easy 60", sport: "running", structure: [step("work", 60, 1)] },
    })
  ).json.id;
});

const weeks = async (from: string, to: string) =>
  (
    await s.coach.browser.call(weeksRoute, "GET", `/api/athletes/${s.athleteA.id}/weeks`, {
      params: { id: s.athleteA.id },
      query: `?from=${from}&to=${to}`,
    })
  ).json;
const plan = (body: unknown, who = s.coach.browser) =>
  who.call(sessionsRoute, "POST", `/api/athletes/${s.athleteA.id}/sessions`, { params: { id: s.athleteA.id }, body });

describe("sessions and weekly budgets", () => {
  it("answers with plain objects: no author ids or bookkeeping timestamps of the rows", async () => {
    const created = await plan({ date: "2027-05-03", templateId: easyId });
    expect(created.status).toBe(201);
    const list = await s.coach.browser.call(sessionsRoute, "GET", `/api/athletes/${s.athleteA.id}/sessions`, {
      params: { id: s.athleteA.id },
      query: "?from=2027-05-03&to=2027-05-03",
    });
    const templates = await s.coach.browser.call(templatesRoute, "GET", "/api/templates", {});
    const moved = await s.coach.browser.call(sessionRoute, "PATCH", `/api/sessions/${created.json.id}`, {
      params: { id: created.json.id },
      body: { date: "2027-05-04" },
    });
    for (const obj of [list.json[0], templates.json[0], moved.json]) {
      expect(obj.id).toBeTruthy();
      for (const key of ["createdBy", "createdAt", "updatedAt"]) expect(obj).not.toHaveProperty(key);
    }
    expect(moved.json.date).toBe("2027-05-04");
    await s.coach.browser.call(sessionRoute, "DELETE", `/api/sessions/${created.json.id}`, {
      params: { id: created.json.id },
    });
  });

  it("moving a session into another week changes both weeks' planned minutes and flags", async () => {
    for (const d of ["2027-03-01", "2027-03-03", "2027-03-05"])
      expect((await plan({ date: d, templateId: easyId })).status).toBe(201);
    const a = await plan({ date: "2027-03-02", templateId: intervalsId });
    const b = await plan({ date: "2027-03-04", templateId: intervalsId });
    for (const d of ["2027-03-08", "2027-03-10", "2027-03-12"]) await plan({ date: d, templateId: easyId });
    let w = await weeks("2027-03-01", "2027-03-08");
    // Week 1: 3 × 60 easy + 2 × (40 z1, 20 z3) = 260 z1, 40 z3 → 13.3 % zone 3: within 15 % + 5 % (hand computation).
    expect(w[0].plannedMinByZone).toEqual([260, 0, 40]);
    expect(w[0].overBudget).toBe(false);
    // The further interval sessions share their days, so that the week keeps the hard-day rules (at most three hard
    // days, none back to back) and only the zone shares are at stake.
    const c = await plan({ date: "2027-03-02", templateId: intervalsId });
    w = await weeks("2027-03-01", "2027-03-08");
    expect(w[0].plannedMinByZone).toEqual([300, 0, 60]); // 16.7 % zone 3, still within
    const d2 = await plan({ date: "2027-03-04", templateId: intervalsId });
    w = await weeks("2027-03-01", "2027-03-08");
    // 340 z1, 80 z3 of 420 → 19.0 % zone 3; zone 1 81 % — within; add one more to break it.
    const e = await plan({ date: "2027-03-06", templateId: intervalsId });
    w = await weeks("2027-03-01", "2027-03-08");
    expect(w[0].plannedMinByZone).toEqual([380, 0, 100]); // 20.8 % zone 3 > 20 %
    expect(w[0].overBudget).toBe(true);
    expect(w[0].flags.map((f: { code: string }) => f.code)).toContain("too_much_high");
    expect(w[0].fix).toBeTruthy();
    const moved = await s.coach.browser.call(sessionRoute, "PATCH", `/api/sessions/${e.json.id}`, {
      params: { id: e.json.id },
      body: { date: "2027-03-09" },
    });
    expect(moved.status).toBe(200);
    w = await weeks("2027-03-01", "2027-03-08");
    expect(w[0].plannedMinByZone).toEqual([340, 0, 80]);
    expect(w[0].overBudget).toBe(false);
    expect(w[1].plannedMinByZone).toEqual([220, 0, 20]);
    expect([a, b, c, d2].every((r) => r.status === 201)).toBe(true);
  });

  it("each session reads the zone set in force on its own date: before a retest the old one, from it on the new one", async () => {
    const meta = (date: string) => ({ sport: "running", protocol: "lab report", date, endedBy: "plan" });
    const manual = (date: string, hr: number) =>
      s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteA.id}/tests`, {
        params: { id: s.athleteA.id },
        body: { kind: "manual", meta: meta(date), vt1: { hrBpm: hr }, vt2: { hrBpm: hr + 20 } },
      });
    expect((await manual("2027-02-01", 140)).status).toBe(201);
    expect((await manual("2027-03-05", 146)).status).toBe(201);
    const r = await s.athleteA.browser.call(sessionsRoute, "GET", `/api/athletes/${s.athleteA.id}/sessions`, {
      params: { id: s.athleteA.id },
      query: "?from=2027-03-01&to=2027-03-12",
    });
    expect(r.status).toBe(200);
    const byDate = (d: string) => r.json.find((x: { date: string }) => x.date === d);
    expect(byDate("2027-03-04").zoneSet.effectiveFrom).toBe("2027-02-01");
    expect(byDate("2027-03-04").zoneSet.zones[0].ranges.hrBpm.max).toBe(140);
    expect(byDate("2027-03-05").zoneSet.effectiveFrom).toBe("2027-03-05");
    expect(byDate("2027-03-08").zoneSet.zones[0].ranges.hrBpm.max).toBe(146);
  });

  it("a planned session downloads as a FIT workout with the athlete's own zones, for the athlete and the coach only", async () => {
    const test = await s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteA.id}/tests`, {
      params: { id: s.athleteA.id },
      body: {
        kind: "manual",
        meta: { sport: "cycling", protocol: "lab report", date: "2027-05-03", endedBy: "plan" },
        vt1: { hrBpm: 148, powerW: 210 },
        vt2: { hrBpm: 170, powerW: 275 },
      },
    });
    expect(test.status).toBe(201);
    const made = await s.coach.browser.call(sessionsRoute, "POST", `/api/athletes/${s.athleteA.id}/sessions`, {
      params: { id: s.athleteA.id },
      body: {
        date: "2027-05-06",
        title: "Threshold blocks",
        sport: "cycling",
        structure: [
          { type: "step", kind: "warmup", durationS: 600, zone: 1 },
          { type: "repeat", times: 3, steps: [{ type: "step", kind: "work", durationS: 480, zone: 2 }] },
        ],
      },
    });
    expect(made.status).toBe(201);
    const get = (who: typeof s.coach.browser) =>
      who.call(workoutRoute, "GET", `/api/sessions/${made.json.id}/workout`, { params: { id: made.json.id } });
    for (const who of [s.athleteA.browser, s.coach.browser]) {
      const r = await get(who);
      expect(r.status).toBe(200);
      expect(r.headers.get("content-disposition")).toContain('filename="tidemark-2027-05-06-threshold-blocks.fit"');
      // Decoded with the FIT SDK (the protocol's reference decoder).
      const decoder = new Decoder(Stream.fromByteArray(Array.from(r.bytes)));
      expect(decoder.checkIntegrity()).toBe(true);
      const { messages } = decoder.read();
      expect(messages.workoutMesgs![0]).toMatchObject({
        wktName: "Threshold blocks",
        sport: "cycling",
        numValidSteps: 3,
      });
      // Zone 2 of this athlete's cycling zones: 210–274 W (watts carry the protocol's offset of 1000).
      expect(messages.workoutStepMesgs![1]).toMatchObject({
        durationTime: 480,
        targetType: "power",
        customTargetPowerLow: 1210,
        customTargetPowerHigh: 1274,
      });
      expect(messages.workoutStepMesgs![2]).toMatchObject({ durationType: "repeatUntilStepsCmplt", repeatSteps: 3 });
    }
    expect((await get(s.athleteB.browser)).status).toBe(404);
    expect((await get(other.coach.browser)).status).toBe(404);
  });

  it("a coach of another squad cannot create, move or read sessions for this athlete; the athlete cannot plan", async () => {
    const r = await plan({ date: "2027-03-20", templateId: easyId }, other.head.browser);
    expect(r.status).toBe(404);
    const [row] = await query<{ id: string }>(`select id from planned_session where athlete_id = $1 limit 1`, [
      s.athleteA.id,
    ]);
    const move = await other.head.browser.call(sessionRoute, "PATCH", `/api/sessions/${row!.id}`, {
      params: { id: row!.id },
      body: { date: "2027-03-21" },
    });
    expect(move.status).toBe(404);
    const read = await other.head.browser.call(sessionsRoute, "GET", `/api/athletes/${s.athleteA.id}/sessions`, {
      params: { id: s.athleteA.id },
      query: "?from=2027-03-01&to=2027-03-31",
    });
    expect(read.status).toBe(404);
    const own = await plan({ date: "2027-03-20", templateId: easyId }, s.athleteA.browser);
    expect(own.status).toBe(403);
    const othersTemplate = await plan({
      date: "2027-03-20",
      templateId: (
        await other.head.browser.call(templatesRoute, "POST", "/api/templates", {
          body: { squadId: other.squadId, name: "Theirs", sport: "running", structure: [step("work", 30, 1)] },
        })
      ).json.id,
    });
    expect(othersTemplate.status).toBe(400);
  });

  it("bad dates and unknown templates answer 400 and write nothing", async () => {
    const before = (await query<{ n: number }>(`select count(*)::int as n from planned_session`))[0]!.n;
    for (const body of [
      { date: "2027-02-30", templateId: easyId },
      { date: "next tuesday", templateId: easyId },
      { date: "2027-03-20", templateId: "nope" },
      { date: "2027-03-20" },
      { date: "2027-03-20", templateId: easyId, repeat: { byWeekday: ["XX"], count: 3 } },
    ]) {
      const r = await plan(body);
      expect(r.status, JSON.stringify(body)).toBe(400);
      expect(r.json.error).toBeTruthy();
    }
    const bad = await s.coach.browser.call(weeksRoute, "GET", `/api/athletes/${s.athleteA.id}/weeks`, {
      params: { id: s.athleteA.id },
      query: "?from=2027-03-10&to=2027-03-01",
    });
    expect(bad.status).toBe(400);
    expect((await query<{ n: number }>(`select count(*)::int as n from planned_session`))[0]!.n).toBe(before);
  });

  it("a weekly repeat creates its occurrences; editing the series moves the rest, one occurrence stays on its own", async () => {
    const r = await plan({ date: "2027-05-04", templateId: easyId, repeat: { byWeekday: ["TU"], count: 4 } });
    expect(r.status).toBe(201);
    expect(r.json.dates).toEqual(["2027-05-04", "2027-05-11", "2027-05-18", "2027-05-25"]);
    const [, second, third] = r.json.ids as string[];
    await s.coach.browser.call(sessionRoute, "PATCH", `/api/sessions/${second}`, {
      params: { id: second! },
      body: { title: "Easy 60 on grass" },
    });
    const series = await s.coach.browser.call(sessionRoute, "PATCH", `/api/sessions/${r.json.id}`, {
      params: { id: r.json.id },
      body: { date: "2027-05-05", scope: "series" },
    });
    expect(series.status).toBe(200);
    const rows = await query<{ id: string; date: string; title: string }>(
      `select id, date, title from planned_session where series_id is not null order by date`,
    );
    expect(rows.map((x) => x.date)).toEqual(["2027-05-05", "2027-05-11", "2027-05-19", "2027-05-26"]);
    expect(rows.find((x) => x.id === second)!.title).toBe("Easy 60 on grass");
    const del = await s.coach.browser.call(sessionRoute, "DELETE", `/api/sessions/${third}`, {
      params: { id: third! },
      query: "?scope=series",
    });
    expect(del.status).toBe(204);
    expect((await query(`select 1 from planned_session where series_id is not null`)).length).toBe(2);
  });

  it("a season places retest sessions in unloading weeks and an overdue retest is flagged", async () => {
    const r = await s.coach.browser.call(seasonsRoute, "POST", `/api/athletes/${s.athleteB.id}/seasons`, {
      params: { id: s.athleteB.id },
      body: {
        name: "Autumn marathon",
        sport: "running",
        startDate: "2026-01-05",
        events: [{ date: "2026-10-04", name: "Autumn marathon" }],
        weeklyHours: 7,
      },
    });
    expect(r.status).toBe(201);
    const retests = await query<{ date: string }>(
      `select date from planned_session where athlete_id = $1 and kind = 'retest' order by date`,
      [s.athleteB.id],
    );
    expect(retests.length).toBeGreaterThanOrEqual(2);
    const retestWeek = r.json.weeks.find((w: { retest: boolean }) => w.retest);
    expect(["unloading", "recovery"]).toContain(retestWeek.role);
    const w = await s.coach.browser.call(weeksRoute, "GET", `/api/athletes/${s.athleteB.id}/weeks`, {
      params: { id: s.athleteB.id },
      query: `?from=2026-05-04&to=2026-05-04`,
    });
    expect(w.json[0].flags.map((f: { code: string }) => f.code)).toContain("retest_overdue");
    const bad = await s.coach.browser.call(seasonsRoute, "POST", `/api/athletes/${s.athleteB.id}/seasons`, {
      params: { id: s.athleteB.id },
      body: {
        name: "x",
        sport: "running",
        startDate: "2026-01-05",
        events: [{ date: "2026-01-08", name: "too soon" }],
        weeklyHours: 7,
      },
    });
    expect(bad.status).toBe(400);
    // A race length scales the recovery after it (3.5 h A race on a Sunday: two recovery weeks; season.ts), and a length
    // that is no race's is refused with the reason.
    const withLength = await s.coach.browser.call(seasonsRoute, "POST", `/api/athletes/${s.athleteB.id}/seasons`, {
      params: { id: s.athleteB.id },
      body: {
        name: "Two marathons",
        sport: "running",
        startDate: "2030-01-07",
        events: [
          { date: "2030-05-05", name: "Spring", priority: "A", durationMin: 210 },
          { date: "2030-09-29", name: "Autumn", priority: "A", durationMin: 210 },
        ],
        weeklyHours: 7,
      },
    });
    expect(withLength.status).toBe(201);
    const ws = withLength.json.weeks as { role: string; events: string[] }[];
    const race = ws.findIndex((w) => w.events.includes("Spring"));
    expect(ws.slice(race + 1, race + 3).map((w) => w.role)).toEqual(["recovery", "recovery"]);
    const tooLong = await s.coach.browser.call(seasonsRoute, "POST", `/api/athletes/${s.athleteB.id}/seasons`, {
      params: { id: s.athleteB.id },
      body: {
        name: "x",
        sport: "running",
        startDate: "2030-01-07",
        events: [{ date: "2030-05-05", name: "Spring", durationMin: 5000 }],
        weeklyHours: 7,
      },
    });
    expect(tooLong.status).toBe(400);
    expect(JSON.stringify(tooLong.json)).toMatch(/at most 24 hours/);
  });

  it("a coach edits a generated season week: volume, budget and the retest, which adds or removes that week's retest session", async () => {
    const r = await s.coach.browser.call(seasonsRoute, "POST", `/api/athletes/${s.athleteA.id}/seasons`, {
      params: { id: s.athleteA.id },
      body: {
        name: "Spring 10k",
        sport: "running",
        startDate: "2028-01-03",
        events: [{ date: "2028-06-04", name: "Spring 10k" }],
        weeklyHours: 6,
      },
    });
    expect(r.status).toBe(201);
    const seasonId = r.json.id as string;
    const plain = r.json.weeks.find(
      (w: { retest: boolean; weekStart: string }) => !w.retest && w.weekStart > "2028-01-10",
    )!.weekStart as string;
    const retestsIn = async (monday: string) =>
      (
        await query<{ n: number }>(
          `select count(*)::int as n from planned_session where athlete_id = $1 and kind = 'retest' and date between $2 and $3`,
          [s.athleteA.id, monday, addDays(monday, 6)],
        )
      )[0]!.n;
    expect(await retestsIn(plain)).toBe(0);
    const edit = (body: unknown, week = plain, who = s.coach.browser) =>
      who.call(seasonWeekRoute, "PATCH", `/api/seasons/${seasonId}/weeks/${week}`, {
        params: { id: seasonId, weekStart: week },
        body,
      });
    const on = await edit({ retest: true, volumeHours: 4.5, budget: "recovery" });
    expect(on.status).toBe(200);
    expect(on.json.week).toMatchObject({ retest: true, volumeHours: 4.5, budget: "recovery" });
    expect(await retestsIn(plain)).toBe(1);
    // The saved week keeps the chosen budget preset.
    const stored = (
      await query<{ weeks: { weekStart: string; budget: string }[] }>(`select weeks from season where id = $1`, [
        seasonId,
      ])
    )[0]!.weeks.find((w) => w.weekStart === plain)!;
    expect(stored.budget).toBe("recovery");
    // A budget that counts sessions: the week is then judged and shown that way.
    expect((await edit({ budget: "polarised_sessions" })).status).toBe(200);
    const counted = (await weeks(plain, plain))[0];
    expect(counted.budget).toMatchObject({ key: "polarised_sessions", counting: "session" });
    expect(counted.budget.source).toMatch(/Seiler/);
    expect((await edit({ budget: "recovery" })).status).toBe(200);
    expect((await edit({ retest: true })).status).toBe(200);
    expect(await retestsIn(plain)).toBe(1); // turning it on twice places one session
    expect((await edit({ retest: false })).status).toBe(200);
    expect(await retestsIn(plain)).toBe(0);
    // Bad input and strangers: 400 for a day outside the season or a bad field, 404 for another squad's coach, 403 for the athlete.
    expect((await edit({ volumeHours: -1 })).status).toBe(400);
    expect((await edit({})).status).toBe(400);
    expect((await edit({ retest: true }, "2030-01-07")).status).toBe(400);
    expect((await edit({ retest: true }, plain, other.coach.browser)).status).toBe(404);
    expect((await edit({ retest: true }, plain, s.athleteA.browser)).status).toBe(403);
    expect(await retestsIn(plain)).toBe(0);
  });

  it("the squad week shows every athlete's sessions and budget state; only the squad's coaches see it", async () => {
    await plan({ date: "2028-09-05", templateId: intervalsId });
    const get = (who = s.coach.browser, week = "2028-09-07") =>
      who.call(squadWeekRoute, "GET", `/api/squads/${s.squadId}/week`, {
        params: { id: s.squadId },
        query: `?week=${week}`,
      });
    const r = await get();
    expect(r.status).toBe(200);
    expect(r.json.map((x: { athlete: { id: string } }) => x.athlete.id).sort()).toEqual(
      [s.athleteA.id, s.athleteB.id].sort(),
    );
    const a = r.json.find((x: { athlete: { id: string } }) => x.athlete.id === s.athleteA.id);
    expect(a.week.weekStart).toBe("2028-09-04");
    expect(a.sessions.map((x: { date: string }) => x.date)).toEqual(["2028-09-05"]);
    expect(a.week.plannedMinByZone).toEqual([40, 0, 20]); // the 5 × 4 min template: 40 min zone 1, 20 min zone 3 (hand sum)
    expect((await get(s.athleteA.browser)).status).toBe(403);
    // Outside the squad, its existence is not told.
    expect((await get(other.coach.browser)).status).toBe(404);
    expect((await get(s.coach.browser, "not-a-date")).status).toBe(400);

    // The same week as a download: a line per session with the athlete's week, read back with papaparse.
    const csv = (who = s.coach.browser) =>
      who.call(squadWeekRoute, "GET", `/api/squads/${s.squadId}/week`, {
        params: { id: s.squadId },
        query: "?week=2028-09-07&format=csv",
      });
    const d = await csv();
    expect(d.status).toBe(200);
    expect(d.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(d.headers.get("content-disposition")).toContain('filename="squad-week-2028-09-04.csv"');
    const lines = Papa.parse<string[]>(
      String(d.json)
        .replace(/^\uFEFF/, "")
        .trim(),
      { skipEmptyLines: true },
    ).data;
    expect(lines[0]!.slice(0, 6)).toEqual(["week_start", "athlete", "date", "title", "kind", "planned_min"]);
    const aLine = lines.find((l) => l[2] === "2028-09-05")!;
    expect(aLine.slice(5, 9)).toEqual(["60", "40", "0", "20"]);
    expect((await csv(s.athleteA.browser)).status).toBe(403);
    expect((await csv(other.coach.browser)).status).toBe(404);
    // And as a workbook (read back with exceljs): one sheet named for the week, the same line.
    const x = await s.coach.browser.call(squadWeekRoute, "GET", `/api/squads/${s.squadId}/week`, {
      params: { id: s.squadId },
      query: "?week=2028-09-07&format=xlsx",
    });
    expect(x.status).toBe(200);
    expect(x.headers.get("content-disposition")).toContain('filename="squad-week-2028-09-04.xlsx"');
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(Buffer.from(x.bytes) as unknown as ArrayBuffer);
    const ws = wb.getWorksheet("Week of 2028-09-04")!;
    const row = ws.getRows(2, ws.rowCount - 1)!.find((r) => r.getCell(3).value === "2028-09-05")!;
    expect([6, 7, 8, 9].map((c) => row.getCell(c).value)).toEqual([60, 40, 0, 20]);
  });

  it("plans a template for several athletes in one action, with a preview of each athlete's week that writes nothing", async () => {
    const squadPlan = (body: unknown, who = s.coach.browser) =>
      who.call(squadPlanRoute, "POST", `/api/squads/${s.squadId}/plan`, { params: { id: s.squadId }, body });
    const body = {
      mode: "template",
      templateId: intervalsId,
      date: "2029-03-06",
      athleteIds: [s.athleteA.id, s.athleteB.id],
    };
    const countOn = async (date: string) =>
      Number(
        ((await query(`select count(*) as n from planned_session where date = $1`, [date])) as { n: string }[])[0]!.n,
      );
    const preview = await squadPlan({ ...body, preview: true });
    expect(preview.status).toBe(200);
    expect(await countOn("2029-03-06")).toBe(0);
    const a = preview.json.athletes.find((x: { athleteId: string }) => x.athleteId === s.athleteA.id);
    // The week after it: the template's 40 min zone 1 and 20 min zone 3 (hand sum); before it: nothing planned.
    expect(a.weeks[0].weekStart).toBe("2029-03-05");
    expect(a.weeks[0].before.plannedMinByZone).toEqual([0, 0, 0]);
    expect(a.weeks[0].after.plannedMinByZone).toEqual([40, 0, 20]);
    const done = await squadPlan(body);
    expect(done.status).toBe(201);
    expect(done.json.created).toBe(2);
    expect(await countOn("2029-03-06")).toBe(2);
    // An athlete of another squad, the athlete themselves and another squad's coach are refused, and nothing is written.
    const stranger = await squadPlan({ ...body, date: "2029-03-07", athleteIds: [other.athleteA.id] });
    expect(stranger.status).toBe(400);
    expect(stranger.json.fieldErrors.athleteIds[0]).toMatch(/not an athlete of this squad/);
    expect((await squadPlan({ ...body, date: "2029-03-07" }, s.athleteA.browser)).status).toBe(403);
    expect((await squadPlan({ ...body, date: "2029-03-07" }, other.coach.browser)).status).toBe(404);
    expect((await squadPlan({ ...body, date: "2029-03-07", athleteIds: [] })).status).toBe(400);
    expect(await countOn("2029-03-07")).toBe(0);
  });

  it("copies one athlete's week into later weeks, for that athlete and for others, in one action", async () => {
    // Week of 2029-06-04: the interval session on Tuesday and an easy hour on Thursday (athlete A).
    await plan({ date: "2029-06-05", templateId: intervalsId });
    await plan({ date: "2029-06-07", templateId: easyId });
    const copy = await s.coach.browser.call(
      copyWeekRoute,
      "POST",
      `/api/athletes/${s.athleteA.id}/weeks/2029-06-04/copy`,
      {
        params: { id: s.athleteA.id, weekStart: "2029-06-04" },
        body: { targetWeeks: ["2029-06-11", "2029-06-18"] },
      },
    );
    expect(copy.status).toBe(201);
    expect(copy.json.created).toBe(4);
    const dates = (
      await query(
        `select date from planned_session where athlete_id = $1 and date between '2029-06-11' and '2029-06-24' order by date`,
        [s.athleteA.id],
      )
    ).map((r) => (r as { date: string }).date);
    expect(dates).toEqual(["2029-06-12", "2029-06-14", "2029-06-19", "2029-06-21"]);
    // The same week for athlete B through the squad: their week then holds the same minutes per zone (40 + 60 z1, 20 z3).
    const forB = await s.coach.browser.call(squadPlanRoute, "POST", `/api/squads/${s.squadId}/plan`, {
      params: { id: s.squadId },
      body: {
        mode: "week",
        sourceAthleteId: s.athleteA.id,
        sourceWeek: "2029-06-04",
        targetWeeks: ["2029-06-04"],
        athleteIds: [s.athleteB.id],
      },
    });
    expect(forB.status).toBe(201);
    expect(forB.json.athletes[0].weeks[0].after.plannedMinByZone).toEqual([100, 0, 20]);
    // Onto itself, a Tuesday as a week, and an empty week are refused with the reason.
    const bad = (targetWeeks: string[], week = "2029-06-04") =>
      s.coach.browser.call(copyWeekRoute, "POST", `/api/athletes/${s.athleteA.id}/weeks/${week}/copy`, {
        params: { id: s.athleteA.id, weekStart: week },
        body: { targetWeeks },
      });
    expect((await bad(["2029-06-04"])).json.fieldErrors.targetWeeks[0]).toMatch(/other than the one copied/);
    expect((await bad(["2029-06-12"])).status).toBe(400);
    expect((await bad(["2029-07-02"], "2029-06-25")).json.error).toMatch(/no training sessions/);
  });

  it("an over-budget week offers a swap for an easier template of the squad's library, and the stored answer follows the library", async () => {
    // A week far from the others: one 5 × 4 min session (40 z1, 20 z3) and one easy hour: 20 of 120 min = 16.7 % zone 3,
    // within 20 %; a second 5 × 4 min makes 40 of 180 = 22.2 %: over. Swapping it for "Easy 60" (60 min z1, within 25 % of
    // its 60 min) gives 20 of 180 = 11.1 % (hand computation).
    for (const [d, t] of [
      ["2031-05-06", intervalsId],
      ["2031-05-07", easyId],
      ["2031-05-09", intervalsId],
    ] as const)
      expect((await plan({ date: d, templateId: t })).status).toBe(201);
    const w = (await weeks("2031-05-05", "2031-05-05"))[0];
    expect(w.overBudget).toBe(true);
    const swap = w.fixes.find((f: { action: string }) => f.action === "swap");
    expect(swap).toMatchObject({ action: "swap", templateId: easyId, templateName: "Easy 60" });
    // The template changes: the stored answer is not served again (the library bumps the athlete's change counter).
    const renamed = await s.coach.browser.call(templateRoute, "PATCH", `/api/templates/${easyId}`, {
      params: { id: easyId },
      body: { name: "Easy hour" },
    });
    expect(renamed.status).toBe(200);
    const after = (await weeks("2031-05-05", "2031-05-05"))[0];
    expect(after.fixes.find((f: { action: string }) => f.action === "swap")).toMatchObject({
      templateName: "Easy hour",
    });
    await s.coach.browser.call(templateRoute, "PATCH", `/api/templates/${easyId}`, {
      params: { id: easyId },
      body: { name: "Easy 60" },
    });
  });

  it("the coach's planning rules on the athlete's profile decide the hard-day checks; the athlete cannot change them", async () => {
    // Two interval days with a rest day between (2027-11-02 and 2027-11-04): allowed by the default rules (three hard
    // days, none back to back).
    for (const d of ["2027-11-02", "2027-11-04"])
      expect((await plan({ date: d, templateId: intervalsId })).status).toBe(201);
    const codes = async () =>
      (await weeks("2027-11-01", "2027-11-01"))[0].flags.map((f: { code: string }) => f.code) as string[];
    expect(await codes()).not.toContain("too_many_hard_days");
    const profileOf = { params: { id: s.athleteA.id } };
    const own = await s.athleteA.browser.call(profileRoute, "PATCH", `/api/athletes/${s.athleteA.id}/profile`, {
      ...profileOf,
      body: { maxHardDays: 1 },
    });
    expect(own.status).toBe(403);
    expect(own.json.error).toMatch(/coach sets the planning rules/);
    const byCoach = await s.coach.browser.call(profileRoute, "PATCH", `/api/athletes/${s.athleteA.id}/profile`, {
      ...profileOf,
      body: { maxHardDays: 1 },
    });
    expect(byCoach.status).toBe(200);
    // The stored weeks answer follows the change (the profile bumps the athlete's change counter).
    expect(await codes()).toContain("too_many_hard_days");
    expect((await weeks("2027-11-01", "2027-11-01"))[0].rules.maxHardDays).toBe(1);
    const bad = await s.coach.browser.call(profileRoute, "PATCH", `/api/athletes/${s.athleteA.id}/profile`, {
      ...profileOf,
      body: { volumeTolerancePct: 80 },
    });
    expect(bad.status).toBe(400);
    expect(bad.json.fieldErrors.volumeTolerancePct[0]).toMatch(/at most 50 %/);
    await s.coach.browser.call(profileRoute, "PATCH", `/api/athletes/${s.athleteA.id}/profile`, {
      ...profileOf,
      body: { maxHardDays: 3 },
    });
  });

  it("editing a session's steps recomputes its minutes per zone", async () => {
    const r = await plan({ date: "2028-10-03", templateId: easyId });
    const patched = await s.coach.browser.call(sessionRoute, "PATCH", `/api/sessions/${r.json.id}`, {
      params: { id: r.json.id },
      body: {
        title: "Hills",
        notes: "Short and sharp",
        structure: [
          step("warmup", 20, 1),
          { type: "repeat", times: 6, steps: [step("work", 1, 3), step("recovery", 2, 1)] },
        ],
      },
    });
    expect(patched.status).toBe(200);
    // 20 + 6 × 2 = 32 min zone 1, 6 × 1 = 6 min zone 3 (hand sum).
    expect(patched.json).toMatchObject({
      title: "Hills",
      notes: "Short and sharp",
      totalS: 38 * 60,
      minutesByZone: [32, 0, 6],
    });
    const bad = await s.coach.browser.call(sessionRoute, "PATCH", `/api/sessions/${r.json.id}`, {
      params: { id: r.json.id },
      body: { structure: [{ type: "repeat", times: 1, steps: [] }] },
    });
    expect(bad.status).toBe(400);
  });

  it("a stored weeks answer is never served after the athlete's plan, tests or squads changed, by any path, nor to someone without access", async () => {
    // A fresh athlete in the squad of `other`, so that nothing else in this file touches their plan.
    const athlete = other.athleteA;
    const get = (who = other.coach.browser, range = "?from=2029-01-01&to=2029-01-08") =>
      who.call(weeksRoute, "GET", `/api/athletes/${athlete.id}/weeks`, { params: { id: athlete.id }, query: range });
    const planFor = (date: string) =>
      other.coach.browser.call(sessionsRoute, "POST", `/api/athletes/${athlete.id}/sessions`, {
        params: { id: athlete.id },
        body: { date, structure: [step("work", 50, 1)], title: "Easy", sport: "running" },
      });
    // The athlete's change counter exists from sign-up on, so that no change goes uncounted before anyone asked.
    expect(await query(`select 1 from roster_cache where athlete_id = $1`, [athlete.id])).toHaveLength(1);
    expect((await get()).json[0].plannedMinByZone).toEqual([0, 0, 0]);
    // Through the API.
    const easy = await planFor("2029-01-02");
    expect(easy.status).toBe(201);
    expect((await get()).json[0].plannedMinByZone).toEqual([50, 0, 0]);
    // The same question twice in a row: the same answer.
    expect((await get()).json).toEqual((await get()).json);
    // Behind the API's back, as another server process or an operator would: moved to the next week in SQL.
    await query(`update planned_session set date = '2029-01-09' where id = $1`, [easy.json.id]);
    let w = (await get()).json;
    expect(w[0].plannedMinByZone).toEqual([0, 0, 0]);
    expect(w[1].plannedMinByZone).toEqual([50, 0, 0]);
    // Deleted in SQL.
    await query(`delete from planned_session where id = $1`, [easy.json.id]);
    w = (await get()).json;
    expect(w[1].plannedMinByZone).toEqual([0, 0, 0]);
    // An overdue retest clears once a test is recorded (the season's first retest week lies in the past).
    const season = await other.coach.browser.call(seasonsRoute, "POST", `/api/athletes/${athlete.id}/seasons`, {
      params: { id: athlete.id },
      body: {
        name: "Spring",
        sport: "running",
        startDate: "2026-01-05",
        events: [{ date: "2026-10-04", name: "Race" }],
        weeklyHours: 6,
      },
    });
    expect(season.status).toBe(201);
    const retestWeek = (season.json.weeks as { weekStart: string; retest: boolean }[]).find((x) => x.retest)!.weekStart;
    const range = `?from=${retestWeek}&to=${retestWeek}`;
    expect((await get(other.coach.browser, range)).json[0].flags.map((f: { code: string }) => f.code)).toContain(
      "retest_overdue",
    );
    const test = await other.coach.browser.call(testsRoute, "POST", `/api/athletes/${athlete.id}/tests`, {
      params: { id: athlete.id },
      body: {
        kind: "manual",
        meta: { sport: "running", protocol: "lab report", date: addDays(retestWeek, 2), endedBy: "plan" },
        vt1: { hrBpm: 142 },
        vt2: { hrBpm: 165 },
      },
    });
    expect(test.status).toBe(201);
    expect((await get(other.coach.browser, range)).json[0].flags.map((f: { code: string }) => f.code)).not.toContain(
      "retest_overdue",
    );
    // A counter row deleted and made again starts beyond every value the old one had, so no stored answer comes back to life.
    const [before] = await query<{ generation: string }>(`select generation from roster_cache where athlete_id = $1`, [
      athlete.id,
    ]);
    await query(`delete from roster_cache where athlete_id = $1`, [athlete.id]);
    await query(`insert into roster_cache (athlete_id) values ($1)`, [athlete.id]);
    const [after] = await query<{ generation: string }>(`select generation from roster_cache where athlete_id = $1`, [
      athlete.id,
    ]);
    expect(BigInt(after!.generation) > BigInt(before!.generation)).toBe(true);
    // Access is checked on every request, the stored answer notwithstanding: a coach of another squad, a squad mate,
    // and the coach once removed from the squad.
    expect((await get()).status).toBe(200);
    expect((await get(s.coach.browser)).status).toBe(404);
    expect((await get(other.athleteB.browser)).status).toBe(404);
    expect((await get(athlete.browser)).status).toBe(200);
    await query(`delete from membership where squad_id = $1 and user_id = $2`, [other.squadId, other.coach.id]);
    expect((await get()).status).toBe(404);
  });

  it("\"today\" is the athlete's own day: a retest week counts as overdue from the athlete's Monday, whatever the day in UTC", async () => {
    const z = { athleteA: other.athleteB, head: other.head };
    const id = z.athleteA.id;
    expect(
      (
        await z.athleteA.browser.call(profileRoute, "PATCH", `/api/athletes/${id}/profile`, {
          params: { id },
          body: { timeZone: "Pacific/Auckland" },
        })
      ).status,
    ).toBe(200);
    const season = await z.head.browser.call(seasonsRoute, "POST", `/api/athletes/${id}/seasons`, {
      params: { id },
      body: {
        name: "Tz",
        sport: "running",
        startDate: "2026-03-02",
        events: [{ date: "2026-09-06", name: "Race" }],
        weeklyHours: 6,
      },
    });
    expect(season.status).toBe(201);
    const retestWeek = (season.json.weeks as { weekStart: string; retest: boolean }[]).find((x) => x.retest)!.weekStart;
    const next = addDays(retestWeek, 7);
    // Sunday 13:00 UTC of the retest week is already Monday in Auckland (UTC+12 or +13), the first day it can be overdue.
    const now = new Date(`${addDays(retestWeek, 6)}T13:00:00Z`);
    const coach = await actorForUser(z.head.id);
    const codes = async (at: Date) =>
      (JSON.parse(await weekSummariesJson(coach, id, next, next, at))[0].flags as { code: string }[]).map(
        (f) => f.code,
      );
    expect(await codes(now)).toContain("retest_overdue");
    // Twelve hours earlier it is Sunday in Auckland as well: not overdue yet.
    expect(await codes(new Date(now.getTime() - 12 * 3_600_000))).not.toContain("retest_overdue");
  });
});
