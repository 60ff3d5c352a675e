import { SharedUnavailable } from "@/components/explorer/shared-explorer";

/** Unknown, revoked, or not yours to see: one page for all, so nothing is given away. */
export default function SharedNotFound() {
  return <SharedUnavailable />;
}
