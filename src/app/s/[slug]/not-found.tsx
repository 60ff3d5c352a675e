import { SharedUnavailable } from "@/components/explorer/shared-explorer";
import { auth } from "@/server/auth";

/** Unknown, revoked, or not yours to see: one page for all, so nothing is given away. */
export default async function SharedNotFound() {
  return <SharedUnavailable signedOut={(await auth()) === null} />;
}
