import type { OutgoingMail } from "@/server/mail";

// Stands in for @/server/mail: `vi.mock("@/server/mail", () => import("./mail-mock"))`. The
// templates are the real ones; what would be sent is kept in `sent` instead.
export * from "@/server/mail/templates";

export const sent: OutgoingMail[] = [];

export async function sendMail(mail: OutgoingMail): Promise<void> {
  sent.push(mail);
}
