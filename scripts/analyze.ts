/**
 * `npm run analyze -- [--json] [--map vo2=COLUMN,...] [--mass KG] FILE...`
 * Analyses gas-exchange CSV files with the same engine as the web upload. Exit status 0 when every file was analysed.
 */
import fs from "node:fs";
import { analyzeCsv, type Threshold } from "../features/gas-exchange/lib/analyze";
import { CHANNELS, type Channel, type ColumnMapping } from "../features/gas-exchange/lib/csv";

const USAGE = "Usage: npm run analyze -- [--json] [--map vo2=COLUMN,...] [--mass KG] FILE...";
const MAX_BYTES = 10 * 1024 * 1024;

function fail(message: string): never {
  console.error(`${message}\n${USAGE}`);
  process.exit(2);
}

function parseArgs(argv: string[]) {
  let json = false;
  let mass: number | null = null;
  const mapping: ColumnMapping = {};
  const files: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a === "--json") json = true;
    else if (a === "--mass") {
      const v = Number(argv[++i]);
      if (!Number.isFinite(v) || v <= 20 || v >= 300) fail("--mass needs a body mass in kg between 20 and 300.");
      mass = v;
    } else if (a === "--map") {
      const spec = argv[++i];
      if (!spec) fail("--map needs CHANNEL=COLUMN pairs.");
      for (const pair of spec.split(",")) {
        const eq = pair.indexOf("=");
        const channel = pair.slice(0, eq).trim() as Channel;
        if (eq < 1 || !CHANNELS.includes(channel)) fail(`--map: "${pair}" is not CHANNEL=COLUMN with CHANNEL one of ${CHANNELS.join(", ")}.`);
        mapping[channel] = pair.slice(eq + 1).trim();
      }
    } else if (a === "--help" || a === "-h") {
      console.log(USAGE);
      process.exit(0);
    } else if (a.startsWith("--")) fail(`Unknown option ${a}.`);
    else files.push(a);
  }
  if (!files.length) fail("No files given.");
  return { json, mass, mapping, files };
}

function thresholdJson(t: Threshold | null) {
  if (!t) return null;
  return {
    vo2MlMin: t.vo2MlMin,
    vo2MlKgMin: t.vo2MlKgMin,
    hrBpm: t.hrBpm,
    timeS: t.timeS,
    powerW: t.powerW,
    speedKmh: t.speedKmh,
    confidence: t.confidence,
    methods: t.methods,
    agreement: t.agreement,
  };
}

function describe(label: string, t: Threshold | null, reason: string | null): string {
  if (!t) return `  ${label}: not found — ${reason ?? "no reason given"}`;
  const parts = [`VO2 ${t.vo2MlMin} mL/min`];
  if (t.vo2MlKgMin !== null) parts.push(`${t.vo2MlKgMin} mL/kg/min`);
  if (t.hrBpm !== null) parts.push(`HR ${t.hrBpm} bpm`);
  if (t.powerW !== null) parts.push(`${t.powerW} W`);
  if (t.speedKmh !== null) parts.push(`${t.speedKmh} km/h`);
  parts.push(`at ${Math.floor(t.timeS / 60)}:${String(Math.round(t.timeS % 60)).padStart(2, "0")}`);
  const agree = t.agreement ? `, methods ${t.agreement.differencePct} % apart` : "";
  return `  ${label}: ${parts.join(", ")} (confidence ${t.confidence}; ${t.methods.join(" + ")}${agree})`;
}

function main() {
  const { json, mass, mapping, files } = parseArgs(process.argv.slice(2));
  let failures = 0;
  for (const file of files) {
    let text: string;
    try {
      const stat = fs.statSync(file);
      if (!stat.isFile()) throw new Error("not a file");
      if (stat.size > MAX_BYTES) throw new Error(`larger than ${MAX_BYTES / 1024 / 1024} MB`);
      text = fs.readFileSync(file, "utf8");
    } catch (e) {
      failures++;
      const error = `cannot read the file: ${e instanceof Error ? e.message : String(e)}`;
      if (json) console.log(JSON.stringify({ file, error }));
      else console.log(`${file}\n  error: ${error}`);
      continue;
    }
    const a = analyzeCsv(text, { mapping, bodyMassKg: mass });
    if (!a.ok) {
      failures++;
      if (json) console.log(JSON.stringify({ file, error: a.error }));
      else console.log(`${file}\n  error: ${a.error}`);
      continue;
    }
    if (json) {
      console.log(
        JSON.stringify({
          file,
          vt1: thresholdJson(a.vt1),
          vt2: thresholdJson(a.vt2),
          peak: { vo2MlMin: a.peak.vo2MlMin, vo2MlKgMin: a.peak.vo2MlKgMin, hrBpm: a.peak.hrBpm, rer: a.peak.rer, plateau: a.peak.plateau },
          warnings: a.warnings,
        }),
      );
    } else {
      console.log(file);
      console.log(describe("VT1", a.vt1, a.vt1Reason));
      console.log(describe("VT2", a.vt2, a.vt2Reason));
      const p = a.peak;
      console.log(`  Peak: VO2 ${p.vo2MlMin} mL/min${p.vo2MlKgMin !== null ? ` (${p.vo2MlKgMin} mL/kg/min)` : ""}, HR ${p.hrBpm ?? "—"} bpm, RER ${p.rer ?? "—"}${p.plateau ? ", VO2 plateaued" : ""}`);
      for (const w of a.warnings) console.log(`  warning: ${w}`);
    }
  }
  process.exit(failures ? 1 : 0);
}

main();
