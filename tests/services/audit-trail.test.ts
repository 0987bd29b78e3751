/** The team's audit trail as /audit reads it (issue 11, item 13): filters and the choices they offer. */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as auditRoute from "@/app/api/v1/audit/route";
import { closeDb, models } from "@/lib/db";
import { auditFacets, listAudit } from "@/lib/services/audit";
import { actorOf, signInAs } from "../helpers/actors";
import { freshDatabase } from "../helpers/db";
import { jsonRequest } from "../helpers/request";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

describe("audit trail", () => {
  it("filters by record, actor and action, newest first, and offers what the trail holds", async () => {
    const sam = await actorOf("steward");
    const all = await listAudit(sam, { limit: 200 });
    expect(all.length).toBeGreaterThan(5);
    expect(all.map((e) => e.id)).toEqual([...all.map((e) => e.id)].sort((a, b) => b - a));
    const facets = await auditFacets(sam);
    expect(facets.entityTypes).toContain("case");
    expect(facets.actions).toContain("case.approved");
    expect(facets.actors.map((a) => a.name)).toContain("Rory Achebe");

    const someCase = all.find((e) => e.entityType === "case")!;
    const one = await listAudit(sam, { entityType: "case", entityId: someCase.entityId });
    expect(one.length).toBeGreaterThan(0);
    expect(one.every((e) => e.entityType === "case" && e.entityId === someCase.entityId)).toBe(true);
    const rory = facets.actors.find((a) => a.name === "Rory Achebe")!;
    const byRory = await listAudit(sam, { actorId: rory.id });
    expect(byRory.length).toBeGreaterThan(0);
    expect(byRory.every((e) => e.actorName === "Rory Achebe")).toBe(true);
    const approvals = await listAudit(sam, { action: "case.approved" });
    expect(approvals.every((e) => e.action === "case.approved")).toBe(true);
    const older = await listAudit(sam, { beforeId: all[2].id, limit: 2 });
    expect(older.map((e) => e.id)).toEqual([all[3].id, all[4].id]);
    // Another team's events never show.
    const tom = await actorOf("other");
    expect((await listAudit(tom, { limit: 200 })).every((e) => !all.some((x) => x.id === e.id))).toBe(true);
    expect(await models().AuditEvent.count()).toBeGreaterThan(all.length - 1);
  });

  it("the API takes the same filters and refuses an unknown one", async () => {
    await signInAs("steward");
    const ok = await auditRoute.GET(jsonRequest("GET", "/api/v1/audit?entityType=case&action=case.approved"), {} as never);
    expect(ok.status).toBe(200);
    const bad = await auditRoute.GET(jsonRequest("GET", "/api/v1/audit?actr=3"), {} as never);
    expect(bad.status).toBe(422);
    await signInAs("engineer");
    expect((await auditRoute.GET(jsonRequest("GET", "/api/v1/audit"), {} as never)).status).toBe(403);
  });
});
