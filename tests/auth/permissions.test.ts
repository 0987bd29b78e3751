import { describe, expect, it } from "vitest";
import { forbidden } from "@/lib/errors";
import { requirePermission, requireSameTeam, type Actor } from "@/lib/auth/guards";
import { PERMISSIONS, ROLES, can, type Action, type Role } from "@/lib/auth/permissions";

// The permission table as DESIGN.md's role table states it (product requirement).
const EXPECTED: Record<Action, Role[]> = {
  "team.view": ["engineer", "steward", "reviewer", "admin"],
  "members.manage": ["admin"],
  "invitations.manage": ["admin"],
  "audit.view": ["steward", "reviewer", "admin"],
  "outbox.view": ["admin"],
  "evaluate.run": ["engineer", "steward", "reviewer", "admin"],
  "library.view": ["engineer", "steward", "reviewer", "admin"],
  "models.draft": ["engineer", "steward", "admin"],
  "models.edit": ["steward", "admin"],
  "models.fit": ["steward", "admin"],
  "models.decide": ["steward", "admin"],
  "datasets.upload": ["engineer", "steward", "admin"],
  "cases.view": ["engineer", "steward", "reviewer", "admin"],
  "cases.create": ["engineer", "steward", "admin"],
  "cases.submit": ["engineer", "steward", "admin"],
  "cases.review": ["reviewer", "admin"],
  "comments.create": ["engineer", "steward", "reviewer", "admin"],
};

const actor = (role: Role): Actor => ({ userId: 1, email: "a@example.test", name: "A", teamId: 7, teamName: "T", role });

describe("permission table", () => {
  it("lists exactly the expected actions", () => {
    expect(Object.keys(PERMISSIONS).sort()).toEqual(Object.keys(EXPECTED).sort());
  });

  const rows = (Object.keys(EXPECTED) as Action[]).flatMap((action) => ROLES.map((role) => ({ action, role, allowed: EXPECTED[action].includes(role) })));
  it.each(rows)("$role may $action: $allowed", ({ action, role, allowed }) => {
    expect(can(role, action)).toBe(allowed);
    if (allowed) expect(requirePermission(actor(role), action).role).toBe(role);
    else expect(() => requirePermission(actor(role), action)).toThrow(forbidden().constructor);
  });

  it("is not a ladder: a reviewer may review but not edit models, a steward the reverse", () => {
    expect(can("reviewer", "cases.review") && !can("reviewer", "models.edit")).toBe(true);
    expect(can("steward", "models.edit") && !can("steward", "cases.review")).toBe(true);
  });

  it("answers 401 without an actor and 404 for another team's record", () => {
    expect(() => requirePermission(null, "team.view")).toThrowError(expect.objectContaining({ status: 401, code: "unauthenticated" }));
    expect(() => requireSameTeam(actor("admin"), 8, "Case")).toThrowError(expect.objectContaining({ status: 404, message: "Case not found." }));
  });
});
