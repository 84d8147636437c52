import "server-only";
import { createHash, randomUUID } from "node:crypto";
import { and, eq, isNull } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { requireAthleteAccess } from "@/features/access/server";
import type { Actor } from "@/features/access/lib/rules";
import { banisterTrimp, edwardsTrimp } from "@/features/load/lib/load";
import { localDate } from "@/features/platform/lib/dates";
import { HttpError } from "@/features/platform/server/http";
import { zoneSetInForce } from "@/features/zones/lib/zones";
import { zoneSetsOf } from "@/features/zones/server";
import { ActivityError, readActivity, type Sport } from "../lib/read";
import { chooseMeasure, matchPlanned, summarise, toStreams, zoneTime } from "../lib/streams";

export interface ImportResult {
  logId: string;
  fileId: string;
  matchedSessionId: string | null;
  date: string;
  sport: string;
  format: string;
  summary: ReturnType<typeof summarise>;
  timeInZone: { measure: string; minutesByZone: [number, number, number]; zoneSetId: string } | null;
  trimp: { value: number; method: "banister" | "edwards" } | null;
  warnings: string[];
}

/** 409 with the log that already holds this file. */
async function duplicateError(athleteId: string, contentHash: string): Promise<HttpError> {
  const [row] = await getDb()
    .select({
      logId: schema.sessionLog.id,
      date: schema.sessionLog.date,
      title: schema.sessionLog.title,
      filename: schema.activityFile.filename,
    })
    .from(schema.activityFile)
    .innerJoin(schema.sessionLog, eq(schema.sessionLog.id, schema.activityFile.logId))
    .where(and(eq(schema.activityFile.athleteId, athleteId), eq(schema.activityFile.contentHash, contentHash)));
  return new HttpError(
    409,
    row
      ? `This file was already imported: it is the log "${row.title}" of ${row.date}. Nothing was added.`
      : "This file is being imported already. Nothing was added.",
    {
      existingLog: row ? { id: row.logId, date: row.date, title: row.title, filename: row.filename } : null,
    },
  );
}

async function refuseDuplicate(athleteId: string, contentHash: string): Promise<void> {
  const [row] = await getDb()
    .select({ id: schema.activityFile.id })
    .from(schema.activityFile)
    .where(and(eq(schema.activityFile.athleteId, athleteId), eq(schema.activityFile.contentHash, contentHash)));
  if (row) throw await duplicateError(athleteId, contentHash);
}

/**
 * Imports an activity file (once per athlete: the same bytes again answer 409 with the log that holds them): reads it, builds 1 Hz streams, computes time in zone with the zone set in force on its day,
 * attaches it to the planned session of that day (the one given, or same sport and nearest duration) or logs it as
 * unplanned, and keeps the file. Nothing is written unless everything worked (one transaction).
 */
