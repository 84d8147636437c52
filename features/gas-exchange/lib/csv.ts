/**
 * Reads a gas-exchange CSV (breath-by-breath or time-averaged) into breaths with units in their names.
 * Tolerates a byte-order mark, blank lines, semicolon or tab delimiters and decimal commas; guesses columns from common
 * header variants; an explicit mapping overrides the guess. Bad cells become warnings and dropped rows, never a crash.
 */
import Papa from "papaparse";
import { acsmRunningVo2, acsmWalkingVo2, kmhToMMin } from "@/features/physiology/lib/equations";

export const CHANNELS = ["time", "vo2", "vco2", "ve", "hr", "power", "speed", "grade", "rf"] as const;
export type Channel = (typeof CHANNELS)[number];
export const REQUIRED_CHANNELS: Channel[] = ["time", "vo2", "vco2", "ve"];

export const CHANNEL_LABELS: Record<Channel, string> = {
  time: "time",
  vo2: "VO2",
  vco2: "VCO2",
  ve: "VE",
  hr: "heart rate",
  power: "power",
  speed: "speed",
  grade: "grade",
  rf: "breathing frequency",
};

/** Units a person can choose for a column when the guess is wrong. */
export const UNIT_CHOICES = {
  time: ["s", "min"],
  vo2: ["mL/min", "L/min", "mL/kg/min"],
  speed: ["km/h", "mph", "m/s"],
} as const;
export type UnitChoices = {
  time?: "s" | "min";
  vo2?: "mL/min" | "L/min" | "mL/kg/min";
  speed?: "km/h" | "mph" | "m/s";
};

export interface ReadOptions {
  /** Body mass, to convert a relative VO2 column (mL/kg/min) when it is the only one. */
  bodyMassKg?: number | null;
  units?: UnitChoices;
}

export interface Breath {
  timeS: number;
  vo2MlMin: number;
  vco2MlMin: number;
  veLMin: number;
  hrBpm: number | null;
  powerW: number | null;
  speedKmh: number | null;
  rfPerMin: number | null;
  /** Treadmill grade in %, when the file has one. */
  gradePct?: number | null;
}

export type ColumnMapping = Partial<Record<Channel, string>>;

export interface DetectedColumn {
  header: string;
  /** Unit the values were read in, before conversion. */
  unit: string;
  /** How the unit was decided. */
  unitReason: "header" | "values" | "default" | "chosen";
}

export type ReadResult =
  | {
      ok: true;
      breaths: Breath[];
      columns: Partial<Record<Channel, DetectedColumn>>;
      headers: string[];
      warnings: string[];
      rowsRead: number;
      bodyMassFromFileKg: number | null;
    }
  | { ok: false; error: string; headers: string[] };

/** Repaired duplicate names ("VO2...4", "vo2.1", "VO2_2") lose their suffix before matching. */
function stripRepair(h: string): string {
  return h.trim().replace(/(\.\.\.\d+|\.\d+|_\d)$/, "");
}

