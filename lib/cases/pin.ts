/**
 * A pinned model version, pure: built from the version, its model and its species as loaded,
 * and the form the API shows (without the version's data). Client-safe.
 */
import type { PinnedVersion } from "@/models/case-snapshot";
import { termKey } from "./balance";
import { phasePointsOf } from "./equilibrium";

/** A pin as the API shows it: everything but the version's data. */
export type PinDto = Omit<PinnedVersion, "data">;

export const pinDtos = (pins: readonly PinnedVersion[]): PinDto[] => pins.map(({ data: _data, ...rest }) => rest);

type VersionFields = { id: number; versionNumber: number; status: string; citation: string; data: unknown; uncertainty?: PinnedVersion["uncertainty"] };
type ModelFields = { id: number; name: string; family: string };
type SpeciesFields = Parameters<typeof phasePointsOf>[0] & { displayName: string; critical?: { tcK: number; pcBar: number; omega: number } | null };

/** The pin of a term on a version: the fields a snapshot freezes, the species' critical constants where it has them. */
export function pinnedVersionOf(term: { formula: string; phase: string | null }, v: VersionFields, m: ModelFields, s: SpeciesFields): PinnedVersion {
  return {
    key: termKey(term),
    formula: term.formula,
    phase: term.phase,
    versionId: v.id,
    modelId: m.id,
    speciesName: s.displayName,
    modelName: m.name,
    family: m.family,
    versionNumber: v.versionNumber,
    status: v.status,
    citation: v.citation,
    data: v.data,
    uncertainty: v.uncertainty ?? null,
    phasePoints: phasePointsOf(s),
    ...(s.critical ? { critical: { tcK: s.critical.tcK, pcBar: s.critical.pcBar, omega: s.critical.omega } } : {}),
  };
}
