/** A member's role in a team, highest first. Each role can do everything the roles after it can. */
export const ROLES = ["owner", "coach", "player", "viewer"] as const;
export type Role = (typeof ROLES)[number];

const RANK: Record<Role, number> = { owner: 4, coach: 3, player: 2, viewer: 1 };

/** Who may invite whom: owners any role; coaches up to coach (a coach cannot make an owner). */
export function mayInvite(inviter: Role | null, role: Role): boolean {
  if (inviter === "owner") return true;
  if (inviter === "coach") return role !== "owner";
  return false;
}

/** Does `role` allow what `needed` allows? No role (not a member) allows nothing. */
export function atLeast(role: Role | null, needed: Role): boolean {
  return role !== null && RANK[role] >= RANK[needed];
}
