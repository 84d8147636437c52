// The signing secret is required: an unsubscribe link is never signed or checked with an empty key.
import { afterEach, describe, expect, it, vi } from "vitest";

vi.mock("server-only", () => ({}));
const saved = process.env.BETTER_AUTH_SECRET;
afterEach(() => {
  process.env.BETTER_AUTH_SECRET = saved;
});

describe("signingSecret", () => {
  it("refuses a missing or short secret with what to do, and returns a good one", async () => {
    const { signingSecret } = await import("./config");
    delete process.env.BETTER_AUTH_SECRET;
    expect(() => signingSecret()).toThrow(/BETTER_AUTH_SECRET is not set/);
    process.env.BETTER_AUTH_SECRET = "short";
    expect(() => signingSecret()).toThrow(/32 characters/);
    process.env.BETTER_AUTH_SECRET = "x".repeat(40);
    expect(signingSecret()).toBe("x".repeat(40));
  });
});
