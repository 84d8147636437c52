/**
 * Reads recorded activity files into timestamped samples of heart rate, power, speed and distance.
 * FIT through the FIT SDK's own decoder (`@garmin/fitsdk`, integrity checked first), TCX and GPX through `fast-xml-parser`
 * (entity expansion off), CSV through papaparse. Anything that cannot be read is refused with an {@link ActivityError} whose
 * message says what is wrong; nothing half-read is returned.
 */
import { Decoder, Stream } from "@garmin/fitsdk";
import { XMLParser } from "fast-xml-parser";
import Papa from "papaparse";
import { SPORTS } from "@/features/platform/lib/sports";

export type Sport = (typeof SPORTS)[number];
export type ActivityFormat = "fit" | "tcx" | "gpx" | "csv";

export const MAX_ACTIVITY_BYTES = 25 * 1024 * 1024;
/** A longer span is refused: no endurance session lasts two days, and the 1 Hz streams must stay bounded. */
export const MAX_SPAN_S = 48 * 3600;

export class ActivityError extends Error {}

/** Column-oriented samples: seconds from the first sample, NaN where a channel has no value. */
export interface Samples {
  timeS: Float64Array;
  hrBpm: Float64Array;
  powerW: Float64Array;
  speedKmh: Float64Array;
  distanceM: Float64Array;
  length: number;
}

export interface Activity {
  format: ActivityFormat;
  sport: Sport | null;
  startTime: Date | null;
  samples: Samples;
  warnings: string[];
}

function newSamples(n: number): Samples {
  return {
    timeS: new Float64Array(n),
    hrBpm: new Float64Array(n).fill(NaN),
    powerW: new Float64Array(n).fill(NaN),
    speedKmh: new Float64Array(n).fill(NaN),
    distanceM: new Float64Array(n).fill(NaN),
    length: 0,
  };
}

const num = (v: unknown): number => {
  if (typeof v === "number") return Number.isFinite(v) ? v : NaN;
  if (typeof v === "string" && v.trim() !== "") {
    const x = Number(v.trim().replace(",", "."));
    return Number.isFinite(x) ? x : NaN;
  }
  return NaN;
};

/** Plausible ranges (common practice); values outside become gaps with a warning. */
const RANGES = { hrBpm: [25, 250], powerW: [0, 2500], speedKmh: [0, 120], distanceM: [0, 2_000_000] } as const;

function sanitise(s: Samples, warnings: string[]): void {
  for (const key of ["hrBpm", "powerW", "speedKmh", "distanceM"] as const) {
    const [lo, hi] = RANGES[key];
    const arr = s[key];
    let dropped = 0;
    for (let i = 0; i < s.length; i++) {
      const v = arr[i]!;
      if (!Number.isNaN(v) && (v < lo || v > hi)) {
        arr[i] = NaN;
        dropped++;
      }
    }
    if (dropped)
      warnings.push(
        `${dropped} ${key === "hrBpm" ? "heart-rate" : key === "powerW" ? "power" : key === "speedKmh" ? "speed" : "distance"} value(s) outside the plausible range were dropped.`,
      );
  }
}

function finish(
  format: ActivityFormat,
  sport: Sport | null,
  startTime: Date | null,
  s: Samples,
  warnings: string[],
): Activity {
  if (s.length === 0) throw new ActivityError("The file holds no samples with a time stamp.");
  for (let i = 1; i < s.length; i++) {
    if (s.timeS[i]! < s.timeS[i - 1]!)
      throw new ActivityError("The samples are not in time order; the file looks damaged.");
  }
  if (s.timeS[s.length - 1]! - s.timeS[0]! > MAX_SPAN_S)
    throw new ActivityError("The file spans more than 48 hours; it is not one session.");
  sanitise(s, warnings);
  let any = false;
  for (let i = 0; i < s.length && !any; i++)
    any =
      !Number.isNaN(s.hrBpm[i]!) ||
      !Number.isNaN(s.powerW[i]!) ||
      !Number.isNaN(s.speedKmh[i]!) ||
      !Number.isNaN(s.distanceM[i]!);
  if (!any) throw new ActivityError("The file has time stamps but no heart rate, power, speed or distance.");
  return { format, sport, startTime, samples: s, warnings };
}

// ---------------------------------------------------------------------------------------------------------------------
// FIT

const FIT_SPORTS: Record<string, Sport> = {
  running: "running",
  cycling: "cycling",
  eBiking: "cycling",
  swimming: "swimming",
  rowing: "rowing",
  crossCountrySkiing: "cross_country_skiing",
  walking: "walking",
  hiking: "walking",
  multisport: "triathlon",
};

export function isFit(bytes: Uint8Array): boolean {
  return bytes.length >= 12 && bytes[8] === 0x2e && bytes[9] === 0x46 && bytes[10] === 0x49 && bytes[11] === 0x54;
}

