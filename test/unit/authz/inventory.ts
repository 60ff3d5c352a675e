import { readdirSync, readFileSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import type { ActionState } from "@/server/actions";

// What the app answers on the network, found on disk: every route handler and every server action.
// The role matrix, the cross-team matrix and the fuzz tests each keep a table keyed by these names
// and fail when a route or an action has no row, so nothing new slips past them.

export const SRC = join(process.cwd(), "src");
export const APP = join(SRC, "app");
const API = join(APP, "api");
export const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

export type Handler = (
  request: Request,
  ctx: { params: Promise<Record<string, string | string[]>> },
) => Promise<Response>;
export type Action = (previous: ActionState, form: FormData) => Promise<ActionState>;

/** Every file under `dir` whose name passes `keep`. */
export function filesUnder(dir: string, keep: (name: string) => boolean): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return filesUnder(path, keep);
    return keep(name) ? [path] : [];
  });
}

/** "GET /api/teams/[team]/members" → the handler, for every route.ts under src/app/api. */
export async function routeHandlers(): Promise<Map<string, Handler>> {
  const out = new Map<string, Handler>();
  for (const file of filesUnder(API, (name) => name === "route.ts")) {
    const route = `/api/${relative(API, file).replace(/\/?route\.ts$/, "")}`.replace(/\/$/, "");
    const mod = (await import(file)) as Partial<Record<(typeof METHODS)[number], Handler>>;
    for (const m of METHODS) if (typeof mod[m] === "function") out.set(`${m} ${route}`, mod[m]);
  }
  return out;
}

/** The path parameters a route's address names: "/api/teams/[team]/members/[user]" → ["team", "user"]. */
export const pathParams = (route: string): string[] => [...route.matchAll(/\[(?:\.\.\.)?(\w+)\]/g)].map((m) => m[1]!);

/** The address a request for `route` goes to, with its parameters filled in. */
export function routeUrl(route: string, params: Record<string, string | string[]>, query = ""): string {
  const path = route.replace(/\[(\.\.\.)?(\w+)\]/g, (_, __, name: string) =>
    [params[name] ?? ""].flat().map(encodeURIComponent).join("/"),
  );
  return `http://test${path}${query}`;
}

const TOP_DIRECTIVE = /^(?:\s|\/\/[^\n]*\n|\/\*[\s\S]*?\*\/)*["']use server["']/;
const sourceFiles = () => filesUnder(SRC, (name) => /\.(ts|tsx)$/.test(name) && !name.endsWith(".test.ts"));

/** Files that start with the "use server" directive: every function they export is a public endpoint. */
export const serverActionFiles = (): string[] =>
  sourceFiles().filter((f) => TOP_DIRECTIVE.test(readFileSync(f, "utf8")));

/**
 * Files that say "use server" anywhere but at the top: an inline server action, which these
 * tables cannot list. Kept empty: actions live in an actions file, exported, with their rows.
 */
export function inlineServerActions(): string[] {
  const actionFiles = serverActionFiles();
  return sourceFiles()
    .filter((f) => !actionFiles.includes(f) && /["']use server["']/.test(readFileSync(f, "utf8")))
    .map((f) => relative(SRC, f));
}

/** "(auth)/actions.ts signUp" → the action, for every function exported by a "use server" file. */
export async function serverActions(): Promise<Map<string, Action>> {
  const out = new Map<string, Action>();
  for (const file of serverActionFiles()) {
    const mod = (await import(file)) as Record<string, unknown>;
    for (const [name, fn] of Object.entries(mod))
      if (typeof fn === "function") out.set(`${relative(APP, file)} ${name}`, fn as Action);
  }
  return out;
}

/** Fails with the keys that are on one side only: a route or action without a row, or a row for nothing. */
export function missingRows(found: Iterable<string>, table: Record<string, unknown>) {
  const names = [...found].sort();
  return {
    "no row": names.filter((k) => !(k in table)),
    "row for nothing": Object.keys(table).filter((k) => !names.includes(k)),
  };
}
