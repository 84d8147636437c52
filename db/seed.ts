/**
 * Demo data for the invented coaching practice "Northfold Endurance". Every name and number here is invented for the demo.
 * Loaded by `npm start` when the database has no users.
 */
import { randomUUID } from "node:crypto";
import { sql as rawSql } from "drizzle-orm";
import { drizzle } from "drizzle-orm/postgres-js";
import postgres from "postgres";
import { hashPassword } from "better-auth/crypto";
import { gasExchangeRecord, talkTestRecord } from "../features/athlete-tests/lib/records";
import type { TalkTestInput } from "../features/field-tests/lib/talk-test";
import { analyzeCsv } from "../features/gas-exchange/lib/analyze";
import { syntheticRamp, type RampOptions } from "../features/gas-exchange/lib/synthetic-ramp";
import { planSeason } from "../features/planning/lib/season";
import { expand, type Block } from "../features/planning/lib/session";
import { threeZones } from "../features/zones/lib/zones";
import { encodeFit, type FitSecond } from "../features/activities/lib/fit-fixture";
import { readActivity } from "../features/activities/lib/read";
import { chooseMeasure, summarise, toStreams, zoneTime } from "../features/activities/lib/streams";
import { banisterTrimp } from "../features/load/lib/load";
import { flatten } from "../features/planning/lib/session";
import { localDate } from "../features/platform/lib/dates";
import { and, eq, lt } from "drizzle-orm";
import * as schema from "./schema";
import { SCREENING_QUESTIONS } from "../features/athlete-tests/lib/readiness";

export const DEMO_PASSWORD = "northfold-demo";

type Role = "head_coach" | "coach" | "athlete";
type Profile = Omit<typeof schema.athleteProfile.$inferInsert, "userId">;

type DemoTest =
  | { kind: "gas"; daysAgo: number; sport: string; protocol: string; ramp: RampOptions }
  | { kind: "talk"; daysAgo: number; sport: string; protocol: string; talk: TalkTestInput };

interface DemoPerson {
  email: string;
  name: string;
  role: Role;
  profile?: Profile;
  tests?: DemoTest[];
}

const talkStages = (start: number, step: number, hr0: number, hrStep: number, firstUneasy: number, firstSilent: number, unit: "km/h" | "W"): TalkTestInput => ({
  workloadUnit: unit,
  stages: Array.from({ length: firstSilent + 1 }, (_, i) => ({
    workload: Math.round((start + i * step) * 10) / 10,
    durationS: 180,
    hrBpm: hr0 + i * hrStep,
    speech: i >= firstSilent ? ("cannot_speak" as const) : i >= firstUneasy ? ("not_fully_comfortable" as const) : ("comfortable" as const),
  })),
});

/** The demo's site operator: an administrator with no squad, who can read the local outbox page. */
export const DEMO_ADMIN = { email: "operator@northfold.test", name: "Site operator" } as const;

