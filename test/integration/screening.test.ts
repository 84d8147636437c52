// Readiness screening through the route handlers: what each kind of answer allows, the clearance, expiry, and the roster.
// The rules are the product's (features/athlete-tests/lib/readiness.ts), stricter than "at the coach's judgement".
import { beforeAll, describe, expect, it } from "vitest";
import * as screeningRoute from "@/app/api/athletes/[id]/screening/route";
import * as clearanceRoute from "@/app/api/athletes/[id]/screening/clearance/route";
import * as testsRoute from "@/app/api/athletes/[id]/tests/route";
import * as rosterRoute from "@/app/api/roster/route";
import { SCREENING_QUESTIONS } from "@/features/athlete-tests/lib/readiness";
import { syntheticRamp } from "@/features/gas-exchange/lib/synthetic-ramp";
import type { Browser } from "../support/api";
import { query } from "../support/db";
import { makeSquad } from "../support/squad";

type Squad = Awaited<ReturnType<typeof makeSquad>>;
let s: Squad;
beforeAll(async () => {
  s = await makeSquad("screen");
});

const allNo = () => Object.fromEntries(SCREENING_QUESTIONS.map((q) => [q.id, false])) as Record<string, boolean>;
const answer = (who: Browser, id: string, yes: string[] = []) =>
  who.call(screeningRoute, "PUT", `/api/athletes/${id}/screening`, {
    params: { id },
    body: { answers: { ...allNo(), ...Object.fromEntries(yes.map((k) => [k, true])) } },
  });
const meta = (date: string) => ({ sport: "running", protocol: "track talk test", date, endedBy: "plan" });
const talk = (who: Browser, id: string, date = "2026-11-20") =>
  who.call(testsRoute, "POST", `/api/athletes/${id}/tests`, {
    params: { id },
    body: {
      kind: "talk",
      meta: meta(date),
      talk: {
        workloadUnit: "km/h",
        stages: ["comfortable", "comfortable", "not_fully_comfortable", "not_fully_comfortable", "cannot_speak"].map(
          (speech, i) => ({ workload: 9 + i, durationS: 180, hrBpm: 130 + 8 * i, speech }),
        ),
      },
    },
  });
const gas = (who: Browser, id: string) => {
  const f = new FormData();
  f.set("file", new File([syntheticRamp({ seed: 5 }).csv], "ramp.csv", { type: "text/csv" }));
  for (const [k, v] of Object.entries({
    sport: "cycling",
    protocol: "ramp 25 W/min",
    date: "2026-11-21",
    endedBy: "exhaustion",
    bodyMassKg: "70",
  }))
    f.set(k, v);
  return who.call(testsRoute, "POST", `/api/athletes/${id}/tests`, { params: { id }, form: f });
};
const testCount = async (id: string) =>
  Number((await query<{ n: string }>(`select count(*) as n from athlete_test where athlete_id = $1`, [id]))[0]!.n);
const rosterRow = async (id: string) =>
  (await s.head.browser.call(rosterRoute, "GET", "/api/roster", { query: `?squad=${s.squadId}` })).json.rows.find(
    (r: { id: string }) => r.id === id,
  );

