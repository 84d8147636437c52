import "server-only";
import type { Actor } from "@/features/access/lib/rules";
import { listLogs } from "@/features/logs/server";
import { addDays } from "@/features/platform/lib/days";
import { HttpError } from "@/features/platform/server/http";
import { listSessions, sessionWithZones } from "@/features/planning/server";
import { getZones } from "@/features/zones/server";
import { csvOf, logsTable, planTable, zonesTable, type Table } from "../lib/csv";
import { toXlsx, XLSX_TYPE } from "../lib/xlsx";
import { encodeWorkout } from "../lib/fit-workout";
import type { Units } from "@/features/platform/lib/units";

export const EXPORT_FILES = ["plan.csv", "logs.csv", "zones.csv", "plan.xlsx", "logs.xlsx", "zones.xlsx"] as const;
export type ExportFile = (typeof EXPORT_FILES)[number];
/** At most three years in one file. */
export const MAX_EXPORT_DAYS = 1100;

export interface Download {
  filename: string;
  contentType: string;
  body: string | Uint8Array;
}

/** A table as the download its name asks for: CSV with a byte-order mark (spreadsheets then read UTF-8), or a workbook. */
export async function asDownload(
  basename: string,
  sheet: string,
  table: Table,
  format: "csv" | "xlsx",
): Promise<Download> {
  if (format === "xlsx")
    return { filename: `${basename}.xlsx`, contentType: XLSX_TYPE, body: await toXlsx([{ name: sheet, table }]) };
  return { filename: `${basename}.csv`, contentType: "text/csv; charset=utf-8", body: `\uFEFF${csvOf(table)}\r\n` };
}

export function downloadResponse(d: Download): Response {
  return new Response(d.body as BodyInit, {
    headers: {
      "content-type": d.contentType,
      "content-disposition": `attachment; filename="${d.filename}"`,
      "cache-control": "private, no-store",
    },
  });
}

/**
 * One athlete's plan, logs or zone history as CSV or .xlsx, for the athlete and their coaches (the same access as the
 * pages), distances and speeds in the reader's units. Defaults: the plan a year back and a year ahead, logs the last year.
 */
export async function exportFile(
  actor: Actor,
  athleteId: string,
  file: ExportFile,
  today: string,
  range: { from?: string; to?: string },
  units: Units = "metric",
): Promise<Download> {
  const [what, format] = file.split(".") as ["plan" | "logs" | "zones", "csv" | "xlsx"];
  if (what === "zones") {
    const zones = await getZones(actor, athleteId);
    return asDownload("tidemark-zone-history", "Zone history", zonesTable(zones.history, units), format);
  }
  const from = range.from ?? addDays(today, -365);
  const to = range.to ?? (what === "plan" ? addDays(today, 365) : today);
  if (from > to)
    throw new HttpError(400, "from must not be after to.", {
      fieldErrors: { from: ["Give a start on or before the end."] },
    });
  if (Date.parse(to) - Date.parse(from) > MAX_EXPORT_DAYS * 86_400_000)
    throw new HttpError(400, `Ask for at most ${MAX_EXPORT_DAYS} days in one file.`);
  if (what === "plan") {
    const sessions = await listSessions(actor, athleteId, from, to);
    return asDownload(`tidemark-plan-${from}-to-${to}`, "Plan", planTable(sessions), format);
  }
  const logs = await listLogs(actor, athleteId, from, to);
  return asDownload(`tidemark-logs-${from}-to-${to}`, "Logs", logsTable(logs, units), format);
}

/** A file name from a session's day and title: letters, digits and dashes only. */
function slug(s: string): string {
  return (
    s
      .normalize("NFKD")
      .replace(/[^\w\s-]/g, "")
      .trim()
      .replace(/[\s_-]+/g, "-")
      .toLowerCase()
      .slice(0, 40) || "session"
  );
}

/** A planned session as a FIT workout file, for the athlete and their coaches (the same access as the session). */
export async function workoutFile(actor: Actor, sessionId: string): Promise<Download> {
  const { session, zones } = await sessionWithZones(actor, sessionId);
  if (!session.structure.length)
    throw new HttpError(409, "This session has no steps to put on a watch: give it a structure first.");
  return {
    filename: `tidemark-${session.date}-${slug(session.title)}.fit`,
    contentType: "application/vnd.ant.fit",
    body: encodeWorkout({
      title: session.title,
      sport: session.sport,
      structure: session.structure,
      zones,
      createdAt: new Date(`${session.date}T00:00:00Z`),
    }),
  };
}