export const DEMO_PEOPLE: DemoPerson[] = [
  { email: "coach@northfold.test", name: "Maren Holt", role: "head_coach" },
  { email: "assistant@northfold.test", name: "Tobias Lind", role: "coach" },
  {
    email: "runner@northfold.test",
    name: "Ines Varga",
    role: "athlete",
    profile: { birthYear: 1991, sex: "female", bodyMassKg: 56, restingHrBpm: 48, maxHrBpm: 188, sports: ["running"], timeZone: "Europe/Oslo", reminderTiming: "evening_before", reminderTime: "19:30" },
    tests: [
      { kind: "talk", daysAgo: 190, sport: "running", protocol: "treadmill talk test, +1 km/h every 3 min", talk: talkStages(9, 1, 128, 8, 3, 6, "km/h") },
      { kind: "talk", daysAgo: 82, sport: "running", protocol: "treadmill talk test, +1 km/h every 3 min", talk: talkStages(9, 1, 126, 8, 4, 7, "km/h") },
    ],
  },
  {
    email: "cyclist@northfold.test",
    name: "Jonas Okafor",
    role: "athlete",
    profile: { birthYear: 1986, sex: "male", bodyMassKg: 74, restingHrBpm: 46, maxHrBpm: 184, sports: ["cycling"], timeZone: "Europe/Berlin", reminderTiming: "morning_of", reminderTime: "06:30" },
    tests: [{ kind: "gas", daysAgo: 80, sport: "cycling", protocol: "cycle ergometer ramp, 25 W/min after 3 min at 50 W", ramp: { seed: 11, massKg: 74, peakW: 390, hrRest: 88, hrMax: 184 } }],
  },
  {
    email: "triathlete@northfold.test",
    name: "Saga Brenner",
    role: "athlete",
    profile: { birthYear: 1995, sex: "female", bodyMassKg: 61, restingHrBpm: 50, maxHrBpm: 192, sports: ["triathlon", "running", "cycling", "swimming"], timeZone: "Europe/Stockholm", reminderTiming: "evening_before", reminderTime: "20:00" },
    tests: [
      { kind: "gas", daysAgo: 60, sport: "cycling", protocol: "cycle ergometer ramp, 20 W/min after 3 min at 50 W", ramp: { seed: 23, massKg: 61, peakW: 300, rampWPerMin: 20, hrRest: 90, hrMax: 192 } },
      { kind: "talk", daysAgo: 55, sport: "running", protocol: "track talk test, +0.5 km/h every 3 min", talk: talkStages(9, 0.5, 132, 6, 5, 9, "km/h") },
    ],
  },
  {
    email: "rower@northfold.test",
    name: "Priya Castell",
    role: "athlete",
    profile: { birthYear: 1999, sex: "female", bodyMassKg: 70, restingHrBpm: 52, maxHrBpm: 196, sports: ["rowing"], timeZone: "Europe/London", reminderTiming: "morning_of", reminderTime: "05:45" },
    tests: [{ kind: "gas", daysAgo: 40, sport: "rowing", protocol: "rowing ergometer ramp, 30 W/min after 3 min at 60 W", ramp: { seed: 37, massKg: 70, warmupW: 60, peakW: 330, rampWPerMin: 30, hrRest: 92, hrMax: 196 } }],
  },
  {
    email: "walker@northfold.test",
    name: "Edwin Marsh",
    role: "athlete",
    profile: { birthYear: 1962, sex: "male", bodyMassKg: 86, restingHrBpm: 64, maxHrBpm: 160, sports: ["walking"], timeZone: "Europe/Dublin", reminderTiming: "evening_before", reminderTime: "18:00" },
    tests: [{ kind: "talk", daysAgo: 30, sport: "walking", protocol: "treadmill walking talk test, +0.5 km/h every 3 min", talk: talkStages(4, 0.5, 92, 7, 4, 7, "km/h") }],
  },
  {
    email: "skier@northfold.test",
    name: "Lotte Aune",
    role: "athlete",
    profile: { birthYear: 1993, sex: "female", bodyMassKg: 63, restingHrBpm: 44, maxHrBpm: 190, sports: ["cross_country_skiing", "running"], timeZone: "Europe/Oslo", reminderTiming: "evening_before", reminderTime: "19:00" },
    tests: [{ kind: "talk", daysAgo: 79, sport: "running", protocol: "uphill treadmill talk test, 8 %, +0.5 km/h every 3 min", talk: talkStages(7, 0.5, 124, 7, 5, 8, "km/h") }],
  },
];

export const DEMO_SQUAD_NAME = "Northfold Endurance";

