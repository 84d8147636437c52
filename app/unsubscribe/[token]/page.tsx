import Link from "next/link";
import { TurnOffButton } from "@/features/messages/components/TurnOffButton";
import { readUnsubscribeLink } from "@/features/messages/server/preferences";

export const metadata = { title: "Unsubscribe" };
export const dynamic = "force-dynamic";

/**
 * The link in every reminder and digest. Opening it only asks (mail scanners and link previews open links too); the
 * button turns that kind of message off without signing in, through the same one-click POST that mail programs send from
 * the List-Unsubscribe header (app/api/unsubscribe), and the page then says what it did.
 */
export default async function UnsubscribePage({ params }: { params: Promise<{ token: string }> }) {
  const { token: raw } = await params;
  let token: string | null = null;
  try {
    token = decodeURIComponent(raw);
  } catch {
    token = null; // damaged percent-encoding: the same answer as any damaged link
  }
  const link = token === null ? null : await readUnsubscribeLink(token);
  if (!link) {
    return (
      <div className="mx-auto max-w-lg card space-y-3" role="alert">
        <h1 className="text-xl font-bold">This link does not work</h1>
        <p>
          The unsubscribe link is damaged or not from Tidemark, so nothing was changed. Sign in and choose which e-mails
          you get in your settings.
        </p>
        <p>
          <Link href="/settings" className="btn-quiet">
            E-mail settings
          </Link>
        </p>
      </div>
    );
  }
  if (link.alreadyOff) {
    return (
      <div className="mx-auto max-w-lg card space-y-3" role="status">
        <h1 className="text-xl font-bold">Turned off: {link.label}</h1>
        <p>
          Tidemark sends no more {link.label} to <strong>{link.email}</strong>. Other messages stay as they were.
        </p>
        <p className="text-sm text-ink-soft">Changed your mind? Turn them on again in your settings.</p>
        <p>
          <Link href="/settings" className="btn-quiet">
            E-mail settings
          </Link>
        </p>
      </div>
    );
  }
  return (
    <div className="mx-auto max-w-lg card space-y-3">
      <h1 className="text-xl font-bold">Stop {link.label}?</h1>
      <p>
        Tidemark will send no more {link.label} to <strong>{link.email}</strong>. Other messages stay as they were, and
        you can turn these on again in your settings.
      </p>
      <div className="flex flex-wrap items-start gap-2">
        <TurnOffButton token={token!} label={link.label} />
        <Link href="/settings" className="btn-quiet">
          E-mail settings
        </Link>
      </div>
    </div>
  );
}
