import "server-only";
import { randomUUID } from "node:crypto";
import { desc, eq } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import type { ThresholdPair, ThresholdValues } from "@/features/zones/lib/thresholds";
import { requireAthleteAccess, requireAthleteAccessOrNotFound } from "@/features/access/server";
import type { Actor } from "@/features/access/lib/rules";
import { estimateVo2Max } from "@/features/field-tests/lib/submax";
import { analyzeRead, DEFAULT_MRT_S, valuesAt } from "@/features/gas-exchange/lib/analyze";
import type { ColumnMapping, UnitChoices } from "@/features/gas-exchange/lib/csv";
import { readGasExchangeFile } from "@/features/gas-exchange/lib/workbook";
import { fromRows, gasExchangeRecord, talkTestRecord, type PointRow } from "../lib/records";
import { fuelProfile } from "@/features/physiology/lib/fuel";
import { HttpError, notFound } from "@/features/platform/server/http";
import { saveZoneSetForTest, zonesFor, zoneSetView, type ZoneSetView } from "@/features/zones/server";
import type { z } from "zod";
import type { JsonTestInput, segmentSchema, testMetaSchema, ThresholdPatch } from "../schemas";
import type { TestView } from "../lib/views";
import { requireTestAllowed } from "./screening";

type Meta = z.infer<typeof testMetaSchema>;

async function profileMass(athleteId: string): Promise<number | null> {
  const [p] = await getDb()
    .select({ m: schema.athleteProfile.bodyMassKg })
    .from(schema.athleteProfile)
    .where(eq(schema.athleteProfile.userId, athleteId));
  return p?.m ?? null;
}

const hasBoth = (p: ThresholdPair) => p.vt1 !== null && p.vt2 !== null;

/** A gas-exchange upload: analysed, stored with its file and, when both thresholds were found, a zone set. One transaction. */
export async function createGasExchangeTest(
  actor: Actor,
  athleteId: string,
  meta: Meta & {
    mapping?: ColumnMapping;
    bodyMassKg?: number | null;
    fiveZones?: boolean;
    units?: UnitChoices;
    segment?: { fromS?: number | null; toS?: number | null };
    sheet?: string | null;
  },
  file: { name: string; type: string; bytes: Uint8Array },
) {
  await requireAthleteAccess(actor, athleteId, "coach");
  // Readiness first: a missing, expired or blocking screening stops the test before anything is read.
  await requireTestAllowed(athleteId, "gas_exchange");
  if (file.bytes.length === 0) throw new HttpError(400, "The file is empty.");
  const mass = meta.bodyMassKg ?? (await profileMass(athleteId));
  const read = await readGasExchangeFile(file.bytes, meta.mapping, {
    bodyMassKg: mass,
    units: meta.units,
    sheet: meta.sheet,
  });
  const a = analyzeRead(read, { bodyMassKg: mass, segment: meta.segment });
  if (!a.ok) throw new HttpError(/binary|\.xls\)/.test(a.error) ? 415 : 422, a.error, { headers: a.headers });
  const { detected, result } = gasExchangeRecord(a, mass);
  const id = randomUUID();
  await getDb().transaction(async (tx) => {
    await tx.insert(schema.athleteTest).values({
      id,
      athleteId,
      kind: "gas_exchange",
      sport: meta.sport,
      protocol: meta.protocol,
      testDate: meta.date,
      endedBy: meta.endedBy,
      stopSign: meta.stopSign ?? null,
      bodyMassKg: mass,
      input: {
        mapping: meta.mapping ?? {},
        units: meta.units ?? {},
        segment: meta.segment ?? null,
        sheet: meta.sheet ?? null,
        filename: file.name,
        fiveZones: meta.fiveZones ?? false,
      },
      result,
      detected,
      createdBy: actor.userId,
    });
    await tx.insert(schema.testFile).values({
      testId: id,
      filename: file.name.slice(0, 200),
      contentType: file.type || "text/csv",
      sizeBytes: file.bytes.length,
      data: Buffer.from(file.bytes),
    });
    if (hasBoth(detected)) {
      await saveZoneSetForTest(tx, {
        athleteId,
        sport: meta.sport,
        testId: id,
        effectiveFrom: meta.date,
        vt1: detected.vt1!,
        vt2: detected.vt2!,
        five: meta.fiveZones ?? false,
        source: "gas-exchange test (detected)",
        createdBy: actor.userId,
      });
    }
  });
  return { id, detected, warnings: a.warnings, vt1Reason: a.vt1Reason, vt2Reason: a.vt2Reason };
}

