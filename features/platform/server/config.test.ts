// The configuration module: validated once, clear messages, and the signing secret required.
import { afterEach, describe, expect, it } from "vitest";
import { config, readConfig, resetConfig, signingSecret } from "./config";

const saved = process.env.BETTER_AUTH_SECRET;
afterEach(() => {
  if (saved === undefined) delete process.env.BETTER_AUTH_SECRET;
  else process.env.BETTER_AUTH_SECRET = saved;
  resetConfig();
});

describe("configuration", () => {
  it("fills the documented defaults for an empty environment", () => {
    const c = readConfig({});
    expect(c.production).toBe(false);
    expect(c.auth.url).toBe("http://127.0.0.1:3000");
    expect(c.database.poolSize).toBe(10);
    expect(c.signIn).toEqual({
      limitPerMin: undefined,
      clientIpHeader: undefined,
      trustedProxies: [],
      rateLimitDisabled: false,
    });
    expect(c.mail.transport).toBe("resend");
    expect(c.mail.fakeUrl).toBe("http://127.0.0.1:4010");
  });

  it("reads and normalises what is set", () => {
    const c = readConfig({
      NODE_ENV: "production",
      BETTER_AUTH_URL: "https://tidemark.example/",
      TIDEMARK_CLIENT_IP_HEADER: " X-Forwarded-For ",
      TIDEMARK_TRUSTED_PROXIES: "10.0.0.1, 10.0.0.2,",
      TIDEMARK_SIGN_IN_LIMIT_PER_MIN: "12",
      TIDEMARK_DISABLE_RATE_LIMIT: "1",
      TIDEMARK_EMAIL_TRANSPORT: "smtp",
      SMTP_PORT: "587",
    });
    expect(c.production).toBe(true);
    expect(c.auth.url).toBe("https://tidemark.example");
    expect(c.signIn).toEqual({
      limitPerMin: 12,
      clientIpHeader: "x-forwarded-for",
      trustedProxies: ["10.0.0.1", "10.0.0.2"],
      rateLimitDisabled: true,
    });
    expect(c.mail.smtp.port).toBe(587);
  });

  it("refuses bad values, naming each variable and what it must be", () => {
    const bad = () =>
      readConfig({ TIDEMARK_EMAIL_TRANSPORT: "pigeon", SMTP_PORT: "seventy", BETTER_AUTH_URL: "tidemark" });
    expect(bad).toThrow(/^The configuration is not valid/);
    expect(bad).toThrow(/TIDEMARK_EMAIL_TRANSPORT: must be resend or smtp/);
    expect(bad).toThrow(/SMTP_PORT: must be a port number/);
    expect(bad).toThrow(/BETTER_AUTH_URL: must be a full address/);
    expect(() => readConfig({ TIDEMARK_SIGN_IN_LIMIT_PER_MIN: "0" })).toThrow(
      /TIDEMARK_SIGN_IN_LIMIT_PER_MIN: must be at least 1/,
    );
  });

  it("is read once: a change to the environment shows only after resetConfig()", () => {
    process.env.BETTER_AUTH_SECRET = "a".repeat(40);
    resetConfig();
    expect(config().auth.secret).toBe("a".repeat(40));
    process.env.BETTER_AUTH_SECRET = "b".repeat(40);
    expect(config().auth.secret).toBe("a".repeat(40));
    resetConfig();
    expect(config().auth.secret).toBe("b".repeat(40));
  });
});

describe("signingSecret", () => {
  it("refuses a missing or short secret with what to do, and returns a good one", () => {
    delete process.env.BETTER_AUTH_SECRET;
    resetConfig();
    expect(() => signingSecret()).toThrow(/BETTER_AUTH_SECRET is not set/);
    process.env.BETTER_AUTH_SECRET = "short";
    resetConfig();
    expect(() => signingSecret()).toThrow(/32 characters/);
    process.env.BETTER_AUTH_SECRET = "x".repeat(40);
    resetConfig();
    expect(signingSecret()).toBe("x".repeat(40));
  });
});
