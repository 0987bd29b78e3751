/**
 * `npm run db:copy`: move a team's whole database from one dialect to the other (SQLite →
 * PostgreSQL, and back). The target must be empty. Its schema is made by the same migrations,
 * then every row is copied inside ONE transaction on the target, id sequences are reset, and
 * before that transaction commits the copy is verified: row counts and an order-independent
 * checksum per table against the source, the immutability triggers present and refusing, and
 * every case snapshot's hash recomputed. Any mismatch rolls the whole copy back.
 * Used by scripts/db-copy.ts; no framework imports.
 */
import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import canonicalize from "canonicalize";
import { QueryTypes, type Sequelize, type Transaction } from "sequelize";
import { canonicalSha256 } from "@/lib/cases/hash";
import { createSequelize } from "@/lib/db";
import { migrator } from "@/lib/migrate";

export type Endpoint = { url: string } | { file: string };
export type CopyOptions = { from: Endpoint; to: Endpoint; dryRun?: boolean; batchSize?: number; log?: (line: string) => void };
export type TableReport = { table: string; rows: number; checksum: string };
export type CopyReport = {
  dryRun: boolean;
  from: string;
  to: string;
  migrations: { pending: number; total: number };
  tables: TableReport[];
  sequences: string[];
  triggers: string[];
  snapshotsVerified: number;
};

const META = "SequelizeMeta";

/** The database guards that make approved versions and snapshots immutable, by dialect (their migrations). */
export const IMMUTABLE_TRIGGERS: Record<"sqlite" | "postgres", string[]> = {
  sqlite: ["case_snapshots_no_delete", "case_snapshots_no_update", "model_versions_immutable", "model_versions_no_delete"],
  postgres: ["case_snapshots_immutable", "model_versions_immutable"],
};

export class CopyRefused extends Error {
  override name = "CopyRefused";
}

/** A URL or file for printing: the password is never shown. */
export function describeEndpoint(e: Endpoint): string {
  if ("file" in e) return `SQLite ${e.file}`;
  const u = new URL(e.url);
  if (u.password) u.password = "***";
  return `PostgreSQL ${u.toString()}`;
}

/** `postgres://…` / `postgresql://…` is PostgreSQL; anything else is a SQLite file path. */
export function parseEndpoint(value: string): Endpoint {
  return /^postgres(ql)?:\/\//i.test(value) ? { url: value } : { file: path.resolve(value) };
}

function open(e: Endpoint): Sequelize {
  return "url" in e ? createSequelize({ url: e.url }) : createSequelize({ storage: e.file });
}

const q = (name: string) => `"${name.replace(/"/g, '""')}"`;

async function select<T extends object>(s: Sequelize, sql: string, transaction?: Transaction): Promise<T[]> {
  return s.query<T>(sql, { type: QueryTypes.SELECT, transaction });
}

async function tablesOf(s: Sequelize): Promise<string[]> {
  const rows =
    s.getDialect() === "postgres"
      ? await select<{ name: string }>(s, "SELECT table_name AS name FROM information_schema.tables WHERE table_schema = current_schema() AND table_type = 'BASE TABLE'")
      : await select<{ name: string }>(s, "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%'");
  return rows.map((r) => r.name).sort();
}

async function count(s: Sequelize, table: string, transaction?: Transaction): Promise<number> {
  const [row] = await select<{ n: number | string }>(s, `SELECT COUNT(*) AS n FROM ${q(table)}`, transaction);
  return Number(row.n);
}

async function migrationsOf(s: Sequelize, tables: string[]): Promise<string[]> {
  if (!tables.includes(META)) return [];
  return (await select<{ name: string }>(s, `SELECT name FROM ${q(META)} ORDER BY name`)).map((r) => r.name);
}

/** child → parents, from the source's foreign keys. */
async function foreignKeys(s: Sequelize, tables: string[]): Promise<Map<string, Set<string>>> {
  const deps = new Map(tables.map((t) => [t, new Set<string>()]));
  if (s.getDialect() === "postgres") {
    const rows = await select<{ child: string; parent: string }>(
      s,
      `SELECT tc.relname AS child, tp.relname AS parent FROM pg_constraint c
         JOIN pg_class tc ON tc.oid = c.conrelid JOIN pg_class tp ON tp.oid = c.confrelid
         JOIN pg_namespace n ON n.oid = tc.relnamespace
        WHERE c.contype = 'f' AND n.nspname = current_schema()`,
    );
    for (const r of rows) deps.get(r.child)?.add(r.parent);
  } else {
    for (const t of tables) for (const r of await select<{ table: string }>(s, `PRAGMA foreign_key_list(${q(t)})`)) deps.get(t)?.add(r.table);
  }
  return deps;
}

