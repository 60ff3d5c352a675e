/**
 * Runs once when the server starts (Next's instrumentation hook): a periodic drain of the mail
 * outbox, so a message whose first try failed is tried again even when no request comes.
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs" || process.env.NEXT_PHASE === "phase-production-build") return;
  const { drainOutbox } = await import("@/server/mail/outbox");
  const every = 30_000;
  setInterval(() => {
    drainOutbox().catch((error: unknown) => console.error("[mail] draining the outbox failed:", error));
  }, every).unref();
}