export function readFit(bytes: Uint8Array): Activity {
  const stream = Stream.fromByteArray(bytes);
  if (!Decoder.isFIT(stream)) throw new ActivityError("This is not a FIT file (its header is missing).");
  const decoder = new Decoder(Stream.fromByteArray(bytes));
  if (!decoder.checkIntegrity())
    throw new ActivityError("The FIT file is damaged or cut short: its checksum does not match.");
  let messages;
  try {
    const read = new Decoder(Stream.fromByteArray(bytes)).read({
      applyScaleAndOffset: true,
      expandComponents: true,
      convertTypesToStrings: true,
      convertDateTimesToDates: true,
      mergeHeartRates: true,
    });
    if (read.errors.length) throw new ActivityError(`The FIT file could not be read: ${read.errors[0]!.message}`);
    messages = read.messages;
  } catch (e) {
    if (e instanceof ActivityError) throw e;
    throw new ActivityError(`The FIT file could not be read: ${(e as Error).message}`);
  }
  const records = (messages.recordMesgs ?? []) as Record<string, unknown>[];
  const warnings: string[] = [];
  const s = newSamples(records.length);
  let t0 = NaN,
    n = 0;
  for (const r of records) {
    const ts = r.timestamp instanceof Date ? r.timestamp.getTime() / 1000 : NaN;
    if (Number.isNaN(ts)) continue;
    if (Number.isNaN(t0)) t0 = ts;
    s.timeS[n] = ts - t0;
    s.hrBpm[n] = num(r.heartRate);
    s.powerW[n] = num(r.power);
    const speed = num(r.enhancedSpeed ?? r.speed);
    s.speedKmh[n] = Number.isNaN(speed) ? NaN : speed * 3.6;
    s.distanceM[n] = num(r.distance);
    n++;
  }
  s.length = n;
  if (records.length > n) warnings.push(`${records.length - n} record(s) without a time stamp were skipped.`);
  const sessionMesg = ((messages.sessionMesgs ?? []) as Record<string, unknown>[])[0];
  const sportName = (sessionMesg?.sport ?? ((messages.sportMesgs ?? []) as Record<string, unknown>[])[0]?.sport) as
    string | undefined;
  const sport = sportName ? (FIT_SPORTS[sportName] ?? null) : null;
  const start = Number.isNaN(t0) ? null : new Date(t0 * 1000);
  return finish("fit", sport, start, s, warnings);
}

// ---------------------------------------------------------------------------------------------------------------------
// TCX and GPX

const xml = new XMLParser({
  ignoreAttributes: false,
  attributeNamePrefix: "@",
  removeNSPrefix: true,
  processEntities: false,
  parseTagValue: false,
  isArray: (name) => ["Activity", "Lap", "Track", "Trackpoint", "trk", "trkseg", "trkpt"].includes(name),
});

function parseXml(text: string): Record<string, unknown> {
  try {
    const doc = xml.parse(text, true) as Record<string, unknown>;
    return doc;
  } catch (e) {
    throw new ActivityError(`The file is not well-formed XML: ${(e as Error).message.split("\n")[0]}`);
  }
}

const asArray = <T>(v: T | T[] | undefined): T[] => (v === undefined ? [] : Array.isArray(v) ? v : [v]);
const text = (v: unknown): string | undefined =>
  typeof v === "string"
    ? v
    : typeof v === "number"
      ? String(v)
      : v && typeof v === "object" && "#text" in v
        ? String((v as { "#text": unknown })["#text"])
        : undefined;

function epochS(iso: string | undefined): number {
  if (!iso) return NaN;
  const t = Date.parse(iso);
  return Number.isNaN(t) ? NaN : t / 1000;
}

const TCX_SPORTS: Record<string, Sport> = { Running: "running", Biking: "cycling" };