/** Parents before children (alphabetical among equals); a table's reference to itself is met by id order. */
export function foreignKeyOrder(deps: Map<string, Set<string>>): string[] {
  const order: string[] = [];
  const done = new Set<string>();
  const left = new Set(deps.keys());
  while (left.size) {
    const ready = [...left].filter((t) => [...deps.get(t)!].every((p) => p === t || done.has(p) || !deps.has(p))).sort();
    if (!ready.length) throw new CopyRefused(`foreign keys form a cycle among: ${[...left].sort().join(", ")}`);
    for (const t of ready) {
      order.push(t);
      done.add(t);
      left.delete(t);
    }
  }
  return order;
}

type Family = "bool" | "time" | "json" | "number" | "text";
type Column = { name: string; family: Family; primaryKey: boolean };

function family(type: string): Family {
  const t = type.toUpperCase();
  if (/BOOL|TINYINT\(1\)/.test(t)) return "bool";
  if (/TIMESTAMP|DATETIME/.test(t)) return "time";
  if (/JSON/.test(t)) return "json";
  if (/INT|REAL|DOUBLE|FLOAT|NUMERIC|DECIMAL/.test(t)) return "number";
  return "text";
}

async function columnsOf(s: Sequelize, table: string): Promise<Column[]> {
  const described = await s.getQueryInterface().describeTable(table);
  return Object.entries(described).map(([name, c]) => ({ name, family: family(String(c.type)), primaryKey: Boolean(c.primaryKey) }));
}

/** One value in a dialect-free form, for the checksum: the same row hashes the same on both. */
function normal(f: Family, v: unknown): unknown {
  if (v === null || v === undefined) return null;
  switch (f) {
    case "bool":
      return v === true || v === 1 || v === "1" || v === "true" || v === "t";
    case "time":
      return new Date(v as string | number | Date).toISOString();
    case "json":
      return JSON.parse(canonicalize(typeof v === "string" ? JSON.parse(v) : v) ?? "null");
    case "number":
      return Number(v);
    default:
      return String(v);
  }
}

/** One value as the target's dialect takes it in a bulk insert. */
function forTarget(f: Family, v: unknown): unknown {
  if (v === null || v === undefined) return null;
  switch (f) {
    case "bool":
      return normal("bool", v);
    case "time":
      return new Date(v as string | number | Date);
    case "json":
      return typeof v === "string" ? v : JSON.stringify(v);
    case "number":
      return Number(v);
    default:
      return v;
  }
}

/** SHA-256 over the sorted per-row hashes: independent of row order and of either dialect's collation. */
class TableHash {
  private rows: string[] = [];
  constructor(private columns: Column[]) {}
  add(row: Record<string, unknown>) {
    const values = this.columns.map((c) => normal(c.family, row[c.name]));
    this.rows.push(
      crypto
        .createHash("sha256")
        .update(canonicalize(values) ?? "")
        .digest("hex"),
    );
  }
  digest(): string {
    return crypto.createHash("sha256").update(this.rows.sort().join("\n")).digest("hex");
  }
}

async function* batches(s: Sequelize, table: string, columns: Column[], size: number, transaction?: Transaction): AsyncGenerator<Record<string, unknown>[]> {
  const keys = columns.filter((c) => c.primaryKey).map((c) => q(c.name));
  const order = (keys.length ? keys : columns.map((c) => q(c.name))).join(", ");
  for (let offset = 0; ; offset += size) {
    const rows = await select<Record<string, unknown>>(s, `SELECT * FROM ${q(table)} ORDER BY ${order} LIMIT ${size} OFFSET ${offset}`, transaction);
    if (rows.length) yield rows;
    if (rows.length < size) return;
  }
}

async function checksum(s: Sequelize, table: string, columns: Column[], size: number, transaction?: Transaction): Promise<{ rows: number; checksum: string }> {
  const hash = new TableHash(columns);
  let rows = 0;
  for await (const batch of batches(s, table, columns, size, transaction)) {
    for (const r of batch) hash.add(r);
    rows += batch.length;
  }
  return { rows, checksum: hash.digest() };
}

async function triggersOf(s: Sequelize, transaction?: Transaction): Promise<string[]> {
  const rows =
    s.getDialect() === "postgres"
      ? await select<{ name: string }>(
          s,
          "SELECT DISTINCT t.tgname AS name FROM pg_trigger t JOIN pg_class c ON c.oid = t.tgrelid JOIN pg_namespace n ON n.oid = c.relnamespace WHERE NOT t.tgisinternal AND n.nspname = current_schema()",
          transaction,
        )
      : await select<{ name: string }>(s, "SELECT name FROM sqlite_master WHERE type = 'trigger'", transaction);
  return rows.map((r) => r.name).sort();
}