/** Talk tests, submaximal estimates and thresholds entered by hand. One transaction. */
export async function createJsonTest(actor: Actor, athleteId: string, input: JsonTestInput) {
  await requireAthleteAccess(actor, athleteId, "coach");
  await requireTestAllowed(athleteId, input.kind);
  const id = randomUUID();
  let detected: ThresholdPair = { vt1: null, vt2: null };
  let result: Record<string, unknown>;
  let stored: Record<string, unknown>;
  let five = false;
  if (input.kind === "talk") {
    ({ detected, result } = talkTestRecord(input.talk));
    stored = { talk: input.talk };
    five = input.fiveZones ?? false;
  } else if (input.kind === "submax") {
    const r = estimateVo2Max(input.submax);
    result = { kind: "submax", ...r };
    stored = { submax: input.submax };
  } else {
    detected = { vt1: input.vt1, vt2: input.vt2 };
    zonesFor(input.vt1, input.vt2);
    result = { kind: "manual", warnings: [] };
    stored = {};
    five = input.fiveZones ?? false;
  }
  await getDb().transaction(async (tx) => {
    await tx.insert(schema.athleteTest).values({
      id,
      athleteId,
      kind: input.kind,
      sport: input.meta.sport,
      protocol: input.meta.protocol,
      testDate: input.meta.date,
      endedBy: input.meta.endedBy,
      stopSign: input.meta.stopSign ?? null,
      input: { ...stored, fiveZones: five },
      result,
      detected,
      createdBy: actor.userId,
    });
    if (hasBoth(detected)) {
      await saveZoneSetForTest(tx, {
        athleteId,
        sport: input.meta.sport,
        testId: id,
        effectiveFrom: input.meta.date,
        vt1: detected.vt1!,
        vt2: detected.vt2!,
        five,
        source: input.kind === "talk" ? "talk test" : "thresholds entered by hand",
        createdBy: actor.userId,
      });
    }
  });
  return { id, detected, result };
}

async function loadTest(actor: Actor, testId: string) {
  const [row] = await getDb().select().from(schema.athleteTest).where(eq(schema.athleteTest.id, testId));
  if (!row) throw notFound("No such test.");
  await requireAthleteAccessOrNotFound(actor, row.athleteId, "view", "No such test.");
  return row;
}

export async function getTest(actor: Actor, testId: string): Promise<TestView> {
  const row = await loadTest(actor, testId);
  const db = getDb();
  const [athlete] = await db
    .select({ name: schema.user.name })
    .from(schema.user)
    .where(eq(schema.user.id, row.athleteId));
  const [adjuster] = row.adjustedBy
    ? await db.select({ name: schema.user.name }).from(schema.user).where(eq(schema.user.id, row.adjustedBy))
    : [];
  const [zs] = await db.select().from(schema.zoneSet).where(eq(schema.zoneSet.testId, row.id));
  const [file] = await db
    .select({ filename: schema.testFile.filename, sizeBytes: schema.testFile.sizeBytes })
    .from(schema.testFile)
    .where(eq(schema.testFile.testId, row.id));
  const zoneSet: ZoneSetView | null = zs ? zoneSetView(zs) : null;
  let fuel = null;
  if (row.kind === "gas_exchange") {
    const points = fromRows((row.result.points as PointRow[]) ?? []);
    const peak = row.result.peak as { vo2MlMin: number } | undefined;
    const onset = Number(row.result.onsetS ?? 0),
      end = Number(row.result.endS ?? Infinity);
    fuel = fuelProfile(
      points.filter((p) => p.timeS >= onset && p.timeS <= end),
      { vo2PeakMlMin: peak?.vo2MlMin },
    );
  }
  return {
    id: row.id,
    athleteId: row.athleteId,
    athleteName: athlete?.name ?? "",
    kind: row.kind,
    sport: row.sport,
    protocol: row.protocol,
    date: row.testDate,
    endedBy: row.endedBy,
    stopSign: row.stopSign,
    bodyMassKg: row.bodyMassKg,
    input: row.input,
    result: row.result,
    detected: row.detected,
    adjusted: row.adjusted,
    adjustedBy: adjuster?.name ?? null,
    adjustedAt: row.adjustedAt,
    effective: row.adjusted ?? row.detected,
    zoneSet,
    fuel,
    file: file ?? null,
  };
}

export type { TestView };

export async function listTests(actor: Actor, athleteId: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  return getDb()
    .select({
      id: schema.athleteTest.id,
      kind: schema.athleteTest.kind,
      sport: schema.athleteTest.sport,
      protocol: schema.athleteTest.protocol,
      date: schema.athleteTest.testDate,
      adjustedAt: schema.athleteTest.adjustedAt,
    })
    .from(schema.athleteTest)
    .where(eq(schema.athleteTest.athleteId, athleteId))
    .orderBy(desc(schema.athleteTest.testDate), desc(schema.athleteTest.createdAt));
}

