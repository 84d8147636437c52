/**
 * Weekly summaries for the calendar's budget band: planned (and later done) minutes per zone per ISO week, checked against
 * the week's intensity budget, with the reasons and a concrete fix when the week is over budget.
 */
import { DEFAULT_PLANNING_RULES, type PlanningRules } from "./rules";
import {
  BUDGET_PRESETS,
  checkWeek,
  isHardDay,
  type Breach,
  type Budget,
  type BudgetPreset,
  type Shares,
} from "./budget";
import { addDays, dayNumber, mondayOf } from "@/features/platform/lib/days";
// Types only: the steps' schemas (zod) stay out of the planner's client bundle, which runs this engine for the drag preview.
import type { Block } from "./session";

export interface WeekSession {
  id: string;
  date: string;
  title: string;
  kind: string;
  minutesByZone: Shares;
  /** The session's sport and length: a swap keeps the sport and a similar length. */
  sport?: string;
  totalS?: number;
  /** Its steps, when the fix search may shorten its hard repeats. */
  structure?: Block[];
}

/** A template a fix may swap a hard session for (the coach's own library). */
export interface FixTemplate {
  id: string;
  name: string;
  sport: string;
  totalS: number;
  minutesByZone: Shares;
}

export interface SeasonWeekInfo {
  weekStart: string;
  budget: BudgetPreset;
  block: string;
  retest: boolean;
  /** The week's role in the season and its volume target (a season's weeks carry them; a preview may not). */
  role?: WeekRole;
  volumeHours?: number;
}

export type WeekRole = "loading" | "unloading" | "taper" | "event" | "recovery";

/**
 * How a week is judged depends on its role. A taper keeps its intensity and cuts volume (Mujika & Padilla 2003; Bosquet
 * et al. 2007), and a race week holds the race itself, so neither is judged on zone shares: both are judged on volume
 * against the season's target for the week. An unloading or recovery week is judged on its reduced volume too, as well as
 * on its (easy) budget. Every week with a target is flagged when its planned minutes stray more than the athlete's volume
 * tolerance from it (PlanningRules, 15 % by default; common practice): above it in every role, below it in loading,
 * unloading and taper weeks (a race or recovery week that ends up lighter than planned does no harm).
 */
const UNDER_TARGET_ROLES = new Set<WeekRole>(["loading", "unloading", "taper"]);
/** A future week with less than this share of its target planned is still being filled: "in progress", not red. */
export const IN_PROGRESS_SHARE = 0.5;
const SHARE_CODES = new Set(["too_much_high", "too_little_low", "too_much_moderate"]);

/** A concrete change that makes a week keep its budget, checked against every rule before it is offered. */
export type Fix =
  | { action: "move"; sessionId: string; title: string; toDate: string; message: string }
  | { action: "swap"; sessionId: string; title: string; templateId: string; templateName: string; message: string }
  | { action: "add"; date: string; sport: string; minutes: number; title: string; message: string }
  | {
      action: "shorten";
      sessionId: string;
      title: string;
      fromTimes: number;
      toTimes: number;
      structure: Block[];
      message: string;
    };

export interface WeekSummary {
  weekStart: string;
  plannedMinByZone: Shares;
  doneMinByZone: Shares;
  /** The week's budget: its preset key (what the season stores), display name, zone shares and tolerance. */
  budget: {
    key: BudgetPreset;
    name: string;
    shares: Shares;
    tolerance: number;
    counting: "time" | "session";
    source: string;
  };
  /** The week's role in its season, when it has one; taper and event weeks are judged on volume, not zone shares. */
  role: WeekRole | null;
  /** The season's volume target for the week, in minutes, when it has one. */
  targetMin: number | null;
  /** A future week still being filled (less than half its target planned): shown as in progress, not over budget. */
  inProgress: boolean;
  overBudget: boolean;
  /** The engine's reasons, each with its numbers (e.g. the minutes of zone 3 to remove). */
  flags: Pick<Breach, "code" | "message" | "numbers">[];
  /** The best fix (the first of `fixes`). */
  fix: Fix | null;
  /** Up to two fixes of different kinds, best first: move a hard session, swap it for an easier template, add easy time. */
  fixes: Fix[];
  block: string | null;
  /** A week of the return after a break: which week back, of how many missed, and its volume limit. */
  rebuild: { week: number; of: number; referenceMin: number; limitMin: number } | null;
  /** The planning rules the week was judged by (a drag preview judges with the same). */
  rules: PlanningRules;
}

