import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import * as session from "@/app/api/v1/session/route";
import * as invitations from "@/app/api/v1/team/invitations/route";
import * as member from "@/app/api/v1/team/members/[id]/route";
import * as accept from "@/app/api/v1/invitations/accept/route";
import * as evaluateRoute from "@/app/api/v1/evaluate/route";
import { signInAs } from "../helpers/actors";
import { freshDatabase } from "../helpers/db";
import { ctx, jsonRequest } from "../helpers/request";
import { hammer, hostileBody, type Handler } from "../helpers/hostile";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

describe("generated hostile input never gets a 5xx and writes nothing", () => {
  it("sign-in", async () => {
    await hammer("sign-in", "anonymous", session.POST as Handler, "/api/v1/session", "POST", {}, hostileBody({ email: fc.string(), password: fc.string() }));
  });

  it("invitations (as admin)", async () => {
    await hammer(
      "invite",
      "admin",
      invitations.POST as Handler,
      "/api/v1/team/invitations",
      "POST",
      {},
      hostileBody({ email: fc.string(), role: fc.constantFrom("admin", "root", "", "engineer ") }),
    );
  });

  it("role change (as admin)", async () => {
    const paramsIds = ["1", "-1", "0", "1e309", "../../etc/passwd", "abc", "99999999999999999999"];
    for (const id of paramsIds) {
      await signInAs("admin");
      const r = await (member.PATCH as Handler)(jsonRequest("PATCH", `/api/v1/team/members/${id}`, { role: "overlord" }), ctx({ id }));
      expect(r.status).toBeGreaterThanOrEqual(400);
      expect(r.status).toBeLessThan(500);
    }
    await hammer("role", "admin", member.PATCH as Handler, "/api/v1/team/members/1", "PATCH", { id: "1" }, hostileBody({ role: fc.string() }));
  });

  it("invitation acceptance", async () => {
    await hammer(
      "accept",
      "anonymous",
      accept.POST as Handler,
      "/api/v1/invitations/accept",
      "POST",
      {},
      hostileBody({ token: fc.string(), name: fc.string(), password: fc.string() }),
    );
  });

  it("evaluate", async () => {
    const seen = await hammer(
      "evaluate",
      "engineer",
      evaluateRoute.POST as Handler,
      "/api/v1/evaluate",
      "POST",
      {},
      hostileBody({
        reaction: fc.oneof(fc.string(), fc.constantFrom("H2 + O2 -> H2O", "2 H2(g) + O2(g) -> 2 H2O(g)", "=>", "H2O(l) -> H2O(g)")),
        species: fc.dictionary(fc.string(), fc.anything()),
        temperatures: fc.oneof(
          fc.record({ fromK: fc.double(), toK: fc.double(), stepK: fc.double() }),
          fc.record({ fromK: fc.constant(-40), toK: fc.constant(300), stepK: fc.constant(10) }),
          fc.record({ listK: fc.array(fc.oneof(fc.double(), fc.string())) }),
        ),
      }),
    );
    expect([...seen.keys()].every((s) => [400, 413, 415, 422].includes(s))).toBe(true);
  });
});
