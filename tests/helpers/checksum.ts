import crypto from "node:crypto";
import { QueryTypes } from "sequelize";
import { db } from "@/lib/db";

/**
 * A SHA-256 over every row of every table, to prove that refused requests
 * wrote nothing. `rate_limits` is left out on purpose: a failed sign-in is
 * counted there by design.
 */
export async function databaseChecksum(options: { except?: string[] } = {}): Promise<string> {
  const skip = new Set(["rate_limits", ...(options.except ?? [])]);
  const tables = ((await db().getQueryInterface().showAllTables()) as string[]).filter((t) => !skip.has(t)).sort();
  const hash = crypto.createHash("sha256");
  for (const t of tables) {
    const rows = await db().query(`SELECT * FROM "${t}" ORDER BY 1`, { type: QueryTypes.SELECT });
    hash.update(t).update(JSON.stringify(rows));
  }
  return hash.digest("hex");
}
