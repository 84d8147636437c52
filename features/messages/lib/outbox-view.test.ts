import { describe, expect, it } from "vitest";
import { localFakeTransport, localOutboxEnabled, maskLinks, type MailSettings } from "./outbox-view";

const mail = (o: {
  outbox?: boolean;
  transport?: "resend" | "smtp";
  resendBaseUrl?: string;
  smtpHost?: string;
}): MailSettings => ({
  transport: o.transport ?? "resend",
  resend: { baseUrl: o.resendBaseUrl },
  smtp: { host: o.smtpHost },
  localOutbox: o.outbox ?? false,
});

describe("the local outbox page", () => {
  it("exists only when the harness turned it on and the messages go to the local e-mail fake", () => {
    expect(localFakeTransport(mail({ resendBaseUrl: "http://127.0.0.1:4010" }))).toBe(true);
    expect(localOutboxEnabled(mail({ outbox: true, resendBaseUrl: "http://127.0.0.1:4010" }))).toBe(true);
    // Real e-mail: the service's own address, or none set (the SDK's default), or an SMTP relay elsewhere.
    expect(localOutboxEnabled(mail({ outbox: true, resendBaseUrl: "https://api.resend.com" }))).toBe(false);
    expect(localOutboxEnabled(mail({ outbox: true }))).toBe(false);
    expect(localOutboxEnabled(mail({ outbox: true, transport: "smtp", smtpHost: "smtp.example.test" }))).toBe(false);
    expect(localOutboxEnabled(mail({ outbox: true, transport: "smtp", smtpHost: "127.0.0.1" }))).toBe(true);
    expect(localOutboxEnabled(mail({ outbox: false, transport: "smtp", smtpHost: "127.0.0.1" }))).toBe(false);
  });

  it("a look-alike host is not loopback", () => {
    expect(localOutboxEnabled(mail({ outbox: true, resendBaseUrl: "http://127.0.0.1.evil.test" }))).toBe(false);
  });

  it("hides the secret part of every link, keeping where it goes", () => {
    const text =
      "Choose a new password here:\nhttp://127.0.0.1:3000/api/auth/reset-password/abcDEF123?callbackURL=%2Freset\nThanks";
    const masked = maskLinks(text);
    expect(masked).not.toContain("abcDEF123");
    expect(masked).toContain("http://127.0.0.1:3000/…");
    expect(masked).toContain("Choose a new password here:");
    expect(maskLinks("join: https://tidemark.test/invite/tok_en-1 today")).toBe(
      "join: https://tidemark.test/… (link hidden; it is in the recipient's inbox) today",
    );
  });
});
