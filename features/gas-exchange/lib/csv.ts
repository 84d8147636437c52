/**
 * Reads a gas-exchange CSV (breath-by-breath or time-averaged) into breaths with units in their names.
 * Tolerates a byte-order mark, blank lines, semicolon or tab delimiters and decimal commas; guesses columns from common
 * header variants; an explicit mapping overrides the guess. Bad cells become warnings and dropped rows, never a crash.
 */
import Papa from "papaparse";

export const CHANNELS = ["time", "vo2", "vco2", "ve", "hr", "power", "speed", "rf"] as const;
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
  rf: "breathing frequency",
};

export interface Breath {
  timeS: number;
  vo2MlMin: number;
  vco2MlMin: number;
  veLMin: number;
  hrBpm: number | null;
  powerW: number | null;
  speedKmh: number | null;
  rfPerMin: number | null;
}

export type ColumnMapping = Partial<Record<Channel, string>>;

export interface DetectedColumn {
  header: string;
  /** Unit the values were read in, before conversion. */
  unit: string;
  /** How the unit was decided. */
  unitReason: "header" | "values" | "default";
}

export type ReadResult =
  | { ok: true; breaths: Breath[]; columns: Partial<Record<Channel, DetectedColumn>>; headers: string[]; warnings: string[] }
  | { ok: false; error: string; headers: string[] };

