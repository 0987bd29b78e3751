import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { DEVELOPMENT_SESSION_SECRET, env, type Env } from "@/lib/env";

/**
 * The iron-session password. Production uses SESSION_SECRET (productionConfigProblems refuses
 * a missing or example one before the server starts). Demo mode uses SESSION_SECRET when it is
 * set to something of its own; otherwise a random secret generated on first start and kept in
 * the data folder (`session-secret` beside the SQLite file, mode 600), the same one after every
 * restart. The example value from `.env.example` is never accepted.
 */
export function sessionSecretFile(e: Pick<Env, "DATABASE_PATH"> = env): string {
  return path.join(path.dirname(path.resolve(e.DATABASE_PATH)), "session-secret");
}

export function resolveSessionSecret(e: Pick<Env, "HEATPATH_MODE" | "SESSION_SECRET" | "DATABASE_PATH"> = env, file = sessionSecretFile(e)): string {
  const configured = e.SESSION_SECRET;
  if (configured && configured !== DEVELOPMENT_SESSION_SECRET) return configured;
  if (e.HEATPATH_MODE === "production") {
    throw new Error(configured ? "SESSION_SECRET is the example secret from .env.example; set a secret of your own." : "SESSION_SECRET is required in production mode.");
  }
  if (configured) console.warn("[heatpath] SESSION_SECRET is the example value from .env.example; it is ignored and the demo's own secret is used.");
  return readOrCreateSecret(file);
}

/** Read the secret file, or create it atomically (two servers starting at once agree on one secret). */
export function readOrCreateSecret(file: string): string {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  if (!fs.existsSync(file)) {
    // Written whole to a private temporary file, then linked into place: a reader never sees a half-written
    // file, and when two servers race, the link of the second fails and both read the first one's secret.
    const temp = `${file}.${process.pid}.${crypto.randomBytes(4).toString("hex")}.tmp`;
    fs.writeFileSync(temp, crypto.randomBytes(32).toString("base64url") + "\n", { flag: "wx", mode: 0o600 });
    try {
      fs.linkSync(temp, file);
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== "EEXIST") throw error;
    } finally {
      fs.rmSync(temp, { force: true });
    }
  }
  if ((fs.statSync(file).mode & 0o077) !== 0) fs.chmodSync(file, 0o600);
  const secret = fs.readFileSync(file, "utf8").trim();
  if (secret.length < 32 || secret === DEVELOPMENT_SESSION_SECRET) {
    throw new Error(`${file} does not hold a usable session secret (at least 32 characters, not the example); delete it to have a new one generated.`);
  }
  return secret;
}
