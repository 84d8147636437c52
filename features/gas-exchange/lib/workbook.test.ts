// Spreadsheet exports: a generated lab test (model in lab-generator.ts) written as .xlsx by exceljs must give exactly the
// answers of the same test as CSV (one engine), and unsupported formats are refused with what to do.
import ExcelJS from "exceljs";
import { describe, expect, it } from "vitest";
import { analyzeCsv, analyzeRead } from "./analyze";
import { labExport } from "./lab-generator";
import { fileKind, readGasExchangeFile } from "./workbook";

async function xlsx(header: string[], cells: (string | number)[][], sheetName = "Breath data", before?: string) {
  const wb = new ExcelJS.Workbook();
  if (before) wb.addWorksheet(before).addRow(["notes"]);
  const ws = wb.addWorksheet(sheetName);
  ws.addRow(header);
  for (const row of cells) ws.addRow(row);
  return new Uint8Array(await wb.xlsx.writeBuffer());
}

describe(".xlsx input", () => {
  it("gives the same thresholds as the CSV of the same test", async () => {
    const { header, cells, csv } = labExport({
      seed: 3,
      protocol: "treadmill-speed-grade",
      phase: "rest-warmup-stage",
      style: "relative-first",
    });
    const bytes = await xlsx(header, cells);
    expect(fileKind(bytes)).toBe("xlsx");
    const fromBook = analyzeRead(await readGasExchangeFile(bytes));
    const fromCsv = analyzeCsv(csv);
    if (!fromBook.ok || !fromCsv.ok) throw new Error("both should read");
    expect(fromBook.columns.vo2?.header).toBe("vo2.1");
    expect(fromBook.peak).toEqual(fromCsv.peak);
    expect(fromBook.vt2?.vo2MlMin).toBe(fromCsv.vt2?.vo2MlMin);
    expect(fromBook.vt1?.vo2MlMin).toBe(fromCsv.vt1?.vo2MlMin);
    expect([fromBook.onsetS, fromBook.endS]).toEqual([fromCsv.onsetS, fromCsv.endS]);
  });

  it("reads a named sheet and names the sheets when one is missing", async () => {
    const { header, cells } = labExport({ seed: 4, protocol: "cycle-ramp", phase: "warmup", style: "breath" });
    const bytes = await xlsx(header, cells, "Ramp", "Notes");
    const first = await readGasExchangeFile(bytes);
    expect(first.ok).toBe(false);
    const named = await readGasExchangeFile(bytes, {}, { sheet: "Ramp" });
    expect(named.ok).toBe(true);
    const missing = await readGasExchangeFile(bytes, {}, { sheet: "Nope" });
    expect(missing.ok).toBe(false);
    if (!missing.ok) expect(missing.error).toMatch(/no sheet "Nope".*Notes, Ramp/);
  });

  it("refuses .xls and other binary files with what to do", async () => {
    const xls = await readGasExchangeFile(new Uint8Array([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]));
    expect(xls.ok).toBe(false);
    if (!xls.ok) expect(xls.error).toMatch(/\.xls.*save it as \.xlsx or as CSV/);
    const png = await readGasExchangeFile(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0, 0, 1, 2]));
    if (!png.ok) expect(png.error).toMatch(/not a text CSV/);
    else throw new Error("a PNG must be refused");
  });
});