function normaliseHeader(h: string): string {
  return h
    .toLowerCase()
    .replace(/\(.*?\)|\[.*?\]/g, "")
    .replace(/[’'`]/g, "")
    .replace(/[^a-z0-9]/g, "");
}

const ALIASES: Record<Channel, string[]> = {
  time: ["times", "time", "t", "ts", "elapsed", "elapsedtime", "timesec", "timeelapsed", "testtime"],
  vo2: ["vo2mlmin", "vo2", "vo2lmin", "vo2stpd", "vo2abs"],
  vco2: ["vco2mlmin", "vco2", "vco2lmin", "vco2stpd", "vco2abs"],
  ve: ["velmin", "ve", "vebtps", "vent", "ventilation", "minuteventilation"],
  hr: ["hrbpm", "hr", "heartrate", "pulse", "hf"],
  power: ["powerw", "power", "load", "watts", "watt", "workrate", "wr", "work"],
  speed: ["speedkmh", "speed", "velocity", "treadmillspeed"],
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
  const first = raw.charCodeAt(0), end = raw.charCodeAt(raw.length - 1);
  let s = first <= 32 || end <= 32 ? raw.trim() : raw;
  if (s === "") return NaN;
  if (s.includes(",")) s = s.replace(",", ".");
  // Number() also reads "0x1f", "Infinity" and "1_0"-free forms; refuse the first two explicitly.
  const last = s.charCodeAt(s.length - 1);
  if (!((last >= 48 && last <= 57) || last === 46)) return NaN;
  if (s.length > 1 && (s[1] === "x" || s[1] === "X" || s[1] === "b" || s[1] === "B" || s[1] === "o" || s[1] === "O")) return NaN;
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
  rfPerMin: [2, 120],
} as const;

/** A cell that held nothing (or only spaces): optional channels read it as "no value", required ones as unreadable. */
const EMPTY = Number.NEGATIVE_INFINITY;

/** The numbers of some columns of the data rows, one array per column, in row order (NaN unreadable, EMPTY blank). */
interface NumericColumns {
  rows: number;
  values: number[][];
}

function cellValue(raw: string, asTime: boolean): number {
  if (raw === "" || raw.trim() === "") return EMPTY;
  return asTime ? parseTime(raw) : parseNumber(raw);
}

/**
 * The general path: papaparse reads every row (quotes, odd line breaks, anything), then each wanted cell is parsed.
 * `greedy` drops blank lines and lines whose cells are all blank.
 */
function columnsThroughPapa(text: string, wanted: number[], timeAt: number): { headers: string[]; columns: NumericColumns } {
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
function columnsInPlace(text: string, bodyStart: number, delimiter: string, wanted: number[], timeAt: number): NumericColumns {
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
      let mantissa = 0, digits = 0, decimals = 0, seenPoint = false, negative = false, plain = true;
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

export function readGasExchangeCsv(text: string, mapping: ColumnMapping = {}): ReadResult {
  const clean = text.replace(/^\uFEFF/, "");
  // The header line and the delimiter come from papaparse reading the first lines.
  const firstBreak = clean.search(/\r\n|\n|\r/);
  const headerLine = firstBreak < 0 ? clean : clean.slice(0, firstBreak);
  const headEnd = nthLineEnd(clean, 20);
  const head = Papa.parse<string[]>(clean.slice(0, headEnd), { skipEmptyLines: "greedy", delimitersToGuess: DELIMITERS, preview: 20 });
  const headRows = head.data;
  const headers = (headRows[0] ?? []).map((h) => h.trim());
  if (headRows.length < 2) return { ok: false, error: "The file has no data rows under a header line.", headers };

  const guessed = guessColumns(headers);
  const chosen: ColumnMapping = { ...guessed };
  for (const [channel, header] of Object.entries(mapping) as [Channel, string | undefined][]) {
    if (header === undefined) continue;
    if (!headers.includes(header)) {
      return { ok: false, error: `The mapping names a column "${header}" for ${CHANNEL_LABELS[channel]}, but the file has no such column.`, headers };
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
  const index = Object.fromEntries(CHANNELS.map((c) => [c, chosen[c] ? headers.indexOf(chosen[c]!) : -1])) as Record<Channel, number>;
  const wanted = CHANNELS.map((c) => index[c]).filter((i) => i >= 0);
  const plainFile = firstBreak > 0 && headerLine.trim() !== "" && !clean.includes('"') && head.meta.delimiter.length === 1;
  const columns0 = plainFile
    ? columnsInPlace(clean, firstBreak + (clean.startsWith("\r\n", firstBreak) ? 2 : 1), head.meta.delimiter, wanted, index.time)
    : columnsThroughPapa(clean, wanted, index.time).columns;
  const column = (c: Channel): number[] | null => (index[c] >= 0 ? columns0.values[wanted.indexOf(index[c])]! : null);
  const warnings: string[] = [];

  // Decide VO2/VCO2 units: header first, then the values (below 10 means L/min).
  const columns: Partial<Record<Channel, DetectedColumn>> = {};
  const scale: Partial<Record<Channel, number>> = {};
  for (const c of ["vo2", "vco2"] as const) {
    const header = chosen[c]!;
    const fromHeader = unitFromHeader(header);
    if (fromHeader) {
      columns[c] = { header, unit: fromHeader === "l" ? "L/min" : "mL/min", unitReason: "header" };
      scale[c] = fromHeader === "l" ? 1000 : 1;
    } else {
      const sample = column(c)!.slice(0, 300).filter((v) => Number.isFinite(v) && v > 0);
      const m = median(sample);
      const litres = Number.isFinite(m) && m < 10;
      columns[c] = { header, unit: litres ? "L/min" : "mL/min", unitReason: "values" };
      scale[c] = litres ? 1000 : 1;
      if (litres) warnings.push(`${CHANNEL_LABELS[c]} read as L/min (typical values below 10) and converted to mL/min.`);
    }
  }
  const veHeader = chosen.ve!;
  columns.ve = { header: veHeader, unit: unitFromHeader(veHeader) === "ml" ? "mL/min" : "L/min", unitReason: unitFromHeader(veHeader) ? "header" : "default" };
  scale.ve = columns.ve.unit === "mL/min" ? 0.001 : 1;
  columns.time = { header: chosen.time!, unit: "s", unitReason: "default" };
  const optionalUnits: Record<"hr" | "power" | "speed" | "rf", string> = { hr: "bpm", power: "W", speed: "km/h", rf: "1/min" };
  for (const c of ["hr", "power", "speed", "rf"] as const) {
    if (chosen[c]) columns[c] = { header: chosen[c]!, unit: optionalUnits[c], unitReason: "default" };
  }
  if (chosen.speed && /m\/s|ms-1|mps/i.test(chosen.speed)) {
    columns.speed = { header: chosen.speed, unit: "m/s", unitReason: "header" };
    scale.speed = 3.6;
  }

  const breaths: Breath[] = [];
  const badRequired: number[] = [];
  const outOfRange: number[] = [];
  const backwards: number[] = [];
  const optionalDropped: Record<string, number> = {};
  let lastTime = -Infinity;
  const times = column("time")!, vo2s = column("vo2")!, vco2s = column("vco2")!, ves = column("ve")!;
  const optionalColumns = (["hr", "power", "speed", "rf"] as const).map((c) => ({
    c,
    values: column(c),
    scale: scale[c] ?? 1,
    limits: LIMITS[({ hr: "hrBpm", power: "powerW", speed: "speedKmh", rf: "rfPerMin" } as const)[c]],
  }));
  const optionalValues: (number | null)[] = [null, null, null, null];
  for (let i = 0; i < columns0.rows; i++) {
    const line = i + 2;
    const timeS = times[i]!;
    const vo2 = vo2s[i]! * scale.vo2!;
    const vco2 = vco2s[i]! * scale.vco2!;
    const ve = ves[i]! * scale.ve!;
    if (!(Number.isFinite(timeS) && Number.isFinite(vo2) && Number.isFinite(vco2) && Number.isFinite(ve))) {
      badRequired.push(line);
      continue;
    }
    if (
      vo2 < LIMITS.vo2MlMin[0] || vo2 > LIMITS.vo2MlMin[1] ||
      vco2 < LIMITS.vco2MlMin[0] || vco2 > LIMITS.vco2MlMin[1] ||
      ve < LIMITS.veLMin[0] || ve > LIMITS.veLMin[1] || timeS < 0
    ) {
      outOfRange.push(line);
      continue;
    }
    if (timeS < lastTime) {
      backwards.push(line);
      continue;
    }
    lastTime = timeS;
    for (let k = 0; k < 4; k++) {
      const col = optionalColumns[k]!;
      optionalValues[k] = null;
      if (!col.values) continue;
      const raw = col.values[i]!;
      if (raw === EMPTY) continue;
      const v = raw * col.scale;
      if (!Number.isFinite(v) || v < col.limits[0] || v > col.limits[1]) optionalDropped[col.c] = (optionalDropped[col.c] ?? 0) + 1;
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
      rfPerMin: optionalValues[3]!,
    });
  }
  if (badRequired.length) warnings.push(`${badRequired.length} row(s) dropped: missing or non-numeric time, VO2, VCO2 or VE (line ${describeRows(badRequired)}).`);
  if (outOfRange.length) warnings.push(`${outOfRange.length} row(s) dropped: negative or physiologically impossible values (line ${describeRows(outOfRange)}).`);
  if (backwards.length) warnings.push(`${backwards.length} row(s) dropped: time goes backwards (line ${describeRows(backwards)}).`);
  for (const [c, count] of Object.entries(optionalDropped)) {
    warnings.push(`${count} ${CHANNEL_LABELS[c as Channel]} value(s) ignored: not a number or out of range.`);
  }
  for (let i = 1; i < breaths.length; i++) {
    const gap = breaths[i]!.timeS - breaths[i - 1]!.timeS;
    if (gap > 30) warnings.push(`A gap of ${Math.round(gap)} s without data at ${Math.round(breaths[i - 1]!.timeS)} s.`);
  }
  if (breaths.length === 0) return { ok: false, error: "No usable rows: every row lacked a readable time, VO2, VCO2 or VE.", headers };
  return { ok: true, breaths, columns, headers, warnings };
}
