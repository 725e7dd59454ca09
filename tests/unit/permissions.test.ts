import { describe, expect, it } from "vitest";
import { ACTIONS, ROLES, can } from "@/lib/auth/permissions";

// The product's role definitions (shared/NAMES.md): owner — billing and members; editor —
// upload, correct, export (and, issue 4, create and revoke API keys); listener — replay and read.
const EXPECTED: Record<(typeof ROLES)[number], (typeof ACTIONS)[number][]> = {
  owner: ["read", "edit", "export", "bill", "manageMembers", "manageApiKeys"],
  editor: ["read", "edit", "export", "manageApiKeys"],
  listener: ["read"],
};

describe("permissions", () => {
  for (const role of ROLES) {
    for (const action of ACTIONS) {
      it(`${role} ${EXPECTED[role].includes(action) ? "may" : "may not"} ${action}`, () => {
        expect(can(role, action)).toBe(EXPECTED[role].includes(action));
      });
    }
  }
  it("nobody without a role may do anything", () => {
    for (const action of ACTIONS) expect(can(null, action)).toBe(false);
  });
});
