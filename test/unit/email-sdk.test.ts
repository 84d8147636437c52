// The e-mail SDK's HTTP calls intercepted with msw: each template's payload (to, subject, HTML and text, unsubscribe
// headers) and the idempotency key, exactly as the Resend SDK sends them. Check values: the SDK's own request shape
// (POST {baseUrl}/emails with a JSON body and an Idempotency-Key header), RFC 2369 / RFC 8058 for List-Unsubscribe.
import { createElement } from "react";
import { http, HttpResponse } from "msw";
import { setupServer } from "msw/node";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { resetConfig } from "@/features/platform/server/config";
import { CoachDigestEmail, coachDigestSubject, coachDigestText } from "@/emails/coach-digest";
import { InvitationEmail, invitationSubject, invitationText } from "@/emails/invitation";
import { PasswordResetEmail, passwordResetSubject, passwordResetText } from "@/emails/password-reset";
import { renderEmailHtml } from "@/emails/render";
import { RetestReminderEmail, retestReminderSubject, retestReminderText } from "@/emails/retest-reminder";
import { SessionReminderEmail, sessionReminderSubject, sessionReminderText } from "@/emails/session-reminder";
import { readUnsubscribeToken, unsubscribeToken } from "@/features/messages/lib/unsubscribe";
import { sendEmail } from "@/features/messages/server/transport";

const BASE = "http://email.msw.test";
const seen: { body: Record<string, unknown>; headers: Headers }[] = [];
const server = setupServer(
  http.post(`${BASE}/emails`, async ({ request }) => {
    seen.push({ body: (await request.json()) as Record<string, unknown>, headers: request.headers });
    return HttpResponse.json({ id: `msg-${seen.length}` });
  }),
);

beforeAll(() => {
  process.env.RESEND_BASE_URL = BASE;
  process.env.RESEND_API_KEY = "re_test_key";
  delete process.env.TIDEMARK_EMAIL_TRANSPORT;
  resetConfig();
  server.listen({ onUnhandledRequest: "error" });
});
afterEach(() => {
  seen.length = 0;
  server.resetHandlers();
});
afterAll(() => server.close());

const unsub = { unsubscribeUrl: "http://app.test/unsubscribe/tok", settingsUrl: "http://app.test/settings" };
const listHeaders = {
  "List-Unsubscribe": "<http://app.test/api/unsubscribe/tok>",
  "List-Unsubscribe-Post": "List-Unsubscribe=One-Click",
};

const templates = [
  {
    kind: "invitation",
    props: {
      inviterName: "Maren Holt",
      squadName: "Harbour Squad",
      roleLabel: "athlete",
      url: "http://app.test/invite/abc",
      expiresOn: "9 December 2026",
    },
    render: (p: never) => createElement(InvitationEmail, p),
    subject: (p: never) => invitationSubject(p),
    text: (p: never) => invitationText(p),
    must: ["http://app.test/invite/abc", "Harbour Squad"],
    unsubscribable: false,
  },
  {
    kind: "password_reset",
    props: { name: "Ines", url: "http://app.test/reset?t=1" },
    render: (p: never) => createElement(PasswordResetEmail, p),
    subject: () => passwordResetSubject,
    text: (p: never) => passwordResetText(p),
    must: ["http://app.test/reset?t=1"],
    unsubscribable: false,
  },
  {
    kind: "session_reminder",
    props: {
      name: "Ines",
      dayLabel: "Tuesday 5 January 2027",
      when: "today",
      sessions: [
        {
          title: "Hill repeats",
          minutes: 60,
          notes: "",
          steps: [{ label: "5 × Work 4 min", target: "zone 3, 172–184 bpm" }],
        },
      ],
      todayUrl: "http://app.test/today",
      ...unsub,
    },
    render: (p: never) => createElement(SessionReminderEmail, p),
    subject: (p: never) => sessionReminderSubject(p),
    text: (p: never) => sessionReminderText(p),
    must: ["Hill repeats", "172–184 bpm", unsub.unsubscribeUrl],
    unsubscribable: true,
  },
  {
    kind: "retest_reminder",
    props: {
      name: "Ines",
      stage: "week",
      date: "2027-01-13",
      dateLabel: "Wednesday 13 January 2027",
      protocol: "Retest: threshold test (running)",
      questions: ["Do you get chest pain?"],
      screeningUrl: "http://app.test/s",
      ...unsub,
    },
    render: (p: never) => createElement(RetestReminderEmail, p),
    subject: (p: never) => retestReminderSubject(p),
    text: (p: never) => retestReminderText(p),
    must: ["Wednesday 13 January 2027", "Do you get chest pain?", unsub.unsubscribeUrl],
    unsubscribable: true,
  },
  {
    kind: "coach_digest",
    props: {
      name: "Maren",
      squad: "Harbour Squad",
      weekLabel: "Monday 4 January 2027",
      overBudget: [{ athlete: "Ines", detail: "Zone 3 is 21 % of the week." }],
      overdueRetests: [],
      loadFlags: [],
      missed: [],
      unread: [],
      rosterUrl: "http://app.test/roster",
      ...unsub,
    },
    render: (p: never) => createElement(CoachDigestEmail, p),
    subject: (p: never) => coachDigestSubject(p),
    text: (p: never) => coachDigestText(p),
    must: ["Zone 3 is 21 % of the week.", unsub.unsubscribeUrl],
    unsubscribable: true,
  },
] as const;

