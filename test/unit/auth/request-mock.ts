import type { ActionState } from "@/server/actions";

// Stands in for next/headers in tests of server actions and auth code:
// `vi.mock("next/headers", () => import("./request-mock"))`. Every call comes from its own
// client address (the limits count per address), and cookies live in one jar the test reads.
export const jar = new Map<string, string>();
let address = 0;

export async function headers(): Promise<Headers> {
  return new Headers({ "x-forwarded-for": `192.0.2.${(address++ % 250) + 1}` });
}

export async function cookies() {
  return {
    get: (name: string) => (jar.has(name) ? { name, value: jar.get(name)! } : undefined),
    getAll: () => [...jar].map(([name, value]) => ({ name, value })),
    has: (name: string) => jar.has(name),
    set: (name: string, value: string) => void jar.set(name, value),
    delete: (cookie: string | { name: string }) => void jar.delete(typeof cookie === "string" ? cookie : cookie.name),
  };
}

// Work that an action leaves for after its answer (next/server `after`), held until the test
// runs it: `vi.mock("next/server", () => import("./request-mock"))`.
const afterAnswer: (() => unknown)[] = [];

export function after(task: () => unknown): void {
  afterAnswer.push(task);
}

/** How many tasks wait for after the answer. */
export const waitingAfterAnswer = (): number => afterAnswer.length;

/** Runs what the actions left for after the answer, and what those left in turn. */
export async function runAfterAnswer(): Promise<void> {
  while (afterAnswer.length > 0) await afterAnswer.shift()!();
}

type Action = (previous: ActionState, form: FormData) => Promise<ActionState>;

/** Calls a server action with a form as the browser would; returns its state, or where it redirected. */
export async function answer(action: Action, fields: Record<string, string>): Promise<unknown> {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  try {
    return await action(null, form);
  } catch (error) {
    const digest = (error as { digest?: string }).digest;
    if (digest?.startsWith("NEXT_REDIRECT")) return { redirect: digest };
    throw error;
  }
}
