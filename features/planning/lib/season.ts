/**
 * Periodisation: from a start date, event dates and weekly hours, the season's weeks with their block, loading or unloading
 * role, volume target, intensity budget and retests.
 * - Loading pattern 3:1 by default (or 2:1): loading weeks rise 5 % each, never more than the ramp cap over the biggest of
 *   the last four weeks; unloading weeks at 65 % of the week before (common practice).
 * - Taper before an A event: 8–14 days of reduced volume before the race, a 41–60 % reduction (Bosquet et al. 2007, Med
 *   Sci Sports Exerc 39:1358–1365): one taper week (55 % of the last loading week) before a race week whose race falls
 *   on Tuesday to Sunday, two (75 %, then 55 %) before a Monday race; the race week at 45 %.
 * - Blocks before the first taper: general preparation ≈ 55 %, specific ≈ 30 %, pre-competition ≈ 15 % of the weeks,
 *   in macrocycles of at most 26 weeks; loading volume peaks in general preparation and eases by 10 % in specific
 *   preparation and 20 % in pre-competition (BLOCK_VOLUME); the event week is competition; two transition weeks after
 *   the last event.
 * - Retests every 12 weeks by default (12–16), each placed in an unloading week at or before the due week.
 */
import { BUDGET_PRESETS, DEFAULT_RAMP_CAP, type BudgetPreset } from "./budget";
import { DateError, dayOf, isoOfDay, mondayOf } from "@/features/platform/lib/days";

export type BlockName =
  "general_preparation" | "specific_preparation" | "pre_competition" | "taper" | "competition" | "transition";

export const BLOCK_LABELS: Record<BlockName, string> = {
  general_preparation: "General preparation",
  specific_preparation: "Specific preparation",
  pre_competition: "Pre-competition",
  taper: "Taper",
  competition: "Competition",
  transition: "Transition",
};

/** The same, short enough for one week of the season ribbon (the ribbon's legend pairs each with its full name). */
export const BLOCK_SHORT: Record<BlockName, string> = {
  general_preparation: "Gen",
  specific_preparation: "Spec",
  pre_competition: "Pre",
  taper: "Taper",
  competition: "Comp",
  transition: "Trans",
};

/**
 * How much a season bends to an event (common practice of periodised plans; the taper lengths follow the taper
 * meta-analyses of Mujika & Padilla 2003 and Bosquet et al. 2007 for A events):
 * - A: the goal: a full taper (two weeks when there is room for eight weeks of preparation, else one) and a recovery week
 *   after it;
 * - B: a short taper inside the event week (its volume reduced) and an easier week after it;
 * - C: trained through: the week keeps its role; the race is a hard session of that week.
 */
export type EventPriority = "A" | "B" | "C";

/** The longest macrocycle (weeks of preparation from general preparation to pre-competition); a longer run-up to an event
 * gets several (common practice: two cycles a year in a long season). */
export const MAX_MACROCYCLE_WEEKS = 26;

/**
 * Loading volume of the later blocks of a macrocycle as a share of its highest week (our numbers for the traditional
 * model of Bompa & Haff 2009, Periodization: Theory and Methodology of Training, 5th ed.: volume peaks in general
 * preparation and falls as intensity rises toward competition).
 */
export const BLOCK_VOLUME: Partial<Record<BlockName, number>> = { specific_preparation: 0.9, pre_competition: 0.8 };

export interface SeasonInput {
  startDate: string;
  /** The season's events; the priority says how much the season bends to each (default A); the expected race length
   * (minutes) scales the recovery after it. */
  events: { date: string; name: string; priority?: EventPriority; durationMin?: number }[];
  weeklyHours: number;
  level?: "trained" | "beginner";
  loadingWeeks?: 2 | 3;
  rampCap?: number;
  retestEveryWeeks?: number;
}

export interface SeasonWeek {
  index: number;
  /** Monday of the week, YYYY-MM-DD. */
  weekStart: string;
  block: BlockName;
  role: "loading" | "unloading" | "taper" | "event" | "recovery";
  volumeHours: number;
  budget: BudgetPreset;
  retest: boolean;
  /** Where the retest went and why, when this week has one. */
  retestNote?: string;
  events: string[];
}

