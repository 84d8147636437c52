import { describe, expect, it } from "vitest";
import { syntheticRamp } from "@/features/gas-exchange/lib/synthetic-ramp";
import { parseTime, readGasExchangeCsv } from "./csv";

describe("reading gas-exchange CSV files", () => {
  it("reads the canonical headers", () => {
    const r = readGasExchangeCsv(syntheticRamp({ seed: 1 }).csv);
    if (!r.ok) throw new Error(r.error);
    expect(r.breaths.length).toBeGreaterThan(300);
    expect(Object.keys(r.columns).sort()).toEqual(["hr", "power", "rf", "time", "vco2", "ve", "vo2"]);
    expect(r.columns.vo2).toMatchObject({ unit: "mL/min" });
  });

  it("reads common header variants, semicolons, decimal commas, a BOM and blank lines, and L/min inferred from the values", () => {
    const { csv } = syntheticRamp({
      seed: 2,
      headers: ["Time", "VO2", "VCO2", "VE", "HR", "Load", "BF"],
      delimiter: ";",
      decimalComma: true,
      litres: true,
    });
    const lines = csv.split("\n");
    lines.splice(5, 0, "", "   ");
    const r = readGasExchangeCsv("\uFEFF" + lines.join("\r\n"));
    if (!r.ok) throw new Error(r.error);
    expect(r.columns.vo2).toMatchObject({ header: "VO2", unit: "L/min", unitReason: "values" });
    expect(r.columns.power?.header).toBe("Load");
    expect(r.warnings.join(" ")).toMatch(/VO2 read as L\/min/);
    expect(r.breaths[10]!.vo2MlMin).toBeGreaterThan(500);
  });

  it("reads mm:ss and hh:mm:ss times", () => {
    expect(parseTime("01:30")).toBe(90);
    expect(parseTime("1:02:03.5")).toBe(3723.5);
    expect(parseTime("75,5")).toBe(75.5);
    expect(parseTime("ab:cd")).toBeNaN();
  });

  it("refuses a file without VO2 or VE and names what is missing", () => {
    const r = readGasExchangeCsv("time,vco2,hr\n1,300,80\n2,310,81\n");
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatch(/no column for VO2, VE/);
  });

  it("an explicit mapping overrides the guess", () => {
    const text = "secs,oxygen,carbon,vent\n0,1000,900,30\n5,1100,950,31\n";
    const r = readGasExchangeCsv(text, { time: "secs", vo2: "oxygen", vco2: "carbon", ve: "vent" });
    if (!r.ok) throw new Error(r.error);
    expect(r.breaths).toHaveLength(2);
    const bad = readGasExchangeCsv(text, { vo2: "nope" });
    expect(bad.ok).toBe(false);
  });

  it("drops non-numeric, negative and impossible rows with warnings instead of crashing", () => {
    const text = [
      "time_s,vo2_ml_min,vco2_ml_min,ve_l_min,hr_bpm",
      "0,1000,900,30,90",
      "5,abc,900,30,90",
      "10,-5,900,30,90",
      "15,1e9,900,30,91",
      "20,1100,950,31,400",
      "8,1000,900,30,90",
      "60,1150,990,33,95",
    ].join("\n");
    const r = readGasExchangeCsv(text);
    if (!r.ok) throw new Error(r.error);
    expect(r.breaths.map((b) => b.timeS)).toEqual([0, 20, 60]);
    expect(r.breaths[1]!.hrBpm).toBeNull();
    const w = r.warnings.join(" | ");
    expect(w).toMatch(/non-numeric/);
    expect(w).toMatch(/impossible/);
    expect(w).toMatch(/backwards/);
    expect(w).toMatch(/heart rate value/);
    expect(w).toMatch(/gap of 40 s/);
  });

  it("answers garbage with an error, not an exception", () => {
    for (const junk of ["", "\u0000\u0001\u0002", "just one line", "a,b\n1,2", "\uFFFD\uFFFD,\n,,,"]) {
      const r = readGasExchangeCsv(junk);
      expect(r.ok).toBe(false);
    }
  });

  it("reads plain files in place exactly as papaparse reads them (cross-check against papaparse's own parse)", () => {
    // A quote in the header sends a file through papaparse; the same file without it is read in place. Both must agree.
    const { csv } = syntheticRamp({ seed: 3 });
    const samples = [
      csv,
      csv.replace(/\n/g, "\r\n"),
      csv.replace(/\n/g, "\r"),
      csv.trimEnd(),
      "time_s;vo2;vco2;ve;hr\n0;1,20;1,10;30,5;90\n00:05;1,25;1,12; 31 ;\n\n;;;;\n   \n0:10;1.3e0;1,15;-3;x\n15;1,4;1,2;32;91;extra\n20;1,5\n25;+1,45;1,21;33,25;92,5\n",
      "time,vo2,vco2,ve,hr\n1,1000.123456789012345,900,30,90\n2,.5,900,30,\t\n3,1000.,900.0,030,0x1F\n4,1000,900,30,1_0\n,,,,\n5,1000,900,30,Infinity\n",
      "time\tVO2\tVCO2\tVE\tHR\n0\t1000\t900\t30\t90\n1\t1010\t910\t30\t\t\n\t\t\t\t\n2\t1020\t920\t31\t92\n",
    ];
    for (const text of samples) {
      const quoted = text.replace(/^([^,;\t\r\n]+)/, '"$1"');
      expect(quoted).not.toBe(text);
      const inPlace = readGasExchangeCsv(text);
      const throughPapa = readGasExchangeCsv(quoted);
      expect(inPlace).toEqual(throughPapa);
    }
  });
});
