import path from "node:path";
import { Op, Sequelize, Transaction } from "sequelize";
import { env } from "@/lib/env";
import { defineModels, type Models } from "@/models";

/** How long a connection waits for another writer before SQLITE_BUSY, in ms. */
const BUSY_TIMEOUT_MS = 15_000;

type Registry = { sequelize: Sequelize; models: Models };
const KEY = Symbol.for("heatpath.db");
type Holder = { [KEY]?: Registry };

interface SqliteHandle {
  configure(option: "busyTimeout", value: number): void;
  exec(sql: string, cb?: (err: Error | null) => void): void;
  __heatpathReady?: boolean;
}

/**
 * Sequelize's SQLite dialect opens one connection per transaction besides the
 * default one and has no afterConnect hook there, so each connection is set up
 * as it is handed out.
 */
function configureEveryConnection(sequelize: Sequelize) {
  const manager = sequelize.connectionManager as unknown as {
    getConnection(options?: unknown): Promise<SqliteHandle>;
  };
  const getConnection = manager.getConnection.bind(manager);
  manager.getConnection = async (options?: unknown) => {
    const connection = await getConnection(options);
    if (!connection.__heatpathReady) {
      connection.configure("busyTimeout", BUSY_TIMEOUT_MS);
      await new Promise<void>((resolve, reject) =>
        connection.exec("PRAGMA journal_mode=WAL; PRAGMA foreign_keys=ON; PRAGMA synchronous=NORMAL;", (err) => (err ? reject(err) : resolve())),
      );
      connection.__heatpathReady = true;
    }
    return connection;
  };
}

/**
 * node-sqlite3 runs statements on libuv's small thread pool. Writers that wait
 * on the database lock there can starve the one that holds it, so within a
 * process managed transactions run one at a time; the busy timeout still
 * covers other processes (scripts, a second app server). On PostgreSQL they
 * run one at a time per process too, so one app server behaves the same on
 * both, and are retried when they collide with another server's.
 */
function serializeTransactions(sequelize: Sequelize, retrySerializationFailures = false) {
  let tail: Promise<unknown> = Promise.resolve();
  const bound = sequelize.transaction.bind(sequelize) as (...args: unknown[]) => Promise<unknown>;
  const original = retrySerializationFailures ? withRetries(bound) : bound;
  const serialized = (...args: unknown[]) => {
    const managed = args.some((a) => typeof a === "function");
    if (!managed) return original(...args);
    const run = tail.then(() => original(...args));
    tail = run.catch(() => undefined);
    return run;
  };
  (sequelize as unknown as { transaction: typeof serialized }).transaction = serialized;
}

/** PostgreSQL's codes for "run the transaction again": serialization failure, deadlock. */
const RETRYABLE = new Set(["40001", "40P01"]);
const MAX_ATTEMPTS = 10;

function retryable(error: unknown): boolean {
  const e = error as { parent?: { code?: string }; original?: { code?: string }; code?: string };
  const code = e?.parent?.code ?? e?.original?.code ?? e?.code;
  return typeof code === "string" && RETRYABLE.has(code);
}

/**
 * Several app servers share one PostgreSQL: managed transactions run
 * SERIALIZABLE, and one that loses a race to another server is rolled back
 * whole and run again (a growing random pause between tries), so it sees the
 * winner's commit just as it would have on SQLite.
 */
function withRetries(transaction: (...args: unknown[]) => Promise<unknown>) {
  return async (...args: unknown[]) => {
    for (let attempt = 1; ; attempt += 1) {
      try {
        return await transaction(...args);
      } catch (error) {
        if (attempt >= MAX_ATTEMPTS || !retryable(error)) throw error;
        // Exponential back-off with full jitter (at most 10, 20, 40 … 250 ms): two servers
        // retrying in step would collide again.
        await new Promise((r) => setTimeout(r, Math.random() * Math.min(250, 5 * 2 ** attempt)));
      }
    }
  };
}

export function createSequelize(options: { storage?: string; url?: string } = {}): Sequelize {
  const logging = env.LOG_SQL === "1" ? (sql: string) => console.log(sql) : false;
  const url = options.url ?? (options.storage ? undefined : env.DATABASE_URL);
  if (url) {
    const sequelize = new Sequelize(url, {
      logging,
      define: { underscored: true },
      isolationLevel: Transaction.ISOLATION_LEVELS.SERIALIZABLE,
    });
    serializeTransactions(sequelize, true);
    return sequelize;
  }
  const storage = path.resolve(/*turbopackIgnore: true*/ options.storage ?? env.DATABASE_PATH);
  const sequelize = new Sequelize({
    dialect: "sqlite",
    storage,
    logging,
    // Writers queue on the database lock instead of failing half-way through.
    transactionType: Transaction.TYPES.IMMEDIATE,
    define: { underscored: true },
  });
  configureEveryConnection(sequelize);
  serializeTransactions(sequelize);
  return sequelize;
}

/**
 * The one Sequelize instance and its model classes. Next bundles modules per
 * route, so both live together on globalThis and every caller takes the models
 * from here rather than importing the classes.
 */
export function registry(): Registry {
  const holder = globalThis as Holder;
  if (!holder[KEY]) {
    const sequelize = createSequelize();
    holder[KEY] = { sequelize, models: defineModels(sequelize) };
  }
  return holder[KEY];
}

export const db = () => registry().sequelize;
export const models = () => registry().models;

/** Close and forget the registry (tests and scripts). */
export async function closeDb(): Promise<void> {
  const holder = globalThis as Holder;
  const current = holder[KEY];
  holder[KEY] = undefined;
  if (current) await current.sequelize.close();
}

export function isPostgres(): boolean {
  return db().getDialect() === "postgres";
}

/** A substring match that ignores case on both dialects, as SQLite's LIKE does: ILIKE on PostgreSQL. */
export function containsText(raw: string) {
  // A NUL byte is an SQL error in both dialects; the search schemas refuse it, and this drops any that slip past.
  const text = raw.replace(/\0/g, "");
  return isPostgres() ? { [Op.iLike]: `%${text}%` } : { [Op.like]: `%${text}%` };
}
