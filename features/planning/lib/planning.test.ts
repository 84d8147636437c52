import { describe, expect, it } from "vitest";
import { BUDGET_PRESETS, checkWeek } from "./budget";
import { expand, structureSchema } from "./session";
import { planSeason, recoveryDays, recoveryWeeksAfter, SeasonError } from "./season";

describe("structured sessions", () => {
  const intervals = structureSchema.parse([
    { type: "step", kind: "warmup", durationS: 900, zone: 1 },
    {
      type: "repeat",
      times: 5,
      steps: [
        { type: "step", kind: "work", durationS: 240, zone: 3 },
        { type: "step", kind: "recovery", durationS: 180, zone: 1 },
      ],
    },
    { type: "step", kind: "cooldown", durationS: 600, zone: 1 },
  ]);

  it("5 × (4 min zone 3, 3 min zone 1) with 15 min warm-up and 10 min cool-down: 60 min, 20 of them in zone 3 (arithmetic)", () => {
    const e = expand(intervals);
    expect(e.totalS).toBe(3600);
    expect(e.minutesByZone).toEqual([40, 0, 20]);
    expect(e.steps).toHaveLength(12);
  });

  it("nested repeats multiply out", () => {
    const nested = structureSchema.parse([
      {
        type: "repeat",
        times: 2,
        steps: [
          { type: "repeat", times: 3, steps: [{ type: "step", kind: "work", durationS: 60, zone: 3 }] },
          { type: "step", kind: "recovery", durationS: 300, zone: 1 },
        ],
      },
    ]);
    expect(expand(nested).minutesByZone).toEqual([10, 0, 6]);
  });

  it("times distance steps from a speed per zone, and says when it cannot", () => {
    const s = structureSchema.parse([{ type: "step", kind: "work", distanceM: 10000, zone: 1 }]);
    expect(expand(s, { 1: 12 }).totalS).toBe(3000);
    const e = expand(s);
    expect(e.untimedSteps).toBe(1);
    expect(e.warnings[0]).toMatch(/no speed/);
  });

  it("rejects impossible structures with clear messages", () => {
    const bad = (v: unknown) =>
      structureSchema
        .safeParse(v)
        .error?.issues.map((i) => i.message)
        .join(" | ") ?? "";
    expect(bad([])).toMatch(/at least one step/);
    expect(bad([{ type: "step", kind: "work", zone: 2 }])).toMatch(/either a duration or a distance/);
    expect(bad([{ type: "step", kind: "work", durationS: 60, distanceM: 100, zone: 2 }])).toMatch(
      /either a duration or a distance/,
    );
    expect(bad([{ type: "step", kind: "sprint", durationS: 60, zone: 4 }])).toMatch(/warm-up, work|zone 1, 2 or 3/);
    expect(
      bad([{ type: "repeat", times: 1, steps: [{ type: "step", kind: "work", durationS: 60, zone: 2 }] }]),
    ).toMatch(/at least twice/);
    const deep = {
      type: "repeat",
      times: 2,
      steps: [
        {
          type: "repeat",
          times: 2,
          steps: [
            {
              type: "repeat",
              times: 2,
              steps: [{ type: "repeat", times: 2, steps: [{ type: "step", kind: "work", durationS: 10, zone: 3 }] }],
            },
          ],
        },
      ],
    };
    expect(bad([deep])).toMatch(/nest at most 3/);
  });
});

