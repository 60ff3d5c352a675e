import next from "eslint-config-next";
import drizzle from "eslint-plugin-drizzle";
import tseslint from "typescript-eslint";

/**
 * Which rooms of `src/` a folder may not import from, type-only imports
 * included: `lib` is pure and shared by both sides; components and stores run on the client too.
 */
const forbidRooms = (rooms, why) => [
  "error",
  {
    patterns: [{ regex: `^(@/|(\\.\\.?/)+)(${rooms.join("|")})(/|$)`, message: why }],
  },
];

const config = [
  { ignores: [".next/**", ".data/**", "node_modules/**", "drizzle/**", "next-env.d.ts"] },
  ...next,
  {
    files: ["**/*.ts", "**/*.tsx"],
    languageOptions: {
      parser: tseslint.parser,
      parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname },
    },
    plugins: { "@typescript-eslint": tseslint.plugin, drizzle },
    rules: {
      // Type-aware rules: a promise nobody awaits is a write that may never happen.
      "@typescript-eslint/no-floating-promises": "error",
      "@typescript-eslint/no-misused-promises": ["error", { checksVoidReturn: { attributes: false } }],
      "@typescript-eslint/await-thenable": "error",
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      // A delete or update without a where clause touches every row.
      "drizzle/enforce-delete-with-where": ["error", { drizzleObjectName: ["db", "tx"] }],
      "drizzle/enforce-update-with-where": ["error", { drizzleObjectName: ["db", "tx"] }],
      // Those two rules know a handle only by its name: a write on `getDb()` itself goes unchecked.
      "no-restricted-syntax": [
        "error",
        {
          selector:
            "CallExpression[callee.type='MemberExpression'][callee.property.name=/^(update|delete)$/][callee.object.type='CallExpression'][callee.object.callee.name='getDb']",
          message: "Write `const db = getDb();` and call db.update / db.delete, so the where-clause rules check it.",
        },
      ],
    },
  },
  {
    files: ["src/lib/**"],
    rules: {
      "no-restricted-imports": forbidRooms(
        ["stores", "components", "server"],
        "src/lib holds pure helpers: it may not import stores, components or server code.",
      ),
    },
  },
  {
    files: ["src/components/**", "src/stores/**"],
    rules: {
      "no-restricted-imports": forbidRooms(
        ["server"],
        "Components and stores may run in the browser: import shared types from @/lib (e.g. @/lib/dto), not @/server.",
      ),
    },
  },
];

export default config;
