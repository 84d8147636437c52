import Link from "next/link";
import { notFound } from "next/navigation";
import { currentActor } from "@/features/access/server/current";
import {
  ACCOUNT_MESSAGE_KINDS,
  fakeEmailOutboxUrl,
  getOutboxMessage,
  listOutbox,
  localOutboxEnabled,
  maskLinks,
} from "@/features/messages/server/list";

export const metadata = { title: "Outbox" };
export const dynamic = "force-dynamic";

const STATUS = { pending: "waiting to be sent", sent: "sent", failed: "refused by the e-mail service" } as const;

const formatter = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short", timeZone: "UTC" });

export default async function OutboxPage({ searchParams }: { searchParams: Promise<{ id?: string }> }) {
  // For site operators only, and only while the local e-mail fake is the transport: anyone else gets "not found".
  if (!localOutboxEnabled()) notFound();
  const actor = await currentActor();
  if (!actor?.isAdmin) notFound();
  const { id } = await searchParams;
  const message = typeof id === "string" && /^[0-9a-f-]{36}$/.test(id) ? await getOutboxMessage(id) : null;
  const messages = await listOutbox();
  return (
    <div className="space-y-4">
      <div>
        <h1 className="text-2xl font-bold">Outbox</h1>
        <p className="text-sm text-ink-soft">
          Messages Tidemark queued on this local installation, newest first, and whether the worker has sent them yet.
          They go to the local e-mail fake (its own outbox is at {fakeEmailOutboxUrl()}); nothing leaves the machine.
          Links that open an account (password resets, invitations, address confirmations) are hidden here; the
          recipient reads them in the e-mail fake&apos;s inbox.
        </p>
      </div>
      <div className="grid gap-6 lg:grid-cols-[2fr_3fr]">
        <section className="card" aria-label="Messages">
          {messages.length === 0 ? (
            <p className="text-ink-soft">No messages yet. Invitations and password resets appear here.</p>
          ) : (
            <ul className="divide-y divide-rule">
              {messages.map((m) => (
                <li key={m.id} className="py-2">
                  <Link href={`/outbox?id=${m.id}`} className="font-semibold text-tide hover:underline">
                    {m.subject}
                  </Link>
                  <p className="text-xs text-ink-soft">
                    to {m.to} · {m.kind.replaceAll("_", " ")} ·{" "}
                    <time dateTime={m.createdAt.toISOString()}>{formatter.format(m.createdAt)} UTC</time> ·{" "}
                    {STATUS[m.status]}
                  </p>
                </li>
              ))}
            </ul>
          )}
        </section>
        <section className="card" aria-label="Message">
          {message ? (
            <article className="space-y-3">
              <h2 className="text-lg font-bold">{message.subject}</h2>
              <p className="text-sm text-ink-soft">
                To {message.to} · {STATUS[message.status]}
                {message.lastError ? ` (last attempt: ${message.lastError})` : ""}
              </p>
              <pre className="whitespace-pre-wrap font-sans text-sm" data-testid="outbox-text">
                {ACCOUNT_MESSAGE_KINDS.has(message.kind) ? maskLinks(message.text) : message.text}
              </pre>
              {typeof message.meta.url === "string" && !ACCOUNT_MESSAGE_KINDS.has(message.kind) ? (
                <a href={message.meta.url} className="btn-quiet">
                  Open the link in this message
                </a>
              ) : null}
            </article>
          ) : (
            <p className="text-ink-soft">Choose a message to read it.</p>
          )}
        </section>
      </div>
    </div>
  );
}