export function readTcx(content: string): Activity {
  const doc = parseXml(content);
  if (!("TrainingCenterDatabase" in doc))
    throw new ActivityError("This XML file is not a TCX file (no TrainingCenterDatabase element).");
  const db = (doc.TrainingCenterDatabase || {}) as Record<string, unknown>;
  const activity = asArray(
    (db.Activities as Record<string, unknown> | undefined)?.Activity as Record<string, unknown>[],
  )[0];
  if (!activity) throw new ActivityError("The TCX file holds no activity.");
  const points: Record<string, unknown>[] = [];
  for (const lap of asArray(activity.Lap as Record<string, unknown>[]))
    for (const track of asArray(lap.Track as Record<string, unknown>[]))
      points.push(...asArray(track.Trackpoint as Record<string, unknown>[]));
  const s = newSamples(points.length);
  const warnings: string[] = [];
  let t0 = NaN,
    n = 0;
  for (const p of points) {
    const ts = epochS(text(p.Time));
    if (Number.isNaN(ts)) continue;
    if (Number.isNaN(t0)) t0 = ts;
    s.timeS[n] = ts - t0;
    s.hrBpm[n] = num(text((p.HeartRateBpm as Record<string, unknown> | undefined)?.Value));
    s.distanceM[n] = num(text(p.DistanceMeters));
    const ext = (p.Extensions as Record<string, unknown> | undefined)?.TPX as Record<string, unknown> | undefined;
    const speed = num(text(ext?.Speed));
    s.speedKmh[n] = Number.isNaN(speed) ? NaN : speed * 3.6;
    s.powerW[n] = num(text(ext?.Watts));
    n++;
  }
  s.length = n;
  if (points.length > n) warnings.push(`${points.length - n} track point(s) without a valid time were skipped.`);
  fillSpeedFromDistance(s);
  const sport = TCX_SPORTS[String(activity["@Sport"] ?? "")] ?? null;
  return finish("tcx", sport, Number.isNaN(t0) ? null : new Date(t0 * 1000), s, warnings);
}

const EARTH_RADIUS_M = 6_371_008.8; // mean Earth radius (IUGG)

/** Great-circle distance by the haversine formula. */
export function haversineM(lat1: number, lon1: number, lat2: number, lon2: number): number {
  const rad = Math.PI / 180;
  const dLat = (lat2 - lat1) * rad,
    dLon = (lon2 - lon1) * rad;
  const a = Math.sin(dLat / 2) ** 2 + Math.cos(lat1 * rad) * Math.cos(lat2 * rad) * Math.sin(dLon / 2) ** 2;
  return 2 * EARTH_RADIUS_M * Math.asin(Math.min(1, Math.sqrt(a)));
}

export function readGpx(content: string): Activity {
  const doc = parseXml(content);
  if (!("gpx" in doc)) throw new ActivityError("This XML file is not a GPX file (no gpx element).");
  const gpx = (doc.gpx || {}) as Record<string, unknown>;
  const tracks = asArray(gpx.trk as Record<string, unknown>[]);
  const points: Record<string, unknown>[] = [];
  for (const trk of tracks)
    for (const seg of asArray(trk.trkseg as Record<string, unknown>[]))
      points.push(...asArray(seg.trkpt as Record<string, unknown>[]));
  const s = newSamples(points.length);
  const warnings: string[] = [];
  let t0 = NaN,
    n = 0,
    dist = 0,
    lastLat = NaN,
    lastLon = NaN;
  for (const p of points) {
    const ts = epochS(text(p.time));
    if (Number.isNaN(ts)) continue;
    if (Number.isNaN(t0)) t0 = ts;
    s.timeS[n] = ts - t0;
    const lat = num(p["@lat"]),
      lon = num(p["@lon"]);
    if (!Number.isNaN(lat) && !Number.isNaN(lon) && Math.abs(lat) <= 90 && Math.abs(lon) <= 180) {
      if (!Number.isNaN(lastLat)) dist += haversineM(lastLat, lastLon, lat, lon);
      lastLat = lat;
      lastLon = lon;
      s.distanceM[n] = dist;
    }
    const ext = p.extensions as Record<string, unknown> | undefined;
    const tpe = ext?.TrackPointExtension as Record<string, unknown> | undefined;
    s.hrBpm[n] = num(text(tpe?.hr ?? ext?.hr));
    s.powerW[n] = num(text(ext?.power ?? tpe?.power));
    n++;
  }
  s.length = n;
  if (points.length > n) warnings.push(`${points.length - n} track point(s) without a valid time were skipped.`);
  fillSpeedFromDistance(s);
  const type = String(text(tracks[0]?.type) ?? "").toLowerCase();
  const sport: Sport | null = type.includes("run")
    ? "running"
    : type.includes("cycl") || type.includes("bik") || type.includes("ride")
      ? "cycling"
      : type.includes("ski")
        ? "cross_country_skiing"
        : type.includes("walk") || type.includes("hik")
          ? "walking"
          : null;
  return finish("gpx", sport, Number.isNaN(t0) ? null : new Date(t0 * 1000), s, warnings);
}

/** Where a file gives distance but no speed, speed is the distance change over the time change. */
function fillSpeedFromDistance(s: Samples): void {
  let prev = -1;
  for (let i = 0; i < s.length; i++) {
    if (Number.isNaN(s.distanceM[i]!)) continue;
    if (prev >= 0 && Number.isNaN(s.speedKmh[i]!)) {
      const dt = s.timeS[i]! - s.timeS[prev]!;
      if (dt > 0 && dt <= 30) s.speedKmh[i] = ((s.distanceM[i]! - s.distanceM[prev]!) / dt) * 3.6;
    }
    prev = i;
  }
}