/** Loads the demo when the database has no users; returns whether it did. One transaction. */
export async function seedDemoIfEmpty(databaseUrl: string): Promise<boolean> {
  const client = postgres(databaseUrl, { max: 1, onnotice: () => {} });
  const db = drizzle(client, { schema });
  try {
    const [{ count }] = (await db.execute(rawSql`select count(*)::int as count from "user"`)) as unknown as [{ count: number }];
    if (count > 0) return false;
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    const people = new Map<string, string>();
    await db.transaction(async (tx) => {
      const squadId = randomUUID();
      await tx.insert(schema.squad).values({ id: squadId, name: DEMO_SQUAD_NAME });
      for (const person of DEMO_PEOPLE) {
        const userId = randomUUID();
        await tx.insert(schema.user).values({ id: userId, name: person.name, email: person.email, emailVerified: true });
        await tx.insert(schema.account).values({
          id: randomUUID(),
          accountId: userId,
          providerId: "credential",
          userId,
          password: passwordHash,
        });
        await tx.insert(schema.membership).values({ squadId, userId, role: person.role });
        if (person.profile) {
          await tx.insert(schema.athleteProfile).values({ userId, ...person.profile });
          // Readiness answered three weeks ago, all no (invented, like the rest of the demo).
          const answers = Object.fromEntries(SCREENING_QUESTIONS.map((q) => [q.id, false]));
          await tx.insert(schema.screening).values({ id: randomUUID(), athleteId: userId, answers, anyYes: false, recordedBy: userId, createdAt: new Date(Date.now() - 21 * 86_400_000) });
        }
        people.set(person.email, userId);
      }
      const adminId = randomUUID();
      await tx.insert(schema.user).values({ id: adminId, name: DEMO_ADMIN.name, email: DEMO_ADMIN.email, emailVerified: true, isAdmin: true });
      await tx.insert(schema.account).values({ id: randomUUID(), accountId: adminId, providerId: "credential", userId: adminId, password: passwordHash });
      const coachId = people.get("coach@northfold.test")!;
      for (const person of DEMO_PEOPLE) {
        for (const t of person.tests ?? []) await insertDemoTest(tx, people.get(person.email)!, coachId, person.profile?.bodyMassKg ?? null, t);
      }
      await insertDemoPlans(tx, squadId, coachId, people);
      await insertDemoLogs(tx, people);
    });
    return true;
  } finally {
    await client.end();
  }
}

type Tx = Parameters<Parameters<ReturnType<typeof drizzle<typeof schema>>["transaction"]>[0]>[0];

function daysAgo(n: number): string {
  return new Date(Date.now() - n * 86_400_000).toISOString().slice(0, 10);
}

async function insertDemoTest(tx: Tx, athleteId: string, coachId: string, massKg: number | null, t: DemoTest): Promise<void> {
  const id = randomUUID();
  const date = daysAgo(t.daysAgo);
  let record: ReturnType<typeof talkTestRecord>;
  let csv: string | null = null;
  if (t.kind === "gas") {
    csv = syntheticRamp(t.ramp).csv;
    const a = analyzeCsv(csv, { bodyMassKg: massKg });
    if (!a.ok) throw new Error(`demo test for ${athleteId}: ${a.error}`);
    record = gasExchangeRecord(a, massKg);
  } else {
    record = talkTestRecord(t.talk);
  }
  await tx.insert(schema.athleteTest).values({
    id,
    athleteId,
    kind: t.kind === "gas" ? "gas_exchange" : "talk",
    sport: t.sport,
    protocol: t.protocol,
    testDate: date,
    endedBy: t.kind === "gas" ? "exhaustion" : "plan",
    bodyMassKg: massKg,
    input: t.kind === "gas" ? { mapping: {}, filename: "demo-ramp.csv", fiveZones: false } : { talk: t.talk, fiveZones: false },
    result: record.result,
    detected: record.detected,
    createdBy: coachId,
  });
  if (csv) {
    const data = Buffer.from(csv);
    await tx.insert(schema.testFile).values({ testId: id, filename: `northfold-${t.sport}-${date}.csv`, contentType: "text/csv", sizeBytes: data.length, data });
  }
  const { vt1, vt2 } = record.detected;
  if (vt1 && vt2) {
    threeZones(vt1, vt2); // the demo's thresholds must make zones
    await tx.insert(schema.zoneSet).values({ id: randomUUID(), athleteId, sport: t.sport, testId: id, effectiveFrom: date, model: "three", vt1, vt2, source: t.kind === "gas" ? "gas-exchange test (detected)" : "talk test", createdBy: coachId });
  }
}

// ---------------------------------------------------------------------------------------------------------------------
// Demo planning: a template library, a season per athlete and a few planned weeks (one over budget, one retest soon).
// ---------------------------------------------------------------------------------------------------------------------

const st = (kind: "warmup" | "work" | "recovery" | "cooldown", min: number, zone: 1 | 2 | 3): Block => ({ type: "step", kind, durationS: min * 60, zone });
const rep = (times: number, ...steps: Block[]): Block => ({ type: "repeat", times, steps });

