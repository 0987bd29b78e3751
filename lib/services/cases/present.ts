import "server-only";
import type { Actor } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import type { SnapshotContentDiff } from "@/lib/cases/diff";
import { pinDtos, type PinDto } from "@/lib/cases/pin";
import { caseReaction } from "@/lib/cases/request";
import { formatQuantity } from "@/lib/cases/temperature";
import type { EvaluateRequest, EvaluateResult } from "@/lib/thermo";
import type { CaseInput, CaseInputs, CaseStatus } from "@/lib/validation/cases";
import type { Case } from "@/models/case";
import type { CaseSnapshot, PinnedVersion } from "@/models/case-snapshot";
import type { Comment } from "@/models/comment";
import type { Review } from "@/models/review";
import type { NewerVersionDto } from "../pins";

/**
 * The case DTOs and their presenters: each picks fields from rows already loaded (and
 * authorised) by a query or command; none loads or re-authorises.
 */

export type { PinDto };

export type CaseSummaryDto = {
  id: number;
  title: string;
  status: CaseStatus;
  reaction: string;
  span: string;
  authorId: number;
  authorName: string;
  latestRevision: number | null;
  updatedAt: string;
};

export type SnapshotSummaryDto = {
  revision: number;
  hash: string;
  engineVersion: string;
  createdAt: string;
  createdByName: string;
  decision: { decision: "approved" | "returned"; reason: string | null; reviewerName: string; at: string } | null;
};

export type CommentDto = { id: number; body: string; authorName: string; authorId: number; revision: number | null; at: string };

export type CaseDto = CaseSummaryDto & {
  notes: string;
  inputs: CaseInputs;
  lockVersion: number;
  pins: PinDto[];
  snapshots: SnapshotSummaryDto[];
  newerVersions: NewerVersionDto[];
  comments: CommentDto[];
  can: { edit: boolean; submit: boolean; review: boolean; comment: boolean; rerun: boolean };
};

export type ResultsDto = {
  /** `snapshot`: the stored, frozen result; `live`: computed now from the pinned versions (drafts only). */
  source: "snapshot" | "live";
  caseId: number;
  title: string;
  status: CaseStatus;
  revision: number | null;
  hash: string | null;
  frozenAt: string | null;
  reaction: string;
  inputs: CaseInput;
  pins: PinDto[];
  request: EvaluateRequest;
  result: EvaluateResult;
};

export type SnapshotDto = SnapshotSummaryDto & { caseId: number; inputs: CaseInput; pins: PinDto[]; request: EvaluateRequest; result: EvaluateResult };

export type SnapshotDiffDto = SnapshotContentDiff & { from: SnapshotSummaryDto; to: SnapshotSummaryDto };

/** A draft or a returned case can be edited and submitted; a submitted or approved one is frozen. */
export const EDITABLE: readonly CaseStatus[] = ["draft", "returned"];

/** User names by id, for the presenters. */
export type Names = ReadonlyMap<number, string>;
const nameIn = (names: Names, id: number) => names.get(id) ?? "—";

function spanText(inputs: CaseInputs): string {
  const t = inputs.temperatures;
  if ("listK" in t) return t.listK.length <= 4 ? t.listK.map(formatQuantity).join(", ") : `${t.listK.length} temperatures`;
  return `${formatQuantity(t.fromK)} – ${formatQuantity(t.toK)}, step ${formatQuantity(t.stepK)}`;
}

/** The stored inputs with the case's title and notes: the whole case as a form or a snapshot holds it. */
export const caseInputOf = (row: Pick<Case, "title" | "notes" | "inputs">): CaseInput => ({ title: row.title, notes: row.notes ?? "", ...row.inputs });

export function presentSummary(row: Case, authorName: string, latestRevision: number | null): CaseSummaryDto {
  return {
    id: row.id,
    title: row.title,
    status: row.status,
    reaction: caseReaction(row.inputs),
    span: spanText(row.inputs),
    authorId: row.authorId,
    authorName,
    latestRevision,
    updatedAt: row.updatedAt.toISOString(),
  };
}

export function presentSnapshotSummary(
  s: Pick<CaseSnapshot, "id" | "revision" | "hash" | "engineVersion" | "createdAt" | "createdById">,
  review: Review | undefined,
  names: Names,
): SnapshotSummaryDto {
  return {
    revision: s.revision,
    hash: s.hash,
    engineVersion: s.engineVersion,
    createdAt: s.createdAt.toISOString(),
    createdByName: nameIn(names, s.createdById),
    decision: review ? { decision: review.decision, reason: review.reason, reviewerName: nameIn(names, review.reviewerId), at: review.createdAt.toISOString() } : null,
  };
}

export function presentComment(c: Comment, authorName: string, revision: number | null): CommentDto {
  return { id: c.id, body: c.body, authorId: c.authorId, authorName, revision, at: c.createdAt.toISOString() };
}

/** What the case page needs beside the row, loaded by the caller. */
export type CaseParts = {
  authorName: string;
  latestRevision: number | null;
  pins: PinnedVersion[];
  snapshots: SnapshotSummaryDto[];
  newerVersions: NewerVersionDto[];
  comments: CommentDto[];
};

/** The case as its page shows it; what the actor may do follows the permission table and the four-eyes rule. */
export function presentCase(me: Actor, row: Case, parts: CaseParts): CaseDto {
  const isAuthor = row.authorId === me.userId;
  const editable = EDITABLE.includes(row.status);
  return {
    ...presentSummary(row, parts.authorName, parts.latestRevision),
    notes: row.notes ?? "",
    inputs: row.inputs,
    lockVersion: row.lockVersion,
    pins: pinDtos(parts.pins),
    snapshots: parts.snapshots,
    newerVersions: parts.newerVersions,
    comments: parts.comments,
    can: {
      edit: isAuthor && can(me.role, "cases.create") && editable,
      submit: isAuthor && can(me.role, "cases.submit") && editable,
      review: !isAuthor && can(me.role, "cases.review") && row.status === "submitted",
      comment: can(me.role, "comments.create"),
      rerun: isAuthor && can(me.role, "cases.submit") && row.status !== "submitted" && parts.newerVersions.length > 0,
    },
  };
}

export function presentSnapshot(s: CaseSnapshot, summary: SnapshotSummaryDto): SnapshotDto {
  return { ...summary, caseId: s.caseId, inputs: s.inputs, pins: pinDtos(s.pins), request: s.request, result: s.result };
}

/** A stored snapshot's results; the status is the case's own now. */
export function presentSnapshotResults(row: Case, snap: Pick<CaseSnapshot, "revision" | "hash" | "createdAt" | "inputs" | "pins" | "request" | "result">): ResultsDto {
  return {
    source: "snapshot",
    caseId: row.id,
    title: snap.inputs.title,
    status: row.status,
    revision: snap.revision,
    hash: snap.hash,
    frozenAt: snap.createdAt.toISOString(),
    reaction: caseReaction(snap.inputs),
    inputs: snap.inputs,
    pins: pinDtos(snap.pins),
    request: snap.request,
    result: snap.result,
  };
}

/** Results computed now from the case's pinned versions. */
export function presentLiveResults(row: Case, pins: readonly PinnedVersion[], request: EvaluateRequest, result: EvaluateResult): ResultsDto {
  return {
    source: "live",
    caseId: row.id,
    title: row.title,
    status: row.status,
    revision: null,
    hash: null,
    frozenAt: null,
    reaction: caseReaction(row.inputs),
    inputs: caseInputOf(row),
    pins: pinDtos(pins),
    request,
    result,
  };
}
