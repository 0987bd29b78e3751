import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import { ALL_WHO, actorOf, signInAs, type Who } from "../helpers/actors";
import { freshDatabase } from "../helpers/db";
import { bodyOf, ctx, jsonRequest } from "../helpers/request";

import * as me from "@/app/api/v1/me/route";
import * as health from "@/app/api/v1/health/route";
import * as session from "@/app/api/v1/session/route";
import * as members from "@/app/api/v1/team/members/route";
import * as member from "@/app/api/v1/team/members/[id]/route";
import * as invitations from "@/app/api/v1/team/invitations/route";
import * as invitation from "@/app/api/v1/team/invitations/[id]/route";
import * as accept from "@/app/api/v1/invitations/accept/route";
import * as audit from "@/app/api/v1/audit/route";
import * as evaluateRoute from "@/app/api/v1/evaluate/route";

type Handler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;
type Expect = Record<Exclude<Who, "steward2">, number>;

const allowAll = (status: number): Expect => ({ anonymous: 401, engineer: status, steward: status, reviewer: status, admin: status, other: status });
const adminOnly = (status: number, other = 404): Expect => ({ anonymous: 401, engineer: 403, steward: 403, reviewer: 403, admin: status, other });

// A small valid evaluation: water vaporisation with constant Cp (common practice values, from memory).
const evaluateBody = {
  reaction: "H2O(l) -> H2O(g)",
  species: {
    "H2O(l)": { segments: [{ phase: "l", form: "constant", tminK: 273.15, tmaxK: 373.15, coeffs: { cpJ: 75.3 } }], reference: { tK: 298.15, phase: "l", hkJ: -285.83, sJ: 69.95 } },
    "H2O(g)": { segments: [{ phase: "g", form: "constant", tminK: 273.15, tmaxK: 1000, coeffs: { cpJ: 33.6 } }], reference: { tK: 298.15, phase: "g", hkJ: -241.83, sJ: 188.84 } },
  },
  temperatures: { fromK: 300, toK: 370, stepK: 10 },
};

type Row = {
  name: string;
  file: string;
  method: "GET" | "POST" | "PATCH" | "DELETE";
  handler: Handler;
  /** Fresh params and body for each call, since some calls consume records. */
  prepare?: () => Promise<{ params?: Record<string, string>; body?: unknown }>;
  expect: Expect;
};

let throwaway = 0;
async function larkspurMembership(): Promise<string> {
  const admin = await actorOf("admin");
  throwaway += 1;
  const user = await models().User.create({ email: `tmp${throwaway}@example.test`, name: `Temp ${throwaway}`, passwordHash: "x" });
  const m = await models().Membership.create({ teamId: admin.teamId, userId: user.id, role: "engineer" });
  return String(m.id);
}
async function larkspurInvitation(): Promise<string> {
  const admin = await actorOf("admin");
  throwaway += 1;
  const i = await models().Invitation.create({
    teamId: admin.teamId,
    invitedById: admin.userId,
    email: `inv${throwaway}@example.test`,
    role: "engineer",
    tokenHash: `${throwaway}`.padStart(64, "0"),
    expiresAt: new Date(Date.now() + 86_400_000),
    acceptedAt: null,
    revokedAt: null,
  });
  return String(i.id);
}

export const ROUTES: Row[] = [
  { name: "me", file: "me", method: "GET", handler: me.GET as Handler, expect: allowAll(200) },
  { name: "members list", file: "team/members", method: "GET", handler: members.GET as Handler, expect: allowAll(200) },
  {
    name: "member role",
    file: "team/members/[id]",
    method: "PATCH",
    handler: member.PATCH as Handler,
    prepare: async () => ({ params: { id: await larkspurMembership() }, body: { role: "steward" } }),
    expect: adminOnly(200),
  },
  {
    name: "member remove",
    file: "team/members/[id]",
    method: "DELETE",
    handler: member.DELETE as Handler,
    prepare: async () => ({ params: { id: await larkspurMembership() } }),
    expect: adminOnly(204),
  },
  { name: "invitations list", file: "team/invitations", method: "GET", handler: invitations.GET as Handler, expect: adminOnly(200, 200) },
  {
    name: "invite",
    file: "team/invitations",
    method: "POST",
    handler: invitations.POST as Handler,
    prepare: async () => ({ body: { email: `new${++throwaway}@example.test`, role: "engineer" } }),
    expect: adminOnly(201, 201),
  },
  {
    name: "revoke invitation",
    file: "team/invitations/[id]",
    method: "DELETE",
    handler: invitation.DELETE as Handler,
    prepare: async () => ({ params: { id: await larkspurInvitation() } }),
    expect: adminOnly(204),
  },
  { name: "audit", file: "audit", method: "GET", handler: audit.GET as Handler, expect: { anonymous: 401, engineer: 403, steward: 403, reviewer: 200, admin: 200, other: 200 } },
  { name: "evaluate", file: "evaluate", method: "POST", handler: evaluateRoute.POST as Handler, prepare: async () => ({ body: evaluateBody }), expect: allowAll(200) },
  // Public doors: the same answer whoever asks.
  { name: "health", file: "health", method: "GET", handler: health.GET as Handler, expect: { anonymous: 200, engineer: 200, steward: 200, reviewer: 200, admin: 200, other: 200 } },
  {
    name: "sign out",
    file: "session",
    method: "DELETE",
    handler: session.DELETE as Handler,
    expect: { anonymous: 204, engineer: 204, steward: 204, reviewer: 204, admin: 204, other: 204 },
  },
  {
    name: "sign in (wrong password)",
    file: "session",
    method: "POST",
    handler: session.POST as Handler,
    prepare: async () => ({ body: { email: "erin.engineer@example.test", password: "wrong-password-1" } }),
    expect: { anonymous: 401, engineer: 401, steward: 401, reviewer: 401, admin: 401, other: 401 },
  },
  {
    name: "accept invitation (unknown token)",
    file: "invitations/accept",
    method: "POST",
    handler: accept.POST as Handler,
    prepare: async () => ({ body: { token: "t".repeat(32), name: "Someone", password: "valid-pass-123" } }),
    expect: { anonymous: 404, engineer: 404, steward: 404, reviewer: 404, admin: 404, other: 404 },
  },
];

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

describe("every route handler has a row", () => {
  it("lists each exported method of each route.ts under app/api", () => {
    const root = path.resolve("app/api/v1");
    const found: string[] = [];
    const walk = (dir: string) => {
      for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
        const p = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(p);
        else if (entry.name === "route.ts") {
          const rel = path.relative(root, dir).split(path.sep).join("/");
          const source = fs.readFileSync(p, "utf8");
          for (const m of source.matchAll(/export (?:const|async function) (GET|POST|PUT|PATCH|DELETE)\b/g)) found.push(`${m[1]} ${rel}`);
        }
      }
    };
    walk(root);
    const covered = new Set(ROUTES.map((r) => `${r.method} ${r.file}`));
    expect(found.filter((f) => !covered.has(f))).toEqual([]);
  });
});

describe.each(ROUTES)("$method $file ($name)", (row) => {
  it.each(ALL_WHO)("as %s", async (who) => {
    const prepared = row.prepare ? await row.prepare() : {};
    await signInAs(who);
    const request = jsonRequest(row.method, `/api/v1/${row.file}`, prepared.body);
    const response = await row.handler(request, ctx(prepared.params ?? {}));
    expect(response.status).toBe(row.expect[who as keyof Expect]);
    if (response.status >= 400) {
      expect(await bodyOf(response)).toEqual({ error: { code: expect.any(String), message: expect.any(String) } });
    }
  });
});
