/**
 * `npm run analyze -- [--json] [--map vo2=COLUMN,...] [--units speed=mph,time=min,vo2=mL/kg/min] [--mass KG]
 *   [--from S|MM:SS] [--to S|MM:SS] [--sheet NAME] [--mrt S] FILE...`
 * Analyses gas-exchange CSV or .xlsx files with the same engine as the web upload. Exit status 0 when every file was
 * analysed and gave a peak; 1 when any file could not be read or gave nothing usable; 2 for a wrong command line.
 */
import fs from "node:fs";
import { analyzeRead, type Threshold } from "../features/gas-exchange/lib/analyze";
import {
  CHANNELS,
  parseTime,
  UNIT_CHOICES,
  type Channel,
  type ColumnMapping,
  type UnitChoices,
} from "../features/gas-exchange/lib/csv";
import { readGasExchangeFile } from "../features/gas-exchange/lib/workbook";

const USAGE =
  "Usage: npm run analyze -- [--json] [--map vo2=COLUMN,...] [--units speed=mph,time=min,vo2=mL/kg/min] [--mass KG] [--from S|MM:SS] [--to S|MM:SS] [--sheet NAME] [--mrt S] FILE...";
const MAX_BYTES = 10 * 1024 * 1024;

function fail(message: string): never {
  console.error(`${message}\n${USAGE}`);
  process.exit(2);
}

function pairs(spec: string | undefined, option: string): [string, string][] {
  if (!spec) fail(`${option} needs NAME=VALUE pairs.`);
  return spec.split(",").map((pair) => {
    const eq = pair.indexOf("=");
    if (eq < 1) fail(`${option}: "${pair}" is not NAME=VALUE.`);
    return [pair.slice(0, eq).trim(), pair.slice(eq + 1).trim()];
  });
}

function seconds(v: string | undefined, option: string): number {
  const s = v === undefined ? NaN : parseTime(v);
  if (!Number.isFinite(s) || s < 0) fail(`${option} needs a time in seconds or mm:ss.`);
  return s;
}

export function parseArgs(argv: string[]) {
  let json = false;
  let mass: number | null = null;
  let fromS: number | null = null,
    toS: number | null = null,
    mrtS: number | undefined;
  let sheet: string | null = null;
  const mapping: ColumnMapping = {};
  const units: UnitChoices = {};
  const files: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a === "--json") json = true;
    else if (a === "--mass") {
      const v = Number(argv[++i]);
      if (!Number.isFinite(v) || v <= 20 || v >= 300) fail("--mass needs a body mass in kg between 20 and 300.");
      mass = v;
    } else if (a === "--map") {
      for (const [channel, column] of pairs(argv[++i], "--map")) {
        if (!CHANNELS.includes(channel as Channel)) fail(`--map: "${channel}" is not one of ${CHANNELS.join(", ")}.`);
        mapping[channel as Channel] = column;
      }
    } else if (a === "--units") {
      for (const [channel, unit] of pairs(argv[++i], "--units")) {
        const allowed = (UNIT_CHOICES as Record<string, readonly string[]>)[channel];
        if (!allowed) fail(`--units: units can be set for ${Object.keys(UNIT_CHOICES).join(", ")}, not "${channel}".`);
        if (!allowed.includes(unit)) fail(`--units: ${channel} takes ${allowed.join(", ")}, not "${unit}".`);
        (units as Record<string, string>)[channel] = unit;
      }
    } else if (a === "--from") fromS = seconds(argv[++i], "--from");
    else if (a === "--to") toS = seconds(argv[++i], "--to");
    else if (a === "--mrt") {
      const v = Number(argv[++i]);
      if (!Number.isFinite(v) || v < 0 || v > 120)
        fail("--mrt needs a mean response time in seconds between 0 and 120.");
      mrtS = v;
    } else if (a === "--sheet") {
      sheet = argv[++i] ?? fail("--sheet needs a sheet name.");
    } else if (a === "--help" || a === "-h") {
      console.log(USAGE);
      process.exit(0);
    } else if (a.startsWith("--")) fail(`Unknown option ${a}.`);
    else files.push(a);
  }
  if (!files.length) fail("No files given.");
  if (fromS !== null && toS !== null && toS <= fromS) fail("--to must come after --from.");
  return { json, mass, mapping, units, fromS, toS, mrtS, sheet, files };
}

function thresholdJson(t: Threshold | null, reason: string | null) {
  if (!t) return { found: false, reason };
  return {
    found: true,
    vo2MlMin: t.vo2MlMin,
    vo2MlKgMin: t.vo2MlKgMin,
    vco2MlMin: t.vco2MlMin,
    rer: t.rer,
    hrBpm: t.hrBpm,
    timeS: t.timeS,
    powerW: t.powerW,
    speedKmh: t.speedKmh,
    gradePct: t.gradePct,
    steadyPowerW: t.steadyPowerW,
    steadySpeedKmh: t.steadySpeedKmh,
    steadyGradePct: t.steadyGradePct,
    confidence: t.confidence,
    methods: t.methods,
    agreement: t.agreement,
    warnings: t.warnings,
  };
}

