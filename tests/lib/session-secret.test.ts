/** Demo mode's own session secret (issue: sessions could be forged with the secret printed in .env.example). */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterEach, describe, expect, it, vi } from "vitest";
import { sealData, unsealData } from "iron-session";
import { DEVELOPMENT_SESSION_SECRET } from "@/lib/env";
import { resolveSessionSecret, sessionSecretFile } from "@/lib/session-secret";

const dirs: string[] = [];
function dataDir() {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-secret-"));
  dirs.push(dir);
  return dir;
}
afterEach(() => {
  for (const d of dirs.splice(0)) fs.rmSync(d, { recursive: true, force: true });
});

describe("session secret", () => {
  it("demo mode generates a random secret on first start, keeps it beside the database (mode 600) and reuses it", () => {
    const dir = dataDir();
    const e = { HEATPATH_MODE: "demo" as const, SESSION_SECRET: undefined, DATABASE_PATH: path.join(dir, "heatpath.sqlite") };
    const file = sessionSecretFile(e);
    expect(file).toBe(path.join(dir, "session-secret"));
    const first = resolveSessionSecret(e);
    expect(first.length).toBeGreaterThanOrEqual(32);
    expect(first).not.toBe(DEVELOPMENT_SESSION_SECRET);
    expect(fs.statSync(file).mode & 0o777).toBe(0o600);
    expect(resolveSessionSecret(e)).toBe(first);
    // Another data folder gets another secret.
    const other = dataDir();
    expect(resolveSessionSecret({ ...e, DATABASE_PATH: path.join(other, "heatpath.sqlite") })).not.toBe(first);
  });

  it("tightens a secret file that others can read", () => {
    const dir = dataDir();
    const file = path.join(dir, "session-secret");
    fs.writeFileSync(file, "x".repeat(43), { mode: 0o644 });
    expect(resolveSessionSecret({ HEATPATH_MODE: "demo", SESSION_SECRET: undefined, DATABASE_PATH: path.join(dir, "db.sqlite") })).toBe("x".repeat(43));
    expect(fs.statSync(file).mode & 0o777).toBe(0o600);
  });

  it("never accepts the .env.example value: ignored in demo mode, refused in production", async () => {
    const dir = dataDir();
    const warn = vi.spyOn(console, "warn").mockImplementation(() => undefined);
    const secret = resolveSessionSecret({ HEATPATH_MODE: "demo", SESSION_SECRET: DEVELOPMENT_SESSION_SECRET, DATABASE_PATH: path.join(dir, "db.sqlite") });
    expect(secret).not.toBe(DEVELOPMENT_SESSION_SECRET);
    expect(warn).toHaveBeenCalled();
    warn.mockRestore();
    // A cookie sealed with the published value does not open with the demo's secret.
    const forged = await sealData({ userId: 1, teamId: 1, issuedAt: Date.now() }, { password: DEVELOPMENT_SESSION_SECRET });
    expect(await unsealData(forged, { password: secret })).toEqual({});
    expect(() => resolveSessionSecret({ HEATPATH_MODE: "production", SESSION_SECRET: DEVELOPMENT_SESSION_SECRET, DATABASE_PATH: path.join(dir, "db.sqlite") })).toThrow(
      /example secret/,
    );
    expect(() => resolveSessionSecret({ HEATPATH_MODE: "production", SESSION_SECRET: undefined, DATABASE_PATH: path.join(dir, "db.sqlite") })).toThrow(/required in production/);
  });

  it("uses a secret of the operator's own when one is set", () => {
    const own = "o".repeat(40);
    expect(resolveSessionSecret({ HEATPATH_MODE: "demo", SESSION_SECRET: own, DATABASE_PATH: path.join(dataDir(), "db.sqlite") })).toBe(own);
    expect(resolveSessionSecret({ HEATPATH_MODE: "production", SESSION_SECRET: own, DATABASE_PATH: path.join(dataDir(), "db.sqlite") })).toBe(own);
  });
});
