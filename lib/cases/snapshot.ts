/**
 * A case snapshot's frozen content and its hash, pure: SHA-256 (hex) of the RFC 8785 canonical
 * JSON of { inputs, pins, engineVersion, request, result } as stored. Server side (node:crypto,
 * through ./hash); shared by the case services and the demo seeder.
 */
import { ENGINE_VERSION, type EvaluateRequest, type EvaluateResult } from "@/lib/thermo";
import type { CaseInput } from "@/lib/validation/cases";
import type { PinnedVersion } from "@/models/case-snapshot";
import { canonicalSha256 } from "./hash";

/** The frozen content whose canonical JSON is hashed. */
export type SnapshotContent = { inputs: CaseInput; pins: PinnedVersion[]; engineVersion: string; request: EvaluateRequest; result: EvaluateResult };

/** The content to freeze, as it will be stored (a JSON round trip), with the engine version that computed the result. */
export function snapshotContent(parts: { inputs: CaseInput; pins: readonly PinnedVersion[]; request: EvaluateRequest; result: EvaluateResult }): SnapshotContent {
  const { inputs, pins, request, result } = parts;
  return JSON.parse(JSON.stringify({ inputs, pins, engineVersion: result.engine.version ?? ENGINE_VERSION, request, result }));
}

/** SHA-256 (hex) of the RFC 8785 canonical JSON of the snapshot content, as it is stored (a JSON round trip). */
export function snapshotHash(content: SnapshotContent): string {
  return canonicalSha256({ inputs: content.inputs, pins: content.pins, engineVersion: content.engineVersion, request: content.request, result: content.result });
}

/** Recompute a stored snapshot's hash; true when it still matches. */
export function verifySnapshot(s: SnapshotContent & { hash: string }): boolean {
  return snapshotHash({ inputs: s.inputs, pins: s.pins, engineVersion: s.engineVersion, request: s.request, result: s.result }) === s.hash;
}
