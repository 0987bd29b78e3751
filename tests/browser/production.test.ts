/**
 * `HEATPATH_MODE=production npm start` on a fresh database (issue: trust, items 10 and 11): the
 * production check runs before the migrations and must not need the tables; the server then
 * sends Strict-Transport-Security and a nonce-based CSP. Everything on 127.0.0.1.
 */
import { spawn, type ChildProcess } from "node:child_process";
import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { freePort, stopServer, waitFor } from "./server";

const root = path.resolve(import.meta.dirname, "../..");
let child: ChildProcess | undefined;
let dir: string | undefined;

afterAll(async () => {
  await stopServer(child);
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

describe("production start", () => {
  it("starts on a fresh database (no tables yet) and sends HSTS and a nonce CSP", async () => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-production-"));
    const port = await freePort();
    let stderr = "";
    child = spawn(process.execPath, [path.join(root, "scripts/start.mjs")], {
      cwd: root,
      env: {
        ...process.env,
        HEATPATH_MODE: "production",
        DATABASE_PATH: path.join(dir, "heatpath.sqlite"),
        SESSION_SECRET: crypto.randomBytes(32).toString("hex"),
        APP_URL: `http://127.0.0.1:${port}`,
        // Nothing listens there; mail would only be retried. No mail is sent in this test.
        SMTP_URL: "smtp://127.0.0.1:9",
        PORT: String(port),
        HOST: "127.0.0.1",
      },
      stdio: ["ignore", "ignore", "pipe"],
    });
    child.stderr!.on("data", (d) => (stderr += String(d)));
    const exited = new Promise<number | null>((r) => child!.once("exit", (code) => r(code)));
    const up = waitFor(`http://127.0.0.1:${port}/api/v1/health`, 120_000).then(() => "up" as const);
    const result = await Promise.race([up, exited.then((code) => `exited ${code}`)]);
    expect(stderr).not.toContain("no such table");
    expect(result).toBe("up");

    const page = await fetch(`http://127.0.0.1:${port}/sign-in`);
    expect(page.status).toBe(200);
    expect(page.headers.get("strict-transport-security")).toBe("max-age=63072000; includeSubDomains");
    const csp = page.headers.get("content-security-policy") ?? "";
    expect(csp).toMatch(/script-src 'self' 'nonce-[^']+' 'strict-dynamic'(;|$)/);
    expect(csp).not.toContain("unsafe-eval");
    expect(csp).toContain("upgrade-insecure-requests");
    const api = await fetch(`http://127.0.0.1:${port}/api/v1/health`);
    expect(api.headers.get("strict-transport-security")).toBe("max-age=63072000; includeSubDomains");
    expect(api.headers.get("cache-control")).toBe("no-store");
  });
});