export class SeasonError extends Error {}

const DAY_MS = 86_400_000;

export function parseDate(iso: string): number {
  try {
    return dayOf(iso) * DAY_MS;
  } catch (e) {
    if (e instanceof DateError) throw new SeasonError(e.message);
    throw e;
  }
}

export function formatDate(t: number): string {
  return isoOfDay(Math.floor(t / DAY_MS));
}

/** The Monday of a date's week, with a SeasonError for a date that is not one (the season form's own message). */
function weekMonday(iso: string): string {
  parseDate(iso);
  return mondayOf(iso);
}

/**
 * Days of recovery after a race (common practice, our rule of thumb: about three days per hour raced after an A race,
 * two after a B race, at least three and two days, at most three and two weeks; a C race is trained through). Without a
 * race length: a recovery week after an A race, an unloading week after a B race.
 */
export function recoveryDays(priority: EventPriority, durationMin: number | undefined): number {
  if (priority === "C") return 0;
  if (durationMin === undefined) return priority === "A" ? 7 : 3;
  const perHour = priority === "A" ? 3 : 2;
  const [lo, hi] = priority === "A" ? [3, 21] : [2, 14];
  return Math.max(lo, Math.min(hi, Math.round((perHour * durationMin) / 60)));
}

/**
 * The weeks after a race week that its recovery takes: the race week's own days after the race count first; a later week
 * holding four or more recovery days is a recovery week, fewer an unloading week. Without a race length: one recovery
 * week after an A race, one unloading week after a B race (as before race lengths were asked for).
 */
export function recoveryWeeksAfter(
  priority: EventPriority,
  durationMin: number | undefined,
  raceDay: number,
): SeasonWeek["role"][] {
  if (priority === "C") return [];
  if (durationMin === undefined) return [priority === "A" ? "recovery" : "unloading"];
  let left = recoveryDays(priority, durationMin) - (6 - raceDay);
  const out: SeasonWeek["role"][] = [];
  while (left > 0) {
    out.push(left >= 4 ? "recovery" : "unloading");
    left -= 7;
  }
  return out;
}

