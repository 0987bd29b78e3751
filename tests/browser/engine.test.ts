/**
 * The engine pool against `next start`: the server keeps answering while a member's heavy
 * evaluation runs, a computation over its time budget is stopped (and the next one works),
 * and a full queue answers 429 with Retry-After. Requests are synthetic, invented for these
 * tests (tests/helpers/heavy.ts). Also: demo mode's mail links follow the server's port.
 */
import fs from "node:fs";
import type { ChildProcess } from "node:child_process";
import sqlite3 from "sqlite3";
import { afterAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD } from "@/seeders/demo-accounts";
import { heavyRequest, smallRequest } from "../helpers/heavy";
import { baseURL } from "./browser";
import { prepareDatabase, startServer, stopServer } from "./server";

async function signIn(base: string, email = "erin.engineer@example.test"): Promise<string> {
  const r = await fetch(`${base}/api/v1/session`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ email, password: DEMO_PASSWORD }) });
  expect(r.status).toBe(200);
  return r.headers.get("set-cookie")!.split(";")[0];
}

const evaluate = (base: string, cookie: string, body: unknown) =>
  fetch(`${base}/api/v1/evaluate`, { method: "POST", headers: { "content-type": "application/json", cookie }, body: JSON.stringify(body) });

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe("engine pool on the running server", () => {
  it("answers health and a small evaluation while a heavy evaluation is still running", async () => {
    const cookie = await signIn(baseURL());
    expect((await evaluate(baseURL(), cookie, smallRequest())).status).toBe(200);
    let heavyDone = false;
    const heavy = evaluate(baseURL(), cookie, heavyRequest()).then(async (r) => {
      heavyDone = true;
      await r.arrayBuffer();
      return r.status;
    });
    await sleep(500); // the heavy request has reached a worker
    const health = await fetch(`${baseURL()}/api/v1/health`);
    expect(health.status).toBe(200);
    expect(heavyDone).toBe(false);
    const small = await evaluate(baseURL(), cookie, smallRequest());
    expect(small.status).toBe(200);
    expect(((await small.json()) as { points: unknown[] }).points).toHaveLength(20);
    expect(heavyDone).toBe(false);
    // It finishes, or (on a very busy machine) meets the 10 s budget; either way it is answered.
    expect([200, 503]).toContain(await heavy);
  });
});

describe("a server of its own (one worker, one queue place, 1 s budget, no APP_URL, 6 sign-in attempts per address)", () => {
  let server: ChildProcess | undefined;
  let dir: string | undefined;
  let base = "";
  let databasePath = "";
  afterAll(async () => {
    await stopServer(server);
    if (dir) fs.rmSync(dir, { recursive: true, force: true });
  });

  it("refuses a computation over ENGINE_TIME_LIMIT_MS with 503 engine-time-limit, a full queue with 429, and serves the next request", async () => {
    const prepared = await prepareDatabase({ ENGINE_THREADS: "1", ENGINE_QUEUE_LIMIT: "1", ENGINE_TIME_LIMIT_MS: "1000", SIGNIN_LIMIT_PER_ADDRESS: "6" });
    dir = prepared.dir;
    databasePath = prepared.databasePath;
    delete prepared.env.APP_URL;
    server = await startServer(prepared.env, prepared.port);
    base = prepared.baseURL;
    const cookie = await signIn(base);
    expect((await evaluate(base, cookie, smallRequest())).status).toBe(200);

    const heavy = evaluate(base, cookie, heavyRequest());
    await sleep(300); // running on the one worker
    const queued = evaluate(base, cookie, smallRequest()); // waits in the one queue place
    await sleep(100);
    const refused = await evaluate(base, cookie, smallRequest());
    expect(refused.status).toBe(429);
    expect(refused.headers.get("retry-after")).toBe("5");
    expect(await refused.json()).toMatchObject({ error: { code: "engine-busy" } });

    const over = await heavy;
    expect(over.status).toBe(503);
    expect(await over.json()).toEqual({
      error: {
        code: "engine-time-limit",
        message: "The computation did not finish within 1 s and was stopped. Ask for fewer temperatures or a simpler Cp expression, or try again when the server is less busy.",
        details: { timeLimitMs: 1000 },
      },
    });
    // The queued one waited (the wait is not counted in its budget) and is computed on the new worker.
    expect((await queued).status).toBe(200);
    // The worker was replaced: the next request is computed.
    const next = await evaluate(base, cookie, smallRequest());
    expect(next.status).toBe(200);
    expect(((await next.json()) as { points: unknown[] }).points).toHaveLength(20);
  });

  it("links in demo mail point at the port the server listens on when APP_URL is unset", async () => {
    const cookie = await signIn(base, "alex.admin@example.test");
    const r = await fetch(`${base}/api/v1/team/invitations`, {
      method: "POST",
      headers: { "content-type": "application/json", cookie },
      body: JSON.stringify({ email: "port-check@example.test", role: "engineer" }),
    });
    expect(r.status).toBe(201);
    const rows = await query<{ body: string }>(databasePath, "SELECT body FROM mail_messages ORDER BY id DESC LIMIT 1");
    expect(rows[0].body).toContain(`${base}/invite/`);
    expect(base).not.toBe("http://127.0.0.1:3000");
  });

  it("limits sign-ins by the socket address: a client's own X-Forwarded-For does not reset it", async () => {
    // Two successful sign-ins above gave their attempts back; wrong passwords keep theirs.
    const wrong = (i: number) =>
      fetch(`${base}/api/v1/session`, {
        method: "POST",
        headers: { "content-type": "application/json", "x-forwarded-for": `198.51.100.${i}` },
        body: JSON.stringify({ email: `nobody${i}@example.test`, password: "wrong-password-1" }),
      });
    for (let i = 0; i < 6; i++) expect((await wrong(i)).status).toBe(401);
    const blocked = await wrong(99);
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers.get("retry-after"))).toBeGreaterThan(0);
  });
});

function query<T>(file: string, sql: string): Promise<T[]> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(file, sqlite3.OPEN_READONLY, (err) => {
      if (err) return reject(err);
      db.all(sql, (e, rows) => db.close(() => (e ? reject(e) : resolve(rows as T[]))));
    });
  });
}
