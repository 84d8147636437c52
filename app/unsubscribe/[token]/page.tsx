import Link from "next/link";
import { unsubscribe } from "@/features/messages/server/preferences";

export const metadata = { title: "Unsubscribe" };
export const dynamic = "force-dynamic";

/** The link in every reminder and digest: turns that kind of message off without signing in, and says what it did. */
export default async function UnsubscribePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const done = await unsubscribe(decodeURIComponent(token));
  return (
    <div className="mx-auto max-w-lg card space-y-3" role={done ? "status" : "alert"}>
      {done ? (
        <>
          <h1 className="text-xl font-bold">Turned off: {done.label}</h1>
          <p>Tidemark will send no more {done.label} to <strong>{done.email}</strong>. Other messages stay as they were.</p>
          <p className="text-sm text-ink-soft">Changed your mind? Turn them on again in your settings.</p>
          <p><Link href="/settings" className="btn-quiet">E-mail settings</Link></p>
        </>
      ) : (
        <>
          <h1 className="text-xl font-bold">This link does not work</h1>
          <p>The unsubscribe link is damaged or not from Tidemark, so nothing was changed. Sign in and choose which e-mails you get in your settings.</p>
          <p><Link href="/settings" className="btn-quiet">E-mail settings</Link></p>
        </>
      )}
    </div>
  );
}