describe("weekly intensity budget", () => {
  it("a polarised week within 80/5/15 ± 5 passes (Seiler & Kjerland 2006 shares, from memory)", () => {
    const r = checkWeek({ minutesByZone: [480, 30, 90], budget: BUDGET_PRESETS.polarised });
    expect(r.ok).toBe(true);
    expect(r.totalMin).toBe(600);
  });

  it("too much zone 3 is flagged with the minutes to remove or add", () => {
    // 600 min, 150 in zone 3 = 25 % vs 20 % allowed: remove 150 − 0.2·450/0.8 = 37.5 → 38 min, or add 150/0.2 − 600 = 150 min of zone 1.
    const r = checkWeek({ minutesByZone: [420, 30, 150], budget: BUDGET_PRESETS.polarised });
    const b = r.breaches.find((x) => x.code === "too_much_high")!;
    expect(b.numbers).toMatchObject({ sharePct: 25, allowedPct: 20, removeZone3Min: 38, addZone1Min: 150 });
    expect(b.message).toMatch(/Remove about 38 min of zone 3/);
    expect(r.breaches.map((x) => x.code)).toContain("too_little_low");
  });

  it("volume ramp above 10 % of the biggest recent week is flagged (common practice, weak evidence)", () => {
    const r = checkWeek({
      minutesByZone: [560, 20, 80],
      previousWeeksMinutes: [500, 580, 600, 390],
      budget: BUDGET_PRESETS.polarised,
    });
    expect(r.breaches.map((b) => b.code)).toEqual([]);
    const over = checkWeek({
      minutesByZone: [600, 20, 80],
      previousWeeksMinutes: [500, 600, 390],
      budget: BUDGET_PRESETS.polarised,
    });
    expect(over.breaches.map((b) => b.code)).toEqual(["volume_ramp"]);
    expect(over.breaches[0]!.numbers).toMatchObject({ risePct: 16.7, referenceMin: 600 });
  });

  it("a week of hard days every day and an overdue retest are flagged", () => {
    const hardDay: [number, number, number] = [60, 5, 10];
    const r = checkWeek({
      minutesByZone: [420, 35, 70],
      days: Array(7).fill(hardDay),
      budget: BUDGET_PRESETS.polarised,
      retestOverdue: true,
    });
    expect(r.breaches.map((b) => b.code)).toEqual(
      expect.arrayContaining(["too_many_hard_days", "back_to_back_hard_days", "retest_overdue"]),
    );
    expect(r.breaches.find((b) => b.code === "too_many_hard_days")!.numbers).toEqual({ hardDays: 7, maxHardDays: 3 });
    expect(r.breaches.find((b) => b.code === "back_to_back_hard_days")!.numbers).toEqual({ pairs: 6 });
  });

  // Common practice: two or three hard days a week, none back to back; strides do not make a day hard.
  const week = (days: [number, number, number][]) =>
    checkWeek({
      minutesByZone: days.reduce((a, d) => [a[0] + d[0], a[1] + d[1], a[2] + d[2]], [0, 0, 0]),
      days,
      budget: BUDGET_PRESETS.pyramidal,
    })
      .breaches.map((b) => b.code)
      .filter((c) => c.includes("hard"));
  const easy: [number, number, number] = [60, 0, 0];
  const strides: [number, number, number] = [55, 0, 5];
  const intervals: [number, number, number] = [45, 0, 20];
  const tempo: [number, number, number] = [30, 40, 0];

  it("seven easy runs with short strides are not hard days", () => {
    expect(week([strides, strides, strides, strides, strides, strides, strides])).toEqual([]);
  });

  it("six interval days in a row are flagged: too many hard days, and back to back", () => {
    expect(week([intervals, intervals, intervals, intervals, intervals, intervals, easy])).toEqual([
      "too_many_hard_days",
      "back_to_back_hard_days",
    ]);
  });

  it("three hard days apart pass; two in a row are flagged; a long zone 2 session is a hard day", () => {
    expect(week([intervals, easy, tempo, easy, intervals, easy, easy])).toEqual([]);
    expect(week([intervals, tempo, easy, easy, easy, easy, easy])).toEqual(["back_to_back_hard_days"]);
    // Four hard days (Monday, Wednesday, Friday, Sunday), none in a row within the week.
    expect(week([intervals, easy, tempo, easy, intervals, easy, tempo])).toEqual(["too_many_hard_days"]);
  });

  it("the limits can be changed: four hard days, back to back allowed", () => {
    const days = [intervals, tempo, easy, intervals, tempo, easy, easy];
    const r = checkWeek({
      minutesByZone: [210, 80, 40],
      days,
      budget: BUDGET_PRESETS.pyramidal,
      hardDays: { max: 4, backToBack: true },
    });
    expect(r.breaches.map((b) => b.code).filter((c) => c.includes("hard"))).toEqual([]);
  });
});

