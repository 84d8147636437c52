// Tests and zones through the real route handlers on real PostgreSQL. Gas-exchange files come from the documented
// synthetic ramp model (features/gas-exchange/lib/synthetic-ramp.ts), whose thresholds are known by construction.
import { beforeAll, describe, expect, it } from "vitest";
import * as testsRoute from "@/app/api/athletes/[id]/tests/route";
import * as zonesRoute from "@/app/api/athletes/[id]/zones/route";
import * as testRoute from "@/app/api/tests/[id]/route";
import * as thresholdsRoute from "@/app/api/tests/[id]/thresholds/route";
import * as fileRoute from "@/app/api/tests/[id]/file/route";
import * as segmentRoute from "@/app/api/tests/[id]/segment/route";
import * as chooseRoute from "@/app/api/zone-sets/[id]/choose/route";
import { syntheticRamp } from "@/features/gas-exchange/lib/synthetic-ramp";
import { makeSquad } from "../support/squad";
import { query, resetDatabase } from "../support/db";

type Squad = Awaited<ReturnType<typeof makeSquad>>;
let s: Squad;
let other: Squad;

function upload(csv: string | Uint8Array<ArrayBuffer>, fields: Record<string, string> = {}, filename = "ramp.csv") {
  const form = new FormData();
  form.set("file", new File([csv], filename, { type: "text/csv" }));
  const defaults = { sport: "cycling", protocol: "ramp 25 W/min", date: "2026-09-01", endedBy: "exhaustion" };
  for (const [k, v] of Object.entries({ ...defaults, ...fields })) form.set(k, v);
  return form;
}

async function testRows() {
  return (await query<{ n: number }>(`select count(*)::int as n from athlete_test`))[0]!.n;
}

beforeAll(async () => {
  await resetDatabase();
  s = await makeSquad("t");
  other = await makeSquad("o");
});

