/**
 * Who may do what in a studio. Every page, route handler and server action asks
 * this module (through `requireRole`/`can`), so the rules live in one place.
 *
 *             read  edit  export  bill  manageMembers  manageApiKeys
 *   owner      ✓     ✓      ✓      ✓         ✓              ✓
 *   editor     ✓     ✓      ✓                               ✓
 *   listener   ✓
 */
export const ROLES = ["owner", "editor", "listener"] as const;
export type Role = (typeof ROLES)[number];

export const ACTIONS = ["read", "edit", "export", "bill", "manageMembers", "manageApiKeys"] as const;
export type Action = (typeof ACTIONS)[number];

const GRANTS: Record<Role, ReadonlySet<Action>> = {
  owner: new Set(["read", "edit", "export", "bill", "manageMembers", "manageApiKeys"]),
  editor: new Set(["read", "edit", "export", "manageApiKeys"]),
  listener: new Set(["read"]),
};

/** Rank of a role, for "no higher than" checks (an API key never outranks its creator). */
export const ROLE_RANK: Record<Role, number> = { listener: 1, editor: 2, owner: 3 };

export function can(role: Role | null | undefined, action: Action): boolean {
  return role != null && GRANTS[role].has(action);
}

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}

export const ROLE_LABEL: Record<Role, string> = {
  owner: "Owner",
  editor: "Editor",
  listener: "Listener",
};

export const ROLE_DESCRIPTION: Record<Role, string> = {
  owner: "Billing and members, and everything an editor does",
  editor: "Upload, correct and export takes",
  listener: "Replay takes and read comments",
};
