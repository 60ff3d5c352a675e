"use client";

import { usePathname } from "next/navigation";
import useSWR from "swr";
import type { MyTeamDto } from "@/lib/dto";
import { SESSION_URL } from "./session-refresh";

export interface SessionAnswer {
  user?: { email: string; name: string | null };
}

async function readJson<T>(url: string): Promise<T> {
  const response = await fetch(url, { cache: "no-store" });
  if (!response.ok) throw new Error(`${url} answered ${response.status}.`);
  return (await response.json()) as T;
}

/**
 * The session as next-auth's endpoint gives it, read in the browser: pages of
 * a published Edition are the same HTML for everyone, so what depends on the
 * reader is filled in here. Read again on each navigation (a sign-in or
 * sign-out ends in one), keeping the last answer meanwhile.
 */
export function useSession() {
  const pathname = usePathname();
  return useSWR([SESSION_URL, pathname], ([url]) => readJson<SessionAnswer>(url), { keepPreviousData: true });
}

/** The signed-in reader's teams with their roles; null while unknown or signed out. */
export function useMyTeams(): MyTeamDto[] | null {
  const { data: session } = useSession();
  const { data } = useSWR(session?.user ? "/api/teams" : null, (url: string) => readJson<{ teams: MyTeamDto[] }>(url));
  return session?.user ? (data?.teams ?? null) : null;
}
