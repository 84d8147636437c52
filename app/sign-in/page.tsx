import Link from "next/link";
import { SignInForm } from "@/features/auth/components/SignInForm";

export const metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string }> }) {
  const { next } = await searchParams;
  return (
    <div className="mx-auto max-w-sm">
      <h1 className="text-2xl font-bold">Sign in</h1>
      <div className="card mt-6">
        <SignInForm next={typeof next === "string" ? next : undefined} />
      </div>
      <p className="mt-4 text-sm text-ink-soft">
        New coach?{" "}
        <Link href="/sign-up" className="font-semibold text-tide hover:underline">
          Create an account
        </Link>
        . Athletes join through their coach&apos;s invitation.
      </p>
    </div>
  );
}
