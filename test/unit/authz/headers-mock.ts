// Stands in for next/headers where server actions or next-auth read the request:
// `vi.mock("next/headers", () => import("./headers-mock"))`. Each call comes from its own
// address, so the rate limits (per address) never decide a test's answer.
let address = 0;

export async function headers(): Promise<Headers> {
  const n = address++;
  return new Headers({ "x-forwarded-for": `203.0.${113 + (Math.floor(n / 250) % 2)}.${(n % 250) + 1}` });
}

export async function cookies() {
  return { getAll: () => [], get: () => undefined, has: () => false };
}
