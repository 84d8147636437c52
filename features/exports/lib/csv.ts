/**
 * CSV downloads through papaparse's writer, with formula injection neutralised: a cell that starts with =, +, -, @, a tab
 * or a carriage return is written with a leading apostrophe (papaparse `escapeFormulae`), so a spreadsheet shows it as
 * text instead of running it (OWASP, "CSV Injection").
 */
import Papa from "papaparse";
import { distanceIn, type Units } from "@/features/platform/lib/units";

export type Cell = string | number | boolean | null | undefined;

/** A download's columns and lines, written as CSV here or as a workbook (xlsx.ts). */
export interface Table {
  header: string[];
  rows: Cell[][];
}

export function toCsv(header: string[], rows: Cell[][]): string {
  return Papa.unparse(
    { fields: header, data: rows.map((r) => r.map((c) => (c === null || c === undefined ? "" : c))) },
    { escapeFormulae: true, newline: "\r\n" },
  );
}

const table = (header: string[], rows: Cell[][]): Table => ({ header, rows });

export const planCsv = (rows: PlanRow[]) => csvOf(planTable(rows));
export const logsCsv = (rows: LogRowOut[]) => csvOf(logsTable(rows));
export const zonesCsv = (rows: ZoneRowOut[]) => csvOf(zonesTable(rows));
export const squadWeekCsv = (weekStart: string, rows: SquadWeekCsvRow[]) => csvOf(squadWeekTable(weekStart, rows));

export function csvOf(t: Table): string {
  return toCsv(t.header, t.rows);
}

const r1 = (v: number | null | undefined) => (v === null || v === undefined ? null : Math.round(v * 10) / 10);

export interface PlanRow {
  date: string;
  title: string;
  sport: string;
  kind: string;
  totalS: number;
  minutesByZone: [number, number, number];
  notes: string;
  log: { status: string; durationMin: number | null; rpe: number | null } | null;
}

export function planTable(rows: PlanRow[]): Table {
  return table(
    [
      "date",
      "title",
      "sport",
      "kind",
      "planned_min",
      "zone1_min",
      "zone2_min",
      "zone3_min",
      "notes",
      "logged",
      "done_min",
      "rpe",
    ],
    rows.map((s) => [
      s.date,
      s.title,
      s.sport,
      s.kind,
      r1(s.totalS / 60),
      r1(s.minutesByZone[0]),
      r1(s.minutesByZone[1]),
      r1(s.minutesByZone[2]),
      s.notes,
      s.log?.status ?? "",
      r1(s.log?.durationMin),
      s.log?.rpe ?? null,
    ]),
  );
}

export interface LogRowOut {
  date: string;
  title: string;
  sport: string;
  status: string;
  durationMin: number | null;
  distanceKm: number | null;
  rpe: number | null;
  measuredMinByZone: [number, number, number] | null;
  hrAvgBpm: number | null;
  powerAvgW: number | null;
  speedAvgKmh: number | null;
  trimp: number | null;
  trimpMethod: string | null;
  notes: string;
  skipReason: string | null;
}

/** Distances and speeds in the reader's units: km and km/h, or mi and mph (the column names say which). */
export function logsTable(rows: LogRowOut[], units: Units = "metric"): Table {
  const imperial = units === "imperial";
  return table(
    [
      "date",
      "title",
      "sport",
      "status",
      "duration_min",
      imperial ? "distance_mi" : "distance_km",
      "rpe",
      "zone1_min",
      "zone2_min",
      "zone3_min",
      "hr_avg_bpm",
      "power_avg_w",
      imperial ? "speed_avg_mph" : "speed_avg_kmh",
      "trimp",
      "trimp_method",
      "notes",
      "skip_reason",
    ],
    rows.map((l) => [
      l.date,
      l.title,
      l.sport,
      l.status,
      r1(l.durationMin),
      l.distanceKm === null ? null : distanceIn(l.distanceKm, units),
      l.rpe,
      r1(l.measuredMinByZone?.[0]),
      r1(l.measuredMinByZone?.[1]),
      r1(l.measuredMinByZone?.[2]),
      r1(l.hrAvgBpm),
      r1(l.powerAvgW),
      r1(l.speedAvgKmh === null ? null : distanceIn(l.speedAvgKmh, units)),
      r1(l.trimp),
      l.trimpMethod,
      l.notes,
      l.skipReason,
    ]),
  );
}

export interface ZoneRowOut {
  sport: string;
  effectiveFrom: string;
  source: string;
  vt1: { hrBpm?: number | null; powerW?: number | null; speedKmh?: number | null };
  vt2: { hrBpm?: number | null; powerW?: number | null; speedKmh?: number | null };
}

export function zonesTable(rows: ZoneRowOut[], units: Units = "metric"): Table {
  const speed = units === "imperial" ? "speed_mph" : "speed_kmh";
  const inUnits = (v: number | null | undefined) => (v === null || v === undefined ? null : distanceIn(v, units));
  return table(
    [
      "sport",
      "effective_from",
      "source",
      "vt1_hr_bpm",
      "vt1_power_w",
      `vt1_${speed}`,
      "vt2_hr_bpm",
      "vt2_power_w",
      `vt2_${speed}`,
    ],
    rows.map((z) => [
      z.sport,
      z.effectiveFrom,
      z.source,
      z.vt1.hrBpm,
      z.vt1.powerW,
      r1(inUnits(z.vt1.speedKmh)),
      z.vt2.hrBpm,
      z.vt2.powerW,
      r1(inUnits(z.vt2.speedKmh)),
    ]),
  );
}

export interface SquadWeekCsvRow {
  athlete: { name: string };
  sessions: {
    date: string;
    title: string;
    kind: string;
    totalS: number;
    minutesByZone: [number, number, number];
    log: string | null;
  }[];
  week: { overBudget: boolean; inProgress?: boolean; flags: { message: string }[] };
}

/**
 * The squad week as a spreadsheet: one line per planned session, each with its athlete's budget state for the week; an
 * athlete without sessions has one line with the state alone.
 */
export function squadWeekTable(weekStart: string, rows: SquadWeekCsvRow[]): Table {
  const state = (w: SquadWeekCsvRow["week"]) =>
    w.overBudget ? "over budget" : w.inProgress ? "in progress" : "within budget";
  const lines: Cell[][] = [];
  for (const r of rows) {
    const flags = r.week.flags.map((f) => f.message).join(" ");
    const base = [weekStart, r.athlete.name];
    if (!r.sessions.length) lines.push([...base, null, null, null, null, null, null, null, null, state(r.week), flags]);
    for (const s of r.sessions)
      lines.push([
        ...base,
        s.date,
        s.title,
        s.kind,
        r1(s.totalS / 60),
        r1(s.minutesByZone[0]),
        r1(s.minutesByZone[1]),
        r1(s.minutesByZone[2]),
        s.log,
        state(r.week),
        flags,
      ]);
  }
  return table(
    [
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
    ],
    lines,
  );
}
