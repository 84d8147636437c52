/**
 * The demo's data: the invented coaching practice "Northfold Endurance". Every name and number here is invented for the
 * demo. Written to the database by scripts/seed-demo.ts through the features' server functions.
 */
import type { TalkTestInput } from "../features/field-tests/lib/talk-test";
import type { RampOptions } from "../features/gas-exchange/lib/synthetic-ramp";
import type { Block } from "../features/planning/lib/session";
import type { Sport } from "../features/platform/lib/sports";
import type { ProfileInput } from "../features/athletes/schemas";

export const DEMO_PASSWORD = "northfold-demo";

export type Role = "head_coach" | "coach" | "athlete";
type Profile = Partial<ProfileInput> & { sports: Sport[]; bodyMassKg: number; timeZone: string };

export type DemoTest =
  | { kind: "gas"; daysAgo: number; sport: Sport; protocol: string; ramp: RampOptions }
  | { kind: "talk"; daysAgo: number; sport: Sport; protocol: string; talk: TalkTestInput };

export interface DemoPerson {
  email: string;
  name: string;
  role: Role;
  profile?: Profile;
  tests?: DemoTest[];
}

const talkStages = (
  start: number,
  step: number,
  hr0: number,
  hrStep: number,
  firstUneasy: number,
  firstSilent: number,
  unit: "km/h" | "W",
): TalkTestInput => ({
  workloadUnit: unit,
  stages: Array.from({ length: firstSilent + 1 }, (_, i) => ({
    workload: Math.round((start + i * step) * 10) / 10,
    durationS: 180,
    hrBpm: hr0 + i * hrStep,
    speech:
      i >= firstSilent
        ? ("cannot_speak" as const)
        : i >= firstUneasy
          ? ("not_fully_comfortable" as const)
          : ("comfortable" as const),
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
    profile: {
      birthYear: 1991,
      sex: "female",
      bodyMassKg: 56,
      restingHrBpm: 48,
      maxHrBpm: 188,
      sports: ["running"],
      timeZone: "Europe/Oslo",
      reminderTiming: "evening_before",
      reminderTime: "19:30",
    },
    tests: [
      {
        kind: "talk",
        daysAgo: 190,
        sport: "running",
        protocol: "treadmill talk test, +1 km/h every 3 min",
        talk: talkStages(9, 1, 128, 8, 3, 6, "km/h"),
      },
      {
        kind: "talk",
        daysAgo: 82,
        sport: "running",
        protocol: "treadmill talk test, +1 km/h every 3 min",
        talk: talkStages(9, 1, 126, 8, 4, 7, "km/h"),
      },
    ],
  },
  {
    email: "cyclist@northfold.test",
    name: "Jonas Okafor",
    role: "athlete",
    profile: {
      birthYear: 1986,
      sex: "male",
      bodyMassKg: 74,
      restingHrBpm: 46,
      maxHrBpm: 184,
      sports: ["cycling"],
      timeZone: "Europe/Berlin",
      reminderTiming: "morning_of",
      reminderTime: "06:30",
    },
    tests: [
      {
        kind: "gas",
        daysAgo: 80,
        sport: "cycling",
        protocol: "cycle ergometer ramp, 25 W/min after 3 min at 50 W",
        ramp: { seed: 11, massKg: 74, peakW: 390, hrRest: 88, hrMax: 184 },
      },
    ],
  },
  {
    email: "triathlete@northfold.test",
    name: "Saga Brenner",
    role: "athlete",
    profile: {
      birthYear: 1995,
      sex: "female",
      bodyMassKg: 61,
      restingHrBpm: 50,
      maxHrBpm: 192,
      sports: ["triathlon", "running", "cycling", "swimming"],
      timeZone: "Europe/Stockholm",
      reminderTiming: "evening_before",
      reminderTime: "20:00",
    },
    tests: [
      {
        kind: "gas",
        daysAgo: 60,
        sport: "cycling",
        protocol: "cycle ergometer ramp, 20 W/min after 3 min at 50 W",
        ramp: { seed: 23, massKg: 61, peakW: 300, rampWPerMin: 20, hrRest: 90, hrMax: 192 },
      },
      {
        kind: "talk",
        daysAgo: 55,
        sport: "running",
        protocol: "track talk test, +0.5 km/h every 3 min",
        talk: talkStages(9, 0.5, 132, 6, 5, 9, "km/h"),
      },
    ],
  },
  {
    email: "rower@northfold.test",
    name: "Priya Castell",
    role: "athlete",
    profile: {
      birthYear: 1999,
      sex: "female",
      bodyMassKg: 70,
      restingHrBpm: 52,
      maxHrBpm: 196,
      sports: ["rowing"],
      timeZone: "Europe/London",
      reminderTiming: "morning_of",
      reminderTime: "05:45",
    },
    tests: [
      {
        kind: "gas",
        daysAgo: 40,
        sport: "rowing",
        protocol: "rowing ergometer ramp, 30 W/min after 3 min at 60 W",
        ramp: { seed: 37, massKg: 70, warmupW: 60, peakW: 330, rampWPerMin: 30, hrRest: 92, hrMax: 196 },
      },
    ],
  },
  {
    email: "walker@northfold.test",
    name: "Edwin Marsh",
    role: "athlete",
    profile: {
      birthYear: 1962,
      sex: "male",
      bodyMassKg: 86,
      restingHrBpm: 64,
      maxHrBpm: 160,
      sports: ["walking"],
      timeZone: "Europe/Dublin",
      reminderTiming: "evening_before",
      reminderTime: "18:00",
    },
    tests: [
      {
        kind: "talk",
        daysAgo: 30,
        sport: "walking",
        protocol: "treadmill walking talk test, +0.5 km/h every 3 min",
        talk: talkStages(4, 0.5, 92, 7, 4, 7, "km/h"),
      },
    ],
  },
  {
    email: "skier@northfold.test",
    name: "Lotte Aune",
    role: "athlete",
    profile: {
      birthYear: 1993,
      sex: "female",
      bodyMassKg: 63,
      restingHrBpm: 44,
      maxHrBpm: 190,
      sports: ["cross_country_skiing", "running"],
      timeZone: "Europe/Oslo",
      reminderTiming: "evening_before",
      reminderTime: "19:00",
    },
    tests: [
      {
        kind: "talk",
        daysAgo: 79,
        sport: "running",
        protocol: "uphill treadmill talk test, 8 %, +0.5 km/h every 3 min",
        talk: talkStages(7, 0.5, 124, 7, 5, 8, "km/h"),
      },
    ],
  },
];

export const DEMO_SQUAD_NAME = "Northfold Endurance";

export { step as st, repeat as rep } from "../features/planning/lib/starter-templates";
import { step as st, repeat as rep } from "../features/planning/lib/starter-templates";

export const DEMO_TEMPLATES: { key: string; name: string; sport: Sport; description: string; structure: Block[] }[] = [
  {
    key: "run-easy",
    name: "Easy run 45 min",
    sport: "running",
    description: "Conversational pace throughout.",
    structure: [st("work", 45, 1)],
  },
  {
    key: "run-long",
    name: "Long run 90 min",
    sport: "running",
    description: "Steady, relaxed; fuel after 60 min.",
    structure: [st("work", 90, 1)],
  },
  {
    key: "run-hills",
    name: "Hill repeats 5 × 4 min",
    sport: "running",
    description: "Hard uphill, walk or jog down.",
    structure: [st("warmup", 15, 1), rep(5, st("work", 4, 3), st("recovery", 3, 1)), st("cooldown", 10, 1)],
  },
  {
    key: "run-tempo",
    name: "Tempo 3 × 10 min",
    sport: "running",
    description: "Comfortably hard, between the thresholds.",
    structure: [st("warmup", 15, 1), rep(3, st("work", 10, 2), st("recovery", 3, 1)), st("cooldown", 10, 1)],
  },
  {
    key: "run-recovery",
    name: "Recovery jog 30 min",
    sport: "running",
    description: "Very easy.",
    structure: [st("work", 30, 1)],
  },
  {
    key: "bike-endurance",
    name: "Endurance ride 2 h",
    sport: "cycling",
    description: "Low zone, steady cadence.",
    structure: [st("work", 120, 1)],
  },
  {
    key: "bike-threshold",
    name: "4 × 8 min above VT2",
    sport: "cycling",
    description: "Hard intervals with easy spinning between.",
    structure: [st("warmup", 20, 1), rep(4, st("work", 8, 3), st("recovery", 4, 1)), st("cooldown", 15, 1)],
  },
  {
    key: "bike-tempo",
    name: "Tempo 2 × 20 min",
    sport: "cycling",
    description: "Between VT1 and VT2.",
    structure: [st("warmup", 15, 1), rep(2, st("work", 20, 2), st("recovery", 5, 1)), st("cooldown", 10, 1)],
  },
  {
    key: "bike-spin",
    name: "Recovery spin 45 min",
    sport: "cycling",
    description: "Easy gears only.",
    structure: [st("work", 45, 1)],
  },
  {
    key: "row-steady",
    name: "Steady state 60 min",
    sport: "rowing",
    description: "Low rate, long strokes.",
    structure: [st("work", 60, 1)],
  },
  {
    key: "row-pieces",
    name: "6 × 2 min pieces",
    sport: "rowing",
    description: "Race-pace pieces.",
    structure: [st("warmup", 15, 1), rep(6, st("work", 2, 3), st("recovery", 3, 1)), st("cooldown", 10, 1)],
  },
  {
    key: "swim-technique",
    name: "Swim technique 45 min",
    sport: "swimming",
    description: "Drills and easy aerobic lengths.",
    structure: [st("work", 45, 1)],
  },
  {
    key: "tri-brick",
    name: "Brick: ride then run",
    sport: "triathlon",
    description: "Ride easy, run the last 20 min a little faster.",
    structure: [st("work", 60, 1), st("work", 20, 2)],
  },
  {
    key: "walk-brisk",
    name: "Brisk walk 40 min",
    sport: "walking",
    description: "Walk with purpose, able to talk.",
    structure: [st("work", 40, 1)],
  },
  {
    key: "walk-hills",
    name: "Hill walk 6 × 3 min",
    sport: "walking",
    description: "Uphill efforts, easy down.",
    structure: [st("warmup", 10, 1), rep(6, st("work", 3, 2), st("recovery", 2, 1)), st("cooldown", 10, 1)],
  },
  {
    key: "ski-classic",
    name: "Classic ski 75 min",
    sport: "cross_country_skiing",
    description: "Easy terrain, long glides.",
    structure: [st("work", 75, 1)],
  },
  {
    key: "ski-uphill",
    name: "Uphill intervals 5 × 5 min",
    sport: "cross_country_skiing",
    description: "Hard climbs, easy back down.",
    structure: [st("warmup", 20, 1), rep(5, st("work", 5, 3), st("recovery", 3, 1)), st("cooldown", 15, 1)],
  },
];

/** The demo week pattern per sport: template keys by weekday (Monday first; null = rest). */
export const WEEK_PATTERN: Record<string, (string | null)[]> = {
  "runner@northfold.test": [null, "run-hills", "run-easy", "run-tempo", "run-recovery", "run-long", null],
  "cyclist@northfold.test": [null, "bike-threshold", "bike-spin", "bike-tempo", null, "bike-endurance", "bike-spin"],
  "triathlete@northfold.test": [
    "swim-technique",
    "run-hills",
    "bike-endurance",
    "swim-technique",
    null,
    "tri-brick",
    "run-easy",
  ],
  "rower@northfold.test": [null, "row-pieces", "row-steady", "row-steady", null, "row-steady", null],
  "walker@northfold.test": [null, "walk-brisk", null, "walk-hills", null, "walk-brisk", null],
  "skier@northfold.test": [null, "ski-uphill", "run-easy", "ski-classic", null, "ski-classic", "run-recovery"],
};

export const SEASON_SPORT: Record<string, Sport> = {
  "runner@northfold.test": "running",
  "cyclist@northfold.test": "cycling",
  "triathlete@northfold.test": "triathlon",
  "rower@northfold.test": "rowing",
  "walker@northfold.test": "walking",
  "skier@northfold.test": "cross_country_skiing",
};

export const FIT_SPORT: Record<
  string,
  "running" | "cycling" | "crossCountrySkiing" | "rowing" | "swimming" | "walking"
> = {
  running: "running",
  cycling: "cycling",
  rowing: "rowing",
  walking: "walking",
  swimming: "swimming",
  cross_country_skiing: "crossCountrySkiing",
  triathlon: "cycling",
};
