/** Route matrix rows for the foundation's handlers. */
import { models } from "@/lib/db";
import { actorOf } from "../../helpers/actors";
import type { Handler, Row } from "./types";
import { adminOnly, allowAll, everyoneGets } from "./types";

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
import * as outbox from "@/app/api/v1/outbox/route";

// A small valid evaluation: water vaporisation with constant Cp (common practice values, from memory).
const evaluateBody = {
  reaction: "H2O(l) -> H2O(g)",
  species: {
    "H2O(l)": { segments: [{ phase: "l", form: "constant", tminK: 273.15, tmaxK: 373.15, coeffs: { cpJ: 75.3 } }], reference: { tK: 298.15, phase: "l", hkJ: -285.83, sJ: 69.95 } },
    "H2O(g)": { segments: [{ phase: "g", form: "constant", tminK: 273.15, tmaxK: 1000, coeffs: { cpJ: 33.6 } }], reference: { tK: 298.15, phase: "g", hkJ: -241.83, sJ: 188.84 } },
  },
  temperatures: { fromK: 300, toK: 370, stepK: 10 },
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

export const ROWS: Row[] = [
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
  { name: "audit", file: "audit", method: "GET", handler: audit.GET as Handler, expect: { anonymous: 401, engineer: 403, steward: 200, reviewer: 200, admin: 200, other: 200 } },
  { name: "outbox (own mail, or the team's for admins)", file: "outbox", method: "GET", handler: outbox.GET as Handler, expect: allowAll(200) },
  { name: "evaluate", file: "evaluate", method: "POST", handler: evaluateRoute.POST as Handler, prepare: async () => ({ body: evaluateBody }), expect: allowAll(200) },
  {
    name: "evaluate (columns)",
    file: "evaluate",
    method: "POST",
    query: "format=columns",
    handler: evaluateRoute.POST as Handler,
    prepare: async () => ({ body: evaluateBody }),
    expect: allowAll(200),
  },
  // Public doors: the same answer whoever asks.
  { name: "health", file: "health", method: "GET", handler: health.GET as Handler, expect: everyoneGets(200) },
  { name: "health (deep: database and mail queue)", file: "health", method: "GET", query: "deep=1", handler: health.GET as Handler, expect: everyoneGets(200) },
  {
    name: "sign out",
    file: "session",
    method: "DELETE",
    handler: session.DELETE as Handler,
    expect: everyoneGets(204),
  },
  {
    name: "sign in (wrong password)",
    file: "session",
    method: "POST",
    handler: session.POST as Handler,
    prepare: async () => ({ body: { email: "erin.engineer@example.test", password: "wrong-password-1" } }),
    expect: everyoneGets(401),
  },
  {
    name: "accept invitation (unknown token)",
    file: "invitations/accept",
    method: "POST",
    handler: accept.POST as Handler,
    prepare: async () => ({ body: { token: "t".repeat(32), name: "Someone", password: "valid-pass-123" } }),
    expect: everyoneGets(404),
  },
];