function minutesOf(sessions: WeekSession[]): Shares {
  const m: Shares = [0, 0, 0];
  for (const s of sessions) for (let z = 0; z < 3; z++) m[z]! += s.minutesByZone[z]!;
  return m;
}

/** The sessions of an ISO week, by its Monday. */
type WeekOf = (weekStart: string) => WeekSession[];

/** Groups sessions by ISO week once, so that each week's checks read only their own sessions. */
function indexByWeek(sessions: WeekSession[]): WeekOf {
  const index = new Map<string, WeekSession[]>();
  for (const s of sessions) {
    const w = mondayOf(s.date);
    const list = index.get(w);
    if (list) list.push(s);
    else index.set(w, [s]);
  }
  return (w) => index.get(w) ?? [];
}

/** Total minutes of the four weeks before a week, oldest first. */
const doneIndex = new WeakMap<object, Map<string, number>>();

/** Minutes done per ISO week (by Monday), from the logs given. */
function doneByWeek(input: SummariseInput): Map<string, number> {
  const done = input.done ?? [];
  let m = doneIndex.get(done);
  if (!m) {
    m = new Map();
    for (const d of done) {
      const w = mondayOf(d.date);
      // The time logged counts even when its zones are not known (a log without a recording or plan).
      m.set(w, (m.get(w) ?? 0) + (d.totalMin ?? d.minutesByZone[0] + d.minutesByZone[1] + d.minutesByZone[2]));
    }
    doneIndex.set(done, m);
  }
  return m;
}

/** Whether a week has ended and its logs are known: then what was done counts, not what was planned. */
function doneCounts(week: string, input: SummariseInput): boolean {
  return (
    input.done !== undefined &&
    input.doneFrom !== undefined &&
    week >= input.doneFrom &&
    addDays(week, 7) <= input.today
  );
}

/** A week's volume as the volume checks see it: done for weeks that have ended (logs known), planned otherwise. */
function weekVolume(week: string, weekOf: WeekOf, input: SummariseInput): number {
  if (doneCounts(week, input)) return doneByWeek(input).get(week) ?? 0;
  const m = minutesOf(weekOf(week));
  return m[0] + m[1] + m[2];
}

function previousTotals(weekStart: string, weekOf: WeekOf, input: SummariseInput): number[] {
  return [4, 3, 2, 1].map((k) => weekVolume(addDays(weekStart, -7 * k), weekOf, input));
}

/** A week missed (ill, injured, away): ended, and under a quarter of its plan done, or under 30 min with nothing planned.
 * Two or more in a row are a break (common practice; the thresholds are ours). */
const MISSED_SHARE = 0.25;
const MISSED_MIN = 30;

function isMissed(week: string, weekOf: WeekOf, input: SummariseInput): boolean {
  if (!doneCounts(week, input)) return false;
  const done = doneByWeek(input).get(week) ?? 0;
  const p = minutesOf(weekOf(week));
  const planned = p[0] + p[1] + p[2];
  return planned > 0 ? done < MISSED_SHARE * planned : done < MISSED_MIN;
}

/**
 * Return after a break (common practice: rebuild over about as many weeks as were missed): after m ≥ 2 missed weeks, the
 * j-th week back (j < m) stays under j / m (at least 30 %) of the biggest week done in the four weeks before the break.
 */
