// The open-redirect cases from the security review (issue: `next=/%5Cevil.test%2Fx`, `next=/%09/evil.test/x`), decoded as
// the page receives them, and ordinary same-site paths.
import { describe, expect, it } from "vitest";
import { safeNext } from "./safe-next";

const origin = "http://127.0.0.1:3000";

describe("where sign-in goes next", () => {
  it("keeps a path on this site, with its query and fragment", () => {
    expect(safeNext("/invite/abc", origin)).toBe("/invite/abc");
    expect(safeNext("/athletes/1/plan?week=2027-01-04#today", origin)).toBe("/athletes/1/plan?week=2027-01-04#today");
    expect(safeNext(`${origin}/roster`, origin)).toBe("/roster");
  });

  it("refuses every way of naming another site", () => {
    for (const next of [
      "/\\evil.test/x",
      "/\t/evil.test/x",
      "//evil.test/x",
      "https://evil.test/x",
      "\\\\evil.test",
      "/\\/evil.test",
      " //evil.test",
      "javascript:alert(1)",
      `${origin}//evil.test`,
    ]) {
      expect(safeNext(next, origin), next).toBe("/home");
    }
  });

  it("goes home when there is no next", () => {
    expect(safeNext(undefined, origin)).toBe("/home");
    expect(safeNext("", origin)).toBe("/home");
  });
});
