"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

/** A link to sign in that comes back to this page (not-found pages get no params to build it from). */
export function SignInHereLink({ children }: { children: React.ReactNode }) {
  const pathname = usePathname();
  return (
    <Link
      href={`/sign-in?callbackUrl=${encodeURIComponent(pathname)}`}
      className="text-accent underline underline-offset-2"
    >
      {children}
    </Link>
  );
}