export function rebuildAfterBreak(
  weekStart: string,
  weekOf: WeekOf,
  input: SummariseInput,
): { week: number; of: number; referenceMin: number; limitMin: number } | null {
  if (!input.done || !input.doneFrom) return null;
  for (let j = 1; j <= 16; j++) {
    // Weeks between the break and this one (j − 1 of them) are the return so far; the week before them ends the break.
    let m = 0;
    while (m < 16 && isMissed(addDays(weekStart, -7 * (j + m)), weekOf, input)) m++;
    if (m === 0) continue;
    if (m < 2 || j >= m) return null;
    const before = [1, 2, 3, 4]
      .map((k) => addDays(weekStart, -7 * (j + m - 1 + k)))
      .filter((w) => doneCounts(w, input));
    const referenceMin = Math.max(0, ...before.map((w) => doneByWeek(input).get(w) ?? 0));
    if (referenceMin <= 0) return null;
    return {
      week: j,
      of: m,
      referenceMin: Math.round(referenceMin),
      limitMin: Math.floor(referenceMin * Math.max(0.3, j / m)),
    };
  }
  return null;
}

/** How far back the volume checks look (the ramp's four weeks and a break with its reference): loaders fetch plans and
 * logs from this many days before the first week they summarise, and pass that Monday as `doneFrom`. */
export const VOLUME_HISTORY_DAYS = 56;

