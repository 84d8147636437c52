// CSV downloads: read back with papaparse (a reference parser), and cells that a spreadsheet would run as formulas
// neutralised (OWASP "CSV Injection": =, +, -, @, tab, carriage return).
import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { logsCsv, planCsv, squadWeekCsv, toCsv } from "./csv";

describe("CSV downloads", () => {
  it("neutralise cells that start like a formula, and keep everything else as written", () => {
    const csv = toCsv(
      ["a", "b"],
      [
        ['=HYPERLINK("http://evil.test")', "+1"],
        ["-2", "@SUM(A1)"],
        ["plain, with comma", 'quote "x"'],
      ],
    );
    const back = Papa.parse<string[]>(csv.trim()).data;
    expect(back[1]).toEqual(['\'=HYPERLINK("http://evil.test")', "'+1"]);
    expect(back[2]).toEqual(["'-2", "'@SUM(A1)"]);
    expect(back[3]).toEqual(["plain, with comma", 'quote "x"']);
  });

  it("a plan and a log read back column by column", () => {
    const plan = Papa.parse<Record<string, string>>(
      planCsv([
        {
          date: "2027-01-05",
          title: "=cmd",
          sport: "running",
          kind: "training",
          totalS: 2700,
          minutesByZone: [40, 0, 5],
          notes: "",
          log: { status: "done", durationMin: 44, rpe: 6 },
        },
      ]),
      { header: true },
    ).data[0]!;
    expect(plan).toMatchObject({
      date: "2027-01-05",
      title: "'=cmd",
      planned_min: "45",
      zone1_min: "40",
      zone3_min: "5",
      logged: "done",
      done_min: "44",
      rpe: "6",
    });
    const log = Papa.parse<Record<string, string>>(
      logsCsv([
        {
          date: "2027-01-05",
          title: "Easy",
          sport: "running",
          status: "done",
          durationMin: 44.26,
          distanceKm: 8.5,
          rpe: 4,
          measuredMinByZone: [40, 4, 0.26],
          hrAvgBpm: 141.2,
          powerAvgW: null,
          speedAvgKmh: 11.52,
          trimp: 62.04,
          trimpMethod: "banister",
          notes: "felt fine",
          skipReason: null,
        },
      ]),
      { header: true },
    ).data[0]!;
    expect(log).toMatchObject({
      duration_min: "44.3",
      distance_km: "8.5",
      zone3_min: "0.3",
      hr_avg_bpm: "141.2",
      power_avg_w: "",
      trimp: "62",
      trimp_method: "banister",
    });
  });

  it("the squad week: a line per session with the athlete's week, a line for an athlete with none; formulas neutralised", () => {
    const csv = squadWeekCsv("2027-01-04", [
      {
        athlete: { name: "=Ines" },
        sessions: [
          {
            date: "2027-01-05",
            title: "Tempo",
            kind: "training",
            totalS: 3000,
            minutesByZone: [30, 20, 0],
            log: "done",
          },
        ],
        week: { overBudget: true, flags: [{ message: "Zone 3 is 25 % of the time." }] },
      },
      { athlete: { name: "Jonas" }, sessions: [], week: { overBudget: false, inProgress: true, flags: [] } },
    ]);
    const [header, ines, jonas] = Papa.parse<string[]>(csv.trim(), { skipEmptyLines: true }).data;
    expect(header).toEqual([
      "week_start",
      "athlete",
      "date",
      "title",
      "kind",
      "planned_min",
      "zone1_min",
      "zone2_min",
      "zone3_min",
      "logged",
      "week_budget",
      "week_flags",
    ]);
    expect(ines).toEqual([
      "2027-01-04",
      "'=Ines",
      "2027-01-05",
      "Tempo",
      "training",
      "50",
      "30",
      "20",
      "0",
      "done",
      "over budget",
      "Zone 3 is 25 % of the time.",
    ]);
    expect(jonas!.slice(0, 2)).toEqual(["2027-01-04", "Jonas"]);
    expect(jonas!.slice(10)).toEqual(["in progress", ""]);
  });
});
