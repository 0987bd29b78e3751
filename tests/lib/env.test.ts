import { spawnSync } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { DEVELOPMENT_SESSION_SECRET, env, productionConfigProblems } from "@/lib/env";
import { freshDatabase } from "../helpers/db";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

describe("production mode", () => {
  it("refuses the development secret and a missing SMTP_URL", () => {
    expect(productionConfigProblems({ ...env, HEATPATH_MODE: "production", SESSION_SECRET: DEVELOPMENT_SESSION_SECRET, SMTP_URL: undefined })).toEqual([
      "SESSION_SECRET is the development secret",
      "SMTP_URL is required in production mode",
    ]);
    expect(productionConfigProblems({ ...env, HEATPATH_MODE: "production", SESSION_SECRET: "s".repeat(40), SMTP_URL: "smtp://mail.example.test:587" })).toEqual([]);
    expect(productionConfigProblems({ ...env, HEATPATH_MODE: "demo" })).toEqual([]);
  });

  it("refuses to start while demo accounts exist (the check npm start runs)", () => {
    const r = spawnSync("node_modules/.bin/tsx", ["scripts/db.ts", "check-production"], {
      env: { ...process.env, HEATPATH_MODE: "production", SESSION_SECRET: "s".repeat(40), SMTP_URL: "smtp://mail.example.test:587" },
      encoding: "utf8",
    });
    expect(r.status).toBe(1);
    expect(r.stderr).toContain("Production mode refused: 7 demo account(s) are present");
  });
});
