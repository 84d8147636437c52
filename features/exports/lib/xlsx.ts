/**
 * Workbook downloads (.xlsx) through exceljs, from the same tables as the CSV downloads (csv.ts): one sheet per table, a
 * bold header row that stays in view, numbers as numbers. Every text cell is written as a text value, never as a formula,
 * so a cell that starts with =, +, - or @ shows as typed and runs nothing (the workbook's own form of the neutralising
 * that CSV needs; OWASP, "CSV Injection").
 */
import type { Table } from "./csv";

export const XLSX_TYPE = "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet";

/** Sheet names: at most 31 characters, none of : \ / ? * [ ] (the format's own rules). */
function sheetName(name: string): string {
  return name.replace(/[:\\/?*[\]]/g, " ").slice(0, 31) || "Sheet";
}

export async function toXlsx(sheets: { name: string; table: Table }[]): Promise<Uint8Array> {
  const ExcelJS = (await import("exceljs")).default;
  const wb = new ExcelJS.Workbook();
  wb.creator = "Tidemark";
  for (const { name, table } of sheets) {
    const ws = wb.addWorksheet(sheetName(name), { views: [{ state: "frozen", ySplit: 1 }] });
    ws.addRow(table.header).font = { bold: true };
    for (const r of table.rows) {
      // A plain string is written as a string cell (exceljs makes formulas only from { formula } values).
      ws.addRow(r.map((c) => (c === null || c === undefined ? null : c)));
    }
    ws.columns.forEach((col, i) => {
      const longest = Math.max(
        table.header[i]!.length,
        ...table.rows.slice(0, 500).map((r) => String(r[i] ?? "").length),
      );
      col.width = Math.min(60, Math.max(8, longest + 2));
    });
  }
  return new Uint8Array(await wb.xlsx.writeBuffer());
}
