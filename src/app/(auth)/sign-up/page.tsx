import type { Metadata } from "next";
import Link from "next/link";
import { emailSchema } from "@/server/auth/schemas";
import { SignUpForm } from "../forms";
import { AuthCard, callbackFor } from "../page-shell";

export const metadata: Metadata = { title: "Create an account" };

export default async function SignUpPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { callbackUrl, withCallback } = await callbackFor(searchParams);
  // An invite's link fills in the address it was sent to; anything that is not an address is ignored.
  const email = emailSchema.safeParse((await searchParams).email);
  return (
    <AuthCard
      title="Create your account"
      lead={
        <>
          Already have one?{" "}
          <Link href={`/sign-in${withCallback}`} className="text-accent underline underline-offset-2">
            Sign in
          </Link>
        </>
      }
    >
      <SignUpForm callbackUrl={callbackUrl} defaultEmail={email.success ? email.data : undefined} />
    </AuthCard>
  );
}
