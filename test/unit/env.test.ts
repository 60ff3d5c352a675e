import { describe, expect, test } from "vitest";
import { checkEnv } from "@/env";

describe("checkEnv", () => {
  test("accepts a MariaDB URL", () => {
    expect(checkEnv({ DATABASE_URL: "mysql://u:p@127.0.0.1:3307/framefork" })).toMatchObject({
      DATABASE_URL: "mysql://u:p@127.0.0.1:3307/framefork",
      NODE_ENV: "development",
    });
  });

  test("names the variable and points at .env.example when it is missing or wrong", () => {
    expect(() => checkEnv({})).toThrow(/DATABASE_URL[\s\S]*\.env\.example/);
    expect(() => checkEnv({ DATABASE_URL: "postgres://u@h/db" })).toThrow(/DATABASE_URL must look like mysql:\/\//);
  });
});
