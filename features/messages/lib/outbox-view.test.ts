import { afterEach, describe, expect, it } from "vitest";
import { localFakeTransport, localOutboxEnabled, maskLinks } from "./outbox-view";

const saved = { ...process.env };
afterEach(() => {
  process.env = { ...saved };
});

describe("the local outbox page", () => {
  it("exists only when the harness turned it on and the messages go to the local e-mail fake", () => {
    process.env.TIDEMARK_LOCAL_OUTBOX = "1";
    delete process.env.TIDEMARK_EMAIL_TRANSPORT;
    process.env.RESEND_BASE_URL = "http://127.0.0.1:4010";
    expect(localFakeTransport()).toBe(true);
    expect(localOutboxEnabled()).toBe(true);
    // Real e-mail: the service's own address, or none set (the SDK's default), or an SMTP relay elsewhere.
    process.env.RESEND_BASE_URL = "https://api.resend.com";
    expect(localOutboxEnabled()).toBe(false);
    delete process.env.RESEND_BASE_URL;
    expect(localOutboxEnabled()).toBe(false);
    process.env.TIDEMARK_EMAIL_TRANSPORT = "smtp";
    process.env.SMTP_HOST = "smtp.example.test";
    expect(localOutboxEnabled()).toBe(false);
    process.env.SMTP_HOST = "127.0.0.1";
    expect(localOutboxEnabled()).toBe(true);
    delete process.env.TIDEMARK_LOCAL_OUTBOX;
    expect(localOutboxEnabled()).toBe(false);
  });

  it("a look-alike host is not loopback", () => {
    process.env.TIDEMARK_LOCAL_OUTBOX = "1";
    delete process.env.TIDEMARK_EMAIL_TRANSPORT;
    process.env.RESEND_BASE_URL = "http://127.0.0.1.evil.test";
    expect(localOutboxEnabled()).toBe(false);
  });

  it("hides the secret part of every link, keeping where it goes", () => {
    const text = "Choose a new password here:\nhttp://127.0.0.1:3000/api/auth/reset-password/abcDEF123?callbackURL=%2Freset\nThanks";
    const masked = maskLinks(text);
    expect(masked).not.toContain("abcDEF123");
    expect(masked).toContain("http://127.0.0.1:3000/…");
    expect(masked).toContain("Choose a new password here:");
    expect(maskLinks("join: https://tidemark.test/invite/tok_en-1 today")).toBe("join: https://tidemark.test/… (link hidden; it is in the recipient's inbox) today");
  });
});
