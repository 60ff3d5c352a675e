import type { z } from "zod";
import { LEVELS, STATES } from "../engine/schema";
import type { PortableCharacter } from "./schema";

/**
 * One thing wrong with a file, said so a coach can fix it: where (a CSV line and column,
 * or a JSON path such as `moves[3].onBlock`) and what, in words.
 */
export interface FileProblem {
  /** 1-based line of the CSV row (its first line when a quoted cell spans several). */
  line?: number;
  /** CSV column name as the header has it. */
  column?: string;
  /** JSON path, e.g. `moves[3].onBlock`. */
  path?: string;
  message: string;
}

export type ParseResult = { ok: true; characters: PortableCharacter[] } | { ok: false; problems: FileProblem[] };

/** Past this many problems a list stops helping; the rest are counted. */
export const MAX_PROBLEMS = 200;

export function formatProblem(p: FileProblem): string {
  const where = [
    p.line === undefined ? null : `line ${p.line}`,
    p.column === undefined ? null : `column ${p.column}`,
    p.path === undefined ? null : p.path,
  ].filter((x) => x !== null);
  return where.length > 0 ? `${where.join(", ")}: ${p.message}` : p.message;
}

export function formatPath(path: readonly PropertyKey[]): string {
  let out = "";
  for (const part of path) {
    if (typeof part === "number") out += `[${part}]`;
    else out += out === "" ? String(part) : `.${String(part)}`;
  }
  return out;
}

/** Cuts a long list and says how many were left out. */
export function capProblems(problems: FileProblem[]): FileProblem[] {
  if (problems.length <= MAX_PROBLEMS) return problems;
  const rest = problems.length - MAX_PROBLEMS;
  return [
    ...problems.slice(0, MAX_PROBLEMS),
    { message: `…and ${rest.toLocaleString("en-US")} more problems; fix these first and try again` },
  ];
}

const quote = (v: unknown) => {
  const s = typeof v === "string" ? v : JSON.stringify(v);
  return `"${s !== undefined && s.length > 40 ? `${s.slice(0, 40)}…` : s}"`;
};

const KIND_WORD: Record<string, string> = {
  string: "text",
  number: "a whole number",
  int: "a whole number",
  boolean: "true or false (yes or no in a CSV)",
  array: "a list",
  object: "an object",
  nan: "a number",
};

function received(input: unknown): string {
  if (input === undefined) return "nothing";
  if (input === null) return "null";
  if (Array.isArray(input)) return "a list";
  if (typeof input === "number") return Number.isInteger(input) ? `${input}` : `${input} (not a whole number)`;
  if (typeof input === "string") return `text ${quote(input)}`;
  if (typeof input === "boolean") return String(input);
  return "an object";
}

const OUTCOME_HINT = `a whole number of frames, or a state (${STATES.join(", ")}) with optional frames`;

/**
 * zod's issues in a coach's words. Used as a per-parse error map, so the engine's schemas
 * (which say nothing about files) speak the same way as ours.
 */
export const coachErrorMap: z.core.$ZodErrorMap = (issue) => {
  const field = issue.path?.[issue.path.length - 1];
  switch (issue.code) {
    case "invalid_type":
      if (issue.input === undefined) return "is empty or missing";
      return `must be ${KIND_WORD[issue.expected] ?? issue.expected}, not ${received(issue.input)}`;
    case "too_small":
      if (issue.origin === "string") return issue.minimum === 1 ? "must not be empty" : `is too short`;
      if (issue.origin === "array") return `needs at least ${issue.minimum} entries`;
      return `must be at least ${issue.minimum as number}, not ${received(issue.input)}`;
    case "too_big":
      if (issue.origin === "string") return `is longer than ${issue.maximum as number} characters`;
      if (issue.origin === "array") return `has more than ${issue.maximum as number} entries`;
      return `must be at most ${issue.maximum as number}, not ${received(issue.input)}`;
    case "invalid_value":
      if (field === "level" || issue.values.every((v) => (LEVELS as readonly unknown[]).includes(v)))
        return `unknown level ${quote(issue.input)}; use one of ${LEVELS.join(", ")}`;
      if (field === "state") return `unknown state ${quote(issue.input)}; use one of ${STATES.join(", ")}`;
      return `${quote(issue.input)} is not allowed here; use ${issue.values.map((v) => quote(v)).join(" or ")}`;
    case "invalid_union":
      if (field === "onBlock" || field === "onHit" || field === "onCounterHit") {
        const state = (issue.input as { state?: unknown } | null)?.state;
        if (typeof state === "string" && !(STATES as readonly string[]).includes(state))
          return `unknown state ${quote(state)}; use one of ${STATES.join(", ")}`;
        return `must be ${OUTCOME_HINT}, not ${received(issue.input)}`;
      }
      if (field === "kind" || (issue.input as { kind?: unknown } | null)?.kind !== undefined) {
        const kind = (issue.input as { kind?: unknown } | null)?.kind ?? issue.input;
        return `unknown edge kind ${quote(kind)}; use follow, cancel or enter`;
      }
      return `is not in a shape this file format knows (${received(issue.input)})`;
    case "unrecognized_keys":
      return `unknown field${issue.keys.length > 1 ? "s" : ""} ${issue.keys.map((k) => quote(k)).join(", ")}`;
    case "invalid_format":
      return `is not in the expected form (${received(issue.input)})`;
    default:
      return undefined;
  }
};