export const DEMO_TEMPLATES: { key: string; name: string; sport: string; description: string; structure: Block[] }[] = [
  { key: "run-easy", name: "Easy run 45 min", sport: "running", description: "Conversational pace throughout.", structure: [st("work", 45, 1)] },
  { key: "run-long", name: "Long run 90 min", sport: "running", description: "Steady, relaxed; fuel after 60 min.", structure: [st("work", 90, 1)] },
  { key: "run-hills", name: "Hill repeats 5 × 4 min", sport: "running", description: "Hard uphill, walk or jog down.", structure: [st("warmup", 15, 1), rep(5, st("work", 4, 3), st("recovery", 3, 1)), st("cooldown", 10, 1)] },
  { key: "run-tempo", name: "Tempo 3 × 10 min", sport: "running", description: "Comfortably hard, between the thresholds.", structure: [st("warmup", 15, 1), rep(3, st("work", 10, 2), st("recovery", 3, 1)), st("cooldown", 10, 1)] },
  { key: "run-recovery", name: "Recovery jog 30 min", sport: "running", description: "Very easy.", structure: [st("work", 30, 1)] },
  { key: "bike-endurance", name: "Endurance ride 2 h", sport: "cycling", description: "Low zone, steady cadence.", structure: [st("work", 120, 1)] },
  { key: "bike-threshold", name: "4 × 8 min above VT2", sport: "cycling", description: "Hard intervals with easy spinning between.", structure: [st("warmup", 20, 1), rep(4, st("work", 8, 3), st("recovery", 4, 1)), st("cooldown", 15, 1)] },
  { key: "bike-tempo", name: "Tempo 2 × 20 min", sport: "cycling", description: "Between VT1 and VT2.", structure: [st("warmup", 15, 1), rep(2, st("work", 20, 2), st("recovery", 5, 1)), st("cooldown", 10, 1)] },
  { key: "bike-spin", name: "Recovery spin 45 min", sport: "cycling", description: "Easy gears only.", structure: [st("work", 45, 1)] },
  { key: "row-steady", name: "Steady state 60 min", sport: "rowing", description: "Low rate, long strokes.", structure: [st("work", 60, 1)] },
  { key: "row-pieces", name: "6 × 2 min pieces", sport: "rowing", description: "Race-pace pieces.", structure: [st("warmup", 15, 1), rep(6, st("work", 2, 3), st("recovery", 3, 1)), st("cooldown", 10, 1)] },
  { key: "swim-technique", name: "Swim technique 45 min", sport: "swimming", description: "Drills and easy aerobic lengths.", structure: [st("work", 45, 1)] },
  { key: "tri-brick", name: "Brick: ride then run", sport: "triathlon", description: "Ride easy, run the last 20 min a little faster.", structure: [st("work", 60, 1), st("work", 20, 2)] },
  { key: "walk-brisk", name: "Brisk walk 40 min", sport: "walking", description: "Walk with purpose, able to talk.", structure: [st("work", 40, 1)] },
  { key: "walk-hills", name: "Hill walk 6 × 3 min", sport: "walking", description: "Uphill efforts, easy down.", structure: [st("warmup", 10, 1), rep(6, st("work", 3, 2), st("recovery", 2, 1)), st("cooldown", 10, 1)] },
  { key: "ski-classic", name: "Classic ski 75 min", sport: "cross_country_skiing", description: "Easy terrain, long glides.", structure: [st("work", 75, 1)] },
  { key: "ski-uphill", name: "Uphill intervals 5 × 5 min", sport: "cross_country_skiing", description: "Hard climbs, easy back down.", structure: [st("warmup", 20, 1), rep(5, st("work", 5, 3), st("recovery", 3, 1)), st("cooldown", 15, 1)] },
];

/** The demo week pattern per sport: template keys by weekday (Monday first; null = rest). */
const WEEK_PATTERN: Record<string, (string | null)[]> = {
  "runner@northfold.test": [null, "run-hills", "run-easy", "run-tempo", "run-recovery", "run-long", null],
  "cyclist@northfold.test": [null, "bike-threshold", "bike-spin", "bike-tempo", null, "bike-endurance", "bike-spin"],
  "triathlete@northfold.test": ["swim-technique", "run-hills", "bike-endurance", "swim-technique", null, "tri-brick", "run-easy"],
  "rower@northfold.test": [null, "row-pieces", "row-steady", "row-steady", null, "row-steady", null],
  "walker@northfold.test": [null, "walk-brisk", null, "walk-hills", null, "walk-brisk", null],
  "skier@northfold.test": [null, "ski-uphill", "run-easy", "ski-classic", null, "ski-classic", "run-recovery"],
};