/** Minutes per zone of each day of the week, Monday first. */
function daysOf(weekStart: string, sessions: WeekSession[]): Shares[] {
  const monday = dayNumber(weekStart);
  const days: Shares[] = [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
  for (const s of sessions) {
    const day = days[dayNumber(s.date) - monday];
    if (day) for (let z = 0; z < 3; z++) day[z]! += s.minutesByZone[z]!;
  }
  return days;
}

export interface SummariseInput {
  from: string;
  to: string;
  sessions: WeekSession[];
  seasonWeeks?: SeasonWeekInfo[];
  defaultBudget?: BudgetPreset;
  /** Dates of the athlete's tests, to tell whether a past retest was done. */
  testDates?: string[];
  /** The athlete's own day (YYYY-MM-DD): which weeks have begun, which retests are overdue, which dates a fix may use.
   * Required: the engine never reads a clock. */
  today: string;
  /** What was done (logged minutes per zone by day), shown beside the plan; it does not change the budget check. */
  done?: { date: string; minutesByZone: Shares; totalMin?: number }[];
  /** From this Monday on, `done` holds every log: weeks that have ended since count what was done in the volume checks. */
  doneFrom?: string;
  /** Propose a fix for over-budget weeks (default); the roster only needs the state. */
  withFix?: boolean;
  /** Templates a swap may use (the coach's library); without them no swap is proposed. */
  templates?: FixTemplate[];
  /** The sport of an added easy session when the week's sessions do not say (the athlete's first sport). */
  defaultSport?: string;
  /** The coach's planning rules for the athlete (hard days, volume tolerance); the defaults when absent. */
  rules?: PlanningRules;
}

const seasonWeekIndex = new WeakMap<SeasonWeekInfo[], Map<string, SeasonWeekInfo>>();

function weekBudget(
  weekStart: string,
  input: SummariseInput,
): {
  preset: BudgetPreset;
  budget: Budget;
  block: string | null;
  retest: boolean;
  role: WeekRole | null;
  volumeHours: number | null;
} {
  let byStart = input.seasonWeeks ? seasonWeekIndex.get(input.seasonWeeks) : undefined;
  if (input.seasonWeeks && !byStart) {
    byStart = new Map(input.seasonWeeks.map((w) => [w.weekStart, w]));
    seasonWeekIndex.set(input.seasonWeeks, byStart);
  }
  const sw = byStart?.get(weekStart);
  const preset = sw?.budget ?? input.defaultBudget ?? "polarised";
  return {
    preset,
    budget: BUDGET_PRESETS[preset],
    block: sw?.block ?? null,
    retest: sw?.retest ?? false,
    role: sw?.role ?? null,
    volumeHours: sw?.volumeHours ?? null,
  };
}

function check(
  weekStart: string,
  weekOf: WeekOf,
  input: SummariseInput,
  previousTotals: number[],
  retestOverdue: boolean,
) {
  const inWeek = weekOf(weekStart);
  const planned = minutesOf(inWeek);
  const { preset, budget, block, role, volumeHours } = weekBudget(weekStart, input);
  const rules = input.rules ?? DEFAULT_PLANNING_RULES;
  // A week that holds nothing but its retest is not planned yet: the test alone is no mix of training to judge (common
  // practice: the budget governs training; the test's minutes count once training is planned around it).
  const judged: Shares = inWeek.some((s) => s.kind !== "retest") ? planned : [0, 0, 0];
  // The hard-day rules (at most three, none back to back: budget.ts) look at each day's minutes.
  const checked = checkWeek({
    minutesByZone: judged,
    // A budget that counts sessions counts the training sessions (a retest is no session goal to judge).
    sessions: inWeek.filter((s) => s.kind !== "retest").map((s) => s.minutesByZone),
    days: daysOf(weekStart, inWeek),
    previousWeeksMinutes: previousTotals,
    budget,
    retestOverdue,
    hardDays: { max: rules.maxHardDays, backToBack: rules.hardDaysBackToBack },
  });
  const byRole = role ? judgeByRole(checked, role, judged, volumeHours, rules.volumeTolerancePct / 100) : checked;
  const rebuild = rebuildAfterBreak(weekStart, weekOf, input);
  const total = judged[0] + judged[1] + judged[2];
  const result =
    rebuild && total > rebuild.limitMin
      ? {
          ...byRole,
          ok: false,
          breaches: [
            ...byRole.breaches,
            {
              code: "return_after_break" as const,
              message: `Week ${rebuild.week} back after ${rebuild.of} weeks with little or no training: rebuild over about as many weeks as were missed. Keep this week under ${rebuild.limitMin} min (${Math.round((100 * rebuild.limitMin) / rebuild.referenceMin)} % of the ${rebuild.referenceMin} min before the break); ${Math.round(total)} min are planned.`,
              numbers: {
                week: rebuild.week,
                missedWeeks: rebuild.of,
                limitMin: rebuild.limitMin,
                referenceMin: rebuild.referenceMin,
                plannedMin: Math.round(total),
              },
            },
          ],
        }
      : byRole;
  return { inWeek, planned, preset, budget, block, role, volumeHours, result, rebuild };
}

/** Role rules (see UNDER_TARGET_ROLES): taper and event weeks drop the zone-share checks; every week with a volume target
 * is held to it within the tolerance. */
function judgeByRole(
  checked: ReturnType<typeof checkWeek>,
  role: WeekRole,
  minutes: Shares,
  volumeHours: number | null,
  tolerance: number,
): ReturnType<typeof checkWeek> {
  let breaches = checked.breaches;
  if (role === "taper" || role === "event") breaches = breaches.filter((b) => !SHARE_CODES.has(b.code));
  if (volumeHours === null || volumeHours <= 0) return { ...checked, breaches, ok: breaches.length === 0 };
  const total = minutes[0] + minutes[1] + minutes[2];
  const target = volumeHours * 60;
  const hours = (m: number) => `${Math.round((m / 60) * 100) / 100} h`;
  const tol = Math.round(tolerance * 100);
  const off = Math.round((100 * total) / target - 100);
  const high = target * (1 + tolerance),
    low = target * (1 - tolerance);
  if (total > high + 1e-9) {
    breaches = [
      ...breaches,
      role === "loading"
        ? {
            code: "volume_off_target",
            message: `This week plans ${hours(total)} against its target of ${hours(target)} (${off} % more; the limit is ${tol} % either way). Remove about ${Math.ceil(total - target)} min, easy minutes first, or raise the season's target.`,
            numbers: { plannedMin: Math.round(total), targetMin: Math.round(target), offPct: off, tolerancePct: tol },
          }
        : {
            code: "role_volume",
            message: `${
              role === "taper"
                ? "A taper keeps its intensity and cuts volume"
                : role === "event"
                  ? "A race week keeps the volume low around the race"
                  : "An easier week rests by its lower volume"
            }: this week plans ${hours(total)} against a target of ${hours(target)} (at most ${hours(high)}). Remove about ${Math.ceil(total - target)} min, easy minutes first.`,
            numbers: {
              plannedMin: Math.round(total),
              targetMin: Math.round(target),
              limitMin: Math.round(high),
              tolerancePct: tol,
            },
          },
    ];
  } else if (UNDER_TARGET_ROLES.has(role) && total > 0 && total < low - 1e-9) {
    // (A week with nothing planned is not a plan off its target: it is not planned yet.)
    breaches = [
      ...breaches,
      {
        code: "volume_off_target",
        message: `This week plans ${hours(total)} against its target of ${hours(target)} (${-off} % less; the limit is ${tol} % either way). Add about ${Math.ceil(target - total)} min of easy training, or lower the season's target for the week.`,
        numbers: { plannedMin: Math.round(total), targetMin: Math.round(target), offPct: off, tolerancePct: tol },
      },
    ];
  }
  return { ...checked, breaches, ok: breaches.length === 0 };
}

/** A retest week in the past without a test on or after its Monday is overdue. */
function isRetestOverdue(weekStart: string, input: SummariseInput): boolean {
  const today = input.today;
  const retestWeeks = (input.seasonWeeks ?? []).filter(
    (w) => w.retest && addDays(w.weekStart, 7) <= today && w.weekStart <= weekStart,
  );
  const last = retestWeeks.at(-1);
  if (!last) return false;
  return !(input.testDates ?? []).some((d) => d >= last.weekStart);
}

export function summariseWeeks(input: SummariseInput): WeekSummary[] {
  const first = mondayOf(input.from);
  const last = mondayOf(input.to);
  const out: WeekSummary[] = [];
  const weekOf = indexByWeek(input.sessions);
  for (let w = first; w <= last; w = addDays(w, 7)) {
    const next = addDays(w, 7);
    const previous = previousTotals(w, weekOf, input);
    const overdue = isRetestOverdue(w, input) && w <= input.today;
    const { inWeek, planned, preset, budget, block, role, volumeHours, result, rebuild } = check(
      w,
      weekOf,
      input,
      previous,
      overdue,
    );
    // A week not yet begun that falls short of its volume target is still being filled: the shortfall is shown, but
    // the week is not marked over budget for it until it begins.
    const budgetBreaches = result.breaches.filter(
      (b) => b.code !== "retest_overdue" && !(w > input.today && isShortfall(b)),
    );
    // A week not yet begun and planned to less than half its target is still being filled: in progress, not red.
    const plannedTotal = planned[0] + planned[1] + planned[2];
    const inProgress =
      volumeHours !== null && volumeHours > 0 && w > input.today && plannedTotal < IN_PROGRESS_SHARE * volumeHours * 60;
    out.push({
      weekStart: w,
      plannedMinByZone: planned.map((v) => Math.round(v * 10) / 10) as Shares,
      doneMinByZone: minutesOf(
        (input.done ?? [])
          .filter((d) => d.date >= w && d.date < next)
          .map((d) => ({ id: "", date: d.date, title: "", kind: "", minutesByZone: d.minutesByZone })),
      ).map((v) => Math.round(v * 10) / 10) as Shares,
      budget: {
        key: preset,
        name: budget.name,
        shares: [...budget.shares] as Shares,
        tolerance: budget.tolerance,
        counting: budget.counting,
        source: budget.source,
      },
      role,
      targetMin: volumeHours !== null ? Math.round(volumeHours * 60) : null,
      inProgress,
      overBudget: !inProgress && budgetBreaches.length > 0,
      flags: result.breaches.map((b) => ({ code: b.code, message: b.message, numbers: b.numbers })),
      ...(() => {
        const fixes =
          !inProgress &&
          input.withFix !== false &&
          budgetBreaches.some(
            (b) =>
              b.code !== "volume_ramp" &&
              b.code !== "role_volume" &&
              b.code !== "volume_off_target" &&
              b.code !== "return_after_break",
          )
            ? proposeFixes(w, inWeek, input, weekOf)
            : [];
        return { fix: fixes[0] ?? null, fixes };
      })(),
      block,
      rebuild,
      rules: input.rules ?? DEFAULT_PLANNING_RULES,
    });
  }
  return out;
}

/**
 * A one-click fix: move the session with the most zone 3 (or zone 2) minutes to the same weekday of a neighbouring week
 * where it fits the budget, preferring the next week.
 */
/** A hard session: meaningful zone 3 (10 min or more) or long zone 2 (30 min or more); short strides are not (common practice). */
export function isHardSession(s: Pick<WeekSession, "minutesByZone">): boolean {
  return isHardDay(s.minutesByZone);
}

function proposeMove(
  weekStart: string,
  inWeek: WeekSession[],
  input: SummariseInput,
  weekOf: WeekOf = indexByWeek(input.sessions),
): Extract<Fix, { action: "move" }> | null {
  // Never a retest or a race: those are placed on purpose.
  const candidates = inWeek
    .filter((s) => s.kind !== "retest" && s.kind !== "race" && s.kind !== "event")
    .sort((a, b) => b.minutesByZone[2] + b.minutesByZone[1] - (a.minutesByZone[2] + a.minutesByZone[1]));
  // The share and hard-day breaches are what a move can cure; a volume ramp needs shorter sessions instead.
  const curable = (b: Breach) =>
    b.code !== "retest_overdue" &&
    b.code !== "volume_ramp" &&
    b.code !== "role_volume" &&
    b.code !== "volume_off_target" &&
    b.code !== "return_after_break";
  const breachesOf = (week: string, of: WeekOf) =>
    check(week, of, input, previousTotals(week, of, input), false).result.breaches.filter(curable);
  // The week it lands in is checked against every rule, the volume ramp and its target included; a shortfall there only
  // shrinks with the minutes it gains.
  const everyBreachOf = (week: string, of: WeekOf) =>
    check(week, of, input, previousTotals(week, of, input), false).result.breaches.filter(
      (b) => b.code !== "retest_overdue" && !isShortfall(b),
    );
  const shortHere = fallsShort(weekStart, input, weekOf);
  const sessionsOn = (of: WeekOf, date: string) => of(mondayOf(date)).filter((x) => x.date === date);
  for (const s of candidates) {
    if (s.minutesByZone[2] + s.minutesByZone[1] === 0) break;
    // The week without this session: the checks that count here (shares, hard days) do not look at other weeks, so
    // whether it then keeps its budget does not depend on where the session goes.
    const without: WeekOf = (w) => (w === weekStart ? weekOf(w).filter((x) => x.id !== s.id) : weekOf(w));
    if (breachesOf(weekStart, without).length > 0) continue;
    // Nor may the week it leaves fall short of its volume target because of the move.
    if (!shortHere && fallsShort(weekStart, input, without)) continue;
    for (const shift of [7, -7, 14]) {
      const toDate = addDays(s.date, shift);
      if (toDate < input.today) continue;
      const targetWeek = mondayOf(toDate);
      // Never into a taper, race, unloading or recovery week, nor a week with a retest.
      const target = weekBudget(targetWeek, input);
      if (
        (target.role && target.role !== "loading") ||
        target.retest ||
        weekOf(targetWeek).some((x) => x.kind === "retest")
      )
        continue;
      // Never back to back with another hard session (nor onto a day that has one).
      if (isHardSession(s) && [-1, 0, 1].some((d) => sessionsOn(without, addDays(toDate, d)).some(isHardSession)))
        continue;
      // The plan with this one session moved: only its old and new weeks differ.
      const moved: WeekOf = (w) => (w === targetWeek ? [...without(w), { ...s, date: toDate }] : without(w));
      if (everyBreachOf(targetWeek, moved).length === 0) {
        return {
          action: "move",
          sessionId: s.id,
          title: s.title,
          toDate,
          message: `Move "${s.title}" to ${toDate}: both weeks then keep their budget.`,
        };
      }
    }
  }
  return null;
}

/** A week planned below its volume target (the tolerance's lower side). */
const isShortfall = (b: Pick<Breach, "code" | "numbers">) =>
  b.code === "volume_off_target" && (b.numbers.offPct ?? 0) < 0;

/** Whether a week, as planned now, falls short of its volume target. */
function fallsShort(week: string, input: SummariseInput, of: WeekOf) {
  return check(week, of, input, previousTotals(week, of, input), false).result.breaches.some(isShortfall);
}

/**
 * The checks a fix must pass in a week: every rule but an overdue retest (a fix does not place tests). A shortfall the
 * week already had before the change does not block it when the change does not deepen it (`shortBefore`).
 */
function breachesAfter(week: string, of: WeekOf, input: SummariseInput, shortBefore = false) {
  return check(week, of, input, previousTotals(week, of, input), false).result.breaches.filter(
    (b) => b.code !== "retest_overdue" && !(shortBefore && isShortfall(b)),
  );
}

const hardMinutes = (m: Shares) => m[1] + m[2];

/**
 * Swap a hard session for an easier template of the same sport and a similar length (within 25 %), the one nearest in
 * length that makes the week keep every rule. Never a retest or a race.
 */
function proposeSwap(
  weekStart: string,
  inWeek: WeekSession[],
  input: SummariseInput,
  weekOf: WeekOf,
): Extract<Fix, { action: "swap" }> | null {
  const templates = input.templates ?? [];
  if (!templates.length) return null;
  const candidates = inWeek
    .filter(
      (s) =>
        s.kind !== "retest" &&
        s.kind !== "race" &&
        s.kind !== "event" &&
        s.sport &&
        s.totalS &&
        hardMinutes(s.minutesByZone) > 0,
    )
    .sort((a, b) => hardMinutes(b.minutesByZone) - hardMinutes(a.minutesByZone));
  const shortBefore = fallsShort(weekStart, input, weekOf);
  for (const s of candidates) {
    const options = templates
      .filter(
        (t) =>
          t.sport === s.sport &&
          hardMinutes(t.minutesByZone) < hardMinutes(s.minutesByZone) &&
          Math.abs(t.totalS - s.totalS!) <= 0.25 * s.totalS!,
      )
      .sort((a, b) => Math.abs(a.totalS - s.totalS!) - Math.abs(b.totalS - s.totalS!));
    for (const t of options) {
      const swapped: WeekOf = (w) =>
        w === weekStart
          ? weekOf(w).map((x) => (x.id === s.id ? { ...x, minutesByZone: t.minutesByZone, totalS: t.totalS } : x))
          : weekOf(w);
      if (breachesAfter(weekStart, swapped, input, shortBefore && t.totalS >= s.totalS!).length === 0) {
        return {
          action: "swap",
          sessionId: s.id,
          title: s.title,
          templateId: t.id,
          templateName: t.name,
          message: `Swap "${s.title}" for "${t.name}" (same sport, ${Math.round(t.totalS / 60)} min): the week then keeps its budget.`,
        };
      }
    }
  }
  return null;
}

/**
 * Add an easy session (zone 1 only) on a free day of the week, not before today: the shortest of 30, 45, … 120 minutes
 * that makes the week keep every rule, the volume ramp and its target included. Its sport is the week's most common one.
 */
function proposeAdd(
  weekStart: string,
  inWeek: WeekSession[],
  input: SummariseInput,
  weekOf: WeekOf,
): Extract<Fix, { action: "add" }> | null {
  const busy = new Set(inWeek.map((s) => s.date));
  const count = new Map<string, number>();
  for (const s of inWeek) if (s.sport) count.set(s.sport, (count.get(s.sport) ?? 0) + 1);
  const sport = [...count].sort((a, b) => b[1] - a[1])[0]?.[0] ?? input.defaultSport;
  if (!sport) return null;
  const days = Array.from({ length: 7 }, (_, d) => addDays(weekStart, d)).filter(
    (d) => !busy.has(d) && d >= input.today,
  );
  for (let minutes = 30; minutes <= 120; minutes += 15) {
    for (const date of days) {
      const added: WeekSession = {
        id: "__added",
        date,
        title: `Easy ${minutes} min`,
        kind: "training",
        minutesByZone: [minutes, 0, 0],
        sport,
        totalS: minutes * 60,
      };
      const withIt: WeekOf = (w) => (w === weekStart ? [...weekOf(w), added] : weekOf(w));
      // Added minutes only shrink a shortfall, so one the week has does not block the fix.
      if (breachesAfter(weekStart, withIt, input, true).length === 0) {
        return {
          action: "add",
          date,
          sport,
          minutes,
          title: added.title,
          message: `Add an easy ${minutes}-minute session (zone 1) on ${date}: the week then keeps its budget.`,
        };
      }
    }
  }
  return null;
}

/** Up to two fixes of different kinds, best first: moving keeps the training, a swap keeps the day, adding keeps both. */
/** Whether a block holds work in zone 3 (or zone 2) directly or in a nested repeat. */
function holdsHard(blocks: Block[]): boolean {
  return blocks.some((b) => (b.type === "repeat" ? holdsHard(b.steps) : b.zone >= 2));
}

/** Minutes per zone of timed steps (as session.ts's `expand` counts them without speeds: distance steps add none). */
function timedMinutes(blocks: Block[]): Shares {
  const m: Shares = [0, 0, 0];
  for (const b of blocks) {
    const inner: Shares =
      b.type === "repeat"
        ? (timedMinutes(b.steps).map((v) => v * b.times) as Shares)
        : ([0, 0, 0].map((_, z) => (b.zone === z + 1 ? (b.durationS ?? 0) / 60 : 0)) as Shares);
    for (let z = 0; z < 3; z++) m[z]! += inner[z]!;
  }
  return m;
}

/**
 * Shorten a hard session: fewer repeats of its hard set (the fewest removed that make the week keep every rule, at least
 * one repeat kept). The session's warm-up and cool-down stay. Never a retest or a race.
 */
function proposeShorten(
  weekStart: string,
  inWeek: WeekSession[],
  input: SummariseInput,
  weekOf: WeekOf,
): Extract<Fix, { action: "shorten" }> | null {
  const candidates = inWeek
    .filter((s) => s.kind !== "retest" && s.kind !== "race" && s.kind !== "event" && s.structure?.length)
    .sort((a, b) => hardMinutes(b.minutesByZone) - hardMinutes(a.minutesByZone));
  for (const s of candidates) {
    const structure = s.structure!;
    const at = structure.findIndex((b) => b.type === "repeat" && b.times >= 2 && holdsHard(b.steps));
    if (at < 0) continue;
    const group = structure[at] as Extract<Block, { type: "repeat" }>;
    const perRepeat = timedMinutes(group.steps);
    for (let times = group.times - 1; times >= 1; times--) {
      const next = structure.map((b, i) => (i === at ? { ...group, times } : b));
      const cut = group.times - times;
      const totals = {
        minutesByZone: s.minutesByZone.map((v, z) => Math.round((v - cut * perRepeat[z]!) * 10) / 10) as Shares,
        totalS: Math.round((s.totalS ?? 0) - cut * 60 * (perRepeat[0] + perRepeat[1] + perRepeat[2])),
      };
      const shortened: WeekOf = (w) =>
        w === weekStart ? weekOf(w).map((x) => (x.id === s.id ? { ...x, ...totals } : x)) : weekOf(w);
      if (breachesAfter(weekStart, shortened, input).length === 0) {
        return {
          action: "shorten",
          sessionId: s.id,
          title: s.title,
          fromTimes: group.times,
          toTimes: times,
          structure: next,
          message: `Shorten "${s.title}" from ${group.times} to ${times} repeats of its hard set (${Math.round(totals.totalS / 60)} min): the week then keeps its budget.`,
        };
      }
    }
  }
  return null;
}

export function proposeFixes(
  weekStart: string,
  inWeek: WeekSession[],
  input: SummariseInput,
  weekOf: WeekOf = indexByWeek(input.sessions),
): Fix[] {
  const out: Fix[] = [];
  for (const f of [proposeMove, proposeShorten, proposeSwap, proposeAdd]) {
    if (out.length >= 2) break;
    const fix = f(weekStart, inWeek, input, weekOf);
    if (fix) out.push(fix);
  }
  return out;
}

/** The best fix, or null. */
export function proposeFix(
  weekStart: string,
  inWeek: WeekSession[],
  input: SummariseInput,
  weekOf: WeekOf = indexByWeek(input.sessions),
): Fix | null {
  return proposeFixes(weekStart, inWeek, input, weekOf)[0] ?? null;
}
