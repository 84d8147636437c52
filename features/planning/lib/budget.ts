/**
 * The intensity budget: a target share per zone with a tolerance, and the weekly check of planned or completed training
 * against it. A budget counts either time in zone (minutes) or sessions by their goal (a session's goal is its hardest
 * meaningful zone: zone 3 with 10 min or more of it, zone 2 with 30 min or more, else zone 1); the week is checked the
 * way its budget counts. Shares reported by session goal are not shares of time: the classic "80/20" of endurance
 * athletes counts sessions (Seiler & Kjerland 2006, Scand J Med Sci Sports 16:49–56; Seiler 2010, Int J Sports Physiol
 * Perform 5:276–291), and the same training counted by time in zone puts even more in zone 1. The volume ramp cap of 10 %
 * a week is common practice with weak evidence (Buist et al. 2008): a caution.
 */

export type Shares = [number, number, number];

export interface Budget {
  name: string;
  shares: Shares;
  /** Allowed deviation of each share, as a fraction (0.05 = 5 percentage points). */
  tolerance: number;
  /** What the shares count: minutes in each zone, or sessions by their goal zone. */
  counting: "time" | "session";
  /** Where the shares come from, as shown beside the preset. */
  source: string;
}

export const BUDGET_PRESETS = {
  polarised: {
    name: "Polarised",
    shares: [0.8, 0.05, 0.15],
    tolerance: 0.05,
    counting: "time",
    source: "by time in zone; common practice, after the polarised model of Seiler & Kjerland 2006",
  },
  polarised_sessions: {
    name: "Polarised by session",
    shares: [0.8, 0, 0.2],
    tolerance: 0.05,
    counting: "session",
    source: "by session goal: about 80 % of sessions easy, 20 % hard (Seiler & Kjerland 2006; Seiler 2010)",
  },
  pyramidal: {
    name: "Pyramidal",
    shares: [0.77, 0.13, 0.1],
    tolerance: 0.05,
    counting: "time",
    source: "by time in zone; common practice for intermediate athletes",
  },
  beginner: {
    name: "Beginner",
    shares: [0.9, 0.07, 0.03],
    tolerance: 0.05,
    counting: "time",
    source: "by time in zone; common practice",
  },
  recovery: {
    name: "Recovery",
    shares: [0.97, 0.03, 0],
    tolerance: 0.03,
    counting: "time",
    source: "by time in zone; common practice for recovery weeks",
  },
} as const satisfies Record<string, Budget>;

/** A session's goal zone, for budgets that count sessions (see the module comment). */
export function sessionGoalZone(minutesByZone: Shares): 1 | 2 | 3 {
  if (minutesByZone[2] >= HARD_Z3_MIN) return 3;
  if (minutesByZone[1] >= HARD_Z2_MIN) return 2;
  return 1;
}

export type BudgetPreset = keyof typeof BUDGET_PRESETS;

export const DEFAULT_RAMP_CAP = 0.1;

export type BreachCode =
  | "too_much_high"
  | "too_little_low"
  | "too_much_moderate"
  | "volume_ramp"
  | "too_many_hard_days"
  | "back_to_back_hard_days"
  | "retest_overdue"
  | "role_volume"
  | "volume_off_target"
  | "return_after_break";

export interface Breach {
  code: BreachCode;
  message: string;
  numbers: Record<string, number>;
}

export interface WeekInput {
  /** Minutes per zone for the week (planned or done). */
  minutesByZone: Shares;
  /** Per day of the week (7 entries, Monday first): minutes per zone. */
  days?: Shares[];
  /** Total minutes of the previous weeks, most recent last. */
  previousWeeksMinutes?: number[];
  budget: Budget;
  rampCap?: number;
  retestOverdue?: boolean;
  /** Each session's minutes per zone: what a budget counting sessions counts. */
  sessions?: Shares[];
  /** Hard days allowed in the week (default 3) and whether two may follow each other (default no). */
  hardDays?: { max?: number; backToBack?: boolean };
}

