import type { ChildProcess } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "@/seeders/demo-accounts";
import { freePort, pgAdminUrl, prepareDatabase, queryDatabase, removeDatabase, startServer, stopServer, type PreparedDatabase } from "./server";

/**
 * Two app servers on one database, hit in parallel over HTTP on 127.0.0.1; requests
 * alternate between the servers. One SQLite file under `npm run test:browser` (the way
 * a team scales out before PostgreSQL); one PostgreSQL database under `npm run test:postgres`.
 */
let servers: ChildProcess[] = [];
let bases: string[] = [];
let prepared: PreparedDatabase | undefined;

beforeAll(async () => {
  prepared = await prepareDatabase();
  const second = await freePort();
  servers = [await startServer(prepared.env, prepared.port), await startServer({ ...prepared.env, APP_URL: `http://127.0.0.1:${second}` }, second)];
  bases = [prepared.baseURL, `http://127.0.0.1:${second}`];
});

afterAll(async () => {
  await Promise.all(servers.map((s) => stopServer(s)));
  await removeDatabase(prepared);
});

const query = <T>(sql: string): Promise<T[]> => queryDatabase<T>(prepared!, sql);
/** A JSON column: text on SQLite, parsed by the driver on PostgreSQL. */
const jsonValue = <T>(v: unknown): T => (typeof v === "string" ? JSON.parse(v) : v) as T;