// ---------------------------------------------------------------------------------------------------------------------
// CSV

const CSV_COLUMNS = {
  time: ["time_s", "time", "t", "seconds", "elapsed_s"],
  hr: ["hr_bpm", "hr", "heart_rate", "heartrate", "heart rate"],
  power: ["power_w", "power", "watts"],
  speed: ["speed_kmh", "speed"],
  distance: ["distance_m", "distance"],
} as const;

function clockToSeconds(v: string): number {
  const parts = v.trim().split(":");
  if (parts.length < 2 || parts.length > 3) return num(v);
  const nums = parts.map((p) => Number(p.replace(",", ".")));
  if (nums.some((x) => !Number.isFinite(x))) return NaN;
  return nums.reduce((acc, x) => acc * 60 + x, 0);
}

export function readActivityCsv(content: string): Activity {
  const parsed = Papa.parse<string[]>(content.replace(/^\uFEFF/, ""), { skipEmptyLines: "greedy", delimiter: "" });
  const rows = parsed.data;
  if (rows.length < 2) throw new ActivityError("The CSV file has no data rows.");
  const header = rows[0]!.map((h) => h.trim().toLowerCase());
  const col = (names: readonly string[]) => header.findIndex((h) => names.includes(h));
  const ti = col(CSV_COLUMNS.time);
  if (ti < 0) throw new ActivityError("The CSV file has no time column (time_s or time).");
  const hi = col(CSV_COLUMNS.hr),
    pi = col(CSV_COLUMNS.power),
    si = col(CSV_COLUMNS.speed),
    di = col(CSV_COLUMNS.distance);
  if (hi < 0 && pi < 0 && si < 0 && di < 0)
    throw new ActivityError("The CSV file has none of the columns hr_bpm, power_w, speed_kmh or distance_m.");
  const s = newSamples(rows.length - 1);
  const warnings: string[] = [];
  let n = 0,
    t0 = NaN,
    bad = 0;
  for (let r = 1; r < rows.length; r++) {
    const row = rows[r]!;
    const t = clockToSeconds(row[ti] ?? "");
    if (Number.isNaN(t)) {
      bad++;
      continue;
    }
    if (Number.isNaN(t0)) t0 = t;
    s.timeS[n] = t - t0;
    if (hi >= 0) s.hrBpm[n] = num(row[hi]);
    if (pi >= 0) s.powerW[n] = num(row[pi]);
    if (si >= 0) s.speedKmh[n] = num(row[si]);
    if (di >= 0) s.distanceM[n] = num(row[di]);
    n++;
  }
  s.length = n;
  if (bad) warnings.push(`${bad} row(s) without a readable time were skipped.`);
  if (si < 0) fillSpeedFromDistance(s);
  return finish("csv", null, null, s, warnings);
}

// ---------------------------------------------------------------------------------------------------------------------

/** Reads a file of any supported format; the format is told by its content first, then by its name. */
export function readActivity(filename: string, bytes: Uint8Array): Activity {
  if (bytes.length === 0) throw new ActivityError("The file is empty.");
  if (bytes.length > MAX_ACTIVITY_BYTES) throw new ActivityError("The file is larger than 25 MB.");
  if (isFit(bytes)) return readFit(bytes);
  const lower = filename.toLowerCase();
  if (lower.endsWith(".fit"))
    throw new ActivityError("This .fit file has no FIT header; it is damaged or not a FIT file.");
  if (bytes[0] === 0x1f && bytes[1] === 0x8b)
    throw new ActivityError("Compressed files are not supported; upload the .fit, .tcx, .gpx or .csv file itself.");
  if (bytes[0] === 0x50 && bytes[1] === 0x4b)
    throw new ActivityError("Zip archives are not supported; upload the .fit, .tcx, .gpx or .csv file itself.");
  let content: string;
  try {
    content = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new ActivityError("The file is neither a FIT file nor UTF-8 text (TCX, GPX or CSV).");
  }
  if (content.includes("\u0000")) throw new ActivityError("The file holds binary data; it is not TCX, GPX or CSV.");
  const head = content.slice(0, 2000);
  if (/<TrainingCenterDatabase[\s>]/.test(head) || lower.endsWith(".tcx")) return readTcx(content);
  if (/<gpx[\s>]/.test(head) || lower.endsWith(".gpx")) return readGpx(content);
  if (head.trimStart().startsWith("<")) throw new ActivityError("This XML file is neither TCX nor GPX.");
  if (lower.endsWith(".csv") || lower.endsWith(".txt") || /[,;\t]/.test(head.split("\n")[0] ?? ""))
    return readActivityCsv(content);
  throw new ActivityError("Unsupported file: upload a FIT, TCX, GPX or CSV file.");
}