describe("season planning", () => {
  const season = planSeason({
    startDate: "2027-01-06",
    events: [{ date: "2027-09-26", name: "Autumn marathon" }],
    weeklyHours: 8,
  });

  it("orders the blocks toward the event and ends with transition", () => {
    const order = season.map((w) => w.block).filter((b, i, a) => a[i - 1] !== b);
    // 37 weeks of preparation: two macrocycles of at most 26 weeks (MAX_MACROCYCLE_WEEKS), then taper and race.
    expect(order).toEqual([
      "general_preparation",
      "specific_preparation",
      "pre_competition",
      "general_preparation",
      "specific_preparation",
      "pre_competition",
      "taper",
      "competition",
      "transition",
    ]);
    expect(season[0]!.weekStart).toBe("2027-01-04");
    expect(season.find((w) => w.block === "competition")!.events).toEqual(["Autumn marathon"]);
    // A Sunday race: one taper week, so 7 + 6 = 13 days of reduced volume (8–14 days: Bosquet et al. 2007).
    expect(season.filter((w) => w.block === "taper")).toHaveLength(1);
  });

  it("tapers 8–14 days before an A race: a Monday race gets two taper weeks (14 days), a Saturday one (12)", () => {
    const taperWeeks = (date: string) =>
      planSeason({ startDate: "2027-01-06", events: [{ date, name: "Race" }], weeklyHours: 8 }).filter(
        (w) => w.role === "taper",
      ).length;
    expect(taperWeeks("2027-06-07")).toBe(2); // Monday: 2 × 7 + 0 days
    expect(taperWeeks("2027-06-12")).toBe(1); // Saturday: 7 + 5 days
  });

  it("loading volume peaks in general preparation and eases in specific preparation and pre-competition", () => {
    // Bompa & Haff 2009's traditional model; the easing (10 % and 20 % of the cycle's peak) is ours.
    const peakOf = (block: string) =>
      Math.max(...season.filter((w) => w.block === block && w.role === "loading").map((w) => w.volumeHours));
    expect(peakOf("specific_preparation")).toBeLessThan(peakOf("general_preparation"));
    expect(peakOf("pre_competition")).toBeLessThan(peakOf("specific_preparation"));
    // Not flat: the loading weeks of the last eight weeks before the taper differ from the general preparation's top.
    const long = planSeason({
      startDate: "2027-01-04",
      events: [{ date: "2027-12-19", name: "Race" }],
      weeklyHours: 8,
    });
    const loading = long.filter((w) => w.role === "loading").map((w) => w.volumeHours);
    expect(new Set(loading.slice(8)).size).toBeGreaterThan(3);
  });

  it("recovery after a race scales with its length: a 3.5-hour A race on a Sunday two recovery weeks, a 40-min 10 km one easier week", () => {
    // Our rule of thumb (common practice): about 3 days per hour raced after an A race, at least 3, at most 21.
    expect(recoveryDays("A", 210)).toBe(11); // 3 × 3.5 h = 10.5 → 11 days
    expect(recoveryDays("A", 40)).toBe(3); // 2 days, raised to the minimum of 3
    expect(recoveryDays("B", 90)).toBe(3); // 2 × 1.5 h
    expect(recoveryDays("C", 600)).toBe(0);
    // Sunday race (day 6): no days left in its week; 11 days = a week of 7 and a week of 4 (both recovery weeks).
    expect(recoveryWeeksAfter("A", 210, 6)).toEqual(["recovery", "recovery"]);
    // Saturday 10 km: 3 days, 1 of them the Sunday: 2 days in the next week, an unloading week.
    expect(recoveryWeeksAfter("A", 40, 5)).toEqual(["unloading"]);
    const two = planSeason({
      startDate: "2027-01-04",
      events: [
        { date: "2027-05-02", name: "Spring marathon", priority: "A", durationMin: 210 },
        { date: "2027-09-26", name: "Autumn marathon", priority: "A", durationMin: 210 },
      ],
      weeklyHours: 8,
    });
    const race = two.findIndex((w) => w.events.includes("Spring marathon"));
    expect(two.slice(race + 1, race + 3).map((w) => w.role)).toEqual(["recovery", "recovery"]);
    expect(two[race + 3]!.role).not.toBe("recovery");
    // Without a length: one recovery week, as before.
    const plain = planSeason({
      startDate: "2027-01-04",
      events: [
        { date: "2027-05-02", name: "Spring marathon" },
        { date: "2027-09-26", name: "Autumn marathon" },
      ],
      weeklyHours: 8,
    });
    expect(plain.slice(race + 1, race + 3).map((w) => w.role)[0]).toBe("recovery");
    expect(plain[race + 2]!.role).not.toBe("recovery");
  });

  // Several macrocycles in a long season: Bompa & Haff 2009 describe two or more a year; the 26-week limit is ours.
  it("a 104-week season is several macrocycles, not one long general preparation", () => {
    const two = planSeason({ startDate: "2027-01-04", events: [{ date: "2028-12-17", name: "Race" }], weeklyHours: 8 });
    const starts = two.filter(
      (w, i) => w.block === "general_preparation" && two[i - 1]?.block !== "general_preparation",
    );
    expect(starts.length).toBeGreaterThanOrEqual(4);
    let run = 0,
      longest = 0;
    for (const w of two) {
      run = w.block === "general_preparation" ? run + 1 : 0;
      longest = Math.max(longest, run);
    }
    expect(longest).toBeLessThanOrEqual(15);
  });

  it("loads 3:1 and never raises volume more than 10 % over the biggest of the last four weeks", () => {
    const prep = season
      .filter((w) => w.role === "loading" || w.role === "unloading")
      .slice(0, 8)
      .map((w) => w.role);
    expect(prep).toEqual(["loading", "loading", "loading", "unloading", "loading", "loading", "loading", "unloading"]);
    for (let i = 1; i < season.length; i++) {
      const ref = Math.max(...season.slice(Math.max(0, i - 4), i).map((w) => w.volumeHours));
      expect(season[i]!.volumeHours).toBeLessThanOrEqual(ref * 1.1 + 0.25);
    }
    expect(Math.max(...season.map((w) => w.volumeHours))).toBeLessThanOrEqual(8 * 1.3 + 0.25);
  });

  it("places retests every 12 weeks or earlier, in unloading weeks, never more than 16 apart", () => {
    const idx = season.filter((w) => w.retest).map((w) => w.index);
    expect(idx.length).toBeGreaterThanOrEqual(2);
    let last = 0;
    for (const i of idx) {
      expect(i - last).toBeLessThanOrEqual(16);
      expect(["unloading", "recovery"]).toContain(season[i]!.role);
      last = i;
    }
  });

  it("refuses impossible inputs", () => {
    expect(() =>
      planSeason({ startDate: "2027-01-06", events: [{ date: "2027-01-10", name: "x" }], weeklyHours: 8 }),
    ).toThrow(SeasonError);
    expect(() =>
      planSeason({
        startDate: "2027-01-06",
        events: [{ date: "2027-06-10", name: "x" }],
        weeklyHours: 8,
        retestEveryWeeks: 20,
      }),
    ).toThrow(/12 to 16/);
    expect(() =>
      planSeason({ startDate: "not a date", events: [{ date: "2027-06-10", name: "x" }], weeklyHours: 8 }),
    ).toThrow(/not a date/);
  });
});

