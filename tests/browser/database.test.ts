import { describe, expect, inject, it } from "vitest";
import { DEMO_PASSWORD } from "@/seeders/demo-accounts";
import { baseURL } from "./browser";
import { pgAdminUrl, queryDatabase } from "./server";

/**
 * The suite's app server writes to the database the suite prepared: a SQLite file
 * under `npm run test:browser`, a PostgreSQL database (DATABASE_URL) under `npm run test:postgres`.
 */
describe("the app's database", () => {
  const target = { databasePath: inject("databasePath"), databaseUrl: inject("databaseUrl") || undefined };

  it(`is ${pgAdminUrl() ? "PostgreSQL" : "SQLite"}, and a write through the app lands there`, async () => {
    expect(Boolean(target.databaseUrl)).toBe(Boolean(pgAdminUrl()));
    const session = await fetch(`${baseURL()}/api/v1/session`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ email: "alex.admin@example.test", password: DEMO_PASSWORD }),
    });
    expect(session.status).toBe(200);
    const cookie = session.headers.get("set-cookie")!.split(";")[0];
    const email = `where-is-it-${Date.now()}@example.test`;
    const r = await fetch(`${baseURL()}/api/v1/team/invitations`, {
      method: "POST",
      headers: { "content-type": "application/json", cookie },
      body: JSON.stringify({ email, role: "engineer" }),
    });
    expect(r.status).toBe(201);
    expect(await queryDatabase<{ email: string }>(target, `SELECT email FROM invitations WHERE email = '${email}'`)).toEqual([{ email }]);
  });

  it("answers the load balancer's deep health check from that database", async () => {
    const r = await fetch(`${baseURL()}/api/v1/health?deep=1`);
    expect(r.status).toBe(200);
    expect(await r.json()).toMatchObject({ status: "ok", database: { ok: true }, mailQueue: { ok: true } });
  });
});
