import { redirect } from "next/navigation";
import { auth } from "@/server/auth";
import { safeCallbackUrl } from "@/server/auth/schemas";

/** The frame of every sign-in page: a heading, a line under it, the content. */
export function AuthCard({
  title,
  lead,
  children,
}: {
  title: string;
  lead?: React.ReactNode;
  children: React.ReactNode;
}) {
  return (
    <section className="space-y-6 rounded-lg border border-ink-800 bg-ink-900 p-5 sm:p-6">
      <header className="space-y-2">
        <h1 className="text-2xl font-semibold">{title}</h1>
        {lead ? <p className="text-ink-300">{lead}</p> : null}
      </header>
      {children}
    </section>
  );
}

export const first = (value: string | string[] | undefined): string | undefined =>
  Array.isArray(value) ? value[0] : value;

type SearchParams = Promise<Record<string, string | string[] | undefined>>;

/**
 * The same-origin place to return to after signing in, and the query that
 * carries it on to the other sign-in page; a signed-in visitor goes there at once.
 */
export async function callbackFor(
  searchParams: SearchParams,
): Promise<{ callbackUrl: string; withCallback: string; params: Record<string, string | string[] | undefined> }> {
  const params = await searchParams;
  const callbackUrl = safeCallbackUrl(first(params.callbackUrl));
  if (await auth()) redirect(callbackUrl);
  return {
    callbackUrl,
    withCallback: callbackUrl === "/" ? "" : `?callbackUrl=${encodeURIComponent(callbackUrl)}`,
    params,
  };
}