describe("readiness screening", () => {
  it("a condition (here a recent injury) holds maximal tests until a clearance; field tests are at the coach's judgement", async () => {
    const a = s.athleteA;
    const put = await answer(a.browser, a.id, ["injury"]);
    expect(put.status).toBe(200);
    expect(put.json.readiness).toMatchObject({
      status: "maximal_needs_clearance",
      tests: "submaximal",
      holdHardSessions: false,
    });
    const before = await testCount(a.id);
    const refused = await gas(s.head.browser, a.id);
    expect(refused.status).toBe(409);
    expect(refused.json.error).toMatch(/maximal test .* needs a recorded clearance/);
    expect(await testCount(a.id)).toBe(before);
    expect((await talk(s.head.browser, a.id)).status).toBe(201);
  });

  it("a symptom blocks every test and holds hard sessions on the roster until a coach records a clearance", async () => {
    const b = s.athleteB;
    const put = await answer(b.browser, b.id, ["chest_pain"]);
    expect(put.json.readiness).toMatchObject({ status: "hold", tests: "none", holdHardSessions: true });
    expect(put.json.advice).toMatch(/physician/);
    const before = await testCount(b.id);
    const refused = await talk(s.head.browser, b.id);
    expect(refused.status).toBe(409);
    expect(refused.json.readiness.status).toBe("hold");
    expect(await testCount(b.id)).toBe(before);
    expect((await rosterRow(b.id)).readiness).toMatchObject({
      holdHardSessions: true,
      label: "Hold hard sessions: symptom reported",
    });

    // The athlete cannot clear themselves; a clearance in the future is refused; a coach records one.
    const clear = (who: Browser, body: unknown) =>
      who.call(clearanceRoute, "POST", `/api/athletes/${b.id}/screening/clearance`, { params: { id: b.id }, body });
    expect([403, 404]).toContain(
      (await clear(b.browser, { clearedBy: "Dr Self", role: "physician", clearedOn: "2026-11-30" })).status,
    );
    const future = await clear(s.head.browser, { clearedBy: "Dr Ahead", role: "physician", clearedOn: "2099-01-01" });
    expect(future.status).toBe(400);
    const ok = await clear(s.head.browser, {
      clearedBy: "Dr Lena Berg",
      role: "sports physician",
      clearedOn: "2026-11-30",
      note: "Exercise ECG normal.",
    });
    expect(ok.status).toBe(201);
    expect(ok.json.readiness).toMatchObject({
      status: "ready",
      holdHardSessions: false,
      tests: "all",
      clearance: { clearedBy: "Dr Lena Berg", role: "sports physician" },
    });
    expect((await talk(s.head.browser, b.id, "2026-11-22")).status).toBe(201);
    expect((await rosterRow(b.id)).readiness.holdHardSessions).toBe(false);

    // A new yes after the clearance needs a new one.
    expect((await answer(b.browser, b.id, ["dizziness"])).json.readiness.status).toBe("hold");
  });

  it("heart-rate-lowering medicine: maximal tests wait for clearance and heart rate gets a caution", async () => {
    const a = s.athleteA;
    const put = await answer(a.browser, a.id, ["hr_medication"]);
    expect(put.json.readiness).toMatchObject({ status: "maximal_needs_clearance", hrMedication: true });
    expect(put.json.readiness.reasons.join(" ")).toMatch(/power, pace or RPE/);
    expect((await rosterRow(a.id)).readiness.hrMedication).toBe(true);
  });

  it("answers older than 12 months, answers to an older set of questions, or none at all: answer again before any test", async () => {
    const a = s.athleteA;
    await answer(a.browser, a.id);
    await query(`update screening set created_at = now() - interval '13 months' where athlete_id = $1`, [a.id]);
    const expired = await talk(s.head.browser, a.id, "2026-11-23");
    expect(expired.status).toBe(409);
    expect(expired.json.readiness.status).toBe("expired");
    expect((await rosterRow(a.id)).readiness.label).toMatch(/Screening expired/);
    await query(
      `insert into screening (id, athlete_id, answers, any_yes, recorded_by) values (gen_random_uuid()::text, $1, '{"heart": false}', false, $1)`,
      [a.id],
    );
    expect((await talk(s.head.browser, a.id, "2026-11-24")).json.readiness.status).toBe("incomplete");
    await query(`delete from screening where athlete_id = $1`, [a.id]);
    expect((await talk(s.head.browser, a.id, "2026-11-25")).json.readiness.status).toBe("missing");
    expect((await rosterRow(a.id)).readiness.label).toBe("Screening not answered");
  });

  it("refuses partial answers and other people's screenings", async () => {
    expect(
      (
        await s.athleteA.browser.call(screeningRoute, "PUT", `/api/athletes/${s.athleteA.id}/screening`, {
          params: { id: s.athleteA.id },
          body: { answers: { heart: false } },
        })
      ).status,
    ).toBe(400);
    expect(
      (
        await s.athleteB.browser.call(screeningRoute, "GET", `/api/athletes/${s.athleteA.id}/screening`, {
          params: { id: s.athleteA.id },
        })
      ).status,
    ).toBe(404);
  });
});