describe("gas-exchange tests", () => {
  let testId = "";
  const ramp = syntheticRamp({ seed: 1 });

  it("stores the upload, analyses it and creates a zone set effective from the test date", async () => {
    const r = await s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteA.id}/tests`, {
      params: { id: s.athleteA.id },
      form: upload(ramp.csv, { bodyMassKg: "72" }),
    });
    expect(r.status).toBe(201);
    testId = r.json.id;
    // Detected thresholds near the model's (VT1 within 10 %, VT2 within 8 %: the engine's stated tolerances).
    expect(Math.abs(r.json.detected.vt1.vo2MlMin / ramp.truth.vt1Vo2MlMin - 1)).toBeLessThan(0.1);
    expect(Math.abs(r.json.detected.vt2.vo2MlMin / ramp.truth.vt2Vo2MlMin - 1)).toBeLessThan(0.08);
    const file = await query<{ size_bytes: number }>(`select size_bytes from test_file where test_id = $1`, [testId]);
    expect(file[0]!.size_bytes).toBe(Buffer.byteLength(ramp.csv));
    const zones = await s.athleteA.browser.call(zonesRoute, "GET", `/api/athletes/${s.athleteA.id}/zones`, {
      params: { id: s.athleteA.id },
      query: "?date=2026-09-01",
    });
    expect(zones.status).toBe(200);
    const set = zones.json.inForce.cycling;
    expect(set.effectiveFrom).toBe("2026-09-01");
    expect(set.zones[0].ranges.hrBpm.max).toBe(r.json.detected.vt1.hrBpm);
    expect(set.zones[2].ranges.powerW.min).toBe(r.json.detected.vt2.powerW);
    const before = await s.athleteA.browser.call(zonesRoute, "GET", `/api/athletes/${s.athleteA.id}/zones`, {
      params: { id: s.athleteA.id },
      query: "?date=2026-08-31",
    });
    expect(before.json.inForce.cycling).toBeUndefined();
  });

  it("the athlete reads the test with its chart points and fuel profile; the original file downloads", async () => {
    const r = await s.athleteA.browser.call(testRoute, "GET", `/api/tests/${testId}`, { params: { id: testId } });
    expect(r.status).toBe(200);
    expect(r.json.result.points.length).toBeGreaterThan(50);
    expect(r.json.fuel.maxFat.fatGMin).toBeGreaterThan(0);
    expect(r.json.adjusted).toBeNull();
    const f = await s.athleteA.browser.call(fileRoute, "GET", `/api/tests/${testId}/file`, { params: { id: testId } });
    expect(f.status).toBe(200);
    expect(f.headers.get("content-disposition")).toMatch(/ramp\.csv/);
  });

  it("adjusting a threshold changes the zones and keeps the detected values, with who and when", async () => {
    const before = (await s.coach.browser.call(testRoute, "GET", `/api/tests/${testId}`, { params: { id: testId } }))
      .json;
    const newVt2Time = before.detected.vt2.timeS - 60;
    const r = await s.coach.browser.call(thresholdsRoute, "PATCH", `/api/tests/${testId}/thresholds`, {
      params: { id: testId },
      body: { vt1: { timeS: before.detected.vt1.timeS }, vt2: { timeS: newVt2Time } },
    });
    expect(r.status).toBe(200);
    expect(r.json.detected).toEqual(before.detected);
    expect(r.json.adjusted.vt2.timeS).toBeCloseTo(newVt2Time, 0);
    expect(r.json.adjusted.vt2.hrBpm).toBeLessThan(before.detected.vt2.hrBpm);
    expect(r.json.adjustedBy).toMatch(/^Coach/);
    expect(r.json.adjustedAt).toBeTruthy();
    const zones = await s.athleteA.browser.call(zonesRoute, "GET", `/api/athletes/${s.athleteA.id}/zones`, {
      params: { id: s.athleteA.id },
      query: "?date=2026-09-02",
    });
    expect(zones.json.inForce.cycling.zones[2].ranges.hrBpm.min).toBe(r.json.adjusted.vt2.hrBpm);
    const wrongOrder = await s.coach.browser.call(thresholdsRoute, "PATCH", `/api/tests/${testId}/thresholds`, {
      params: { id: testId },
      body: { vt1: { timeS: 800 }, vt2: { timeS: 700 } },
    });
    expect(wrongOrder.status).toBe(400);
  });

  it("a coach sets the test segment by hand: the file is analysed again inside it, adjustments are cleared, the zones follow", async () => {
    const before = (await s.coach.browser.call(testRoute, "GET", `/api/tests/${testId}`, { params: { id: testId } }))
      .json;
    expect(before.adjusted).not.toBeNull(); // from the test above
    const put = (body: unknown, who = s.coach) =>
      who.browser.call(segmentRoute, "PUT", `/api/tests/${testId}/segment`, { params: { id: testId }, body });
    // End the segment half-way between the detected VT1 and VT2: VT2 can no longer be found there, VT1 still can.
    const cut = Math.round((before.detected.vt1.timeS + before.detected.vt2.timeS) / 2);
    const r = await put({ fromS: before.result.onsetS, toS: cut });
    expect(r.status, JSON.stringify(r.json)).toBe(200);
    expect(r.json.result.segmentSource).toBe("chosen");
    expect(r.json.result.endS).toBe(cut);
    expect(r.json.input.segment).toEqual({ fromS: before.result.onsetS, toS: cut });
    expect(r.json.adjusted).toBeNull();
    expect(r.json.detected.vt2 === null || r.json.detected.vt2.timeS <= cut).toBe(true);
    if (r.json.detected.vt2 === null) expect(r.json.zoneSet).toBeNull();
    // Given back to the finder, the original detection returns, and with it the zone set.
    const back = await put({ fromS: null, toS: null });
    expect(back.status).toBe(200);
    expect(back.json.result.segmentSource).toBe("workload");
    expect(back.json.detected).toEqual(before.detected);
    expect(back.json.input.segment).toBeNull();
    expect(back.json.zoneSet.vt2.timeS).toBe(before.detected.vt2.timeS);
    // Bad input and the wrong person.
    const bad = await put({ fromS: 600, toS: 620 });
    expect(bad.status).toBe(400);
    expect(bad.json.error + JSON.stringify(bad.json)).toMatch(/at least a minute/);
    const athlete = await put({ fromS: 100, toS: 900 }, s.athleteA);
    expect(athlete.status).toBe(403);
    const outsider = await put({ fromS: 100, toS: 900 }, other.head);
    expect(outsider.status).toBe(404);
  });

  it("an athlete cannot read another athlete's test or zones, and cannot adjust their own", async () => {
    const r = await s.athleteB.browser.call(testRoute, "GET", `/api/tests/${testId}`, { params: { id: testId } });
    expect(r.status).toBe(404);
    const z = await s.athleteB.browser.call(zonesRoute, "GET", `/api/athletes/${s.athleteA.id}/zones`, {
      params: { id: s.athleteA.id },
    });
    expect(z.status).toBe(404);
    const outsider = await other.head.browser.call(testRoute, "GET", `/api/tests/${testId}`, {
      params: { id: testId },
    });
    expect(outsider.status).toBe(404);
    const own = await s.athleteA.browser.call(thresholdsRoute, "PATCH", `/api/tests/${testId}/thresholds`, {
      params: { id: testId },
      body: { vt1: { timeS: 500 }, vt2: { timeS: 700 } },
    });
    expect(own.status).toBe(403);
    const create = await s.athleteA.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteA.id}/tests`, {
      params: { id: s.athleteA.id },
      form: upload(ramp.csv),
    });
    expect(create.status).toBe(403);
  });

  it("takes an explicit column mapping for files with other headers", async () => {
    const csv = syntheticRamp({
      seed: 4,
      headers: ["secs", "oxygen", "carbon", "vent", "pulse", "watts", "breaths"],
    }).csv;
    const mapping = JSON.stringify({
      time: "secs",
      vo2: "oxygen",
      vco2: "carbon",
      ve: "vent",
      hr: "pulse",
      power: "watts",
    });
    const ok = await s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteA.id}/tests`, {
      params: { id: s.athleteA.id },
      form: upload(csv, { mapping, date: "2026-10-01" }),
    });
    expect(ok.status).toBe(201);
    expect(ok.json.detected.vt1.hrBpm).toBeGreaterThan(100);
    const unmapped = await s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteA.id}/tests`, {
      params: { id: s.athleteA.id },
      form: upload(csv, { date: "2026-10-02" }),
    });
    expect(unmapped.status).toBe(422);
    expect(unmapped.json.error).toMatch(/no column for time, VO2, VCO2\./); // "vent" is a known alias of VE
    const wrong = await s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteA.id}/tests`, {
      params: { id: s.athleteA.id },
      form: upload(csv, { mapping: JSON.stringify({ vo2: "nope" }) }),
    });
    expect(wrong.status).toBe(422);
    expect(wrong.json.error).toMatch(/no such column/);
  });

  it("bad uploads answer 4xx with the reason and store nothing", async () => {
    const before = await testRows();
    const post = (form: FormData) =>
      s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteA.id}/tests`, {
        params: { id: s.athleteA.id },
        form,
      });
    const cases: [FormData, number, RegExp][] = [
      [upload(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0, 0, 1, 2]), {}, "photo.png"), 415, /not a text CSV/],
      [upload(""), 400, /empty/],
      [upload("time,vco2,ve\n1,900,30\n2,950,31\n"), 422, /no column for VO2/],
      [upload("lorem ipsum dolor\nsit amet\nconsectetur\n"), 422, /no column/],
      [upload(ramp.csv, { date: "2026-13-45" }), 400, /not valid/],
      [upload(ramp.csv, { endedBy: "stop_sign" }), 400, /not valid/],
    ];
    for (const [form, status, reason] of cases) {
      const r = await post(form);
      expect(r.status, JSON.stringify(r.json)).toBe(status);
      expect(r.json.error).toMatch(reason);
    }
    const big = upload("time_s,vo2_ml_min,vco2_ml_min,ve_l_min\n" + "1,1000,900,30\n".repeat(800_000));
    const tooBig = await post(big);
    expect(tooBig.status).toBe(413);
    expect(tooBig.json.error).toMatch(/larger than 10 MB/);
    const noFile = new FormData();
    noFile.set("sport", "cycling");
    const r = await post(noFile);
    expect(r.status).toBe(400);
    expect(await testRows()).toBe(before);
    expect((await query<{ n: number }>(`select count(*)::int as n from test_file`))[0]!.n).toBe(before);
  });
});

