import { describe, expect, test } from "vitest";
import { usableCallbackUrl } from "@/lib/callback-url";
import { refusedAuthInput } from "@/server/auth/next-auth-input";

// What next-auth would answer with a 500 is refused before it gets there (the answers themselves,
// over HTTP, are in test/e2e/fuzz-auth.spec.ts).

const at = (path: string, init: RequestInit = {}) => new Request(`http://app.test/api/auth/${path}`, init);
const form = (body: string) => ({
  method: "POST",
  headers: { "content-type": "application/x-www-form-urlencoded" },
  body,
});
const codeOf = async (request: Request, action: string[]) => (await refusedAuthInput(request, action))?.code ?? null;

describe("input next-auth cannot take", () => {
  test("a return address is a path on this site or an http(s) address", () => {
    for (const ok of ["/", "/teams?x=1", "http://app.test/teams", "https://elsewhere.test/"])
      expect(usableCallbackUrl(ok)).toBe(true);
    for (const bad of ["", "true", "x", "javascript:alert(1)", "mailto:a@b.c", "%E0"])
      expect(usableCallbackUrl(bad)).toBe(false);
  });

  test("the sign-in's own requests pass", async () => {
    expect(await codeOf(at("csrf"), ["csrf"])).toBeNull();
    expect(
      await codeOf(at("callback/credentials", form("email=a%40b.c&password=x&callbackUrl=%2Fteams&json=true")), [
        "callback",
        "credentials",
      ]),
    ).toBeNull();
    expect(await codeOf(at("signin/email", form("email=a%40b.c&callbackUrl=%2F")), ["signin", "email"])).toBeNull();
    expect(await codeOf(at("error?error=Verification"), ["error"])).toBeNull();
  });

  test("a return address that is no address, in the query or the form, is a 400", async () => {
    expect(await codeOf(at("session?callbackUrl=true"), ["session"])).toBe("bad_request");
    expect(await codeOf(at("signin/email", form("callbackUrl=x")), ["signin", "email"])).toBe("bad_request");
    expect(await codeOf(at("signin/email", form("callbackUrl=%2F&callbackUrl=x")), ["signin", "email"])).toBe(
      "bad_request",
    );
  });

  test("a JSON body is a 415; the password callback by GET and an error code that is not a word are 400s", async () => {
    const json = { method: "POST", headers: { "content-type": "application/json" }, body: "{" };
    expect(await codeOf(at("signin", json), ["signin"])).toBe("unsupported_media_type");
    expect(await codeOf(at("callback/credentials"), ["callback", "credentials"])).toBe("bad_request");
    expect(await codeOf(at("error/%F1%AF%A4%8D"), ["error", "\u{6f90d}"])).toBe("bad_request");
    expect(await codeOf(at("error?error=%0A"), ["error"])).toBe("bad_request");
  });
});