async function signIn(email: string): Promise<string> {
  const r = await fetch(`${bases[0]}/api/v1/session`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  expect(r.status).toBe(200);
  return r.headers.get("set-cookie")!.split(";")[0];
}

async function call(i: number, cookie: string, method: string, path: string, body?: unknown): Promise<{ status: number; json: Record<string, unknown> }> {
  const r = await fetch(`${bases[i % bases.length]}${path}`, {
    method,
    headers: { cookie, ...(body === undefined ? {} : { "content-type": "application/json" }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await r.text();
  return { status: r.status, json: text ? JSON.parse(text) : {} };
}

const solid = { segments: [{ phase: "cr", form: "constant", tminK: 250, tmaxK: 900, coeffs: { cpJ: 120 } }], reference: { tK: 298.15, phase: "cr", hkJ: -1000, sJ: 80 } };

describe("concurrency across two app servers on one database", () => {
  it(`both servers run on ${pgAdminUrl() ? "PostgreSQL" : "SQLite"}, the database the test reads`, async () => {
    expect(prepared!.dialect).toBe(pgAdminUrl() ? "postgres" : "sqlite");
    const [users] = await query<{ n: number }>("SELECT COUNT(*) AS n FROM users");
    expect(users.n).toBeGreaterThan(0);
  });

  it("50 parallel edits of one draft: one success per lock version, the rest 409, no lost update", async () => {
    const sam = await signIn("sam.steward@example.test");
    const [species] = await query<{ id: number }>("SELECT id FROM species WHERE formula = 'NiAl2O4'");
    const created = await call(0, sam, "POST", "/api/v1/models", {
      speciesId: species.id,
      name: "Concurrency draft",
      version: { data: solid, citation: "Invented for the concurrency test" },
    });
    expect(created.status).toBeLessThan(300);
    const version = created.json.version as { id: number; lockVersion: number };

    // Round 1: everyone edits the same lock version.
    const round1 = await Promise.all(
      Array.from({ length: 50 }, (_, i) => call(i, sam, "PATCH", `/api/v1/versions/${version.id}`, { lockVersion: version.lockVersion, citation: `edit ${i}` })),
    );
    const statuses = round1.map((r) => r.status);
    expect(statuses.filter((s) => s === 200)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(49);
    const winner = round1.find((r) => r.status === 200)!.json.version as { citation: string; lockVersion: number };
    expect(winner.lockVersion).toBe(version.lockVersion + 1);

    // Round 2: every client retries with what it reads until its own edit lands.
    const landed = await Promise.all(
      Array.from({ length: 50 }, async (_, i) => {
        for (let attempt = 0; attempt < 200; attempt++) {
          const current = await call(i + attempt, sam, "GET", `/api/v1/versions/${version.id}`);
          const lock = (current.json.version as { lockVersion: number }).lockVersion;
          const r = await call(i + attempt + 1, sam, "PATCH", `/api/v1/versions/${version.id}`, { lockVersion: lock, changeNote: `note ${i}` });
          if (r.status === 200) return true;
          expect(r.status).toBe(409);
        }
        return false;
      }),
    );
    expect(landed.every(Boolean)).toBe(true);
    const [row] = await query<{ lock_version: number }>(`SELECT lock_version FROM model_versions WHERE id = ${version.id}`);
    expect(Number(row.lock_version)).toBe(version.lockVersion + 51);
    const [audits] = await query<{ n: number }>(
      `SELECT COUNT(*) AS n FROM audit_events WHERE entity_type = 'model-version' AND entity_id = '${version.id}' AND action LIKE '%edit%'`,
    );
    expect(audits.n).toBe(51);
  });

  it("parallel approvals of one proposal: exactly one approval", async () => {
    const [proposal] = await query<{ id: number }>("SELECT id FROM model_versions WHERE status = 'proposed' ORDER BY id LIMIT 1");
    const stella = await signIn("stella.steward@example.test");
    const alex = await signIn("alex.admin@example.test");
    const results = await Promise.all(Array.from({ length: 20 }, (_, i) => call(i, i % 2 ? stella : alex, "POST", `/api/v1/versions/${proposal.id}/approve`, {})));
    expect(results.filter((r) => r.status === 200)).toHaveLength(1);
    expect(results.every((r) => r.status === 200 || r.status === 409)).toBe(true);
    const [approvals] = await query<{ n: number }>(`SELECT COUNT(*) AS n FROM audit_events WHERE entity_id = '${proposal.id}' AND action LIKE '%approved%'`);
    expect(approvals.n).toBe(1);
  });

  it("parallel submissions of one case: one snapshot, no duplicates", async () => {
    const erin = await signIn("erin.engineer@example.test");
    const [draft] = await query<{ id: number; lock_version: number }>("SELECT id, lock_version FROM cases WHERE status = 'draft' ORDER BY id LIMIT 1");
    const results = await Promise.all(Array.from({ length: 20 }, (_, i) => call(i, erin, "POST", `/api/v1/cases/${draft.id}/submit`, { lockVersion: draft.lock_version })));
    expect(results.filter((r) => r.status === 200)).toHaveLength(1);
    expect(results.every((r) => r.status === 200 || r.status === 409)).toBe(true);
    const snapshots = await query<{ revision: number }>(`SELECT revision FROM case_snapshots WHERE case_id = ${draft.id}`);
    expect(snapshots.map((s) => s.revision)).toEqual([1]);
  });

  it("mail is claimed once: 30 invitations through both servers, each delivered exactly once", async () => {
    const alex = await signIn("alex.admin@example.test");
    const emails = Array.from({ length: 30 }, (_, i) => `claim-once-${i}@example.test`);
    const created = await Promise.all(emails.map((email, i) => call(i, alex, "POST", "/api/v1/team/invitations", { email, role: "engineer" })));
    expect(created.map((r) => r.status)).toEqual(emails.map(() => 201));
    // Both servers' workers poll the one queue (and the enqueuing one is woken at once).
    const ours = async () =>
      (
        await query<{ recipients: unknown; status: string; attempts: number }>("SELECT recipients, status, attempts FROM mail_messages WHERE kind = 'invitation' ORDER BY id")
      ).filter((m) => emails.includes(jsonValue<string[]>(m.recipients)[0]));
    const until = Date.now() + 60_000;
    while ((await ours()).some((m) => m.status !== "sent") && Date.now() < until) await new Promise((r) => setTimeout(r, 250));
    const sent = await ours();
    expect(sent).toHaveLength(30);
    expect(sent.map((m) => m.status)).toEqual(emails.map(() => "sent"));
    expect(sent.map((m) => Number(m.attempts))).toEqual(emails.map(() => 1));
    const caught = await query<{ envelope_to: unknown }>("SELECT envelope_to FROM caught_mail ORDER BY id");
    const counts = new Map<string, number>();
    for (const c of caught) for (const to of jsonValue<string[]>(c.envelope_to)) counts.set(to, (counts.get(to) ?? 0) + 1);
    expect(emails.map((e) => counts.get(e) ?? 0)).toEqual(emails.map(() => 1));
  });
});
