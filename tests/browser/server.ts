import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import crypto from "node:crypto";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import sqlite3 from "sqlite3";

const root = path.resolve(import.meta.dirname, "../..");

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
    s.on("error", reject);
  });
}

export async function waitFor(url: string, ms = 60_000): Promise<void> {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`server did not answer ${url} within ${ms} ms`);
}

/**
 * The PostgreSQL server `npm run test:postgres` started, when it did: the browser
 * suite then serves every app from a new database there instead of a SQLite file.
 */
export const pgAdminUrl = (): string | undefined => process.env.HEATPATH_TEST_PG_ADMIN_URL || undefined;

export type PreparedDatabase = {
  dir: string;
  port: number;
  baseURL: string;
  env: NodeJS.ProcessEnv;
  dialect: "sqlite" | "postgres";
  /** The SQLite file (also set, unused, on PostgreSQL). */
  databasePath: string;
  /** The PostgreSQL database, when `dialect` is postgres. */
  databaseUrl?: string;
};

async function createPgDatabase(admin: string): Promise<string> {
  const name = `heatpath_browser_${process.pid}_${crypto.randomBytes(4).toString("hex")}`;
  const client = new pg.Client({ connectionString: admin });
  await client.connect();
  try {
    await client.query(`CREATE DATABASE "${name}"`);
  } finally {
    await client.end();
  }
  const url = new URL(admin);
  url.pathname = `/${name}`;
  return url.toString();
}

/**
 * A migrated, seeded database in a fresh folder, and the environment to serve it:
 * a SQLite file, or a new PostgreSQL database under `npm run test:postgres`
 * (`dialect: "sqlite"` insists on SQLite, for checks that are SQLite's own).
 */
export async function prepareDatabase(extraEnv: Record<string, string> = {}, options: { dialect?: "sqlite" } = {}): Promise<PreparedDatabase> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-server-"));
  const port = await freePort();
  const baseURL = `http://127.0.0.1:${port}`;
  const admin = options.dialect === "sqlite" ? undefined : pgAdminUrl();
  const databaseUrl = admin ? await createPgDatabase(admin) : undefined;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    HEATPATH_MODE: "demo",
    DATABASE_PATH: path.join(dir, "heatpath.sqlite"),
    APP_URL: baseURL,
    MAIL_CATCHER_PORT: String(await freePort()),
    ...extraEnv,
  };
  if (databaseUrl) env.DATABASE_URL = databaseUrl;
  else delete env.DATABASE_URL;
  for (const step of ["migrate", "seed"]) {
    const r = spawnSync(path.join(root, "node_modules/.bin/tsx"), ["scripts/db.ts", step], { cwd: root, env, stdio: "inherit" });
    if (r.status !== 0) throw new Error(`db ${step} failed`);
  }
  return { dir, port, baseURL, env, dialect: databaseUrl ? "postgres" : "sqlite", databasePath: env.DATABASE_PATH!, databaseUrl };
}

/** Read-only SQL against the prepared database, either dialect. COUNT(*) comes back as a number on both. */
export async function queryDatabase<T>(prepared: Pick<PreparedDatabase, "databasePath" | "databaseUrl">, sql: string): Promise<T[]> {
  if (prepared.databaseUrl) {
    const client = new pg.Client({ connectionString: prepared.databaseUrl });
    client.setTypeParser(20, (v: string) => Number(v));
    await client.connect();
    try {
      return (await client.query(sql)).rows as T[];
    } finally {
      await client.end();
    }
  }
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(prepared.databasePath, sqlite3.OPEN_READONLY, (err) => {
      if (err) return reject(err);
      db.all(sql, (e, rows) => db.close(() => (e ? reject(e) : resolve(rows as T[]))));
    });
  });
}

/** Remove the folder and, on PostgreSQL, drop the database (the servers must be stopped first). */
export async function removeDatabase(prepared: Pick<PreparedDatabase, "dir" | "databaseUrl"> | undefined): Promise<void> {
  if (!prepared) return;
  fs.rmSync(prepared.dir, { recursive: true, force: true });
  const admin = pgAdminUrl();
  if (prepared.databaseUrl && admin) {
    const client = new pg.Client({ connectionString: admin });
    await client.connect();
    try {
      await client.query(`DROP DATABASE IF EXISTS "${new URL(prepared.databaseUrl).pathname.slice(1)}" WITH (FORCE)`);
    } finally {
      await client.end();
    }
  }
}

/** `next start` on 127.0.0.1 as one process, so one PID stops it (the build must exist). */
export async function startServer(env: NodeJS.ProcessEnv, port: number): Promise<ChildProcess> {
  const child = spawn(process.execPath, [path.join(root, "node_modules/next/dist/bin/next"), "start", "-H", "127.0.0.1", "-p", String(port)], {
    cwd: root,
    env,
    stdio: ["ignore", "ignore", "inherit"],
  });
  await waitFor(`http://127.0.0.1:${port}/api/v1/health`);
  return child;
}

export async function stopServer(child: ChildProcess | undefined, signal: NodeJS.Signals = "SIGTERM"): Promise<void> {
  if (!child || child.exitCode !== null) return;
  const exited = new Promise((r) => child.once("exit", r));
  child.kill(signal);
  await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
  if (child.exitCode === null) child.kill("SIGKILL");
}
