import type { Metadata } from "next";
import Link from "next/link";
import { SignUpForm } from "../forms";
import { AuthCard, callbackFor } from "../page-shell";

export const metadata: Metadata = { title: "Create an account" };

export default async function SignUpPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { callbackUrl, withCallback } = await callbackFor(searchParams);
  return (
    <AuthCard
      title="Create your account"
      lead={
        <>
          Already have one?{" "}
          <Link href={`/sign-in${withCallback}`} className="text-accent hover:underline">
            Sign in
          </Link>
        </>
      }
    >
      <SignUpForm callbackUrl={callbackUrl} />
    </AuthCard>
  );
}
