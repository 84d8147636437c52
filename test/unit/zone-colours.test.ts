// Contrast of the palette in app/globals.css, with the contrast ratio and relative luminance of WCAG 2.2 (W3C
// Recommendation, "contrast ratio" and "relative luminance" definitions): text needs 4.5 : 1 (1.4.3), the parts of a
// graphic that carry meaning 3 : 1 against what adjoins them (1.4.11).
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

const css = fs.readFileSync(path.resolve("app/globals.css"), "utf8");
const colour = (name: string) => {
  const m = css.match(new RegExp(`--color-${name}:\\s*(#[0-9a-fA-F]{6})`));
  if (!m) throw new Error(`no --color-${name}`);
  return m[1]!;
};
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const lin = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);
  return 0.2126 * lin(r!) + 0.7152 * lin(g!) + 0.0722 * lin(b!);
}
function ratio(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi! + 0.05) / (lo! + 0.05);
}

describe("palette contrast (WCAG 2.2)", () => {
  it("the formula gives the published extremes: black on white 21 : 1, a colour on itself 1 : 1", () => {
    expect(ratio("#000000", "#ffffff")).toBeCloseTo(21, 5);
    expect(ratio("#777777", "#777777")).toBe(1);
  });

  it("zone segments are told apart from the track and from each other by their ink outline (3 : 1 or more)", () => {
    const ink = colour("ink"),
      track = colour("ground");
    // The outline against the track and against the two light fills it separates.
    expect(ratio(ink, track)).toBeGreaterThanOrEqual(3);
    expect(ratio(ink, colour("zone-1"))).toBeGreaterThanOrEqual(3);
    expect(ratio(ink, colour("zone-2"))).toBeGreaterThanOrEqual(3);
    // Zone 3 is as dark as the outline, so it must stand out from the track and from zone 2 on its own.
    expect(ratio(colour("zone-3"), track)).toBeGreaterThanOrEqual(3);
    expect(ratio(colour("zone-3"), colour("zone-2"))).toBeGreaterThanOrEqual(3);
  });

  it("the text of each season-ribbon block is readable on its colour (4.5 : 1)", () => {
    for (const b of ["general", "specific", "pre", "taper", "transition"])
      expect(ratio(colour("ink"), colour(`block-${b}`)), b).toBeGreaterThanOrEqual(4.5);
    expect(ratio("#ffffff", colour("block-competition"))).toBeGreaterThanOrEqual(4.5);
  });

  it("the block palette shares no colour with the zones", () => {
    const zones = [1, 2, 3].map((z) => colour(`zone-${z}`).toLowerCase());
    for (const b of ["general", "specific", "pre", "taper", "competition", "transition"])
      expect(zones).not.toContain(colour(`block-${b}`).toLowerCase());
  });
});