/** The guard must refuse a change to a frozen row: tried inside a savepoint, always undone. */
async function probeRefuses(s: Sequelize, transaction: Transaction, sql: string): Promise<boolean> {
  await s.query("SAVEPOINT heatpath_copy_probe", { transaction });
  let refused = false;
  try {
    await s.query(sql, { transaction });
  } catch {
    refused = true;
  }
  await s.query("ROLLBACK TO SAVEPOINT heatpath_copy_probe", { transaction });
  await s.query("RELEASE SAVEPOINT heatpath_copy_probe", { transaction });
  return refused;
}

function parseJson(v: unknown): unknown {
  return typeof v === "string" ? JSON.parse(v) : v;
}

async function verifySnapshots(s: Sequelize, tables: string[], size: number, transaction?: Transaction): Promise<number> {
  if (!tables.includes("case_snapshots")) return 0;
  const columns = await columnsOf(s, "case_snapshots");
  let n = 0;
  for await (const batch of batches(s, "case_snapshots", columns, size, transaction)) {
    for (const r of batch) {
      const content = { inputs: parseJson(r.inputs), pins: parseJson(r.pins), engineVersion: r.engine_version, request: parseJson(r.request), result: parseJson(r.result) };
      if (canonicalSha256(content) !== r.hash) throw new CopyRefused(`case snapshot ${r.id} does not match its stored hash`);
      n += 1;
    }
  }
  return n;
}

/**
 * Copy `from` into the empty `to` (see the file comment). A dry run checks everything it can
 * without writing and returns the plan; `CopyRefused` says why a copy will not start.
 */
