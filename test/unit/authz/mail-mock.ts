import type { OutgoingMail } from "@/server/mail";

// Stands in for @/server/mail: `vi.mock("@/server/mail", () => import("./mail-mock"))`. The
// templates and the outbox are the real ones (queued mail is written in the action's
// transaction); nothing is sent: what would be sent at once is kept in `sent`, and queued mail
// is left in the outbox for the tests that drain it (they drain only their own recipients).
export * from "@/server/mail/templates";
export { drainOutbox, queueMail } from "@/server/mail/outbox";

export const sent: OutgoingMail[] = [];

export async function sendMail(mail: OutgoingMail): Promise<void> {
  sent.push(mail);
}

export function deliverSoon(): void {}