/** Common practice for endurance training: two or three hard days a week, never two in a row (e.g. Seiler 2010, Int J
 * Sports Physiol Perform 5:276–291, describes two to three high-intensity sessions a week in successful athletes). */
export const DEFAULT_MAX_HARD_DAYS = 3;
/** A day is hard with at least 10 min in zone 3 or 30 min in zone 2; short strides or pick-ups do not make it hard
 * (common practice; the thresholds are ours). */
export const HARD_Z3_MIN = 10;
export const HARD_Z2_MIN = 30;

export interface WeekCheck {
  totalMin: number;
  shares: Shares;
  breaches: Breach[];
  ok: boolean;
}

const pct = (v: number) => Math.round(v * 1000) / 10;
const r1 = (v: number) => Math.round(v * 10) / 10;

/** A hard day: at least HARD_Z3_MIN minutes of zone 3 or HARD_Z2_MIN of zone 2 (strides alone keep a day easy). */
export function isHardDay(day: Shares): boolean {
  return day[2] >= HARD_Z3_MIN || day[1] >= HARD_Z2_MIN;
}

/**
 * The share checks of a budget that counts sessions: each share may exceed its target by the tolerance, rounded up to
 * whole sessions (five sessions at 20 % ± 5 allow two hard ones: ceil(0.25 × 5)); zone 1 must reach its share less the
 * tolerance, rounded down.
 */
function sessionShareBreaches(sessions: Shares[], budget: Budget): Breach[] {
  const n = sessions.length;
  const count = [0, 0, 0];
  for (const s of sessions) count[sessionGoalZone(s) - 1]!++;
  const out: Breach[] = [];
  const allowed = (z: number) => Math.ceil((budget.shares[z]! + budget.tolerance) * n - 1e-9);
  const name = budget.name.toLowerCase();
  if (count[2]! > allowed(2)) {
    out.push({
      code: "too_much_high",
      message: `${count[2]} of ${n} sessions are hard (zone 3); the ${name} budget allows ${allowed(2)} of ${n} (${pct(budget.shares[2] + budget.tolerance)} %). Make ${count[2]! - allowed(2)} of them easy or move them to another week.`,
      numbers: { sessions: n, hardSessions: count[2]!, allowedSessions: allowed(2) },
    });
  }
  if (count[1]! > allowed(1)) {
    out.push({
      code: "too_much_moderate",
      message: `${count[1]} of ${n} sessions aim at zone 2; the ${name} budget allows ${allowed(1)} of ${n}. Make ${count[1]! - allowed(1)} of them easy, or hard, or move them.`,
      numbers: { sessions: n, moderateSessions: count[1]!, allowedSessions: allowed(1) },
    });
  }
  const needEasy = Math.floor((budget.shares[0] - budget.tolerance) * n + 1e-9);
  if (count[0]! < needEasy) {
    out.push({
      code: "too_little_low",
      message: `${count[0]} of ${n} sessions are easy (zone 1); the ${name} budget asks for at least ${needEasy}. Add an easy session or make one easy.`,
      numbers: { sessions: n, easySessions: count[0]!, neededSessions: needEasy },
    });
  }
  return out;
}