describe("retest placement", () => {
  const cases = [
    { weeks: 16, events: [["2027-04-25", "Spring 10k"]] },
    {
      weeks: 52,
      events: [
        ["2027-06-06", "Half"],
        ["2027-10-03", "Marathon"],
      ],
    },
    {
      weeks: 104,
      events: [
        ["2027-05-02", "A"],
        ["2027-05-23", "B"],
        ["2028-09-24", "C"],
      ],
    },
  ] as const;
  for (const c of cases) {
    it(`never lands in a taper, race or recovery week, and says where it went (${c.weeks} weeks, ${c.events.length} event(s))`, () => {
      const weeks = planSeason({
        startDate: "2027-01-04",
        events: c.events.map(([date, name]) => ({ date, name })),
        weeklyHours: 8,
      });
      const tests = weeks.filter((w) => w.retest);
      expect(tests.length).toBeGreaterThan(0);
      for (const w of tests) {
        expect(["unloading", "loading"], `${w.weekStart} is ${w.role}`).toContain(w.role);
        expect(w.retestNote).toMatch(/Retest due/);
      }
      // At least 8 weeks apart.
      for (let i = 1; i < tests.length; i++) expect(tests[i]!.index - tests[i - 1]!.index).toBeGreaterThanOrEqual(8);
    });
  }
});

