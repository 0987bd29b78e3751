import { spawnSync } from "node:child_process";
import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { QueryTypes, type Sequelize } from "sequelize";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { canonicalSha256 } from "@/lib/cases/hash";
import { createSequelize } from "@/lib/db";
import { copyDatabase, CopyRefused, foreignKeyOrder, type CopyReport, type Endpoint } from "@/lib/db-copy";
import { migrateUp } from "@/lib/migrate";
import { defineModels } from "@/models";
import { runSeeders } from "@/seeders";

/**
 * db:copy. Under `npm run test:postgres` the throwaway server gives the real directions:
 * SQLite → an empty PostgreSQL database, and that PostgreSQL back into a new SQLite file.
 * Under `npm test` (no PostgreSQL) the same checks run SQLite → SQLite, so the code path,
 * refusals and verification are exercised on every run.
 */
const admin = process.env.HEATPATH_TEST_PG_ADMIN_URL;
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-copy-"));
const made: string[] = [];
const sourceFile = path.join(dir, "team.sqlite");
const log: string[] = [];

async function emptyTarget(): Promise<Endpoint> {
  if (!admin) return { file: path.join(dir, `target-${crypto.randomBytes(4).toString("hex")}.sqlite`) };
  const name = `heatpath_copy_${process.pid}_${crypto.randomBytes(4).toString("hex")}`;
  const c = new pg.Client({ connectionString: admin });
  await c.connect();
  await c.query(`CREATE DATABASE "${name}"`);
  await c.end();
  made.push(name);
  const u = new URL(admin);
  u.pathname = `/${name}`;
  return { url: u.toString() };
}

const open = (e: Endpoint) => ("url" in e ? createSequelize({ url: e.url }) : createSequelize({ storage: e.file }));
async function counts(s: Sequelize): Promise<Record<string, number>> {
  const tables = ((await s.getQueryInterface().showAllTables()) as string[]).filter((t) => t !== "SequelizeMeta").sort();
  const out: Record<string, number> = {};
  for (const t of tables) out[t] = Number((await s.query<{ n: number }>(`SELECT COUNT(*) AS n FROM "${t}"`, { type: QueryTypes.SELECT }))[0].n);
  return out;
}
async function withDb<T>(e: Endpoint, fn: (s: Sequelize) => Promise<T>): Promise<T> {
  const s = open(e);
  try {
    return await fn(s);
  } finally {
    await s.close();
  }
}

let sourceCounts: Record<string, number>;

beforeAll(async () => {
  // A team's SQLite database: the migrations and the demo data (cases with frozen snapshots, approved versions).
  const s = createSequelize({ storage: sourceFile });
  await migrateUp(s);
  await runSeeders({ sequelize: s, models: defineModels(s) }, { demo: true });
  sourceCounts = await counts(s);
  await s.close();
}, 120_000);

afterAll(async () => {
  fs.rmSync(dir, { recursive: true, force: true });
  if (admin && made.length) {
    const c = new pg.Client({ connectionString: admin });
    await c.connect();
    for (const name of made) await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    await c.end();
  }
});

