import fs from "node:fs";
import path from "node:path";
import sqlite3 from "sqlite3";

type Backup = { step(pages: number, cb: (err: Error | null) => void): void; finish(cb?: (err: Error | null) => void): void; completed: boolean; failed: boolean };

function open(file: string, mode: number): Promise<sqlite3.Database> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(file, mode, (err) => (err ? reject(err) : resolve(db)));
  });
}

const close = (db: sqlite3.Database) => new Promise<void>((resolve, reject) => db.close((err) => (err ? reject(err) : resolve())));

/** Copy every page with SQLite's online backup API, retrying while writers hold the lock. */
function copyAll(backup: Backup): Promise<void> {
  return new Promise((resolve, reject) => {
    const step = () =>
      backup.step(256, (err) => {
        if (err) return reject(err);
        if (backup.completed) return backup.finish((e) => (e ? reject(e) : resolve()));
        if (backup.failed) return reject(new Error("backup failed"));
        setImmediate(step);
      });
    step();
  });
}

async function integrity(file: string): Promise<string> {
  const db = await open(file, sqlite3.OPEN_READONLY);
  try {
    return await new Promise((resolve, reject) => db.get("PRAGMA integrity_check", (err, row: { integrity_check: string }) => (err ? reject(err) : resolve(row.integrity_check))));
  } finally {
    await close(db);
  }
}

/**
 * A consistent copy of the live database while the app keeps running
 * (SQLite online backup: readers and writers carry on; the copy is one point in time).
 */
export async function backupDatabase(source: string, destination: string): Promise<{ file: string; bytes: number }> {
  fs.mkdirSync(path.dirname(destination), { recursive: true });
  if (fs.existsSync(destination)) throw new Error(`refusing to overwrite ${destination}`);
  const db = await open(source, sqlite3.OPEN_READONLY);
  try {
    const backup = (db as unknown as { backup(file: string, d: string, s: string, isDest: boolean): Backup }).backup(destination, "main", "main", true);
    await copyAll(backup);
  } finally {
    await close(db);
  }
  const check = await integrity(destination);
  if (check !== "ok") throw new Error(`backup ${destination} failed its integrity check: ${check}`);
  return { file: destination, bytes: fs.statSync(destination).size };
}

/**
 * Replace the database's contents with a backup file, page by page through the
 * same API, after checking that the file is a sound Heatpath database.
 * Stop the app servers first: sessions stay valid, but open requests would see the switch.
 */
export async function restoreDatabase(backupFile: string, target: string): Promise<void> {
  if (!fs.existsSync(backupFile)) throw new Error(`no such backup file: ${backupFile}`);
  const check = await integrity(backupFile).catch((e: Error) => e.message);
  if (check !== "ok") throw new Error(`${backupFile} is not a sound SQLite database: ${check}`);
  const probe = await open(backupFile, sqlite3.OPEN_READONLY);
  const hasMeta = await new Promise<boolean>((resolve) =>
    probe.get("SELECT name FROM sqlite_master WHERE type = 'table' AND name = 'SequelizeMeta'", (err, row) => resolve(!err && !!row)),
  );
  await close(probe);
  if (!hasMeta) throw new Error(`${backupFile} is not a Heatpath database (no SequelizeMeta table)`);
  fs.mkdirSync(path.dirname(target), { recursive: true });
  const db = await open(target, sqlite3.OPEN_READWRITE | sqlite3.OPEN_CREATE);
  try {
    const backup = (db as unknown as { backup(file: string, d: string, s: string, isDest: boolean): Backup }).backup(backupFile, "main", "main", false);
    await copyAll(backup);
  } finally {
    await close(db);
  }
}
