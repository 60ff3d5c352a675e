import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

export default defineConfig({
  resolve: {
    alias: {
      "@/": here("./src/"),
      // `server-only` throws outside React Server Components; vitest runs the
      // server modules directly, which is exactly what that guard forbids.
      "server-only": here("./test/fixtures/server-only.ts"),
    },
  },
  test: {
    include: ["src/**/*.test.ts", "test/unit/**/*.test.ts", "test/reference/**/*.test.ts"],
    environment: "node",
    // Database tests share one MariaDB; files run in parallel, tests in a file in order.
    fileParallelism: true,
    testTimeout: 30_000,
    hookTimeout: 60_000,
  },
});
