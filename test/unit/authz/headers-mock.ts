// Stands in for next/headers where server actions or next-auth read the request:
// `vi.mock("next/headers", () => import("./headers-mock"))`. Each call comes from its own
// address, so the rate limits (per address) never decide a test's answer; actions that start
// or end a session in this browser write its cookie into a jar that forgets.
let address = 0;

/** A caller's address no earlier call used (500 of them, then round again). */
export function nextAddress(): string {
  const n = address++;
  return `203.0.${113 + (Math.floor(n / 250) % 2)}.${(n % 250) + 1}`;
}

export async function headers(): Promise<Headers> {
  return new Headers({ "x-forwarded-for": nextAddress() });
}

export async function cookies() {
  return { getAll: () => [], get: () => undefined, has: () => false, set: () => undefined, delete: () => undefined };
}
