import type { Metadata } from "next";
import Link from "next/link";
import { ForgotPasswordForm } from "../forms";
import { AuthCard } from "../page-shell";

export const metadata: Metadata = { title: "Forgot your password" };

export default function ForgotPasswordPage() {
  return (
    <AuthCard title="Forgot your password?" lead="Enter your e-mail and we will send you a link to choose a new one.">
      <ForgotPasswordForm />
      <p className="text-sm">
        <Link href="/sign-in" className="text-accent underline underline-offset-2">
          Back to sign in
        </Link>
      </p>
    </AuthCard>
  );
}