describe("budgets counted by time or by session", () => {
  // Seiler & Kjerland 2006 and Seiler 2010 count sessions by their goal: about 80 % easy, 20 % hard. Counted by session,
  // five sessions at 20 % ± 5 allow ceil(0.25 × 5) = 2 hard sessions (hand computation).
  const easy: [number, number, number] = [60, 0, 0];
  const hard: [number, number, number] = [40, 0, 30];
  const strides: [number, number, number] = [55, 0, 5];
  const minutes = (list: [number, number, number][]) =>
    list.reduce((a, d) => [a[0] + d[0], a[1] + d[1], a[2] + d[2]], [0, 0, 0]) as [number, number, number];
  const bySession = (list: [number, number, number][]) =>
    checkWeek({ minutesByZone: minutes(list), sessions: list, budget: BUDGET_PRESETS.polarised_sessions });

  it("every preset states what it counts and where its shares come from", () => {
    for (const b of Object.values(BUDGET_PRESETS)) {
      expect(["time", "session"]).toContain(b.counting);
      expect(b.source.length).toBeGreaterThan(10);
    }
    expect(BUDGET_PRESETS.polarised_sessions.counting).toBe("session");
  });

  it("two hard sessions of five pass by session, three are flagged with the counts", () => {
    expect(bySession([hard, easy, hard, easy, easy]).breaches.map((b) => b.code)).toEqual([]);
    const three = bySession([hard, easy, hard, easy, hard]);
    expect(three.breaches.map((b) => b.code)).toContain("too_much_high");
    expect(three.breaches.find((b) => b.code === "too_much_high")!.numbers).toEqual({
      sessions: 5,
      hardSessions: 3,
      allowedSessions: 2,
    });
  });

  it("the same week counted by time is judged on minutes instead: two hard sessions of five are 60 of 300 min zone 3", () => {
    // 60 / 300 = 20 % zone 3: within the polarised-by-time 15 % ± 5 (hand computation).
    const week = [hard, easy, hard, easy, easy];
    expect(
      checkWeek({ minutesByZone: minutes(week), sessions: week, budget: BUDGET_PRESETS.polarised }).breaches,
    ).toEqual([]);
    // Three hard sessions: 90 of 330 min = 27.3 %: over by time as well.
    const three = [hard, easy, hard, easy, hard];
    expect(
      checkWeek({ minutesByZone: minutes(three), sessions: three, budget: BUDGET_PRESETS.polarised }).breaches.map(
        (b) => b.code,
      ),
    ).toContain("too_much_high");
  });

  it("strides do not make a session hard; a session with 30 min of zone 2 aims at zone 2", () => {
    expect(bySession([strides, strides, strides, strides, strides]).breaches).toEqual([]);
    const tempo: [number, number, number] = [30, 40, 0];
    // 0 % zone 2 ± 5 by session: ceil(0.05 × 5) = 1 tempo session allowed, two are flagged.
    expect(bySession([tempo, easy, easy, easy, easy]).breaches).toEqual([]);
    expect(bySession([tempo, easy, tempo, easy, easy]).breaches.map((b) => b.code)).toContain("too_much_moderate");
  });
});