export async function copyDatabase(options: CopyOptions): Promise<CopyReport> {
  const log = options.log ?? (() => undefined);
  const size = options.batchSize ?? 200;
  const dryRun = Boolean(options.dryRun);
  if ("file" in options.from && !fs.existsSync(options.from.file)) throw new CopyRefused(`the source ${options.from.file} does not exist`);
  if ("file" in options.to && "file" in options.from && path.resolve(options.to.file) === path.resolve(options.from.file))
    throw new CopyRefused("the source and the target are the same file");
  if ("url" in options.from && "url" in options.to && options.from.url === options.to.url) throw new CopyRefused("the source and the target are the same database");
  const source = open(options.from);
  // A dry run never creates a missing SQLite target file.
  const targetMissing = "file" in options.to && !fs.existsSync(options.to.file);
  const target = dryRun && targetMissing ? undefined : open(options.to);
  try {
    // The source: fully migrated by this code's migrations.
    const sourceTables = await tablesOf(source);
    const all = (await migrator(source).migrations(source.getQueryInterface())).map((m) => m.name).sort();
    const sourceDone = await migrationsOf(source, sourceTables);
    if (sourceDone.join("\n") !== all.join("\n")) {
      const missing = all.filter((m) => !sourceDone.includes(m));
      const unknown = sourceDone.filter((m) => !all.includes(m));
      throw new CopyRefused(
        missing.length
          ? `the source is not fully migrated (${missing.length} pending, first ${missing[0]}); run npm run db:migrate against it first`
          : `the source has migrations this code does not know (${unknown[0]}); copy with the code that wrote it`,
      );
    }

    // The target: no rows anywhere (an empty, freshly migrated schema is fine).
    const targetTables = target ? await tablesOf(target) : [];
    const nonEmpty: string[] = [];
    for (const t of targetTables) if (t !== META && (await count(target!, t)) > 0) nonEmpty.push(t);
    if (nonEmpty.length)
      throw new CopyRefused(`the target is not empty: ${nonEmpty.slice(0, 5).join(", ")}${nonEmpty.length > 5 ? ", …" : ""} hold rows; copy only into an empty database`);
    const stray = targetTables.filter((t) => t !== META && !sourceTables.includes(t));
    if (stray.length) throw new CopyRefused(`the target has tables the schema does not: ${stray.join(", ")}; copy only into an empty database`);
    const targetDone = target ? await migrationsOf(target, targetTables) : [];
    const pending = all.filter((m) => !targetDone.includes(m));

    const data = sourceTables.filter((t) => t !== META);
    const order = foreignKeyOrder(await foreignKeys(source, data));
    const plan: TableReport[] = [];
    const sourceColumns = new Map<string, Column[]>();
    for (const t of order) {
      const columns = await columnsOf(source, t);
      sourceColumns.set(t, columns);
      plan.push({ table: t, rows: await count(source, t), checksum: "" });
    }
    log(`${dryRun ? "plan" : "copy"}: ${describeEndpoint(options.from)} → ${describeEndpoint(options.to)}`);
    log(`  target schema: ${pending.length ? `${pending.length} of ${all.length} migrations to run` : "up to date and empty"}`);
    log(`  tables in foreign-key order, in one transaction: ${plan.map((p) => `${p.table} (${p.rows})`).join(", ")}`);
    log(`  then: reset id sequences, verify row counts and checksums per table, the immutability triggers, every snapshot hash; commit only if all agree`);

    const report: CopyReport = {
      dryRun,
      from: describeEndpoint(options.from),
      to: describeEndpoint(options.to),
      migrations: { pending: pending.length, total: all.length },
      tables: plan,
      sequences: [],
      triggers: [],
      snapshotsVerified: 0,
    };
    if (dryRun || !target) {
      report.snapshotsVerified = await verifySnapshots(source, data, size);
      log(`  source snapshots verified: ${report.snapshotsVerified}; dry run: nothing written`);
      return report;
    }

    await migrator(target).up();
    const targetColumns = new Map<string, Column[]>();
    for (const t of order) {
      const columns = await columnsOf(target, t);
      const names = (cs: Column[]) =>
        cs
          .map((c) => c.name)
          .sort()
          .join(",");
      if (names(columns) !== names(sourceColumns.get(t)!)) throw new CopyRefused(`table ${t} has different columns in the source and the target`);
      targetColumns.set(t, columns);
    }

    await target.transaction(async (transaction) => {
      // A PostgreSQL serialization retry runs this again from the start.
      report.sequences = [];
      const qi = target.getQueryInterface();
      for (const p of plan) {
        const columns = targetColumns.get(p.table)!;
        const hash = new TableHash(columns);
        let rows = 0;
        for await (const batch of batches(source, p.table, sourceColumns.get(p.table)!, size)) {
          const records = batch.map((r) => {
            hash.add(r);
            return Object.fromEntries(columns.map((c) => [c.name, forTarget(c.family, r[c.name])]));
          });
          await qi.bulkInsert(p.table, records, { transaction });
          rows += batch.length;
        }
        p.rows = rows;
        p.checksum = hash.digest();
        log(`  copied ${p.table}: ${rows}`);
      }

      if (target.getDialect() === "postgres") {
        for (const p of plan) {
          if (!targetColumns.get(p.table)!.some((c) => c.name === "id")) continue;
          const [seq] = await select<{ seq: string | null }>(target, `SELECT pg_get_serial_sequence('${q(p.table)}', 'id') AS seq`, transaction);
          if (!seq.seq) continue;
          await target.query(`SELECT setval('${seq.seq}', COALESCE((SELECT MAX(id) FROM ${q(p.table)}), 0) + 1, false)`, { transaction });
          report.sequences.push(p.table);
        }
      }

      // Verify before commit: anything that disagrees throws and the whole copy is rolled back.
      for (const p of plan) {
        const copied = await checksum(target, p.table, targetColumns.get(p.table)!, size, transaction);
        if (copied.rows !== p.rows) throw new CopyRefused(`table ${p.table}: ${p.rows} rows in the source, ${copied.rows} in the target`);
        if (copied.checksum !== p.checksum) throw new CopyRefused(`table ${p.table}: the checksum differs between source and target`);
      }
      const dialect = target.getDialect() === "postgres" ? "postgres" : "sqlite";
      const triggers = await triggersOf(target, transaction);
      const absent = IMMUTABLE_TRIGGERS[dialect].filter((t) => !triggers.includes(t));
      if (absent.length) throw new CopyRefused(`the target lacks the immutability triggers ${absent.join(", ")}`);
      const [snap] = await select<{ id: number }>(target, "SELECT id FROM case_snapshots ORDER BY id LIMIT 1", transaction);
      if (snap && !(await probeRefuses(target, transaction, `UPDATE case_snapshots SET hash = hash WHERE id = ${Number(snap.id)}`)))
        throw new CopyRefused("the target's case snapshot guard did not refuse an update");
      const [approved] = await select<{ id: number }>(target, "SELECT id FROM model_versions WHERE status = 'approved' ORDER BY id LIMIT 1", transaction);
      if (approved && !(await probeRefuses(target, transaction, `UPDATE model_versions SET citation = citation WHERE id = ${Number(approved.id)}`)))
        throw new CopyRefused("the target's model version guard did not refuse an update");
      report.triggers = IMMUTABLE_TRIGGERS[dialect];
      report.snapshotsVerified = await verifySnapshots(target, order, size, transaction);
    });
    log(`  verified: ${plan.length} tables (row counts and checksums), triggers ${report.triggers.join(", ")}, ${report.snapshotsVerified} snapshot hashes; committed`);
    return report;
  } finally {
    await source.close();
    await target?.close();
  }
}
