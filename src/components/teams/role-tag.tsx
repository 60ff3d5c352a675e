import type { Role } from "@/lib/roles";

export const ROLE_HINT: Record<Role, string> = {
  owner: "Manages the team and its members",
  coach: "Edits the team's games, frame data and mix-up boards; invites people",
  player: "Reads everything of the team and makes permalinks",
  viewer: "Reads only",
};

/** A role as a word, with what it allows on hover. */
export function RoleTag({ role }: { role: Role }) {
  return (
    <span
      title={ROLE_HINT[role]}
      data-role={role}
      className="rounded border border-ink-700 px-1.5 py-0.5 text-xs tracking-wider text-ink-300 uppercase"
    >
      {role}
    </span>
  );
}
