import "server-only";
import type { Actor } from "@/features/access/lib/rules";
import { listLogs } from "@/features/logs/server";
import { addDays } from "@/features/platform/lib/days";
import { HttpError } from "@/features/platform/server/http";
import { listSessions } from "@/features/planning/server";
import { getZones } from "@/features/zones/server";
import { logsCsv, planCsv, zonesCsv } from "../lib/csv";

export const EXPORT_FILES = ["plan.csv", "logs.csv", "zones.csv"] as const;
export type ExportFile = (typeof EXPORT_FILES)[number];
/** At most three years in one file. */
export const MAX_EXPORT_DAYS = 1100;

/**
 * One athlete's plan, logs or zone history as CSV, for the athlete and their coaches (the same access as the pages).
 * Defaults: the plan a year back and a year ahead, logs the last year.
 */
export async function exportCsv(
  actor: Actor,
  athleteId: string,
  file: ExportFile,
  today: string,
  range: { from?: string; to?: string },
): Promise<{ filename: string; csv: string }> {
  if (file === "zones.csv") {
    const zones = await getZones(actor, athleteId);
    return { filename: "tidemark-zone-history.csv", csv: zonesCsv(zones.history) };
  }
  const from = range.from ?? addDays(today, -365);
  const to = range.to ?? (file === "plan.csv" ? addDays(today, 365) : today);
  if (from > to)
    throw new HttpError(400, "from must not be after to.", {
      fieldErrors: { from: ["Give a start on or before the end."] },
    });
  if (Date.parse(to) - Date.parse(from) > MAX_EXPORT_DAYS * 86_400_000)
    throw new HttpError(400, `Ask for at most ${MAX_EXPORT_DAYS} days in one file.`);
  if (file === "plan.csv") {
    const sessions = await listSessions(actor, athleteId, from, to);
    return { filename: `tidemark-plan-${from}-to-${to}.csv`, csv: planCsv(sessions) };
  }
  const logs = await listLogs(actor, athleteId, from, to);
  return { filename: `tidemark-logs-${from}-to-${to}.csv`, csv: logsCsv(logs) };
}