describe("several events with priorities A, B and C (common practice; A tapers after Mujika & Padilla 2003)", () => {
  // Season from Monday 4 January 2027; events in weeks 12 (29 March), 20 (24 May) and 26 (5 July).
  const plan = (p: ("A" | "B" | "C")[]) =>
    planSeason({
      startDate: "2027-01-04",
      weeklyHours: 8,
      events: [
        { date: "2027-03-31", name: "Spring race", priority: p[0] },
        { date: "2027-05-26", name: "Summer race", priority: p[1] },
        { date: "2027-07-07", name: "Goal race", priority: p[2] },
      ],
    });
  const at = (weeks: ReturnType<typeof plan>, start: string) => weeks.find((w) => w.weekStart === start)!;

  it("every A event gets a taper before it and a recovery week after it", () => {
    const weeks = plan(["A", "A", "A"]);
    for (const [race, before, after] of [
      ["2027-03-29", "2027-03-22", "2027-04-05"],
      ["2027-05-24", "2027-05-17", "2027-05-31"],
    ]) {
      expect(at(weeks, race!).role).toBe("event");
      expect(at(weeks, before!).role).toBe("taper");
      expect(at(weeks, after!).role).toBe("recovery");
      expect(at(weeks, after!).volumeHours).toBeLessThan(at(weeks, before!).volumeHours);
    }
    expect(at(weeks, "2027-07-05").role).toBe("event");
    expect(at(weeks, "2027-07-12").block).toBe("transition");
  });

  it("a B event tapers inside its own week (no taper week before) and is followed by an easier week", () => {
    const weeks = plan(["A", "B", "A"]);
    const race = at(weeks, "2027-05-24"),
      before = at(weeks, "2027-05-17"),
      after = at(weeks, "2027-05-31");
    expect(race.role).toBe("event");
    expect(race.events).toEqual(["Summer race"]);
    expect(before.role).not.toBe("taper");
    expect(after.role).toBe("unloading");
    // Its week keeps more volume than an A race week (70 % against 45 % of the last loading week).
    expect(race.volumeHours).toBeGreaterThan(at(weeks, "2027-03-29").volumeHours);
  });

  it("a C event is trained through: its week keeps its ordinary role and lists the race", () => {
    const weeks = plan(["C", "A", "A"]);
    const race = at(weeks, "2027-03-29");
    expect(["loading", "unloading"]).toContain(race.role);
    expect(race.events).toEqual(["Spring race"]);
    expect(at(weeks, "2027-03-22").role).not.toBe("taper");
    expect(at(weeks, "2027-04-05").role).not.toBe("recovery");
  });

  it("an event without a priority is an A event (seasons saved before priorities read the same)", () => {
    const weeks = planSeason({
      startDate: "2027-01-04",
      weeklyHours: 8,
      events: [
        { date: "2027-03-31", name: "Race" },
        { date: "2027-05-26", name: "Race 2" },
      ],
    });
    expect(at(weeks, "2027-03-22").role).toBe("taper");
    expect(at(weeks, "2027-04-05").role).toBe("recovery");
  });
});
