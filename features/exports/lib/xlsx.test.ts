// Workbook downloads, read back with exceljs (the reference reader, REFERENCES.md's spreadsheet library): the same columns
// as the CSV, numbers as numbers, and text that starts like a formula stored as text (OWASP "CSV Injection").
import ExcelJS from "exceljs";
import { describe, expect, it } from "vitest";
import { planTable } from "./csv";
import { toXlsx } from "./xlsx";

async function readBack(bytes: Uint8Array) {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(Buffer.from(bytes) as unknown as ArrayBuffer);
  return wb;
}

describe("xlsx downloads", () => {
  it("hold the plan's columns, numbers as numbers and formula-like text as text", async () => {
    const table = planTable([
      {
        date: "2027-01-05",
        title: '=HYPERLINK("http://evil.test")',
        sport: "running",
        kind: "training",
        totalS: 2700,
        minutesByZone: [40, 0, 5],
        notes: "@SUM(A1)",
        log: { status: "done", durationMin: 44, rpe: 6 },
      },
    ]);
    const wb = await readBack(await toXlsx([{ name: "Plan", table }]));
    const ws = wb.getWorksheet("Plan")!;
    const header = (ws.getRow(1).values as unknown[]).slice(1);
    expect(header).toEqual(table.header);
    const cell = (name: string) => ws.getRow(2).getCell(table.header.indexOf(name) + 1);
    expect(cell("date").value).toBe("2027-01-05");
    expect(cell("planned_min").value).toBe(45);
    expect(cell("zone1_min").value).toBe(40);
    expect(cell("rpe").value).toBe(6);
    expect(cell("title").type).toBe(ExcelJS.ValueType.String);
    expect(cell("title").value).toBe('=HYPERLINK("http://evil.test")');
    expect(cell("notes").type).toBe(ExcelJS.ValueType.String);
    expect(ws.views[0]).toMatchObject({ state: "frozen", ySplit: 1 });
  });

  it("one sheet per table, with names the format accepts", async () => {
    const t = { header: ["a"], rows: [[1], [2]] };
    const wb = await readBack(
      await toXlsx([
        { name: "Zones: history / all", table: t },
        { name: "x".repeat(40), table: t },
      ]),
    );
    expect(wb.worksheets.map((w) => w.name)).toEqual(["Zones  history   all", "x".repeat(31)]);
    expect(wb.worksheets[0]!.rowCount).toBe(3);
  });
});
