import { describe, expect, test } from "vitest";
import { checkEnv } from "@/env";

const good = {
  DATABASE_URL: "mysql://u:p@127.0.0.1:3307/framefork",
  SMTP_URL: "smtp://127.0.0.1:1025",
  MAIL_FROM: "Framefork <no-reply@example.com>",
  NEXTAUTH_URL: "http://127.0.0.1:3000",
  NEXTAUTH_SECRET: "a".repeat(32),
};

describe("checkEnv", () => {
  test("accepts a full local setup", () => {
    expect(checkEnv(good)).toMatchObject({ ...good, NODE_ENV: "development" });
    expect(
      checkEnv({ ...good, MAIL_FROM: "no-reply@example.test", SMTP_URL: "smtps://user:pw@mail.example.test:465" })
        .MAIL_FROM,
    ).toBe("no-reply@example.test");
  });

  test("names the variable and points at .env.example when it is missing or wrong", () => {
    expect(() => checkEnv({})).toThrow(/DATABASE_URL[\s\S]*\.env\.example/);
    expect(() => checkEnv({ ...good, DATABASE_URL: "postgres://u@h/db" })).toThrow(
      /DATABASE_URL must look like mysql:\/\//,
    );
  });

  test("refuses a short NEXTAUTH_SECRET, and says how long it must be", () => {
    expect(() => checkEnv({ ...good, NEXTAUTH_SECRET: "a".repeat(31) })).toThrow(
      /NEXTAUTH_SECRET must be at least 32 characters/,
    );
    expect(() => checkEnv({ ...good, NEXTAUTH_SECRET: undefined })).toThrow(/NEXTAUTH_SECRET/);
  });

  test("trusts no proxy unless told how many stand in front of the app", () => {
    expect(checkEnv(good).TRUSTED_PROXY_HOPS).toBe(0);
    expect(checkEnv({ ...good, TRUSTED_PROXY_HOPS: "" }).TRUSTED_PROXY_HOPS).toBe(0);
    expect(checkEnv({ ...good, TRUSTED_PROXY_HOPS: "2" }).TRUSTED_PROXY_HOPS).toBe(2);
    expect(() => checkEnv({ ...good, TRUSTED_PROXY_HOPS: "one" })).toThrow(/TRUSTED_PROXY_HOPS must be the number/);
    expect(() => checkEnv({ ...good, TRUSTED_PROXY_HOPS: "1.5" })).toThrow(/TRUSTED_PROXY_HOPS must be a whole number/);
    expect(() => checkEnv({ ...good, TRUSTED_PROXY_HOPS: "-1" })).toThrow(/TRUSTED_PROXY_HOPS must be 0 or more/);
  });

  test("refuses mail settings that cannot send", () => {
    expect(() => checkEnv({ ...good, SMTP_URL: "http://127.0.0.1:1080" })).toThrow(/SMTP_URL must look like smtp:\/\//);
    expect(() => checkEnv({ ...good, MAIL_FROM: "Framefork" })).toThrow(/MAIL_FROM must be an address/);
    expect(() => checkEnv({ ...good, NEXTAUTH_URL: "127.0.0.1:3000" })).toThrow(
      /NEXTAUTH_URL must be the app's own address/,
    );
  });
});
