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
import * as schema from "./schema";

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
        if (person.profile) await tx.insert(schema.athleteProfile).values({ userId, ...person.profile });
        people.set(person.email, userId);
      }
      const coachId = people.get("coach@northfold.test")!;
      for (const person of DEMO_PEOPLE) {
        for (const t of person.tests ?? []) await insertDemoTest(tx, people.get(person.email)!, coachId, person.profile?.bodyMassKg ?? null, t);
      }
      await insertDemoPlans(tx, squadId, coachId, people);
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