export async function importActivity(
  actor: Actor,
  athleteId: string,
  file: { name: string; bytes: Uint8Array },
  sessionId?: string,
): Promise<ImportResult> {
  await requireAthleteAccess(actor, athleteId, "edit");
  const contentHash = createHash("sha256").update(file.bytes).digest("hex");
  await refuseDuplicate(athleteId, contentHash);
  let activity;
  try {
    activity = readActivity(file.name, file.bytes);
  } catch (e) {
    if (e instanceof ActivityError) throw new HttpError(400, `The file could not be used: ${e.message}`);
    throw e;
  }
  const db = getDb();
  const [profile] = await db.select().from(schema.athleteProfile).where(eq(schema.athleteProfile.userId, athleteId));
  const timeZone = profile?.timeZone ?? "UTC";
  const date = localDate(activity.startTime ?? new Date(), timeZone);
  const streams = toStreams(activity.samples);
  const summary = summarise(activity.samples, streams);
  const warnings = [...activity.warnings];

  const dayRows = await db
    .select({
      id: schema.plannedSession.id,
      sport: schema.plannedSession.sport,
      totalS: schema.plannedSession.totalS,
      title: schema.plannedSession.title,
      logId: schema.sessionLog.id,
      fileId: schema.activityFile.id,
    })
    .from(schema.plannedSession)
    .leftJoin(schema.sessionLog, eq(schema.sessionLog.plannedSessionId, schema.plannedSession.id))
    .leftJoin(schema.activityFile, eq(schema.activityFile.logId, schema.sessionLog.id))
    .where(and(eq(schema.plannedSession.athleteId, athleteId), eq(schema.plannedSession.date, date)));
  let matched: (typeof dayRows)[number] | null = null;
  if (sessionId) {
    const [row] = await db
      .select()
      .from(schema.plannedSession)
      .where(and(eq(schema.plannedSession.id, sessionId), eq(schema.plannedSession.athleteId, athleteId)));
    if (!row)
      throw new HttpError(400, "That planned session is not this athlete's.", {
        fieldErrors: { sessionId: ["No such session for this athlete."] },
      });
    const [log] = await db
      .select({ id: schema.sessionLog.id })
      .from(schema.sessionLog)
      .where(eq(schema.sessionLog.plannedSessionId, row.id));
    matched = {
      id: row.id,
      sport: row.sport,
      totalS: row.totalS,
      title: row.title,
      logId: log?.id ?? null,
      fileId: null,
    };
  } else {
    const open = dayRows.filter((r) => !r.fileId);
    const id = matchPlanned(open, activity.sport, summary.elapsedS);
    matched = open.find((r) => r.id === id) ?? null;
  }
  const sport: Sport = (activity.sport ??
    (matched?.sport as Sport | undefined) ??
    (profile?.sports[0] as Sport | undefined) ??
    "running") as Sport;

  const sets = (await zoneSetsOf(athleteId)).filter((z) => z.sport === sport);
  const zones = zoneSetInForce(sets, date);
  let timeInZone: ImportResult["timeInZone"] = null;
  if (!zones)
    warnings.push(`No ${sport.replaceAll("_", " ")} zone set was in force on ${date}: time in zone was not computed.`);
  else {
    const measure = chooseMeasure(summary.channels, zones.vt1, zones.vt2);
    if (!measure)
      warnings.push(
        "The file and the zone set share no measure (heart rate, power or speed): time in zone was not computed.",
      );
    else {
      const z = zoneTime(streams, measure, zones.vt1[measure]!, zones.vt2[measure]!);
      timeInZone = { measure, minutesByZone: z.minutesByZone, zoneSetId: zones.id };
      if (z.secondsWithoutData > 60)
        warnings.push(
          `${Math.round(z.secondsWithoutData / 60)} min without ${measure === "hrBpm" ? "heart rate" : measure === "powerW" ? "power" : "speed"} are not counted in any zone.`,
        );
    }
  }

  // One TRIMP method per athlete, kept from the first TRIMP computed: Banister's (Banister 1991; needs resting and
  // maximal heart rate and sex) or Edwards' (Edwards 1993; needs maximal heart rate). The two scales differ (60 min at
  // 150 of 190 bpm is about 100 in one and 180 in the other), so a week never adds up both.
  let trimp: ImportResult["trimp"] = null;
  let fixMethod: "banister" | "edwards" | null = null;
  if (summary.hrAvgBpm !== null && profile?.maxHrBpm) {
    const method =
      (profile.trimpMethod as "banister" | "edwards" | null) ??
      (profile.restingHrBpm && profile.sex ? "banister" : "edwards");
    if (!profile.trimpMethod) fixMethod = method;
    if (method === "banister") {
      if (profile.restingHrBpm && profile.sex) {
        trimp = {
          value: banisterTrimp({
            minutes: summary.recordedS / 60,
            hrAvgBpm: summary.hrAvgBpm,
            hrRestBpm: profile.restingHrBpm,
            hrMaxBpm: profile.maxHrBpm,
            sex: profile.sex,
          }),
          method,
        };
      } else
        warnings.push(
          "This athlete's TRIMP is Banister's, which needs resting heart rate and sex in the profile: TRIMP was not computed.",
        );
    } else {
      trimp = {
        value: edwardsTrimp(
          Array.from(streams.hrBpm, (v) => (Number.isNaN(v) ? null : v)),
          profile.maxHrBpm,
        ),
        method,
      };
    }
  } else if (summary.hrAvgBpm !== null) warnings.push("No maximal heart rate in the profile: TRIMP was not computed.");

  const measured = {
    measuredMinByZone: timeInZone?.minutesByZone ?? null,
    zoneMeasure: timeInZone?.measure ?? null,
    zoneSetId: timeInZone?.zoneSetId ?? null,
    hrAvgBpm: summary.hrAvgBpm,
    powerAvgW: summary.powerAvgW,
    speedAvgKmh: summary.speedAvgKmh,
    trimp: trimp?.value ?? null,
    trimpMethod: trimp?.method ?? null,
  };
  const durationMin = Math.round((summary.elapsedS / 60) * 10) / 10;
  const distanceKm = summary.distanceKm !== null ? Math.round(summary.distanceKm * 100) / 100 : null;
  const fileId = randomUUID();
  let logId = "";
  await db.transaction(async (tx) => {
    // The first TRIMP fixes the athlete's method (only if none was fixed meanwhile).
    if (fixMethod)
      await tx
        .update(schema.athleteProfile)
        .set({ trimpMethod: fixMethod })
        .where(and(eq(schema.athleteProfile.userId, athleteId), isNull(schema.athleteProfile.trimpMethod)));
    if (matched?.logId) {
      logId = matched.logId;
      const [existing] = await tx.select().from(schema.sessionLog).where(eq(schema.sessionLog.id, logId));
      await tx
        .update(schema.sessionLog)
        .set({
          ...measured,
          durationMin: existing?.durationMin ?? durationMin,
          distanceKm: existing?.distanceKm ?? distanceKm,
          ...(existing?.status === "skipped" ? { status: "done" as const, skipReason: null } : {}),
        })
        .where(eq(schema.sessionLog.id, logId));
    } else {
      logId = randomUUID();
      await tx.insert(schema.sessionLog).values({
        id: logId,
        athleteId,
        plannedSessionId: matched?.id ?? null,
        date,
        sport,
        title: matched?.title ?? `${sport[0]!.toUpperCase()}${sport.slice(1).replaceAll("_", " ")} (from file)`,
        status: "done",
        durationMin,
        distanceKm,
        loggedBy: actor.userId,
        ...measured,
      });
    }
    const inserted = await tx
      .insert(schema.activityFile)
      .values({
        id: fileId,
        athleteId,
        logId,
        filename: file.name.slice(0, 200),
        format: activity.format,
        sizeBytes: file.bytes.length,
        startTime: activity.startTime,
        summary: { ...summary, warnings, trimpMethod: trimp?.method ?? null },
        data: Buffer.from(file.bytes),
        contentHash,
        uploadedBy: actor.userId,
      })
      .onConflictDoNothing()
      .returning({ id: schema.activityFile.id });
    // The same file arrived twice at once: the other upload won; this one writes nothing (the log above rolls back).
    if (!inserted.length) throw await duplicateError(athleteId, contentHash);
  });
  return {
    logId,
    fileId,
    matchedSessionId: matched?.id ?? null,
    date,
    sport,
    format: activity.format,
    summary,
    timeInZone,
    trimp,
    warnings,
  };
}
