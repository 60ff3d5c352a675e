import "server-only";
import { usableCallbackUrl } from "@/lib/callback-url";
import { AppError } from "@/lib/errors";

/**
 * Input that next-auth answers with a 500 ("a problem with the server configuration") or throws
 * on, refused before it gets there with what was wrong:
 * - a return address (callbackUrl in the query or the form) that is no address
 *   (a forged return-address cookie is dropped for every request in src/proxy.ts);
 * - a JSON body: next-auth's clients post forms, and it throws on JSON it cannot parse;
 * - the password sign-in's callback asked for by GET (it is a POST of the sign-in form);
 * - an error code that is not a word: next-auth writes it unescaped into the Location header,
 *   which cannot hold a line break or a character past Latin-1.
 */
export async function refusedAuthInput(request: Request, action: string[]): Promise<AppError | null> {
  const wrongAddress = new AppError(
    "bad_request",
    "The address to return to after signing in must be a path on this site, like /teams.",
  );
  const query = new URL(request.url).searchParams;
  if (query.getAll("callbackUrl").some((v) => !usableCallbackUrl(v))) return wrongAddress;
  const errorCodes = action[0] === "error" ? [...query.getAll("error"), action[1] ?? ""] : [];
  if (errorCodes.some((code) => !/^\w{0,64}$/.test(code)))
    return new AppError("bad_request", "That is not a sign-in error code.");
  if (request.method === "POST") {
    const type = request.headers.get("content-type") ?? "";
    if (type.includes("application/json"))
      return new AppError("unsupported_media_type", "Send the sign-in form as a form, not as JSON.");
    if (type.includes("application/x-www-form-urlencoded")) {
      const form = new URLSearchParams(await request.clone().text());
      if (form.getAll("callbackUrl").some((v) => !usableCallbackUrl(v))) return wrongAddress;
    }
  }
  if (request.method !== "POST" && action[0] === "callback" && action[1] === "credentials")
    return new AppError("bad_request", "Sign in with your e-mail and password on the sign-in page.");
  return null;
}