const SEASON_SPORT: Record<string, string> = {
  "runner@northfold.test": "running",
  "cyclist@northfold.test": "cycling",
  "triathlete@northfold.test": "triathlon",
  "rower@northfold.test": "rowing",
  "walker@northfold.test": "walking",
  "skier@northfold.test": "cross_country_skiing",
};

function mondayOfToday(): string {
  const now = new Date();
  const dow = (now.getUTCDay() + 6) % 7;
  return new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate() - dow)).toISOString().slice(0, 10);
}

function plusDays(iso: string, n: number): string {
  return new Date(Date.parse(`${iso}T00:00:00Z`) + n * 86_400_000).toISOString().slice(0, 10);
}

async function insertDemoPlans(tx: Tx, squadId: string, coachId: string, people: Map<string, string>): Promise<void> {
  const templateIds = new Map<string, string>();
  for (const t of DEMO_TEMPLATES) {
    const id = randomUUID();
    templateIds.set(t.key, id);
    const e = expand(t.structure);
    await tx.insert(schema.sessionTemplate).values({ id, squadId, name: t.name, sport: t.sport, description: t.description, structure: t.structure, totalS: Math.round(e.totalS), minutesByZone: e.minutesByZone, createdBy: coachId });
  }
  const monday = mondayOfToday();
  const year = Number(monday.slice(0, 4)) + (Number(monday.slice(5, 7)) >= 9 ? 1 : 0);
  for (const [email, pattern] of Object.entries(WEEK_PATTERN)) {
    const athleteId = people.get(email)!;
    const sport = SEASON_SPORT[email]!;
    const beginner = email.startsWith("walker");
    const weeks = planSeason({ startDate: plusDays(monday, -42), events: [{ date: `${year}-10-03`, name: "Autumn goal event" }], weeklyHours: beginner ? 3 : 7, level: beginner ? "beginner" : "trained" });
    await tx.insert(schema.season).values({ id: randomUUID(), athleteId, name: `Toward the autumn goal event ${year}`, sport, startDate: weeks[0]!.weekStart, events: [{ date: `${year}-10-03`, name: "Autumn goal event" }], weeklyHours: beginner ? 3 : 7, level: beginner ? "beginner" : "trained", retestEveryWeeks: 12, weeks: weeks as unknown as Record<string, unknown>[], createdBy: coachId });
    // Two weeks back, this week and next week.
    for (const weekOffset of [-14, -7, 0, 7]) {
      for (let d = 0; d < 7; d++) {
        let key = pattern[d];
        // Every athlete has something planned today (in their own time zone), so that "today" is never empty in the demo.
        const profile = DEMO_PEOPLE.find((p) => p.email === email)!.profile!;
        if (!key && plusDays(monday, weekOffset + d) === localDate(new Date(), profile.timeZone ?? "UTC")) key = pattern.find((k) => k && DEMO_TEMPLATES.find((t) => t.key === k)!.structure.length === 1) ?? null;
        // The cyclist's current week carries two interval sessions too many: the demo's over-budget week.
        if (email.startsWith("cyclist") && weekOffset === 0 && (d === 4 || d === 6)) key = "bike-threshold";
        if (!key) continue;
        const t = DEMO_TEMPLATES.find((x) => x.key === key)!;
        const e = expand(t.structure);
        await tx.insert(schema.plannedSession).values({ id: randomUUID(), athleteId, date: plusDays(monday, weekOffset + d), sport: t.sport, title: t.name, templateId: templateIds.get(key)!, structure: t.structure, totalS: Math.round(e.totalS), minutesByZone: e.minutesByZone, createdBy: coachId });
      }
    }
    // The skier's retest is due within the next seven days.
    if (email.startsWith("skier")) {
      const retest: Block[] = [st("warmup", 10, 1), st("work", 15, 2), st("cooldown", 10, 1)];
      const e = expand(retest);
      await tx.insert(schema.plannedSession).values({ id: randomUUID(), athleteId, date: plusDays(new Date().toISOString().slice(0, 10), 4), kind: "retest", sport: "running", title: "Retest: threshold test", structure: retest, totalS: Math.round(e.totalS), minutesByZone: e.minutesByZone, createdBy: coachId, notes: "Twelve weeks since the last talk test. Answer the readiness questions first." });
    }
  }
}