export function checkWeek(input: WeekInput): WeekCheck {
  const [z1, z2, z3] = input.minutesByZone;
  const total = z1 + z2 + z3;
  const shares: Shares = total > 0 ? [z1 / total, z2 / total, z3 / total] : [0, 0, 0];
  const { budget } = input;
  const tol = budget.tolerance;
  const breaches: Breach[] = [];
  if (budget.counting === "session" && input.sessions?.length) {
    breaches.push(...sessionShareBreaches(input.sessions, budget));
  } else if (total > 0) {
    if (shares[2] > budget.shares[2] + tol) {
      // Minutes of zone 3 to remove, or zone 1 minutes to add, to come back within the budget.
      const maxShare = budget.shares[2] + tol;
      const removeZ3 = z3 - (maxShare * (z1 + z2)) / (1 - maxShare);
      const addZ1 = z3 / maxShare - total;
      breaches.push({
        code: "too_much_high",
        message: `Zone 3 is ${pct(shares[2])} % of the week; the ${budget.name.toLowerCase()} budget allows ${pct(maxShare)} %. Remove about ${Math.ceil(removeZ3)} min of zone 3 or add about ${Math.ceil(addZ1)} min of zone 1.`,
        numbers: {
          sharePct: pct(shares[2]),
          allowedPct: pct(maxShare),
          removeZone3Min: Math.ceil(removeZ3),
          addZone1Min: Math.ceil(addZ1),
        },
      });
    }
    if (shares[1] > budget.shares[1] + tol) {
      const maxShare = budget.shares[1] + tol;
      breaches.push({
        code: "too_much_moderate",
        message: `Zone 2 is ${pct(shares[1])} % of the week; the budget allows ${pct(maxShare)} %.`,
        numbers: { sharePct: pct(shares[1]), allowedPct: pct(maxShare) },
      });
    }
    if (shares[0] < budget.shares[0] - tol) {
      const minShare = budget.shares[0] - tol;
      const addZ1 = (minShare * total - z1) / (1 - minShare);
      breaches.push({
        code: "too_little_low",
        message: `Zone 1 is only ${pct(shares[0])} % of the week; the budget asks for at least ${pct(minShare)} %. Add about ${Math.ceil(addZ1)} min of zone 1 or turn harder minutes into easy ones.`,
        numbers: { sharePct: pct(shares[0]), minimumPct: pct(minShare), addZone1Min: Math.ceil(addZ1) },
      });
    }
  }
  const cap = input.rampCap ?? DEFAULT_RAMP_CAP;
  const previous = (input.previousWeeksMinutes ?? []).slice(-4).filter((m) => m > 0);
  if (previous.length && total > 0) {
    // Compared with the biggest of the last four weeks, so that an unloading week does not make the next loading week a breach.
    const reference = Math.max(...previous);
    const rise = total / reference - 1;
    if (rise > cap + 1e-9) {
      breaches.push({
        code: "volume_ramp",
        message: `Volume rises ${pct(rise)} % over the biggest of the last weeks (${Math.round(reference)} min); the cap is ${pct(cap)} %. Keep the week under ${Math.floor(reference * (1 + cap))} min.`,
        numbers: { risePct: pct(rise), capPct: pct(cap), referenceMin: Math.round(reference), totalMin: r1(total) },
      });
    }
  }
  if (input.days && input.days.length === 7) {
    const hard = input.days.map(isHardDay);
    const count = hard.filter(Boolean).length;
    const max = input.hardDays?.max ?? DEFAULT_MAX_HARD_DAYS;
    if (count > max) {
      breaches.push({
        code: "too_many_hard_days",
        message: `${count} hard days this week (zone 3 for ${HARD_Z3_MIN} min or more, or zone 2 for ${HARD_Z2_MIN} min or more); at most ${max}. Make ${count - max} of them easy or move them to another week.`,
        numbers: { hardDays: count, maxHardDays: max },
      });
    }
    if (!input.hardDays?.backToBack) {
      const pairs = hard.map((h, i) => h && hard[i + 1] === true).filter(Boolean).length;
      if (pairs > 0) {
        breaches.push({
          code: "back_to_back_hard_days",
          message: `${pairs === 1 ? "Two hard days follow each other" : `${pairs} pairs of hard days follow each other`}: put an easy or rest day between hard days.`,
          numbers: { pairs },
        });
      }
    }
  }
  if (input.retestOverdue) {
    breaches.push({
      code: "retest_overdue",
      message: "The retest is overdue: the zones may no longer match the athlete's fitness.",
      numbers: {},
    });
  }
  return { totalMin: r1(total), shares, breaches, ok: breaches.length === 0 };
}
