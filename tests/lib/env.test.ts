import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { demoAppUrl, DEVELOPMENT_SESSION_SECRET, env, productionConfigProblems, readEnv } from "@/lib/env";
import { freshDatabase } from "../helpers/db";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

describe("production mode", () => {
  const good = { HEATPATH_MODE: "production", SESSION_SECRET: "s".repeat(40), SMTP_URL: "smtp://mail.example.test:587", APP_URL: "https://heatpath.example.test" } as const;

  it("refuses the example secret, a missing secret, a missing SMTP_URL and a missing APP_URL", () => {
    expect(productionConfigProblems({ ...env, ...good, SESSION_SECRET: DEVELOPMENT_SESSION_SECRET, SMTP_URL: undefined })).toEqual([
      "SESSION_SECRET is the example secret from .env.example",
      "SMTP_URL is required in production mode",
    ]);
    expect(productionConfigProblems(readEnv({ HEATPATH_MODE: "production", PORT: "3102" }))).toEqual([
      "SESSION_SECRET is required in production mode",
      "APP_URL is required in production mode (the public address used in mail links)",
      "SMTP_URL is required in production mode",
    ]);
    expect(productionConfigProblems({ ...env, ...good })).toEqual([]);
    expect(productionConfigProblems({ ...env, HEATPATH_MODE: "demo" })).toEqual([]);
  });

  it("refuses to start while demo accounts exist (the check npm start runs)", () => {
    const r = spawnSync("node_modules/.bin/tsx", ["scripts/db.ts", "check-production"], {
      env: { ...process.env, ...good },
      encoding: "utf8",
    });
    expect(r.status).toBe(1);
    expect(r.stderr).toContain("Production mode refused: 7 demo account(s) are present");
  });

  it("passes the check on a fresh database that has no tables yet (it runs before the migrations)", () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-fresh-"));
    try {
      // A fresh SQLite file, also when the suite itself runs on PostgreSQL (DATABASE_URL set).
      const { DATABASE_URL: _pg, ...rest } = process.env;
      void _pg;
      const r = spawnSync("node_modules/.bin/tsx", ["scripts/db.ts", "check-production"], {
        env: { ...rest, ...good, DATABASE_PATH: path.join(dir, "heatpath.sqlite") },
        encoding: "utf8",
      });
      expect(r.stderr).not.toContain("no such table");
      expect(r.status).toBe(0);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe("APP_URL", () => {
  it("defaults in demo mode to the host and port the server listens on", () => {
    expect(readEnv({ PORT: "3102" }).APP_URL).toBe("http://127.0.0.1:3102");
    expect(readEnv({ HOST: "heatpath.local", PORT: "8080" }).APP_URL).toBe("http://heatpath.local:8080");
    expect(readEnv({ HOST: "0.0.0.0", PORT: "8080" }).APP_URL).toBe("http://127.0.0.1:8080");
    expect(readEnv({}).APP_URL).toBe("http://127.0.0.1:3000");
    expect(demoAppUrl({ HOST: "::1", PORT: "4000" })).toBe("http://[::1]:4000");
    expect(readEnv({ PORT: "3102", APP_URL: "https://heatpath.example.test" }).APP_URL).toBe("https://heatpath.example.test");
  });

  it("has no default in production mode", () => {
    expect(readEnv({ HEATPATH_MODE: "production", PORT: "3102" }).APP_URL).toBe("");
  });
});