export function planSeason(input: SeasonInput): SeasonWeek[] {
  const cap = input.rampCap ?? DEFAULT_RAMP_CAP;
  const every = input.retestEveryWeeks ?? 12;
  if (every < 12 || every > 16) throw new SeasonError("Retests come every 12 to 16 weeks.");
  if (!(input.weeklyHours > 0 && input.weeklyHours <= 40))
    throw new SeasonError("Weekly hours must be between 0 and 40.");
  if (!input.events.length) throw new SeasonError("Give at least one event date.");
  const start = parseDate(weekMonday(input.startDate));
  const events = [...input.events].sort((a, b) => a.date.localeCompare(b.date));
  const eventWeek = (d: string) => Math.floor((parseDate(weekMonday(d)) - start) / (7 * DAY_MS));
  const eventWeeks = events.map((e) => eventWeek(e.date));
  if (eventWeeks[0]! < 3) throw new SeasonError("The first event must be at least three weeks after the start.");
  if (eventWeeks[eventWeeks.length - 1]! > 104) throw new SeasonError("A season spans at most two years.");
  // Two transition weeks after the last event, or its recovery when that is longer.
  const lastEvent = events[events.length - 1]!;
  const lastRecovery = recoveryWeeksAfter(
    lastEvent.priority ?? "A",
    lastEvent.durationMin,
    (dayOf(lastEvent.date) - dayOf(weekMonday(lastEvent.date))) % 7,
  ).length;
  const total = eventWeeks[eventWeeks.length - 1]! + 1 + Math.max(2, lastRecovery);
  const trained = (input.level ?? "trained") === "trained";
  const loadingWeeks = input.loadingWeeks ?? 3;

  const block: BlockName[] = new Array(total);
  const role: SeasonWeek["role"][] = new Array(total);
  /** The priority of the event each event week holds (B events taper inside their week). */
  const eventPriority: (EventPriority | undefined)[] = new Array(total);
  /** The recovery weeks after each event week. */
  const recoveryAfter: SeasonWeek["role"][][] = new Array(total);
  let previousEvent = -1;
  let previousPriority: EventPriority | null = null;
  let firstMain = true;
  for (let e = 0; e < eventWeeks.length; e++) {
    const ev = eventWeeks[e]!;
    const priority = events[e]!.priority ?? "A";
    if (ev === previousEvent) {
      // Two events in one week: the week is the higher-priority one's (already placed, or placed now).
      if (priority === "A" && previousPriority !== "A") role[ev] = "event";
      continue;
    }
    // After an A or B event: its recovery weeks (recoveryWeeksAfter), as far as the next event leaves room.
    let prepStart = previousEvent + 1;
    if (previousEvent >= 0 && previousPriority !== "C")
      for (const r of recoveryAfter[previousEvent] ?? []) {
        if (prepStart >= ev) break;
        block[prepStart] = "transition";
        role[prepStart] = r;
        prepStart++;
      }
    if (priority === "C") {
      // Trained through: the week is an ordinary week of its block; the race is one of its sessions.
      previousEvent = ev;
      previousPriority = "C";
      for (let w = prepStart; w <= ev; w++)
        if (!block[w]) block[w] = firstMain ? "general_preparation" : "specific_preparation";
      continue;
    }
    const room = ev - prepStart;
    // An A race's taper: 8–14 days of reduced volume before it (Bosquet et al. 2007). The event week's own days before
    // the race count, so a race from Tuesday to Sunday tapers one week before its week, a Monday race two.
    const raceDay = (dayOf(events[e]!.date) - dayOf(weekMonday(events[e]!.date))) % 7;
    const taperWanted = raceDay >= 1 ? 1 : 2;
    const taper = priority === "A" ? (room >= 4 + taperWanted ? taperWanted : room >= 3 ? 1 : 0) : 0;
    const prepEnd = ev - taper; // exclusive
    const prep = prepEnd - prepStart;
    // A long run-up is split into macrocycles of at most MAX_MACROCYCLE_WEEKS, each from general preparation to
    // pre-competition (Bompa & Haff 2009: two or more cycles a year when the preparation is long).
    const cycles = Math.max(1, Math.ceil(prep / MAX_MACROCYCLE_WEEKS));
    for (let w = prepStart; w < prepEnd; w++) {
      if (block[w]) continue; // a C event's week already placed
      const c = Math.min(cycles - 1, Math.floor(((w - prepStart) * cycles) / Math.max(1, prep)));
      const cStart = prepStart + Math.round((c * prep) / cycles),
        cEnd = prepStart + Math.round(((c + 1) * prep) / cycles);
      const f = (w - cStart) / Math.max(1, cEnd - cStart);
      if (firstMain || c > 0 || prep >= MAX_MACROCYCLE_WEEKS / 2)
        block[w] = f < 0.55 ? "general_preparation" : f < 0.85 ? "specific_preparation" : "pre_competition";
      else block[w] = f < 0.7 ? "specific_preparation" : "pre_competition";
    }
    for (let w = prepEnd; w < ev; w++) {
      block[w] = "taper";
      role[w] = "taper";
    }
    block[ev] = "competition";
    role[ev] = "event";
    eventPriority[ev] = priority;
    recoveryAfter[ev] = recoveryWeeksAfter(priority, events[e]!.durationMin, raceDay);
    previousEvent = ev;
    previousPriority = priority;
    firstMain = false;
  }
  // After the last event: its recovery, then transition weeks at recovery volume to the season's end.
  const after = recoveryAfter[previousEvent] ?? [];
  for (let w = previousEvent + 1; w < total; w++) {
    block[w] = "transition";
    role[w] = after[w - previousEvent - 1] ?? "recovery";
  }
  // Loading cycles within the preparation weeks (reset at each block change after competition).
  let cyclePos = 0;
  for (let w = 0; w < total; w++) {
    if (role[w]) {
      cyclePos = 0;
      continue;
    }
    role[w] = cyclePos < loadingWeeks ? "loading" : "unloading";
    cyclePos = (cyclePos + 1) % (loadingWeeks + 1);
  }

  const base = input.weeklyHours;
  const ceiling = base * 1.3;
  const volumes: number[] = [];
  let lastLoading = base / 1.05;
  // The highest loading volume of the current macrocycle: specific preparation and pre-competition ease from it as the
  // intensity rises (BLOCK_VOLUME; Bompa & Haff 2009's traditional model).
  let cyclePeak = 0;
  for (let w = 0; w < total; w++) {
    const recent = volumes.slice(-4);
    const reference = recent.length ? Math.max(...recent) : base;
    if (block[w] === "general_preparation" && w > 0 && block[w - 1] !== "general_preparation") cyclePeak = 0;
    let v: number;
    switch (role[w]) {
      case "loading": {
        const grown = Math.min(lastLoading * 1.05, ceiling, reference * (1 + cap));
        const easing = BLOCK_VOLUME[block[w]!];
        v = easing !== undefined && cyclePeak > 0 ? Math.min(grown, cyclePeak * easing) : grown;
        cyclePeak = Math.max(cyclePeak, v);
        lastLoading = v;
        break;
      }
      case "unloading":
        v = lastLoading * 0.65;
        break;
      case "taper": {
        const nextIsTaper = role[w + 1] === "taper";
        v = lastLoading * (nextIsTaper ? 0.75 : 0.55);
        break;
      }
      case "event":
        // A: the race week after a full taper; B: a short taper inside the week (common practice).
        v = lastLoading * (eventPriority[w] === "B" ? 0.7 : 0.45);
        break;
      default:
        v = lastLoading * 0.4;
    }
    volumes.push(Math.round(v * 4) / 4);
  }

  const budgetFor = (b: BlockName): BudgetPreset => {
    if (b === "transition") return "recovery";
    if (b === "general_preparation") return trained ? "pyramidal" : "beginner";
    return trained ? "polarised" : "pyramidal";
  };

  // Retests: due every `every` weeks from the start, never in a taper, race or recovery week (a test there would cost the
  // event or measure a tired athlete). The nearest unloading week within four weeks of the due week (earlier first) is
  // best (rested, common practice); otherwise the nearest loading week; never sooner than 8 weeks after the previous one.
  // Each placed retest says where it went and why.
  const retest = new Array<boolean>(total).fill(false);
  const retestNote = new Array<string | null>(total).fill(null);
  let last = 0;
  for (let due = every; due < total; due = last + every) {
    const window: number[] = [];
    for (let d = 0; d <= 4; d++)
      for (const w of d === 0 ? [due] : [due - d, due + d]) if (w >= Math.max(last + 8, 1) && w < total) window.push(w);
    const placed = window.find((w) => role[w] === "unloading") ?? window.find((w) => role[w] === "loading") ?? -1;
    if (placed === -1) {
      // Nothing suitable near the due week (a block of races and tapers): the next cycle starts from the due week.
      last = due;
      continue;
    }
    retest[placed] = true;
    const dueOn = formatDate(start + due * 7 * DAY_MS);
    retestNote[placed] =
      placed === due
        ? `Retest due this week (${role[placed]} week).`
        : `Retest due the week of ${dueOn}; placed here, ${placed < due ? "earlier" : "later"}, in ${role[placed] === "unloading" ? "an unloading" : "a loading"} week${role[due] === "taper" || role[due] === "event" || role[due] === "recovery" ? `, because the due week is a ${role[due] === "event" ? "race" : role[due]} week` : ""}.`;
    last = placed;
  }

  return Array.from({ length: total }, (_, w) => ({
    index: w,
    weekStart: formatDate(start + w * 7 * DAY_MS),
    block: block[w]!,
    role: role[w]!,
    volumeHours: volumes[w]!,
    budget: budgetFor(block[w]!),
    retest: retest[w]!,
    ...(retestNote[w] ? { retestNote: retestNote[w]! } : {}),
    events: events.filter((_, i) => eventWeeks[i] === w).map((e) => e.name),
  }));
}

export { BUDGET_PRESETS };
