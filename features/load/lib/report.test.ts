import { describe, expect, it } from "vitest";
import { acwrRolling } from "./load";
import { latestLoad, loadReport, logZoneMinutes, type ReportLog } from "./report";

const log = (date: string, durationMin: number, rpe: number, extra: Partial<ReportLog> = {}): ReportLog => ({
  date,
  status: "done",
  durationMin,
  rpe,
  measuredMinByZone: null,
  trimp: null,
  plannedSessionId: null,
  ...extra,
});

describe("load report", () => {
  it("daily session-RPE load (Foster et al. 2001: 60 min at RPE 5 → 300 AU) and weekly monotony and strain", () => {
    // Week of Mon 2026-11-23: 300, 0, 300, 0, 300, 0, 0 → mean 128.57, SD 147.0 (population), monotony 0.8748, strain 787.3.
    const logs = [log("2026-11-23", 60, 5), log("2026-11-25", 60, 5), log("2026-11-27", 60, 5)];
    const r = loadReport({ logs, planned: [], from: "2026-11-23", to: "2026-11-29" });
    expect(r.days[0]!.load).toBe(300);
    const w = r.weeks[0]!;
    expect(w.load).toBe(900);
    const mean = 900 / 7,
      sd = Math.sqrt((3 * (300 - mean) ** 2 + 4 * mean ** 2) / 7);
    expect(w.monotony).toBeCloseTo(mean / sd, 9);
    expect(w.strain).toBeCloseTo(900 * (mean / sd), 6);
  });

  it("acute:chronic ratio per day equals the rolling definition (Hulin et al. 2016) over the same daily loads", () => {
    const logs = Array.from({ length: 40 }, (_, i) =>
      log(new Date(Date.UTC(2026, 9, 1 + i)).toISOString().slice(0, 10), 30 + (i % 7) * 10, 4 + (i % 3)),
    );
    const r = loadReport({ logs, planned: [], from: "2026-11-01", to: "2026-11-09" });
    const daily = Array.from({ length: 40 }, (_, i) => (30 + (i % 7) * 10) * (4 + (i % 3)));
    // 2026-11-09 is day index 39 of the logs (2026-10-01 + 39).
    expect(r.days.at(-1)!.acwrRolling).toBeCloseTo(acwrRolling(daily.slice(0, 40))!, 9);
    expect(r.latest.acwrEwma).not.toBeNull();
  });

  it("time per zone uses the file's measurement, else the planned split scaled to the logged minutes; compliance is done ÷ planned", () => {
    const planned = [
      { id: "p1", date: "2026-11-24", totalS: 3600, minutesByZone: [40, 10, 10] as [number, number, number] },
      { id: "p2", date: "2026-11-26", totalS: 1800, minutesByZone: [30, 0, 0] as [number, number, number] },
    ];
    expect(logZoneMinutes(log("2026-11-24", 30, 6, { plannedSessionId: "p1" }), planned[0])).toEqual([20, 5, 5]);
    const logs = [
      log("2026-11-24", 45, 6, { plannedSessionId: "p1", measuredMinByZone: [30, 10, 5] }),
      {
        ...log("2026-11-26", 0, 0, { plannedSessionId: "p2" }),
        status: "skipped" as const,
        durationMin: null,
        rpe: null,
      },
    ];
    const w = loadReport({ logs, planned, from: "2026-11-23", to: "2026-11-29" }).weeks[0]!;
    expect(w.minByZone).toEqual([30, 10, 5]);
    expect(w.plannedMin).toBe(90);
    expect(w.doneMin).toBe(45);
    expect(w.compliance).toBeCloseTo(0.5, 9);
    expect(w.sessionsDone).toBe(1);
    expect(w.sessionsPlanned).toBe(2);
  });
});

describe("latest load (the roster's shortcut)", () => {
  it("gives the same ratios as the full report's last day", async () => {
    const { latestLoad } = await import("./report");
    const logs = Array.from({ length: 60 }, (_, i) =>
      log(new Date(Date.UTC(2026, 8, 20 + i)).toISOString().slice(0, 10), 20 + ((i * 37) % 70), 2 + ((i * 13) % 8)),
    );
    const full = loadReport({ logs, planned: [], from: "2026-10-21", to: "2026-11-17" }).latest; // from = today − 27
    expect(latestLoad(logs, "2026-11-17")).toEqual(full);
  });
});

describe("the exponentially weighted ratio is the same on every screen", () => {
  // A year of invented logs: 45–90 min at RPE 3–8 on five days a week (deterministic).
  const logs: ReportLog[] = [];
  for (let d = 0; d < 365; d++) {
    if (d % 7 === 2 || d % 7 === 5) continue;
    const date = new Date(Date.UTC(2026, 0, 1) + d * 86_400_000).toISOString().slice(0, 10);
    logs.push({
      date,
      status: "done",
      durationMin: 45 + ((d * 37) % 46),
      rpe: 3 + ((d * 13) % 6),
      measuredMinByZone: null,
      trimp: null,
      plannedSessionId: null,
    });
  }
  const first = logs[0]!.date;
  const day = "2026-11-17";

  it("a one-week report, an eight-week report and the roster's value agree for the same day", () => {
    const week = loadReport({ logs, planned: [], from: "2026-11-11", to: day, firstLogDate: first }).days.at(
      -1,
    )!.acwrEwma!;
    const eight = loadReport({ logs, planned: [], from: "2026-09-23", to: day, firstLogDate: first }).days.at(
      -1,
    )!.acwrEwma!;
    const roster = latestLoad(logs, day, first).acwrEwma!;
    expect(Math.abs(week - eight)).toBeLessThan(1e-4);
    expect(Math.abs(roster - eight)).toBeLessThan(1e-4);
  });

  it("with a short history every window starts at the first log, so the values are identical; no ratio before 28 days of it", () => {
    const recent = logs.filter((l) => l.date >= "2026-10-01");
    const a = loadReport({
      logs: recent,
      planned: [],
      from: "2026-11-10",
      to: day,
      firstLogDate: "2026-10-01",
    }).days.at(-1)!.acwrEwma;
    const b = loadReport({
      logs: recent,
      planned: [],
      from: "2026-10-20",
      to: day,
      firstLogDate: "2026-10-01",
    }).days.at(-1)!.acwrEwma;
    expect(a).not.toBeNull();
    expect(a).toBe(b);
    expect(latestLoad(recent, day, "2026-10-01").acwrEwma).toBe(a);
    expect(latestLoad(recent, "2026-10-20", "2026-10-01").acwrEwma).toBeNull();
  });
});

describe("not enough history", () => {
  it("one day of logs gives no ratio and no flag (it would read as about 4); from 21 days of history the rolling ratio shows", () => {
    const one = [log("2026-11-17", 60, 6)];
    expect(latestLoad(one, "2026-11-17", "2026-11-17")).toEqual({ acwrRolling: null, acwrEwma: null, flag: null });
    const three = Array.from({ length: 21 }, (_, i) =>
      log(new Date(Date.UTC(2026, 9, 28 + i)).toISOString().slice(0, 10), 45, 5),
    );
    expect(latestLoad(three, "2026-11-17", "2026-10-28").acwrRolling).not.toBeNull();
    expect(latestLoad(three.slice(1), "2026-11-17", "2026-10-29").acwrRolling).toBeNull();
  });
});