describe("talk tests, hand-entered thresholds and zones on a date", () => {
  it("a talk test creates zones; a later retest replaces them from its date on", async () => {
    const meta = (date: string) => ({
      sport: "running",
      protocol: "talk test, 1 km/h steps of 3 min",
      date,
      endedBy: "plan",
    });
    const stages = (base: number) =>
      ["comfortable", "comfortable", "not_fully_comfortable", "not_fully_comfortable", "cannot_speak"].map(
        (speech, i) => ({ workload: base + i, durationS: 180, hrBpm: 130 + 8 * i, speech }),
      );
    const first = await s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteB.id}/tests`, {
      params: { id: s.athleteB.id },
      body: { kind: "talk", meta: meta("2026-03-01"), talk: { workloadUnit: "km/h", stages: stages(9) } },
    });
    expect(first.status).toBe(201);
    expect(first.json.detected).toEqual({ vt1: { hrBpm: 146, speedKmh: 11 }, vt2: { hrBpm: 162, speedKmh: 13 } });
    const retest = await s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteB.id}/tests`, {
      params: { id: s.athleteB.id },
      body: {
        kind: "manual",
        meta: meta("2026-06-01"),
        vt1: { hrBpm: 150, speedKmh: 12 },
        vt2: { hrBpm: 166, speedKmh: 14 },
      },
    });
    expect(retest.status).toBe(201);
    const on = async (date: string) =>
      (
        await s.athleteB.browser.call(zonesRoute, "GET", `/api/athletes/${s.athleteB.id}/zones`, {
          params: { id: s.athleteB.id },
          query: `?date=${date}`,
        })
      ).json.inForce.running;
    // A session dated before the retest reads the old zone set, on and after it the new one.
    expect((await on("2026-05-31")).vt1.hrBpm).toBe(146);
    expect((await on("2026-06-01")).vt1.hrBpm).toBe(150);
    expect(await on("2026-02-28")).toBeUndefined();
    const bad = await s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteB.id}/tests`, {
      params: { id: s.athleteB.id },
      body: { kind: "manual", meta: meta("2026-07-01"), vt1: { hrBpm: 170 }, vt2: { hrBpm: 160 } },
    });
    expect(bad.status).toBe(400);
    expect(bad.json.error).toMatch(/VT1 must lie below VT2/);
  });

  it("two tests on the same day: the newest sets the zones until a coach chooses the other, which every view then reads", async () => {
    const meta = { sport: "running", protocol: "manual entry", date: "2026-08-10", endedBy: "plan" };
    const make = (vt1: number, vt2: number) =>
      s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteB.id}/tests`, {
        params: { id: s.athleteB.id },
        body: { kind: "manual", meta, vt1: { hrBpm: vt1, speedKmh: 12 }, vt2: { hrBpm: vt2, speedKmh: 14 } },
      });
    expect((await make(151, 167)).status).toBe(201);
    expect((await make(153, 169)).status).toBe(201);
    const zones = async () =>
      (
        await s.athleteB.browser.call(zonesRoute, "GET", `/api/athletes/${s.athleteB.id}/zones`, {
          params: { id: s.athleteB.id },
          query: "?date=2026-08-10",
        })
      ).json;
    expect((await zones()).inForce.running.vt1.hrBpm).toBe(153);
    const older = (await zones()).history.find((z: { vt1: { hrBpm: number } }) => z.vt1.hrBpm === 151);
    const choose = (id: string, who = s.coach.browser) =>
      who.call(chooseRoute, "POST", `/api/zone-sets/${id}/choose`, { params: { id } });
    expect((await choose(older.id, s.athleteB.browser)).status).toBe(403);
    expect((await choose("no-such-set")).status).toBe(404);
    const chosen = await choose(older.id);
    expect(chosen.status).toBe(200);
    expect(chosen.json.chosenAt).toBeTruthy();
    expect((await zones()).inForce.running.vt1.hrBpm).toBe(151);
    // The history lists the chosen set first on its day (what the zone pages and the sessions' targets read).
    const sameDay = (await zones()).history.filter((z: { effectiveFrom: string }) => z.effectiveFrom === "2026-08-10");
    expect(sameDay.map((z: { vt1: { hrBpm: number } }) => z.vt1.hrBpm)).toEqual([151, 153]);
  });

  it("a submaximal estimate is stored with its error band and makes no zones", async () => {
    const r = await s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteB.id}/tests`, {
      params: { id: s.athleteB.id },
      body: {
        kind: "submax",
        meta: { sport: "cycling", protocol: "three 4-min stages", date: "2026-07-10", endedBy: "plan" },
        submax: {
          modality: "cycling",
          massKg: 70,
          age: 40,
          measuredHrMaxBpm: null,
          stages: [
            { powerW: 50, hrBpm: 100 },
            { powerW: 100, hrBpm: 120 },
            { powerW: 150, hrBpm: 140 },
          ],
        },
      },
    });
    expect(r.status).toBe(201);
    expect(r.json.result.vo2MaxMlKgMin).toBeCloseTo(46.3, 1);
    expect(r.json.result.band).toHaveLength(2);
    const zones = await s.coach.browser.call(zonesRoute, "GET", `/api/athletes/${s.athleteB.id}/zones`, {
      params: { id: s.athleteB.id },
      query: "?date=2026-12-01",
    });
    expect(zones.json.inForce.cycling).toBeUndefined();
  });
});
