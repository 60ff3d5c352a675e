import { AppError } from "./errors";

/** The one SWR fetcher: JSON on success, the server's error body back as an `AppError` otherwise. */
export async function fetcher<T>(url: string): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, { headers: { accept: "application/json" } });
  } catch {
    throw new AppError("unavailable", "Framefork could not be reached. Check your connection and try again.");
  }
  const body: unknown = await res.json().catch(() => null);
  if (!res.ok) throw AppError.fromResponseBody(body, res.status);
  return body as T;
}
