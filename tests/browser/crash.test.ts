import fs from "node:fs";
import type { ChildProcess } from "node:child_process";
import sqlite3 from "sqlite3";
import { afterAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "@/seeders/demo-accounts";
import { prepareDatabase, startServer, stopServer } from "./server";

let server: ChildProcess | undefined;
let dir: string | undefined;

afterAll(async () => {
  await stopServer(server, "SIGKILL");
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

function query<T>(file: string, sql: string): Promise<T[]> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(file, sqlite3.OPEN_READONLY, (err) => {
      if (err) return reject(err);
      db.all(sql, (e, rows) => db.close(() => (e ? reject(e) : resolve(rows as T[]))));
    });
  });
}

async function signIn(baseURL: string): Promise<string> {
  const r = await fetch(`${baseURL}/api/v1/session`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ email: "alex.admin@example.test", password: DEMO_PASSWORD }),
  });
  expect(r.status).toBe(200);
  return r.headers.get("set-cookie")!.split(";")[0];
}

describe("crash safety", () => {
  it("survives SIGKILL during a write load: integrity ok, nothing half-written, every acknowledged write kept", async () => {
    // SQLite's own property (its WAL file after a kill); PostgreSQL's crash recovery is the server's job.
    const prepared = await prepareDatabase({}, { dialect: "sqlite" });
    dir = prepared.dir;
    server = await startServer(prepared.env, prepared.port);
    const cookie = await signIn(prepared.baseURL);

    const acknowledged: string[] = [];
    let n = 0;
    let killed = false;
    const deadline = Date.now() + 20_000;
    const worker = async () => {
      while (!killed && Date.now() < deadline && n < 400) {
        const email = `load${n++}@example.test`;
        try {
          const r = await fetch(`${prepared.baseURL}/api/v1/team/invitations`, {
            method: "POST",
            headers: { "content-type": "application/json", cookie },
            body: JSON.stringify({ email, role: "engineer" }),
          });
          if (r.status === 201) acknowledged.push(email);
          else expect(r.status).toBeLessThan(500);
        } catch {
          // The server died under this request: it was never acknowledged.
        }
      }
    };
    const workers = Array.from({ length: 6 }, worker);
    while (acknowledged.length < 30 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 20));
    killed = true;
    server.kill("SIGKILL");
    await Promise.all(workers);
    await new Promise((r) => (server!.exitCode !== null || server!.signalCode !== null ? r(null) : server!.once("exit", r)));
    expect(acknowledged.length).toBeGreaterThanOrEqual(30);

    server = await startServer(prepared.env, prepared.port);
    const [check] = await query<{ integrity_check: string }>(prepared.databasePath, "PRAGMA integrity_check");
    expect(check.integrity_check).toBe("ok");

    const invitations = await query<{ id: number; email: string }>(prepared.databasePath, "SELECT id, email FROM invitations");
    const stored = new Set(invitations.map((i) => i.email));
    expect(acknowledged.filter((e) => !stored.has(e))).toEqual([]);

    // One transaction wrote the invitation, its audit event and its mail: all three or none.
    const audits = await query<{ entity_id: string }>(prepared.databasePath, "SELECT entity_id FROM audit_events WHERE action = 'invitation.created'");
    const mails = await query<{ recipients: string }>(prepared.databasePath, "SELECT recipients FROM mail_messages WHERE kind = 'invitation'");
    expect(audits.map((a) => Number(a.entity_id)).sort((a, b) => a - b)).toEqual(invitations.map((i) => i.id).sort((a, b) => a - b));
    expect(mails.map((m) => JSON.parse(m.recipients)[0]).sort()).toEqual(invitations.map((i) => i.email).sort());

    // And the restarted server serves the same data.
    const after = await fetch(`${prepared.baseURL}/api/v1/team/invitations`, { headers: { cookie: await signIn(prepared.baseURL) } });
    expect(((await after.json()) as { invitations: unknown[] }).invitations.length).toBe(invitations.length);
  });
});
