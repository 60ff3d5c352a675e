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

/** Sends JSON (POST, PUT, PATCH, DELETE) and reads the answer like `fetcher`: an `AppError` when refused. */
export async function sendJson<T>(
  method: "POST" | "PUT" | "PATCH" | "DELETE",
  url: string,
  body?: unknown,
): Promise<T | null> {
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      headers: { accept: "application/json", ...(body === undefined ? {} : { "content-type": "application/json" }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new AppError("unavailable", "Framefork could not be reached. Check your connection and try again.");
  }
  if (res.status === 204) return null;
  const json: unknown = await res.json().catch(() => null);
  if (!res.ok) throw AppError.fromResponseBody(json, res.status);
  return json as T;
}