function normaliseHeader(h: string): string {
  return stripRepair(h)
    .toLowerCase()
    .replace(/\(.*?\)|\[.*?\]/g, "")
    .replace(/[’'`]/g, "")
    .replace(/[^a-z0-9]/g, "");
}

const ALIASES: Record<Channel, string[]> = {
  time: [
    "times",
    "time",
    "t",
    "ts",
    "elapsed",
    "elapsedtime",
    "timesec",
    "timeelapsed",
    "testtime",
    "timemin",
    "tmin",
    "extime",
    "exercisetime",
  ],
  vo2: ["vo2mlmin", "vo2abs", "vo2", "vo2lmin", "vo2stpd", "vo2mlkgmin", "vo2kg", "vo2rel", "relvo2"],
  vco2: ["vco2mlmin", "vco2", "vco2lmin", "vco2stpd", "vco2abs"],
  ve: ["velmin", "ve", "vebtps", "vent", "ventilation", "minuteventilation"],
  hr: ["hrbpm", "hr", "heartrate", "pulse", "hf"],
  power: ["powerw", "power", "load", "watts", "watt", "workrate", "wr", "work"],
  speed: ["speedkmh", "speed", "velocity", "treadmillspeed", "speedmph", "belt", "beltspeed"],
  grade: ["grade", "gradepct", "incline", "slope", "elevation", "treadmillgrade"],
  rf: ["rfpermin", "rf", "bf", "rr", "breathingfrequency", "respiratoryrate", "fr"],
};

export function guessColumns(headers: string[]): ColumnMapping {
  const out: ColumnMapping = {};
  const used = new Set<string>();
  for (const channel of CHANNELS) {
    for (const alias of ALIASES[channel]) {
      const hit = headers.find((h) => !used.has(h) && normaliseHeader(h) === alias);
      if (hit) {
        out[channel] = hit;
        used.add(hit);
        break;
      }
    }
  }
  return out;
}

/** Seconds from "123.4", "mm:ss", "hh:mm:ss" (fractions allowed); NaN when unreadable. */
export function parseTime(raw: string): number {
  const s = raw.trim();
  if (!s) return NaN;
  if (s.includes(":")) {
    const parts = s.split(":");
    if (parts.length > 3 || parts.some((p) => !/^\d+(\.\d+)?$/.test(p))) return NaN;
    return parts.reduce((acc, p) => acc * 60 + Number(p), 0);
  }
  return parseNumber(s);
}

/** A decimal number with a point or a decimal comma; NaN for anything else (empty, text, hexadecimal, infinities). */
export function parseNumber(raw: string): number {
  if (raw === "") return NaN;
  const first = raw.charCodeAt(0),
    end = raw.charCodeAt(raw.length - 1);
  let s = first <= 32 || end <= 32 ? raw.trim() : raw;
  if (s === "") return NaN;
  if (s.includes(",")) s = s.replace(",", ".");
  // Number() also reads "0x1f", "Infinity" and "1_0"-free forms; refuse the first two explicitly.
  const last = s.charCodeAt(s.length - 1);
  if (!((last >= 48 && last <= 57) || last === 46)) return NaN;
  if (s.length > 1 && (s[1] === "x" || s[1] === "X" || s[1] === "b" || s[1] === "B" || s[1] === "o" || s[1] === "O"))
    return NaN;
  const n = Number(s);
  return Number.isFinite(n) ? n : NaN;
}

function median(values: number[]): number {
  if (!values.length) return NaN;
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

function unitFromHeader(header: string): "l" | "ml" | null {
  const h = header.toLowerCase().replace(/\s/g, "");
  if (/ml\/?(min|·min|\*min)|mlmin|ml\/m\b/.test(h)) return "ml";
  if (/(^|[^m])l\/?(min|·min|\*min)|(^|[^m])lmin|\(l\)/.test(h)) return "l";
  return null;
}

/** The offset just past the n-th line break (or the end of the text). */
function nthLineEnd(text: string, n: number): number {
  let pos = 0;
  for (let i = 0; i < n; i++) {
    const next = text.indexOf("\n", pos);
    if (next < 0) return text.length;
    pos = next + 1;
  }
  return pos;
}

function describeRows(rows: number[]): string {
  const shown = rows.slice(0, 5).join(", ");
  return rows.length > 5 ? `${shown} and ${rows.length - 5} more` : shown;
}

const LIMITS = {
  vo2MlMin: [50, 9000],
  vco2MlMin: [50, 10000],
  veLMin: [2, 350],
  hrBpm: [25, 250],
  powerW: [0, 3000],
  speedKmh: [0, 60],
  gradePct: [-5, 45],
  rfPerMin: [2, 120],
} as const;

/** A cell that held nothing (or only spaces): optional channels read it as "no value", required ones as unreadable. */
export const EMPTY = Number.NEGATIVE_INFINITY;

/** The numbers of some columns of the data rows, one array per column, in row order (NaN unreadable, EMPTY blank). */
export interface NumericColumns {
  rows: number;
  values: number[][];
}

export function cellValue(raw: string, asTime: boolean): number {
  if (raw === "" || raw.trim() === "") return EMPTY;
  return asTime ? parseTime(raw) : parseNumber(raw);
}

/**
 * The general path: papaparse reads every row (quotes, odd line breaks, anything), then each wanted cell is parsed.
 * `greedy` drops blank lines and lines whose cells are all blank.
 */
function columnsThroughPapa(
  text: string,
  wanted: number[],
  timeAt: number,
): { headers: string[]; columns: NumericColumns } {
  const rows = Papa.parse<string[]>(text, { skipEmptyLines: "greedy", delimitersToGuess: DELIMITERS }).data;
  const headers = (rows[0] ?? []).map((h) => h.trim());
  const values = wanted.map(() => [] as number[]);
  for (let i = 1; i < rows.length; i++) {
    const row = rows[i]!;
    for (let k = 0; k < wanted.length; k++) values[k]!.push(cellValue(row[wanted[k]!] ?? "", wanted[k] === timeAt));
  }
  return { headers, columns: { rows: Math.max(0, rows.length - 1), values } };
}

/**
 * The usual path for files without quotes: one pass over the characters after the header line, reading plain decimal
 * numbers in place (digits, one decimal point or decimal comma, a sign) without making a string per cell; any other cell
 * (a time as mm:ss, text, an exponent, spaces, long mantissas) goes through the same parsers as the general path, so both
 * paths give the same numbers. Lines that are blank or whose cells are all blank are skipped, as papaparse's `greedy` does.
 */
function columnsInPlace(
  text: string,
  bodyStart: number,
  delimiter: string,
  wanted: number[],
  timeAt: number,
): NumericColumns {
  const delim = delimiter.charCodeAt(0);
  const slot = new Int32Array(Math.max(0, ...wanted) + 1).fill(-1);
  wanted.forEach((col, k) => (slot[col] = k));
  const values = wanted.map(() => [] as number[]);
  const rowValues = new Float64Array(wanted.length);
  const n = text.length;
  let rows = 0;
  let pos = bodyStart;
  while (pos < n) {
    let field = 0;
    let content = false;
    rowValues.fill(EMPTY);
    // One line: fields up to a delimiter, the line up to \n, \r or \r\n.
    for (;;) {
      const fieldStart = pos;
      const k = field < slot.length ? slot[field]! : -1;
      let mantissa = 0,
        digits = 0,
        decimals = 0,
        seenPoint = false,
        negative = false,
        plain = true;
      let c = 0;
      while (pos < n) {
        c = text.charCodeAt(pos);
        if (c === delim || c === 10 || c === 13) break;
        if (!(c === 32 || (c >= 9 && c <= 13) || c === 160 || c === 0xfeff)) content = true;
        if (k >= 0 && plain) {
          if (c >= 48 && c <= 57) {
            mantissa = mantissa * 10 + (c - 48);
            digits++;
            if (seenPoint) decimals++;
          } else if ((c === 46 || c === 44) && !seenPoint) seenPoint = true;
          else if ((c === 45 || c === 43) && pos === fieldStart) negative = c === 45;
          else plain = false;
        }
        pos++;
      }
      if (k >= 0 && pos > fieldStart) {
        if (plain && digits > 0 && digits <= 15) {
          // An exact integer divided by an exact power of ten rounds once, like Number() does on the same text.
          const v = decimals ? mantissa / 10 ** decimals : mantissa;
          rowValues[k] = negative ? -v : v;
        } else {
          rowValues[k] = cellValue(text.slice(fieldStart, pos), field === timeAt);
        }
      }
      field++;
      if (pos >= n || c !== delim) break;
      pos++; // past the delimiter
    }
    if (pos < n) pos += text.charCodeAt(pos) === 13 && text.charCodeAt(pos + 1) === 10 ? 2 : 1;
    if (!content) continue;
    for (let k = 0; k < wanted.length; k++) values[k]!.push(rowValues[k]!);
    rows++;
  }
  return { rows, values };
}

const DELIMITERS = [",", ";", "\t", "|"];

/** Every header that could be the VO2 column (absolute or relative), in file order. */
function vo2Candidates(headers: string[]): string[] {
  return headers.filter((h) => ALIASES.vo2.includes(normaliseHeader(h)));
}

type Vo2Unit = "mL/min" | "L/min" | "mL/kg/min";

function vo2UnitFromHeader(header: string): Vo2Unit | null {
  const h = header.toLowerCase().replace(/\s/g, "");
  if (/kg|rel/.test(h)) return "mL/kg/min";
  if (/abs/.test(h)) return null;
  const u = unitFromHeader(header);
  return u === "ml" ? "mL/min" : u === "l" ? "L/min" : null;
}

/** From typical values: litres below 8, per kilogram below 120 (rest 3–5, peaks 20–90), else mL/min. */
function vo2UnitFromValues(values: number[]): Vo2Unit {
  const m = median(values.slice(0, 300).filter((v) => Number.isFinite(v) && v > 0));
  if (!Number.isFinite(m) || m >= 120) return "mL/min";
  return m < 8 ? "L/min" : "mL/kg/min";
}

function speedUnitFromHeader(header: string): "km/h" | "mph" | "m/s" | null {
  const h = header.toLowerCase().replace(/\s/g, "");
  if (/mph|mi\/h|miles/.test(h)) return "mph";
  if (/km\/?h|kmh|kph/.test(h)) return "km/h";
  if (/m\/s|ms-1|mps/.test(h)) return "m/s";
  return null;
}

function timeUnitFromHeader(header: string): "s" | "min" | null {
  const h = header.toLowerCase().replace(/\s/g, "");
  if (/\(min\)|\[min\]|_min$|min$|minutes/.test(h)) return "min";
  if (/\(s\)|\[s\]|_s$|sec/.test(h)) return "s";
  return null;
}

/** ACSM walking or running VO2 demand (mL/kg/min) for a speed in km/h and a grade in %: the walking equation up to
 * 6.5 km/h, the running one from 8 km/h, a linear blend between (ACSM's Guidelines for Exercise Testing and Prescription). */
export function treadmillDemand(speedKmh: number, gradePct: number | null | undefined): number {
  const s = kmhToMMin(speedKmh);
  const g = Math.max(0, (gradePct ?? 0) / 100);
  const w = Math.max(0, Math.min(1, (speedKmh - 6.5) / 1.5));
  return (1 - w) * acsmWalkingVo2(s, g) + w * acsmRunningVo2(s, g);
}

/**
 * The speed unit from the values when the header does not say: when the body mass is known, the unit under which the ACSM
 * demand of the fastest minutes lies nearest the measured VO2 per kilogram (mph and km/h differ by a factor 1.6, far more
 * than the equations' error); otherwise km/h.
 */
function speedUnitFromValues(
  speeds: number[],
  grades: number[] | null,
  vo2: number[],
  vo2Scale: number,
  massKg: number | null,
): "km/h" | "mph" | null {
  if (!massKg) return null;
  const idx = speeds.map((v, i) => [v, i] as const).filter(([v]) => Number.isFinite(v) && v > 0.5);
  if (idx.length < 20) return null;
  const sorted = [...idx].sort((a, b) => b[0] - a[0]);
  const top = sorted.slice(0, Math.max(10, Math.floor(sorted.length * 0.15)));
  const measured = median(top.map(([, i]) => (vo2[i]! * vo2Scale) / massKg).filter((v) => Number.isFinite(v) && v > 0));
  if (!Number.isFinite(measured)) return null;
  const demand = (factor: number) =>
    median(
      top.map(([v, i]) =>
        treadmillDemand(v * factor, grades ? (Number.isFinite(grades[i]!) && grades[i]! < 45 ? grades[i]! : 0) : 0),
      ),
    );
  const dk = Math.abs(Math.log(measured / demand(1)));
  const dm = Math.abs(Math.log(measured / demand(1.609344)));
  return dm < dk ? "mph" : "km/h";
}

export function readGasExchangeCsv(text: string, mapping: ColumnMapping = {}, opts: ReadOptions = {}): ReadResult {
  const clean = text.replace(/^\uFEFF/, "");
  // The header line and the delimiter come from papaparse reading the first lines.
  const firstBreak = clean.search(/\r\n|\n|\r/);
  const headerLine = firstBreak < 0 ? clean : clean.slice(0, firstBreak);
  const headEnd = nthLineEnd(clean, 20);
  const head = Papa.parse<string[]>(clean.slice(0, headEnd), {
    skipEmptyLines: "greedy",
    delimitersToGuess: DELIMITERS,
    preview: 20,
  });
  const headRows = head.data;
  const headers = (headRows[0] ?? []).map((h) => h.trim());
  if (headRows.length < 2) return { ok: false, error: "The file has no data rows under a header line.", headers };
  const plainFile =
    firstBreak > 0 && headerLine.trim() !== "" && !clean.includes('"') && head.meta.delimiter.length === 1;
  const bodyStart = firstBreak + (clean.startsWith("\r\n", firstBreak) ? 2 : 1);
  return readTable(
    headers,
    (wanted, timeAt) =>
      plainFile
        ? columnsInPlace(clean, bodyStart, head.meta.delimiter, wanted, timeAt)
        : columnsThroughPapa(clean, wanted, timeAt).columns,
    mapping,
    opts,
  );
}

/**
 * Column choice, units and row checks, shared by the CSV and the spreadsheet readers: `load(wanted, timeAt)` returns the
 * numbers of the wanted column indexes.
 */
export function readTable(
  headers: string[],
  load: (wanted: number[], timeAt: number) => NumericColumns,
  mapping: ColumnMapping = {},
  opts: ReadOptions = {},
): ReadResult {
  const guessed = guessColumns(headers);
  const chosen: ColumnMapping = { ...guessed };
  for (const [channel, header] of Object.entries(mapping) as [Channel, string | undefined][]) {
    if (header === undefined) continue;
    if (!headers.includes(header)) {
      return {
        ok: false,
        error: `The mapping names a column "${header}" for ${CHANNEL_LABELS[channel]}, but the file has no such column.`,
        headers,
      };
    }
    for (const c of CHANNELS) if (chosen[c] === header && c !== channel) delete chosen[c];
    chosen[channel] = header;
  }
  const missing = REQUIRED_CHANNELS.filter((c) => !chosen[c]);
  if (missing.length) {
    return {
      ok: false,
      error: `The file has no column for ${missing.map((c) => CHANNEL_LABELS[c]).join(", ")}. Found columns: ${headers.join(", ") || "none"}. Map the columns by hand if they have other names.`,
      headers,
    };
  }
  // Several VO2 columns (relative and absolute, often with repaired names): read them all and prefer an absolute one.
  const vo2Options = mapping.vo2
    ? [mapping.vo2]
    : vo2Candidates(headers).filter((h) => !Object.entries(chosen).some(([c, v]) => c !== "vo2" && v === h));
  if (!vo2Options.includes(chosen.vo2!)) vo2Options.unshift(chosen.vo2!);
  const index = Object.fromEntries(CHANNELS.map((c) => [c, chosen[c] ? headers.indexOf(chosen[c]!) : -1])) as Record<
    Channel,
    number
  >;
  const wanted = [
    ...new Set([...CHANNELS.map((c) => index[c]).filter((i) => i >= 0), ...vo2Options.map((h) => headers.indexOf(h))]),
  ];
  const columns0 = load(wanted, index.time);
  const byHeader = (h: string): number[] => columns0.values[wanted.indexOf(headers.indexOf(h))]!;
  const column = (c: Channel): number[] | null => (index[c] >= 0 ? columns0.values[wanted.indexOf(index[c])]! : null);
  const warnings: string[] = [];
  const columns: Partial<Record<Channel, DetectedColumn>> = {};
  const scale: Partial<Record<Channel, number>> = {};
  const units = opts.units ?? {};

  // VO2: the chosen unit, else the header, else the values; absolute columns first.
  const classified = vo2Options.map((h) => {
    const fromHeader = vo2UnitFromHeader(h);
    return {
      header: h,
      unit: fromHeader ?? vo2UnitFromValues(byHeader(h)),
      reason: (fromHeader ? "header" : "values") as DetectedColumn["unitReason"],
    };
  });
  let vo2Pick = classified[0]!;
  if (!mapping.vo2) vo2Pick = classified.find((c) => c.unit !== "mL/kg/min") ?? classified[0]!;
  if (units.vo2) vo2Pick = { ...vo2Pick, unit: units.vo2, reason: "chosen" };
  const relative = classified.find((c) => c.unit === "mL/kg/min" && c.header !== vo2Pick.header);
  // The body mass the file implies, when it holds both an absolute and a relative VO2.
  let massFromFile: number | null = null;
  if (relative && vo2Pick.unit !== "mL/kg/min") {
    const abs = byHeader(vo2Pick.header),
      rel = byHeader(relative.header);
    const f = vo2Pick.unit === "L/min" ? 1000 : 1;
    const ratios: number[] = [];
    for (let i = 0; i < abs.length; i++) if (abs[i]! > 0 && rel[i]! > 0) ratios.push((abs[i]! * f) / rel[i]!);
    const m = median(ratios);
    if (Number.isFinite(m) && m > 20 && m < 300) massFromFile = Math.round(m * 10) / 10;
  }
  chosen.vo2 = vo2Pick.header;
  index.vo2 = headers.indexOf(vo2Pick.header);
  if (vo2Pick.unit === "mL/kg/min") {
    const mass = opts.bodyMassKg ?? null;
    if (!mass) {
      return {
        ok: false,
        error: `The only VO2 column ("${vo2Pick.header}") is relative (mL/kg/min). Give the body mass on the day so that it can be converted to mL/min, or map an absolute VO2 column.`,
        headers,
      };
    }
    scale.vo2 = mass;
    warnings.push(`VO2 read as mL/kg/min from "${vo2Pick.header}" and converted with the body mass of ${mass} kg.`);
  } else scale.vo2 = vo2Pick.unit === "L/min" ? 1000 : 1;
  columns.vo2 = { header: vo2Pick.header, unit: vo2Pick.unit, unitReason: vo2Pick.reason };
  if (vo2Pick.unit === "L/min" && vo2Pick.reason === "values")
    warnings.push(`VO2 read as L/min (typical values below 8) and converted to mL/min.`);
  if (relative && vo2Pick.unit !== "mL/kg/min")
    warnings.push(
      `Absolute VO2 taken from "${vo2Pick.header}"; the relative column "${relative.header}" (mL/kg/min) was not used.`,
    );

  {
    const header = chosen.vco2!;
    const fromHeader = unitFromHeader(header);
    if (fromHeader) {
      columns.vco2 = { header, unit: fromHeader === "l" ? "L/min" : "mL/min", unitReason: "header" };
      scale.vco2 = fromHeader === "l" ? 1000 : 1;
    } else {
      const sample = column("vco2")!
        .slice(0, 300)
        .filter((v) => Number.isFinite(v) && v > 0);
      const m = median(sample);
      const litres = Number.isFinite(m) && m < 10;
      columns.vco2 = { header, unit: litres ? "L/min" : "mL/min", unitReason: "values" };
      scale.vco2 = litres ? 1000 : 1;
      if (litres) warnings.push(`VCO2 read as L/min (typical values below 10) and converted to mL/min.`);
    }
  }
  const veHeader = chosen.ve!;
  columns.ve = {
    header: veHeader,
    unit: unitFromHeader(veHeader) === "ml" ? "mL/min" : "L/min",
    unitReason: unitFromHeader(veHeader) ? "header" : "default",
  };
  scale.ve = columns.ve.unit === "mL/min" ? 0.001 : 1;

  // Time: clock text is seconds; plain numbers are minutes when the header says so, or when a whole test spans under
  // 90 units with steps under one unit (breaths come every 1–6 s, averages every 5–60 s).
  const times = column("time")!;
  {
    const header = chosen.time!;
    const fromHeader = timeUnitFromHeader(header);
    let unit: "s" | "min" = fromHeader ?? "s";
    let reason: DetectedColumn["unitReason"] = fromHeader ? "header" : "default";
    if (!fromHeader) {
      const finite = times.filter((v) => Number.isFinite(v) && v >= 0);
      const steps: number[] = [];
      for (let i = 1; i < Math.min(finite.length, 400); i++)
        if (finite[i]! > finite[i - 1]!) steps.push(finite[i]! - finite[i - 1]!);
      const span = finite.length ? finite[finite.length - 1]! - finite[0]! : 0;
      if (finite.length > 20 && span > 0 && span < 90 && median(steps) < 1) {
        unit = "min";
        reason = "values";
      }
    }
    if (units.time) {
      unit = units.time;
      reason = "chosen";
    }
    columns.time = { header, unit, unitReason: reason };
    scale.time = unit === "min" ? 60 : 1;
    if (unit === "min" && reason === "values")
      warnings.push(
        `Time read as decimal minutes (the whole test spans under 90 of its units) and converted to seconds.`,
      );
  }

  const optionalUnits: Record<"hr" | "power" | "speed" | "grade" | "rf", string> = {
    hr: "bpm",
    power: "W",
    speed: "km/h",
    grade: "%",
    rf: "1/min",
  };
  for (const c of ["hr", "power", "speed", "grade", "rf"] as const) {
    if (chosen[c]) columns[c] = { header: chosen[c]!, unit: optionalUnits[c], unitReason: "default" };
  }
  if (chosen.speed) {
    const fromHeader = speedUnitFromHeader(chosen.speed);
    const massForSpeed =
      vo2Pick.unit === "mL/kg/min" ? (opts.bodyMassKg ?? null) : (massFromFile ?? opts.bodyMassKg ?? null);
    const fromValues = fromHeader
      ? null
      : speedUnitFromValues(column("speed")!, column("grade"), column("vo2")!, scale.vo2!, massForSpeed);
    const unit = units.speed ?? fromHeader ?? fromValues ?? "km/h";
    columns.speed = {
      header: chosen.speed,
      unit,
      unitReason: units.speed ? "chosen" : fromHeader ? "header" : fromValues ? "values" : "default",
    };
    scale.speed = unit === "mph" ? 1.609344 : unit === "m/s" ? 3.6 : 1;
    if (columns.speed.unitReason === "values")
      warnings.push(
        `Speed read as ${unit} (the VO2 measured at the fastest minutes matches the ACSM treadmill demand in ${unit}).`,
      );
    if (columns.speed.unitReason === "default")
      warnings.push("Speed read as km/h (the header gives no unit); choose mph or m/s if the treadmill showed those.");
  }

  const breaths: Breath[] = [];
  const badRequired: number[] = [];
  const outOfRange: number[] = [];
  const backwards: number[] = [];
  const optionalDropped: Record<string, number> = {};
  let lastTime = -Infinity;
  const vo2s = column("vo2")!,
    vco2s = column("vco2")!,
    ves = column("ve")!;
  const OPTIONAL = ["hr", "power", "speed", "grade", "rf"] as const;
  const optionalColumns = OPTIONAL.map((c) => ({
    c,
    values: column(c),
    scale: scale[c] ?? 1,
    limits:
      LIMITS[({ hr: "hrBpm", power: "powerW", speed: "speedKmh", grade: "gradePct", rf: "rfPerMin" } as const)[c]],
  }));
  const optionalValues: (number | null)[] = OPTIONAL.map(() => null);
  for (let i = 0; i < columns0.rows; i++) {
    const line = i + 2;
    const timeS = times[i]! * scale.time!;
    const vo2 = vo2s[i]! * scale.vo2!;
    const vco2 = vco2s[i]! * scale.vco2!;
    const ve = ves[i]! * scale.ve!;
    if (!(Number.isFinite(timeS) && Number.isFinite(vo2) && Number.isFinite(vco2) && Number.isFinite(ve))) {
      badRequired.push(line);
      continue;
    }
    if (
      vo2 < LIMITS.vo2MlMin[0] ||
      vo2 > LIMITS.vo2MlMin[1] ||
      vco2 < LIMITS.vco2MlMin[0] ||
      vco2 > LIMITS.vco2MlMin[1] ||
      ve < LIMITS.veLMin[0] ||
      ve > LIMITS.veLMin[1] ||
      timeS < 0
    ) {
      outOfRange.push(line);
      continue;
    }
    if (timeS < lastTime) {
      backwards.push(line);
      continue;
    }
    lastTime = timeS;
    for (let k = 0; k < OPTIONAL.length; k++) {
      const col = optionalColumns[k]!;
      optionalValues[k] = null;
      if (!col.values) continue;
      const raw = col.values[i]!;
      if (raw === EMPTY) continue;
      const v = raw * col.scale;
      if (!Number.isFinite(v) || v < col.limits[0] || v > col.limits[1])
        optionalDropped[col.c] = (optionalDropped[col.c] ?? 0) + 1;
      else optionalValues[k] = v;
    }
    breaths.push({
      timeS,
      vo2MlMin: vo2,
      vco2MlMin: vco2,
      veLMin: ve,
      hrBpm: optionalValues[0]!,
      powerW: optionalValues[1]!,
      speedKmh: optionalValues[2]!,
      gradePct: optionalValues[3]!,
      rfPerMin: optionalValues[4]!,
    });
  }
  if (badRequired.length)
    warnings.push(
      `${badRequired.length} row(s) dropped: missing or non-numeric time, VO2, VCO2 or VE (line ${describeRows(badRequired)}).`,
    );
  if (outOfRange.length)
    warnings.push(
      `${outOfRange.length} row(s) dropped: negative or physiologically impossible values (line ${describeRows(outOfRange)}).`,
    );
  if (backwards.length)
    warnings.push(`${backwards.length} row(s) dropped: time goes backwards (line ${describeRows(backwards)}).`);
  for (const [c, count] of Object.entries(optionalDropped)) {
    warnings.push(
      `${count} ${CHANNEL_LABELS[c as Channel]} value(s) ignored: not a number or out of range${c === "grade" ? " (a standing belt often reports a placeholder grade)" : ""}.`,
    );
  }
  let gaps = 0;
  for (let i = 1; i < breaths.length; i++) {
    const gap = breaths[i]!.timeS - breaths[i - 1]!.timeS;
    if (gap > 30 && gaps++ < 5)
      warnings.push(`A gap of ${Math.round(gap)} s without data at ${Math.round(breaths[i - 1]!.timeS)} s.`);
  }
  if (breaths.length === 0)
    return {
      ok: false,
      error:
        "No usable rows: every row lacked a readable time, VO2, VCO2 or VE. Check the column mapping and the units.",
      headers,
    };
  if (columns0.rows >= 50 && breaths.length < 0.5 * columns0.rows) {
    return {
      ok: false,
      error: `Only ${breaths.length} of ${columns0.rows} rows could be used (${outOfRange.length} with impossible values, ${badRequired.length} unreadable). A column or a unit is probably wrong: check the mapping (VO2 ${columns.vo2.unit} from "${columns.vo2.header}", time in ${columns.time.unit}).`,
      headers,
    };
  }
  return { ok: true, breaths, columns, headers, warnings, rowsRead: columns0.rows, bodyMassFromFileKg: massFromFile };
}
