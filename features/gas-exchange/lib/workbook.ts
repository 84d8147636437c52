/**
 * Spreadsheet exports (.xlsx) through exceljs, read with the same column and unit detection as CSV files (`readTable`).
 * The first sheet is read unless another is named; the header is the first row with text in it. Old binary formats are
 * refused with what to do instead.
 */
import {
  cellValue,
  EMPTY,
  readGasExchangeCsv,
  readTable,
  type ColumnMapping,
  type NumericColumns,
  type ReadOptions,
  type ReadResult,
} from "./csv";

export type FileKind = "csv" | "xlsx" | "xls" | "binary";

/** The kind of an uploaded file from its first bytes (a zip archive is an .xlsx workbook; the OLE signature is .xls). */
export function fileKind(bytes: Uint8Array): FileKind {
  if (bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04) return "xlsx";
  if (bytes[0] === 0xd0 && bytes[1] === 0xcf && bytes[2] === 0x11 && bytes[3] === 0xe0) return "xls";
  if (bytes.subarray(0, 4096).includes(0)) return "binary";
  return "csv";
}

export const REFUSED_KINDS: Record<"xls" | "binary", string> = {
  xls: "This is an old Excel workbook (.xls), which Tidemark cannot read. Open it and save it as .xlsx or as CSV, then upload that.",
  binary:
    "This file is not a text CSV or an .xlsx workbook (it contains binary data). Export the test as CSV or .xlsx and try again.",
};

const EXCEL_EPOCH_MS = Date.UTC(1899, 11, 30);

function cellNumber(v: unknown, asTime: boolean): number {
  if (v === null || v === undefined) return EMPTY;
  if (typeof v === "number") return Number.isFinite(v) ? v : NaN;
  if (v instanceof Date) {
    // exceljs gives time-formatted cells as dates counted from Excel's day zero; the time of day is the elapsed time.
    const s = (v.getTime() - EXCEL_EPOCH_MS) / 1000;
    return asTime ? s : NaN;
  }
  if (typeof v === "string") return cellValue(v, asTime);
  if (typeof v === "object") {
    const o = v as { result?: unknown; richText?: { text: string }[]; text?: string };
    if ("result" in o) return cellNumber(o.result, asTime);
    if (o.richText) return cellValue(o.richText.map((r) => r.text).join(""), asTime);
    if (typeof o.text === "string") return cellValue(o.text, asTime);
  }
  return NaN;
}

function cellText(v: unknown): string {
  if (v === null || v === undefined) return "";
  if (typeof v === "string" || typeof v === "number") return String(v).trim();
  if (typeof v === "object") {
    const o = v as { result?: unknown; richText?: { text: string }[]; text?: string };
    if (o.richText)
      return o.richText
        .map((r) => r.text)
        .join("")
        .trim();
    if (typeof o.text === "string") return o.text.trim();
    if ("result" in o) return cellText(o.result);
  }
  return String(v);
}

export type WorkbookRead = ReadResult & { sheets: string[]; sheet: string | null };

export async function readGasExchangeWorkbook(
  bytes: Uint8Array,
  mapping: ColumnMapping = {},
  opts: ReadOptions & { sheet?: string | null } = {},
): Promise<WorkbookRead> {
  const ExcelJS = (await import("exceljs")).default;
  const wb = new ExcelJS.Workbook();
  try {
    await wb.xlsx.load(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
  } catch {
    return {
      ok: false,
      error: "The workbook could not be opened (damaged or not an .xlsx file). Save it again as .xlsx or CSV.",
      headers: [],
      sheets: [],
      sheet: null,
    };
  }
  const sheets = wb.worksheets.map((w) => w.name);
  const ws = opts.sheet ? wb.getWorksheet(opts.sheet) : wb.worksheets[0];
  if (!ws) {
    const error = opts.sheet
      ? `The workbook has no sheet "${opts.sheet}". Its sheets: ${sheets.join(", ") || "none"}.`
      : "The workbook has no sheets.";
    return { ok: false, error, headers: [], sheets, sheet: null };
  }
  const rows: unknown[][] = [];
  ws.eachRow({ includeEmpty: false }, (row) => {
    const values = row.values as unknown[];
    rows.push(values.slice(1));
  });
  const headerAt = rows.findIndex((r) => r.some((v) => typeof v === "string" && v.trim() !== ""));
  if (headerAt < 0)
    return { ok: false, error: `The sheet "${ws.name}" has no header row.`, headers: [], sheets, sheet: ws.name };
  const headers = rows[headerAt]!.map(cellText);
  const body = rows.slice(headerAt + 1).filter((r) => r.some((v) => cellText(v) !== ""));
  if (!body.length)
    return {
      ok: false,
      error: `The sheet "${ws.name}" has no data rows under its header.`,
      headers,
      sheets,
      sheet: ws.name,
    };
  const read = readTable(
    headers,
    (wanted, timeAt): NumericColumns => ({
      rows: body.length,
      values: wanted.map((col) => body.map((r) => cellNumber(r[col], col === timeAt))),
    }),
    mapping,
    opts,
  );
  return { ...read, sheets, sheet: ws.name };
}

/** Any supported export, by its content: CSV text or an .xlsx workbook. */
export async function readGasExchangeFile(
  bytes: Uint8Array,
  mapping: ColumnMapping = {},
  opts: ReadOptions & { sheet?: string | null } = {},
): Promise<ReadResult & { sheets?: string[]; sheet?: string | null }> {
  const kind = fileKind(bytes);
  if (kind === "xls" || kind === "binary") return { ok: false, error: REFUSED_KINDS[kind], headers: [] };
  if (kind === "xlsx") return readGasExchangeWorkbook(bytes, mapping, opts);
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    // Many lab exports are Latin-1; every byte sequence is valid there.
    text = new TextDecoder("latin1").decode(bytes);
  }
  return readGasExchangeCsv(text, mapping, opts);
}
