import Link from "next/link";
import { SignUpForm } from "@/features/auth/components/SignUpForm";

export const metadata = { title: "Create a coach account" };

export default function SignUpPage() {
  return (
    <div className="mx-auto max-w-sm">
      <h1 className="text-2xl font-bold">Create a coach account</h1>
      <p className="mt-2 text-sm text-ink-soft">
        Next you name your squad; you become its head coach and can invite coaches and athletes.
      </p>
      <div className="card mt-6">
        <SignUpForm />
      </div>
      <p className="mt-4 text-sm text-ink-soft">
        Already have an account?{" "}
        <Link href="/sign-in" className="font-semibold text-tide hover:underline">
          Sign in
        </Link>
        .
      </p>
    </div>
  );
}
