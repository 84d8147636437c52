// Fuzzed uploads through the real route handlers: more than 500 malformed gas-exchange CSVs and FIT, TCX, GPX and CSV
// activity files (truncated, bytes flipped, wrong encoding, huge numbers, NaN, wrong columns, binary garbage, a
// compression bomb, 0 bytes, over the size limit). Every one must answer 4xx with a reason, none 5xx, and nothing may be
// left in the database. Deterministic: a seeded generator (mulberry32, common practice) picks cuts and flips.
import { gzipSync } from "node:zlib";
import { beforeAll, describe, expect, it } from "vitest";
import * as activitiesRoute from "@/app/api/athletes/[id]/activities/route";
import * as testsRoute from "@/app/api/athletes/[id]/tests/route";
import { encodeFit } from "@/features/activities/lib/fit-fixture";
import { syntheticRamp } from "@/features/gas-exchange/lib/synthetic-ramp";
import { query, resetDatabase } from "../support/db";
import { makeSquad } from "../support/squad";

type Squad = Awaited<ReturnType<typeof makeSquad>>;
let s: Squad;

function mulberry32(seed: number) {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const rand = mulberry32(20261202);
const int = (n: number) => Math.floor(rand() * n);
const text = (t: string) => new TextEncoder().encode(t);
const utf16 = (t: string) => new Uint8Array(Buffer.from(`\ufeff${t}`, "utf16le"));
const garbage = (n: number) => Uint8Array.from({ length: n }, () => int(256));
const flip = (b: Uint8Array, from: number) => {
  const c = b.slice();
  const at = from + int(c.length - from - 2);
  c[at] = c[at]! ^ (1 + int(255));
  return c;
};

const seconds = Array.from({ length: 900 }, (_, i) => ({
  hrBpm: 120 + (i % 40),
  powerW: 180 + (i % 50),
  speedKmh: 10 + (i % 5),
}));
const fit = encodeFit({ start: new Date("2026-11-20T09:00:00Z"), sport: "running", seconds });
const points = Array.from({ length: 200 }, (_, i) =>
  new Date(Date.parse("2026-11-20T09:00:00Z") + i * 1000).toISOString(),
);
const tcx = `<?xml version="1.0"?><TrainingCenterDatabase xmlns="http://www.garmin.com/xmlschemas/TrainingCenterDatabase/v2"><Activities><Activity Sport="Running"><Id>${points[0]}</Id><Lap StartTime="${points[0]}"><Track>${points.map((t, i) => `<Trackpoint><Time>${t}</Time><HeartRateBpm><Value>${130 + (i % 9)}</Value></HeartRateBpm></Trackpoint>`).join("")}</Track></Lap></Activity></Activities></TrainingCenterDatabase>`;
const gpx = `<?xml version="1.0"?><gpx version="1.1" creator="fuzz" xmlns="http://www.topografix.com/GPX/1/1"><trk><trkseg>${points.map((t, i) => `<trkpt lat="59.9${i}" lon="10.7${i}"><time>${t}</time></trkpt>`).join("")}</trkseg></trk></gpx>`;
const ramp = syntheticRamp({ seed: 5 }).csv;

/** Malformed activity files: [bytes, file name, what is wrong]. */
function activityCases(): [Uint8Array, string, string][] {
  const out: [Uint8Array, string, string][] = [];
  for (let i = 0; i < 80; i++) out.push([fit.slice(0, int(fit.length - 1)), "cut.fit", "truncated FIT"]);
  for (let i = 0; i < 130; i++) out.push([flip(fit, 14), "flipped.fit", "FIT with a changed byte (checksum)"]);
  for (let i = 0; i < 50; i++) out.push([text(tcx).slice(0, int(tcx.length - 40)), "cut.tcx", "truncated TCX"]);
  for (let i = 0; i < 50; i++) out.push([text(gpx).slice(0, int(gpx.length - 20)), "cut.gpx", "truncated GPX"]);
  for (let i = 0; i < 40; i++)
    out.push([garbage(1 + int(4000)), ["x.fit", "x.tcx", "x.gpx", "x.csv", "x.bin"][i % 5]!, "binary garbage"]);
  for (const ext of ["fit", "tcx", "gpx", "csv"]) out.push([new Uint8Array(), `empty.${ext}`, "0 bytes"]);
  out.push(
    [utf16(tcx), "utf16.tcx", "TCX in UTF-16"],
    [utf16("time,hr\n0,120\n1,121\n"), "utf16.csv", "CSV in UTF-16"],
  );
  out.push(
    [text("time,hr\n0,1e308\n1,9e999\n2,NaN\n"), "huge.csv", "huge numbers and NaN"],
    [text("time,cadence\n1,90\n2,91\n"), "cols.csv", "no usable columns"],
  );
  out.push([new Uint8Array(gzipSync(Buffer.alloc(20_000_000))), "bomb.fit", "a compression bomb named .fit"]);
  out.push([new Uint8Array(gzipSync(Buffer.alloc(20_000_000))), "bomb.csv", "a compression bomb named .csv"]);
  out.push([new Uint8Array(25 * 1024 * 1024 + 1), "big.fit", "over the 25 MB limit"]);
  return out;
}

/** Malformed gas-exchange CSVs. */
function gasCases(): [Uint8Array, string][] {
  const lines = ramp.split("\n");
  const out: [Uint8Array, string][] = [];
  for (let i = 0; i < 40; i++) out.push([garbage(1 + int(3000)), "binary garbage"]);
  for (let i = 0; i < 40; i++) {
    const header = lines[0]!.split(",");
    header[int(4)] = `col${int(100)}`; // one of time, VO2, VCO2, VE renamed away
    out.push([text([header.join(","), ...lines.slice(1)].join("\n")), "a required column missing"]);
  }
  for (let i = 0; i < 40; i++)
    out.push([
      text(
        [
          lines[0],
          ...lines.slice(1, 2 + int(50)).map((l) =>
            l
              .split(",")
              .map((c, k) => (k === 0 ? c : ["NaN", "1e400", "-1e308", "∞", ""][int(5)]))
              .join(","),
          ),
        ].join("\n"),
      ),
      "NaN, infinite and huge values only",
    ]);
  for (let i = 0; i < 20; i++)
    out.push([text(lines[0]!.slice(0, int(lines[0]!.length))), "a header (part) and no rows"]);
  out.push(
    [new Uint8Array(), "0 bytes"],
    [utf16(ramp), "UTF-16"],
    [new Uint8Array(gzipSync(Buffer.from(ramp))), "gzip"],
    [new Uint8Array(10 * 1024 * 1024 + 1), "over the size limit"],
  );
  return out;
}

const counts = async () =>
  (
    await query<{ tests: number; files: number; activities: number; logs: number; zones: number }>(
      `select (select count(*)::int from athlete_test) as tests, (select count(*)::int from test_file) as files,
            (select count(*)::int from activity_file) as activities, (select count(*)::int from session_log) as logs,
            (select count(*)::int from zone_set) as zones`,
    )
  )[0]!;

beforeAll(async () => {
  await resetDatabase();
  s = await makeSquad("fuzz");
});

describe("fuzzed uploads", () => {
  it("more than 500 malformed files: each answers 4xx with a reason, none 5xx, and nothing is written", async () => {
    const before = await counts();
    const activities = activityCases();
    const gas = gasCases();
    expect(activities.length + gas.length).toBeGreaterThanOrEqual(500);
    const answers: Record<string, number> = {};
    for (const [bytes, name, what] of activities) {
      const form = new FormData();
      form.set("file", new File([new Uint8Array(bytes)], name));
      const r = await s.athleteA.browser.call(activitiesRoute, "POST", "/api/athletes/x/activities", {
        params: { id: s.athleteA.id },
        form,
      });
      answers[r.status] = (answers[r.status] ?? 0) + 1;
      expect(r.status, `${what} (${name}, ${bytes.length} bytes)`).toBeGreaterThanOrEqual(400);
      expect(r.status, `${what} (${name})`).toBeLessThan(500);
      expect(typeof r.json?.error === "string" && r.json.error.length > 10, `${what}: a reason`).toBe(true);
    }
    for (const [bytes, what] of gas) {
      const form = new FormData();
      form.set("file", new File([new Uint8Array(bytes)], "ramp.csv", { type: "text/csv" }));
      for (const [k, v] of Object.entries({
        sport: "cycling",
        protocol: "ramp 25 W/min",
        date: "2026-09-01",
        endedBy: "exhaustion",
      }))
        form.set(k, v);
      const r = await s.coach.browser.call(testsRoute, "POST", `/api/athletes/${s.athleteA.id}/tests`, {
        params: { id: s.athleteA.id },
        form,
      });
      answers[r.status] = (answers[r.status] ?? 0) + 1;
      expect(r.status, `${what} (${bytes.length} bytes)`).toBeGreaterThanOrEqual(400);
      expect(r.status, what).toBeLessThan(500);
      expect(typeof r.json?.error === "string" && r.json.error.length > 10, `${what}: a reason`).toBe(true);
    }
    expect(await counts()).toEqual(before);
    expect(Object.keys(answers).every((k) => Number(k) >= 400 && Number(k) < 500)).toBe(true);
  }, 240_000);
});
