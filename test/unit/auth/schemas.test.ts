import { describe, expect, test } from "vitest";
import { emailSchema, safeCallbackUrl } from "@/server/auth/schemas";

describe("safeCallbackUrl", () => {
  test("keeps paths on this site", () => {
    expect(safeCallbackUrl("/games/vesper-circuit/tarrow?edition=1-0#x")).toBe(
      "/games/vesper-circuit/tarrow?edition=1-0#x",
    );
    expect(safeCallbackUrl("/account")).toBe("/account");
  });

  test("sends anything that could leave the site to the home page (common practice, no source)", () => {
    for (const bad of [
      "https://evil.example.test/",
      "//evil.example.test/x",
      "/\\evil.example.test",
      "javascript:alert(1)",
      "",
      undefined,
      42,
    ]) {
      expect(safeCallbackUrl(bad)).toBe("/");
    }
  });
});

describe("emailSchema", () => {
  test("trims and lower-cases, so one address is one account", () => {
    expect(emailSchema.parse("  Coach@Example.COM ")).toBe("coach@example.com");
  });
  test("refuses what is not an address", () => {
    expect(emailSchema.safeParse("coach").error?.issues[0]?.message).toMatch(/valid e-mail/);
  });
});