const mmss = (s: number) => `${Math.floor(s / 60)}:${String(Math.round(s % 60)).padStart(2, "0")}`;

function describe(label: string, t: Threshold | null, reason: string | null): string[] {
  if (!t) return [`  ${label}: not found — ${reason ?? "no reason given"}`];
  const parts = [`VO2 ${t.vo2MlMin} mL/min`];
  if (t.vo2MlKgMin !== null) parts.push(`${t.vo2MlKgMin} mL/kg/min`);
  parts.push(`RER ${t.rer}`);
  if (t.hrBpm !== null) parts.push(`HR ${t.hrBpm} bpm`);
  if (t.powerW !== null) parts.push(`${t.powerW} W (steady state ${t.steadyPowerW} W)`);
  if (t.speedKmh !== null)
    parts.push(
      `${t.speedKmh} km/h${t.gradePct !== null ? ` at ${t.gradePct} %` : ""} (steady state ${t.steadySpeedKmh} km/h${t.steadyGradePct !== null ? ` at ${t.steadyGradePct} %` : ""})`,
    );
  parts.push(`at ${mmss(t.timeS)}`);
  const agree = t.agreement ? `, methods ${t.agreement.differencePct} % apart` : "";
  return [
    `  ${label}: ${parts.join(", ")} (confidence ${t.confidence}; ${t.methods.join(" + ")}${agree})`,
    ...t.warnings.map((w) => `    ${label} warning: ${w}`),
  ];
}

async function main() {
  const { json, mass, mapping, units, fromS, toS, mrtS, sheet, files } = parseArgs(process.argv.slice(2));
  let failures = 0;
  for (const file of files) {
    let bytes: Uint8Array;
    try {
      const stat = fs.statSync(file);
      if (!stat.isFile()) throw new Error("not a file");
      if (stat.size > MAX_BYTES) throw new Error(`larger than ${MAX_BYTES / 1024 / 1024} MB`);
      bytes = fs.readFileSync(file);
    } catch (e) {
      failures++;
      const error = `cannot read the file: ${e instanceof Error ? e.message : String(e)}`;
      console.log(json ? JSON.stringify({ file, error }) : `${file}\n  error: ${error}`);
      continue;
    }
    const read = await readGasExchangeFile(bytes, mapping, { bodyMassKg: mass, units, sheet });
    const a = analyzeRead(read, { bodyMassKg: mass, segment: { fromS, toS }, meanResponseTimeS: mrtS });
    if (!a.ok) {
      failures++;
      console.log(json ? JSON.stringify({ file, error: a.error }) : `${file}\n  error: ${a.error}`);
      continue;
    }
    if (!a.peak.vo2MlMin) failures++;
    if (json) {
      console.log(
        JSON.stringify({
          file,
          vt1: thresholdJson(a.vt1, a.vt1Reason),
          vt2: thresholdJson(a.vt2, a.vt2Reason),
          peak: a.peak,
          segment: {
            fromS: Math.round(a.onsetS),
            toS: Math.round(a.endS),
            source: a.segmentSource,
            meanResponseTimeS: a.meanResponseTimeS,
          },
          columns: a.columns,
          breathsRead: a.breathsRead,
          warnings: a.warnings,
        }),
      );
    } else {
      console.log(file);
      const cols = Object.entries(a.columns)
        .map(([c, d]) => `${c} = "${d!.header}" (${d!.unit})`)
        .join(", ");
      console.log(`  Columns: ${cols}`);
      console.log(
        `  Test segment: ${mmss(a.onsetS)}–${mmss(a.endS)} (${a.segmentSource === "chosen" ? "as given" : `found from the ${a.segmentSource}`})`,
      );
      for (const line of [...describe("VT1", a.vt1, a.vt1Reason), ...describe("VT2", a.vt2, a.vt2Reason)])
        console.log(line);
      const p = a.peak;
      console.log(
        `  Peak: VO2 ${p.vo2MlMin} mL/min${p.vo2MlKgMin !== null ? ` (${p.vo2MlKgMin} mL/kg/min)` : ""}, HR ${p.hrBpm ?? "—"} bpm, RER ${p.rer ?? "—"}${p.plateau ? ", VO2 plateaued" : ""}`,
      );
      for (const w of a.warnings) console.log(`  warning: ${w}`);
    }
  }
  process.exit(failures ? 1 : 0);
}

void main();
