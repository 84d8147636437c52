import { ForgotPasswordForm } from "@/features/auth/components/PasswordResetForms";

export const metadata = { title: "Forgot password" };

export default function ForgotPasswordPage() {
  return (
    <div className="mx-auto max-w-sm">
      <h1 className="text-2xl font-bold">Forgot your password?</h1>
      <p className="mt-2 text-sm text-ink-soft">
        Enter the e-mail of your account and we will send a link to choose a new password.
      </p>
      <div className="card mt-6">
        <ForgotPasswordForm />
      </div>
    </div>
  );
}