describe(`db:copy SQLite → ${admin ? "PostgreSQL" : "SQLite (no PostgreSQL in this run)"}`, () => {
  let target: Endpoint;
  let copied: CopyReport;

  it("the demo team has rows to prove something with", () => {
    expect(sourceCounts.case_snapshots).toBeGreaterThan(0);
    expect(sourceCounts.model_versions).toBeGreaterThan(10);
    expect(sourceCounts.audit_events).toBeGreaterThan(0);
  });

  it("--dry-run prints the plan in foreign-key order and writes nothing", async () => {
    target = await emptyTarget();
    const lines: string[] = [];
    const plan = await copyDatabase({ from: { file: sourceFile }, to: target, dryRun: true, log: (l) => lines.push(l) });
    expect(plan.dryRun).toBe(true);
    expect(plan.migrations.pending).toBe(plan.migrations.total);
    const order = plan.tables.map((t) => t.table);
    expect(order.indexOf("teams")).toBeLessThan(order.indexOf("memberships"));
    expect(order.indexOf("cases")).toBeLessThan(order.indexOf("case_snapshots"));
    expect(Object.fromEntries(plan.tables.map((t) => [t.table, t.rows]))).toEqual(sourceCounts);
    expect(plan.snapshotsVerified).toBe(sourceCounts.case_snapshots);
    expect(lines.join("\n")).toMatch(/plan: SQLite .* → /);
    if ("url" in target) expect(await withDb(target, (s) => s.getQueryInterface().showAllTables())).toEqual([]);
    else expect(fs.existsSync(target.file)).toBe(false);
  });

  it("copies every row in one transaction, resets sequences, and verifies before committing", async () => {
    copied = await copyDatabase({ from: { file: sourceFile }, to: target, log: (l) => log.push(l) });
    expect(copied.dryRun).toBe(false);
    expect(Object.fromEntries(copied.tables.map((t) => [t.table, t.rows]))).toEqual(sourceCounts);
    expect(copied.snapshotsVerified).toBe(sourceCounts.case_snapshots);
    expect(copied.triggers.length).toBeGreaterThanOrEqual(2);
    if ("url" in target) expect(copied.sequences).toEqual(expect.arrayContaining(["users", "cases", "case_snapshots", "audit_events"]));

    // Checked again independently of the copier.
    await withDb(target, async (s) => {
      expect(await counts(s)).toEqual(sourceCounts);
      const snaps = await s.query<Record<string, unknown>>("SELECT * FROM case_snapshots ORDER BY id", { type: QueryTypes.SELECT });
      const parse = (v: unknown) => (typeof v === "string" ? JSON.parse(v) : v);
      for (const r of snaps)
        expect(canonicalSha256({ inputs: parse(r.inputs), pins: parse(r.pins), engineVersion: r.engine_version, request: parse(r.request), result: parse(r.result) })).toBe(r.hash);
      // The guards are live: a frozen snapshot cannot change.
      await expect(s.query(`UPDATE case_snapshots SET hash = 'x' WHERE id = ${Number(snaps[0].id)}`)).rejects.toSatisfy((e: unknown) =>
        /case snapshots are immutable/.test(String((e as { parent?: Error }).parent?.message ?? e)),
      );
      // The sequences were moved past the copied ids: the app's next insert does not collide.
      const m = defineModels(s);
      const team = await m.Team.findOne({ order: [["id", "ASC"]] });
      const ev = await m.AuditEvent.create({
        teamId: team!.id,
        actorId: null,
        action: "copy.checked",
        entityType: "team",
        entityId: String(team!.id),
        before: null,
        after: null,
      } as never);
      expect(ev.id).toBeGreaterThan(sourceCounts.audit_events);
    });
  });

  it("refuses a target that is not empty, and leaves it as it was", async () => {
    const before = await withDb(target, counts);
    await expect(copyDatabase({ from: { file: sourceFile }, to: target })).rejects.toThrow(/the target is not empty/);
    await expect(copyDatabase({ from: { file: sourceFile }, to: target, dryRun: true })).rejects.toThrow(CopyRefused);
    expect(await withDb(target, counts)).toEqual(before);
  });

  it.runIf(Boolean(admin))("and back: PostgreSQL → a new SQLite file, with the same checksums as the original", async () => {
    const back: Endpoint = { file: path.join(dir, "back.sqlite") };
    // The round trip carries the one audit event the test above added.
    const there = await copyDatabase({ from: target, to: back });
    const original = new Map(copied.tables.map((t) => [t.table, t.checksum]));
    for (const t of there.tables) if (t.table !== "audit_events") expect(t.checksum, t.table).toBe(original.get(t.table));
    expect(there.snapshotsVerified).toBe(sourceCounts.case_snapshots);
    expect(await withDb(back, counts)).toEqual({ ...sourceCounts, audit_events: sourceCounts.audit_events + 1 });
  });

  it("a snapshot whose hash no longer matches stops the copy, and nothing is committed", async () => {
    const tampered = path.join(dir, "tampered.sqlite");
    fs.copyFileSync(sourceFile, tampered);
    await withDb({ file: tampered }, async (s) => {
      await s.query("DROP TRIGGER case_snapshots_no_update");
      await s.query("UPDATE case_snapshots SET hash = 'deadbeef' WHERE id = (SELECT MAX(id) FROM case_snapshots)");
    });
    const fresh = await emptyTarget();
    await expect(copyDatabase({ from: { file: tampered }, to: fresh })).rejects.toThrow(/does not match its stored hash/);
    const after = await withDb(fresh, counts);
    expect(Object.values(after).every((n) => n === 0)).toBe(true);
    expect(Object.keys(after)).toContain("case_snapshots");
  });

  it("refuses a source that is not fully migrated", async () => {
    const partial = path.join(dir, "partial.sqlite");
    await withDb({ file: partial }, async (s) => {
      const { migrator } = await import("@/lib/migrate");
      await migrator(s).up({ step: 3 });
    });
    await expect(copyDatabase({ from: { file: partial }, to: await emptyTarget(), dryRun: true })).rejects.toThrow(/not fully migrated.*db:migrate/);
  });

  it("foreign-key order puts parents first and refuses a cycle", () => {
    const deps = new Map([
      ["b", new Set(["a"])],
      ["a", new Set<string>()],
      ["c", new Set(["b", "c"])],
    ]);
    expect(foreignKeyOrder(deps)).toEqual(["a", "b", "c"]);
    expect(() =>
      foreignKeyOrder(
        new Map([
          ["x", new Set(["y"])],
          ["y", new Set(["x"])],
        ]),
      ),
    ).toThrow(/cycle/);
  });

  it("the CLI: --dry-run exits 0 with the plan; a non-empty target exits 1 naming the refusal; bad usage exits 2", async () => {
    const tsx = path.resolve("node_modules/.bin/tsx");
    const toArg = "url" in target ? target.url : target.file;
    const run = (args: string[]) => spawnSync(tsx, ["scripts/db-copy.ts", ...args], { encoding: "utf8", env: { ...process.env, DATABASE_PATH: sourceFile } });
    const empty = await emptyTarget();
    const plan = run(["--dry-run", "--to", "url" in empty ? empty.url : empty.file]);
    expect(plan.status, plan.stderr).toBe(0);
    expect(plan.stdout).toMatch(/^plan: SQLite .*team\.sqlite → /m);
    expect(plan.stdout).toMatch(/dry run: nothing written/);
    if ("file" in empty) expect(fs.existsSync(empty.file)).toBe(false);
    else expect(await withDb(empty, (s) => s.getQueryInterface().showAllTables())).toEqual([]);
    const refused = run(["--to", toArg]);
    expect(refused.status).toBe(1);
    expect(refused.stderr).toMatch(/db:copy refused: the target is not empty/);
    expect(refused.stderr).not.toMatch(/:[^@/]*@/); // no password echoed back
    expect(run([]).status).toBe(2);
    expect(run(["--to", toArg, "--tooo", "x"]).status).toBe(2);
  }, 60_000);
});
