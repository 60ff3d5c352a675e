import "server-only";
import { after } from "next/server";

/**
 * Runs `task` once the answer has gone to the browser (Next's `after`). Work whose cost or
 * outcome depends on something the visitor must not learn (whether an address has an account)
 * goes here, so the answer's content and timing cannot tell. A failure is logged, never shown:
 * the visitor already has their answer. Outside a request (scripts, tests) it starts at once.
 */
export function afterAnswer(what: string, task: () => Promise<void>): void {
  const run = async () => {
    try {
      await task();
    } catch (error) {
      console.error(`[after] ${what} failed:`, error);
    }
  };
  try {
    after(run);
  } catch {
    void run();
  }
}