// Demo logs: the past planned sessions logged (a few partly done or skipped), each endurance athlete's latest past session
// with an invented FIT file, and nine earlier weeks of logged sessions for the load chart — the cyclist's heart rate at the
// same power creeping up in the last three weeks, the demo's zone drift.
// ---------------------------------------------------------------------------------------------------------------------

/** A deterministic pseudo-random number in [0, 1) (mulberry32), so that the demo is the same on every machine. */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const FIT_SPORT: Record<string, "running" | "cycling" | "crossCountrySkiing" | "rowing" | "swimming" | "walking"> = { running: "running", cycling: "cycling", rowing: "rowing", walking: "walking", swimming: "swimming", cross_country_skiing: "crossCountrySkiing", triathlon: "cycling" };

async function insertDemoLogs(tx: Tx, people: Map<string, string>): Promise<void> {
  const random = rng(20261201);
  for (const person of DEMO_PEOPLE.filter((p) => p.role === "athlete")) {
    const athleteId = people.get(person.email)!;
    const profile = person.profile!;
    const today = localDate(new Date(), profile.timeZone ?? "UTC");
    const sets = await tx.select().from(schema.zoneSet).where(eq(schema.zoneSet.athleteId, athleteId));
    const past = await tx.select().from(schema.plannedSession).where(and(eq(schema.plannedSession.athleteId, athleteId), lt(schema.plannedSession.date, today)));
    past.sort((a, b) => (a.date < b.date ? -1 : 1));
    const bikeZones = person.email.startsWith("cyclist") ? sets.find((z) => z.sport === "cycling") : undefined;
    /** The cyclist's averages: heart rate on a line through the thresholds at the same power, seven beats higher once drifted. */
    const bikeAverages = (k: number, drifted: boolean): Partial<typeof schema.sessionLog.$inferInsert> => {
      const z = bikeZones;
      if (!z?.vt1.powerW || !z.vt1.hrBpm || !z.vt2.powerW || !z.vt2.hrBpm) return {};
      const power = Math.round(z.vt1.powerW * (0.8 + 0.05 * k));
      const slope = (z.vt2.hrBpm - z.vt1.hrBpm) / (z.vt2.powerW - z.vt1.powerW);
      return { powerAvgW: power, hrAvgBpm: Math.round(z.vt1.hrBpm + slope * (power - z.vt1.powerW)) + (drifted ? 7 : 0) + Math.round((random() - 0.5) * 2) };
    };
    const withFile = past.filter((p) => p.kind === "training").at(-1)?.id;
    for (const p of past) {
      const r = random();
      const plannedMin = p.totalS / 60;
      const hard = p.minutesByZone[2] > 0 ? 2 : p.minutesByZone[1] > 0 ? 1 : 0;
      if (r < 0.07 && p.id !== withFile) {
        await tx.insert(schema.sessionLog).values({ id: randomUUID(), athleteId, plannedSessionId: p.id, date: p.date, sport: p.sport, title: p.title, status: "skipped", skipReason: "Work ran late", loggedBy: athleteId });
        continue;
      }
      const partial = r < 0.14 && p.id !== withFile;
      const durationMin = Math.round(plannedMin * (partial ? 0.6 : 0.95 + random() * 0.1));
      const rpe = [3, 5, 7][hard]! + (random() < 0.3 ? 1 : 0);
      const logId = randomUUID();
      let measured: Partial<typeof schema.sessionLog.$inferInsert> = {};
      let file: typeof schema.activityFile.$inferInsert | null = null;
      const sport = p.sport === "triathlon" ? "cycling" : p.sport;
      const zones = sets.filter((z) => z.sport === sport || (p.sport === "triathlon" && z.sport === "cycling")).sort((a, b) => (a.effectiveFrom < b.effectiveFrom ? 1 : -1))[0];
      if (p.id === withFile && zones) {
        // An invented recording that follows the planned steps: each zone at a value inside it, with a little noise.
        const at = (zone: number, key: "hrBpm" | "powerW" | "speedKmh") => {
          const v1 = zones.vt1[key], v2 = zones.vt2[key];
          if (v1 == null || v2 == null) return undefined;
          const v = zone === 1 ? v1 * 0.88 : zone === 2 ? (v1 + v2) / 2 : v2 * 1.04;
          return key === "speedKmh" ? v : Math.round(v);
        };
        const seconds: FitSecond[] = [];
        for (const step of flatten(p.structure as Block[])) {
          const n = Math.round((step.durationS ?? 600) * (durationMin / plannedMin));
          for (let i = 0; i < n; i++) {
            const noise = (random() - 0.5) * 4;
            const hr = at(step.zone, "hrBpm"), pw = at(step.zone, "powerW"), sp = at(step.zone, "speedKmh");
            seconds.push({ ...(hr !== undefined ? { hrBpm: Math.round(hr + noise) } : {}), ...(pw !== undefined ? { powerW: Math.max(0, Math.round(pw + noise * 3)) } : {}), ...(sp !== undefined ? { speedKmh: sp } : {}) });
          }
        }
        const start = new Date(`${p.date}T07:00:00Z`);
        const bytes = encodeFit({ start, sport: FIT_SPORT[p.sport] ?? "running", seconds });
        const activity = readActivity("demo.fit", bytes);
        const streams = toStreams(activity.samples);
        const summary = summarise(activity.samples, streams);
        const measure = chooseMeasure(summary.channels, zones.vt1, zones.vt2);
        const zt = measure ? zoneTime(streams, measure, zones.vt1[measure]!, zones.vt2[measure]!) : null;
        const trimp = summary.hrAvgBpm && profile.restingHrBpm && profile.maxHrBpm && profile.sex ? banisterTrimp({ minutes: summary.recordedS / 60, hrAvgBpm: summary.hrAvgBpm, hrRestBpm: profile.restingHrBpm, hrMaxBpm: profile.maxHrBpm, sex: profile.sex }) : null;
        measured = { measuredMinByZone: zt?.minutesByZone ?? null, zoneMeasure: measure, zoneSetId: zones.id, hrAvgBpm: summary.hrAvgBpm, powerAvgW: summary.powerAvgW, speedAvgKmh: summary.speedAvgKmh, trimp };
        file = { id: randomUUID(), athleteId, logId, filename: `${p.date}-${sport}.fit`, format: "fit", sizeBytes: bytes.length, startTime: start, summary: { ...summary, warnings: [], trimpMethod: trimp ? "banister" : null }, data: Buffer.from(bytes), uploadedBy: athleteId };
      }
      if (!file && bikeZones) measured = bikeAverages(1 + (past.indexOf(p) % 3), true);
      await tx.insert(schema.sessionLog).values({ id: logId, athleteId, plannedSessionId: p.id, date: p.date, sport: p.sport, title: p.title, status: partial ? "partial" : "done", durationMin, rpe, notes: partial ? "Cut short: heavy legs." : "", loggedBy: athleteId, ...measured });
      if (file) await tx.insert(schema.activityFile).values(file);
    }
    // Nine earlier weeks (weeks 3 to 11 back): four sessions a week, for the load chart and the acute:chronic ratio.
    const monday = mondayOfToday();
    for (let w = 11; w >= 3; w--) {
      for (const [d, minutes, rpe] of [[1, 60, 6], [2, 45, 3], [3, 60, 5], [5, 100, 4]] as const) {
        const date = plusDays(monday, -7 * w + d);
        const extra = bikeAverages(d, w <= 4);
        await tx.insert(schema.sessionLog).values({ id: randomUUID(), athleteId, date, sport: person.profile!.sports?.[0] ?? "running", title: "Logged session", status: "done", durationMin: Math.round(minutes * (0.9 + random() * 0.2)), rpe, loggedBy: athleteId, ...extra });
      }
    }
  }
}
