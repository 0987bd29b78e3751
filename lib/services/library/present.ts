/**
 * The library's DTOs and the presenters that pick their fields from rows already loaded and
 * authorised by the caller. Pure: no database access, no permission checks.
 */
import { phasePointsOf } from "@/lib/cases/equilibrium";
import type { SpeciesInput } from "@/lib/thermo";
import { describeData } from "@/lib/thermo/curve";
import type { CpModel, ModelVersion, Species } from "@/models";
import type { VersionStatus, VersionUncertainty } from "@/models/model-version";
import type { ContributorRole } from "@/models/model-version-contributor";

type Scope = "reference" | "team";
export type SpeciesDto = {
  id: number;
  formula: string;
  displayName: string;
  elements: Record<string, number>;
  molarMassGPerMol: number;
  scope: Scope;
  /** Normal boiling point and triple point (K) with their source, where the library has them. */
  phasePoints: { boilingPointK: number | null; triplePointK: number | null; citation: string | null } | null;
};
export type ModelSummaryDto = { id: number; name: string; family: string; variant: string | null; scope: Scope; copiedFromId: number | null };
type VersionSummaryDto = {
  id: number;
  versionNumber: number;
  status: VersionStatus;
  phases: string[];
  forms: string[];
  rangeK: [number, number] | null;
  authorName: string | null;
  changeNote: string | null;
  updatedAt: string;
};
/** Someone who changed or proposed a version, with each part they took (docs/library.md, four-eyes). */
type ContributorDto = { userId: number; name: string; roles: ContributorRole[] };
export type VersionDto = VersionSummaryDto & {
  modelId: number;
  scope: Scope;
  data: SpeciesInput;
  citation: string;
  uncertainty: VersionUncertainty | null;
  decisionReason: string | null;
  datasetId: number | null;
  authorId: number | null;
  decidedById: number | null;
  decidedByName: string | null;
  proposedAt: string | null;
  decidedAt: string | null;
  lockVersion: number;
  createdAt: string;
  /** Author, editors, proposer and contributors of an unapproved version it was started from: none may decide on it. */
  contributors: ContributorDto[];
  model: ModelSummaryDto;
  species: SpeciesDto;
};
export type ModelRowDto = ModelSummaryDto & {
  species: SpeciesDto;
  /** The version this row shows: the approved one by default, else the one matching the status filter. */
  shown: VersionSummaryDto | null;
  approvedVersionId: number | null;
  versionCount: number;
  openCount: number;
};
export type Page<T> = { items: T[]; page: number; pageSize: number; total: number; pages: number };
export type ModelDetailDto = ModelSummaryDto & { species: SpeciesDto; versions: VersionSummaryDto[] };
export type SpeciesDetailDto = SpeciesDto & { models: ModelDetailDto[] };
export type VersionAuditDto = { id: number; action: string; actorName: string | null; at: string; before: unknown; after: unknown };
export type ImportResult = { models: { id: number; name: string; created: boolean; versionIds: number[] }[]; versions: number };

/** A person's parts in a version, in the order of CONTRIBUTOR_ROLES. */
export type Contributor = { userId: number; roles: ContributorRole[] };

const scopeOf = (teamId: number | null): Scope => (teamId === null ? "reference" : "team");

export function speciesDto(s: Species): SpeciesDto {
  return {
    id: s.id,
    formula: s.formula,
    displayName: s.displayName,
    elements: s.elements,
    molarMassGPerMol: s.molarMassGPerMol,
    scope: scopeOf(s.teamId),
    phasePoints: phasePointsOf(s) ?? null,
  };
}

export function modelSummary(m: CpModel): ModelSummaryDto {
  return { id: m.id, name: m.name, family: m.family, variant: m.variant ?? null, scope: scopeOf(m.teamId), copiedFromId: m.copiedFromId };
}

/** `names`: user id → name, for the author. */
export function versionSummary(v: ModelVersion, names: Map<number, string>): VersionSummaryDto {
  const d = describeData(v.data);
  return {
    id: v.id,
    versionNumber: v.versionNumber,
    status: v.status,
    phases: d.phases,
    forms: d.forms,
    rangeK: d.rangeK,
    authorName: v.authorId != null ? (names.get(v.authorId) ?? null) : null,
    changeNote: v.changeNote,
    updatedAt: v.updatedAt.toISOString(),
  };
}

/** `names`: user id → name, for the author, the decider and every contributor. */
export function versionDto(v: ModelVersion, model: CpModel, species: Species, contributors: readonly Contributor[], names: Map<number, string>): VersionDto {
  return {
    ...versionSummary(v, names),
    modelId: v.modelId,
    scope: scopeOf(v.teamId),
    data: v.data,
    citation: v.citation,
    uncertainty: v.uncertainty,
    decisionReason: v.decisionReason,
    datasetId: v.datasetId,
    authorId: v.authorId,
    decidedById: v.decidedById,
    decidedByName: v.decidedById != null ? (names.get(v.decidedById) ?? null) : null,
    proposedAt: v.proposedAt?.toISOString() ?? null,
    decidedAt: v.decidedAt?.toISOString() ?? null,
    lockVersion: v.lockVersion,
    createdAt: v.createdAt.toISOString(),
    contributors: contributors.map((c) => ({ userId: c.userId, name: names.get(c.userId) ?? "—", roles: c.roles })),
    model: modelSummary(model),
    species: speciesDto(species),
  };
}