describe("messages through the Resend SDK (intercepted with msw)", () => {
  for (const t of templates) {
    it(`${t.kind}: to, subject, HTML and text parts, ${t.unsubscribable ? "unsubscribe headers" : "no unsubscribe (account message)"} and the idempotency key`, async () => {
      const props = t.props as never;
      const html = await renderEmailHtml(t.render(props));
      const text = t.text(props);
      const key = `${t.kind}:user-1:2027-01-05`;
      const r = await sendEmail({
        to: "ines@example.test",
        subject: t.subject(props),
        html,
        text,
        kind: t.kind,
        headers: t.unsubscribable ? listHeaders : {},
        idempotencyKey: key,
      });
      expect(r).toEqual({ ok: true, providerId: "msg-1" });
      expect(seen).toHaveLength(1);
      const { body, headers } = seen[0]!;
      expect(headers.get("idempotency-key")).toBe(key);
      expect(headers.get("authorization")).toBe("Bearer re_test_key");
      expect(body.to).toEqual(["ines@example.test"]);
      expect(body.subject).toBe(t.subject(props));
      expect(String(body.html)).toMatch(/^<!DOCTYPE html>/);
      expect(body.text).toBe(text);
      expect(body.tags).toEqual([{ name: "kind", value: t.kind }]);
      for (const m of t.must) {
        expect(String(body.html)).toContain(m.replaceAll("&", "&amp;"));
        expect(String(body.text)).toContain(m);
      }
      if (t.unsubscribable) expect(body.headers).toEqual(listHeaders);
      else expect(body.headers ?? {}).toEqual({});
    });
  }

  it("a 429 or an unreachable service is retried later; a refused message is not", async () => {
    server.use(
      http.post(`${BASE}/emails`, () =>
        HttpResponse.json(
          { statusCode: 429, name: "rate_limit_exceeded", message: "Too many requests." },
          { status: 429 },
        ),
      ),
    );
    const base = {
      to: "a@example.test",
      subject: "s",
      html: "<p>x</p>",
      text: "x",
      kind: "k",
      headers: {},
      idempotencyKey: "k1",
    };
    expect(await sendEmail(base)).toMatchObject({ ok: false, retry: true });
    server.use(http.post(`${BASE}/emails`, () => HttpResponse.error()));
    expect(await sendEmail(base)).toMatchObject({ ok: false, retry: true });
    server.use(
      http.post(`${BASE}/emails`, () =>
        HttpResponse.json(
          { statusCode: 422, name: "validation_error", message: "Invalid `to` field." },
          { status: 422 },
        ),
      ),
    );
    expect(await sendEmail(base)).toMatchObject({ ok: false, retry: false });
  });

  it("unsubscribe tokens name one account and one kind, and cannot be altered", () => {
    const t = unsubscribeToken("secret-1", "user-42", "retest_reminder");
    expect(readUnsubscribeToken("secret-1", t)).toEqual({ userId: "user-42", kind: "retest_reminder" });
    expect(readUnsubscribeToken("secret-2", t)).toBeNull();
    expect(readUnsubscribeToken("secret-1", t.replace("retest_reminder", "coach_digest"))).toBeNull();
    const [, kind, sig] = t.split(".");
    expect(
      readUnsubscribeToken("secret-1", `${Buffer.from("user-43").toString("base64url")}.${kind}.${sig}`),
    ).toBeNull();
    expect(readUnsubscribeToken("secret-1", "junk")).toBeNull();
  });
});
