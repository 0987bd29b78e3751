/**
 * The snapshot hash: SHA-256 (hex) of the RFC 8785 canonical JSON of the content as it is
 * stored (after a JSON round trip, so undefined fields vanish exactly as in the database).
 * Server side (node:crypto); shared by the case service and the demo seeder.
 */
import crypto from "node:crypto";
import canonicalize from "canonicalize";

export function canonicalSha256(content: unknown): string {
  const text = canonicalize(JSON.parse(JSON.stringify(content)));
  if (text === undefined) throw new Error("content cannot be canonicalized");
  return crypto.createHash("sha256").update(text, "utf8").digest("hex");
}
