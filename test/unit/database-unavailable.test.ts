// The database being unreachable is recognised however deeply the driver's error is wrapped, so that the API answers
// 503 with Retry-After instead of 500. Codes: Node's socket errors, postgres.js's connection codes, and PostgreSQL's
// SQLSTATE classes 57P0x (shutdown) and 08 (connection exception) — from the PostgreSQL manual, Appendix A.
import { describe, expect, it } from "vitest";
import { isDatabaseUnavailable, route } from "@/features/platform/server/http";

describe("database unavailable", () => {
  it("is found in the error or in its causes, and nothing else counts", () => {
    const driver = Object.assign(new Error("write ECONNRESET"), { code: "ECONNRESET" });
    const query = Object.assign(new Error("Failed query: select 1"), { cause: driver });
    const auth = Object.assign(new Error("Failed to get session"), { cause: query });
    expect(isDatabaseUnavailable(driver)).toBe(true);
    expect(isDatabaseUnavailable(auth)).toBe(true);
    expect(
      isDatabaseUnavailable(
        Object.assign(new Error("terminating connection due to administrator command"), { code: "57P01" }),
      ),
    ).toBe(true);
    expect(isDatabaseUnavailable(Object.assign(new Error("duplicate key"), { code: "23505" }))).toBe(false);
    expect(isDatabaseUnavailable(new Error("plain"))).toBe(false);
    expect(isDatabaseUnavailable(undefined)).toBe(false);
  });

  it("a route handler answers 503 with Retry-After", async () => {
    const handler = route(async () => {
      throw Object.assign(new Error("Failed query"), {
        cause: Object.assign(new Error("connect ECONNREFUSED"), { code: "ECONNREFUSED" }),
      });
    });
    const res = await handler(new Request("http://x.test/api"), {});
    expect(res.status).toBe(503);
    expect(res.headers.get("retry-after")).toBe("5");
  });
});
