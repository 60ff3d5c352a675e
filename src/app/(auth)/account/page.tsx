import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { auth } from "@/server/auth";
import { ChangePasswordForm, SignOutEverywhereForm } from "../forms";
import { AuthCard } from "../page-shell";

export const metadata: Metadata = { title: "Your account" };

export default async function AccountPage() {
  const user = await auth();
  if (!user) redirect("/sign-in?callbackUrl=%2Faccount");
  return (
    <AuthCard title="Your account" lead={`Signed in as ${user.name ? `${user.name} (${user.email})` : user.email}.`}>
      <h2 className="text-lg font-semibold">Change your password</h2>
      <ChangePasswordForm />
      <h2 className="text-lg font-semibold">Sign out everywhere</h2>
      <p className="text-sm text-ink-300">
        Ends every session of your account: on other computers and phones, and on this one. Use it if you signed in
        somewhere you no longer use, or think someone else has.
      </p>
      <SignOutEverywhereForm />
    </AuthCard>
  );
}