/** A coach moves the thresholds: the detected values stay, the adjusted ones and the zone set change. One transaction. */
export async function adjustThresholds(actor: Actor, testId: string, patch: ThresholdPatch) {
  const row = await loadTest(actor, testId);
  await requireAthleteAccess(actor, row.athleteId, "coach");
  const points = row.kind === "gas_exchange" ? fromRows((row.result.points as PointRow[]) ?? []) : [];
  const resolve = (p: ThresholdPatch["vt1"]): ThresholdValues | null => {
    if (p === null) return null;
    if ("timeS" in p) {
      if (!points.length)
        throw new HttpError(
          400,
          "Only gas-exchange tests take a threshold time; give heart rate, power or speed instead.",
        );
      const v = valuesAt(points, p.timeS, row.bodyMassKg, Number(row.result.meanResponseTimeS ?? DEFAULT_MRT_S));
      return {
        timeS: v.timeS,
        vo2MlMin: v.vo2MlMin,
        hrBpm: v.hrBpm,
        powerW: v.steadyPowerW ?? v.powerW,
        speedKmh: v.steadySpeedKmh ?? v.speedKmh,
        rampPowerW: v.powerW,
        rampSpeedKmh: v.speedKmh,
      };
    }
    return { hrBpm: p.hrBpm ?? null, powerW: p.powerW ?? null, speedKmh: p.speedKmh ?? null };
  };
  const adjusted: ThresholdPair = { vt1: resolve(patch.vt1), vt2: resolve(patch.vt2) };
  if (adjusted.vt1?.timeS != null && adjusted.vt2?.timeS != null && adjusted.vt1.timeS >= adjusted.vt2.timeS) {
    throw new HttpError(400, "VT1 must come before VT2.", { fieldErrors: { vt1: ["VT1 must come before VT2."] } });
  }
  const five = patch.fiveZones ?? Boolean(row.input.fiveZones);
  await getDb().transaction(async (tx) => {
    await tx
      .update(schema.athleteTest)
      .set({ adjusted, adjustedBy: actor.userId, adjustedAt: new Date(), input: { ...row.input, fiveZones: five } })
      .where(eq(schema.athleteTest.id, testId));
    if (hasBoth(adjusted)) {
      await saveZoneSetForTest(tx, {
        athleteId: row.athleteId,
        sport: row.sport,
        testId,
        effectiveFrom: row.testDate,
        vt1: adjusted.vt1!,
        vt2: adjusted.vt2!,
        five,
        source: `${row.kind === "gas_exchange" ? "gas-exchange test" : row.kind === "talk" ? "talk test" : "thresholds by hand"} (adjusted)`,
        createdBy: actor.userId,
      });
    }
  });
  return getTest(actor, testId);
}

/**
 * The coach sets the test segment by hand (or gives it back to the finder with nulls): the stored file is read again with
 * the same columns and units and the engine searches the thresholds inside the new segment. The detection, the segment and
 * the test's zone set change together; thresholds a coach had moved belong to the old segment and are cleared. One
 * transaction.
 */
export async function resegmentTest(actor: Actor, testId: string, segment: z.infer<typeof segmentSchema>) {
  const row = await loadTest(actor, testId);
  await requireAthleteAccess(actor, row.athleteId, "coach");
  if (row.kind !== "gas_exchange") throw new HttpError(400, "Only gas-exchange tests have a test segment.");
  const [file] = await getDb().select().from(schema.testFile).where(eq(schema.testFile.testId, row.id));
  if (!file)
    throw new HttpError(409, "This test's file is not stored, so it cannot be analysed again; upload it once more.");
  const input = row.input as {
    mapping?: ColumnMapping;
    units?: UnitChoices;
    sheet?: string | null;
    fiveZones?: boolean;
  };
  const mass = row.bodyMassKg ?? null;
  const read = await readGasExchangeFile(new Uint8Array(file.data), input.mapping, {
    bodyMassKg: mass,
    units: input.units,
    sheet: input.sheet ?? null,
  });
  const chosen = { fromS: segment.fromS ?? null, toS: segment.toS ?? null };
  const a = analyzeRead(read, { bodyMassKg: mass, segment: chosen });
  if (!a.ok) throw new HttpError(422, a.error);
  const { detected, result } = gasExchangeRecord(a, mass);
  const five = Boolean(input.fiveZones);
  await getDb().transaction(async (tx) => {
    await tx
      .update(schema.athleteTest)
      .set({
        result,
        detected,
        adjusted: null,
        adjustedBy: null,
        adjustedAt: null,
        input: { ...row.input, segment: chosen.fromS === null && chosen.toS === null ? null : chosen },
      })
      .where(eq(schema.athleteTest.id, testId));
    if (hasBoth(detected)) {
      await saveZoneSetForTest(tx, {
        athleteId: row.athleteId,
        sport: row.sport,
        testId,
        effectiveFrom: row.testDate,
        vt1: detected.vt1!,
        vt2: detected.vt2!,
        five,
        source: "gas-exchange test (detected in a segment set by a coach)",
        createdBy: actor.userId,
      });
    } else {
      // Without both thresholds the old zone set would describe a segment the coach has just rejected.
      await tx.delete(schema.zoneSet).where(eq(schema.zoneSet.testId, testId));
    }
  });
  return getTest(actor, testId);
}

export async function getTestFile(actor: Actor, testId: string) {
  const row = await loadTest(actor, testId);
  const [file] = await getDb().select().from(schema.testFile).where(eq(schema.testFile.testId, row.id));
  if (!file) throw notFound("This test has no stored file.");
  return file;
}
