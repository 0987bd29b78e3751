import fs from "node:fs";
import type { ChildProcess } from "node:child_process";
import sqlite3 from "sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "@/seeders/demo-accounts";
import { freePort, prepareDatabase, startServer, stopServer } from "./server";

/**
 * Two app servers on one SQLite file (the way a team scales out before PostgreSQL),
 * hit in parallel over HTTP on 127.0.0.1. Requests alternate between the servers.
 */
let servers: ChildProcess[] = [];
let bases: string[] = [];
let databasePath = "";
let dir = "";

beforeAll(async () => {
  const prepared = await prepareDatabase();
  dir = prepared.dir;
  databasePath = prepared.databasePath;
  const second = await freePort();
  servers = [await startServer(prepared.env, prepared.port), await startServer({ ...prepared.env, APP_URL: `http://127.0.0.1:${second}` }, second)];
  bases = [prepared.baseURL, `http://127.0.0.1:${second}`];
});

afterAll(async () => {
  await Promise.all(servers.map((s) => stopServer(s)));
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

function query<T>(sql: string): Promise<T[]> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(databasePath, sqlite3.OPEN_READONLY, (err) => {
      if (err) return reject(err);
      db.all(sql, (e, rows) => db.close(() => (e ? reject(e) : resolve(rows as T[]))));
    });
  });
}

async function signIn(email: string): Promise<string> {
  const r = await fetch(`${bases[0]}/api/v1/session`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ email, password: DEMO_PASSWORD }) });
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
  it("50 parallel edits of one draft: one success per lock version, the rest 409, no lost update", async () => {
    const sam = await signIn("sam.steward@example.test");
    const [species] = await query<{ id: number }>("SELECT id FROM species WHERE formula = 'NiAl2O4'");
    const created = await call(0, sam, "POST", "/api/v1/models", { speciesId: species.id, name: "Concurrency draft", version: { data: solid, citation: "Invented for the concurrency test" } });
    expect(created.status).toBeLessThan(300);
    const version = created.json.version as { id: number; lockVersion: number };

    // Round 1: everyone edits the same lock version.
    const round1 = await Promise.all(Array.from({ length: 50 }, (_, i) => call(i, sam, "PATCH", `/api/v1/versions/${version.id}`, { lockVersion: version.lockVersion, citation: `edit ${i}` })));
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
    expect(row.lock_version).toBe(version.lockVersion + 51);
    const [audits] = await query<{ n: number }>(`SELECT COUNT(*) AS n FROM audit_events WHERE entity_type = 'model-version' AND entity_id = '${version.id}' AND action LIKE '%edit%'`);
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
});
