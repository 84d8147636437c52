import type { Metadata, Viewport } from "next";
import Link from "next/link";
import type { ReactNode } from "react";
import { currentActor, homeFor } from "@/features/access/server/current";
import { SignOutButton } from "@/features/auth/components/SignOutButton";
import { tidemarkSans } from "./fonts";
import { Providers } from "./providers";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Tidemark", template: "%s · Tidemark" },
  icons: { icon: "/icon.svg" },
  manifest: "/manifest.webmanifest",
  description:
    "Threshold tests, personal zones and intensity-budgeted training plans for endurance coaches and athletes.",
};

export const viewport: Viewport = { themeColor: "#0f5e63" };

export default async function RootLayout({ children }: { children: ReactNode }) {
  const actor = await currentActor().catch(() => null);
  const isCoach = actor?.memberships.some((m) => m.role !== "athlete");
  const isAthlete = actor?.memberships.some((m) => m.role === "athlete");
  return (
    <html lang="en" className={tidemarkSans.variable}>
      <body className="min-h-screen font-sans antialiased">
        <a
          href="#main"
          className="sr-only focus:not-sr-only focus:absolute focus:left-4 focus:top-4 focus:z-50 focus:bg-paper focus:p-2"
        >
          Skip to content
        </a>
        <header className="border-b border-rule bg-paper">
          <nav aria-label="Main" className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
            <Link
              href={actor ? homeFor(actor) : "/"}
              className="flex items-center gap-2 font-bold tracking-wide text-tide"
            >
              <TideGlyph />
              Tidemark
            </Link>
            {actor ? (
              <>
                {isCoach ? (
                  <Link href="/roster" className="text-sm font-semibold hover:text-tide">
                    Roster
                  </Link>
                ) : null}
                {isCoach ? (
                  <Link href="/templates" className="text-sm font-semibold hover:text-tide">
                    Templates
                  </Link>
                ) : null}
                {isAthlete ? (
                  <Link href="/today" className="text-sm font-semibold hover:text-tide">
                    Today
                  </Link>
                ) : null}
                {isAthlete ? (
                  <Link href="/zones" className="text-sm font-semibold hover:text-tide">
                    My zones
                  </Link>
                ) : null}
                <Link href="/settings" className="text-sm font-semibold hover:text-tide">
                  Settings
                </Link>
                <span className="ml-auto flex items-center gap-4 text-sm text-ink-soft">
                  <span>{actor.name}</span>
                  <SignOutButton />
                </span>
              </>
            ) : (
              <span className="ml-auto flex gap-4 text-sm font-semibold">
                <Link href="/sign-in" className="hover:text-tide">
                  Sign in
                </Link>
                <Link href="/sign-up" className="hover:text-tide">
                  Create a coach account
                </Link>
              </span>
            )}
          </nav>
        </header>
        <Providers dateStyle={actor?.dateStyle ?? "iso"}>
          <main id="main" className="mx-auto max-w-6xl px-4 py-8">
            {children}
          </main>
        </Providers>
        <footer className="mx-auto max-w-6xl px-4 pb-8 text-xs text-ink-soft">
          Tidemark is a training tool, not a medical device. Exercise testing and hard training carry risk: follow local
          clinical practice and the advice of licensed health professionals.
        </footer>
      </body>
    </html>
  );
}

function TideGlyph() {
  return (
    <svg aria-hidden="true" width="22" height="22" viewBox="0 0 24 24" fill="none">
      <path
        d="M2 15c3 0 3-3 6-3s3 3 6 3 3-3 6-3 2 1 2 1"
        stroke="currentColor"
        strokeWidth="2.2"
        strokeLinecap="round"
      />
      <path
        d="M2 20c3 0 3-3 6-3s3 3 6 3 3-3 6-3 2 1 2 1"
        stroke="currentColor"
        strokeWidth="2.2"
        strokeLinecap="round"
        opacity=".45"
      />
      <path
        d="M12 3v7M9 7l3 3 3-3"
        stroke="currentColor"
        strokeWidth="2.2"
        strokeLinecap="round"
        strokeLinejoin="round"
      />
    </svg>
  );
}
