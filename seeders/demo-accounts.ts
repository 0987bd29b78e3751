import type { Role } from "@/lib/auth/permissions";

/** Demo credentials for the invented Larkspur Hydrogen Works team. Never used in production mode. */
export const DEMO_PASSWORD = "larkspur-demo-2026";

export const DEMO_TEAM = { name: "Larkspur Hydrogen Works", slug: "larkspur" };
export const OTHER_TEAM = { name: "Tansy Gas Cooperative", slug: "tansy" };

export const DEMO_ACCOUNTS: { email: string; name: string; role: Role; team: "larkspur" | "tansy" }[] = [
  { email: "erin.engineer@example.test", name: "Erin Okafor", role: "engineer", team: "larkspur" },
  { email: "sam.steward@example.test", name: "Sam Lindqvist", role: "steward", team: "larkspur" },
  { email: "stella.steward@example.test", name: "Stella Marsh", role: "steward", team: "larkspur" },
  { email: "rory.reviewer@example.test", name: "Rory Achebe", role: "reviewer", team: "larkspur" },
  { email: "alex.admin@example.test", name: "Alex Moreau", role: "admin", team: "larkspur" },
  { email: "tara.tansy@example.test", name: "Tara Quill", role: "engineer", team: "tansy" },
  { email: "tom.tansy@example.test", name: "Tom Quill", role: "admin", team: "tansy" },
];
