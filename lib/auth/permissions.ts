/** Roles are per team membership and are not a ladder. */
export const ROLES = ["engineer", "steward", "reviewer", "admin"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  engineer: "Engineer",
  steward: "Steward",
  reviewer: "Reviewer",
  admin: "Admin",
};

const everyone: readonly Role[] = ROLES;

/**
 * The one table that decides who may do what. Services ask it through the
 * guards; the UI may ask it to hide controls, never to allow them.
 */
export const PERMISSIONS = {
  "team.view": everyone,
  "members.manage": ["admin"],
  "invitations.manage": ["admin"],
  "audit.view": ["admin", "reviewer", "steward"],
  "outbox.view": ["admin"],
  "evaluate.run": everyone,
  "library.view": everyone,
  "models.draft": ["engineer", "steward", "admin"],
  "models.edit": ["steward", "admin"],
  "models.fit": ["steward", "admin"],
  "models.decide": ["steward", "admin"],
  "datasets.upload": ["engineer", "steward", "admin"],
  "cases.view": everyone,
  "cases.create": ["engineer", "steward", "admin"],
  "cases.submit": ["engineer", "steward", "admin"],
  "cases.review": ["reviewer", "admin"],
  "comments.create": everyone,
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof PERMISSIONS;

export function can(role: Role | null | undefined, action: Action): boolean {
  return !!role && (PERMISSIONS[action] as readonly Role[]).includes(role);
}
