import Link from "next/link";
import { ResetPasswordForm } from "@/features/auth/components/PasswordResetForms";

export const metadata = { title: "Choose a new password" };

export default async function ResetPasswordPage({
  searchParams,
}: {
  searchParams: Promise<{ token?: string; error?: string }>;
}) {
  const { token, error } = await searchParams;
  return (
    <div className="mx-auto max-w-sm">
      <h1 className="text-2xl font-bold">Choose a new password</h1>
      <div className="card mt-6">
        {typeof token === "string" && token && !error ? (
          <ResetPasswordForm token={token} />
        ) : (
          <p role="alert" className="text-sm">
            This reset link has expired or was already used.{" "}
            <Link href="/forgot-password" className="font-semibold text-tide hover:underline">
              Ask for a new link
            </Link>
            .
          </p>
        )}
      </div>
    </div>
  );
}
