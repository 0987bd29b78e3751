/** Route matrix rows for cases, snapshots, comments, reviews and pins. */
import { createCase, submitCase } from "@/lib/services/cases";
import { decideCase } from "@/lib/services/reviews";
import { caseInputSchema, decisionSchema } from "@/lib/validation/cases";
import { actorOf } from "../../helpers/actors";
import { shiftCase } from "../../helpers/cases";
import { ensureReferenceLibrary, type RefFormula } from "../../helpers/reference-library";
import type { Expect, Handler, Row } from "./types";
import { allowAll } from "./types";

import * as cases from "@/app/api/v1/cases/route";
import * as one from "@/app/api/v1/cases/[id]/route";
import * as results from "@/app/api/v1/cases/[id]/results/route";
import * as submit from "@/app/api/v1/cases/[id]/submit/route";
import * as rerun from "@/app/api/v1/cases/[id]/rerun/route";
import * as snapshots from "@/app/api/v1/cases/[id]/snapshots/route";
import * as snapshot from "@/app/api/v1/cases/[id]/snapshots/[revision]/route";
import * as diff from "@/app/api/v1/cases/[id]/diff/route";
import * as exportCsv from "@/app/api/v1/cases/[id]/export/route";
import * as comments from "@/app/api/v1/cases/[id]/comments/route";
import * as reviews from "@/app/api/v1/cases/[id]/reviews/route";
import * as queue from "@/app/api/v1/reviews/route";
import * as pinsRoute from "@/app/api/v1/pins/route";

let library: Promise<Record<RefFormula, number>> | undefined;
const pins = () => (library ??= ensureReferenceLibrary());

/** A fresh draft by Erin (engineer, Larkspur). */
async function draft(): Promise<string> {
  const c = await createCase(await actorOf("engineer"), caseInputSchema.parse(shiftCase(await pins())));
  return String(c.id);
}
/** A fresh case by Erin awaiting review. */
async function awaiting(): Promise<string> {
  const erin = await actorOf("engineer");
  const c = await createCase(erin, caseInputSchema.parse(shiftCase(await pins())));
  await submitCase(erin, c.id, 0);
  return String(c.id);
}
/** A fresh case by `who` awaiting review. */
async function awaitingBy(who: "admin" | "steward"): Promise<string> {
  const author = await actorOf(who);
  const c = await createCase(author, caseInputSchema.parse(shiftCase(await pins())));
  await submitCase(author, c.id, 0);
  return String(c.id);
}
/** A case with two revisions: submitted, returned, resubmitted. */
async function twoRevisions(): Promise<string> {
  const erin = await actorOf("engineer");
  const id = Number(await awaiting());
  const returned = await decideCase(await actorOf("reviewer"), id, decisionSchema.parse({ decision: "returned", reason: "Check the span." }));
  await submitCase(erin, id, returned.lockVersion);
  return String(id);
}

/** Larkspur members read; the other team's admin gets 404. */
const teamReads = (status = 200): Expect => ({ ...allowAll(status), other: 404 });
/** Only the author (Erin) may do it: a role without the permission 403, another member not the author 403. */
const authorOnly = (status: number): Expect => ({ anonymous: 401, engineer: status, steward: 403, reviewer: 403, admin: 403, other: 404 });

export const ROWS: Row[] = [
  { name: "case list", file: "cases", method: "GET", handler: cases.GET as Handler, expect: allowAll(200) },
  {
    name: "case create",
    file: "cases",
    method: "POST",
    handler: cases.POST as Handler,
    prepare: async () => ({ body: shiftCase(await pins()) }),
    // The other team's admin may pin global reference versions too.
    expect: { anonymous: 401, engineer: 201, steward: 201, reviewer: 403, admin: 201, other: 201 },
  },
  { name: "case read", file: "cases/[id]", method: "GET", handler: one.GET as Handler, prepare: async () => ({ params: { id: await draft() } }), expect: teamReads() },
  {
    name: "case edit",
    file: "cases/[id]",
    method: "PATCH",
    handler: one.PATCH as Handler,
    prepare: async () => ({ params: { id: await draft() }, body: { ...shiftCase(await pins(), { title: "Edited" }), lockVersion: 0 } }),
    expect: authorOnly(200),
  },
  {
    name: "case results",
    file: "cases/[id]/results",
    method: "GET",
    handler: results.GET as Handler,
    prepare: async () => ({ params: { id: await draft() } }),
    expect: teamReads(),
  },
  {
    name: "case results (columns)",
    file: "cases/[id]/results",
    method: "GET",
    query: "format=columns",
    handler: results.GET as Handler,
    prepare: async () => ({ params: { id: await draft() } }),
    expect: teamReads(),
  },
  {
    name: "case results (the case page's sample and first page)",
    file: "cases/[id]/results",
    method: "GET",
    query: "format=columns&points=1200&offset=0&limit=50",
    handler: results.GET as Handler,
    prepare: async () => ({ params: { id: await draft() } }),
    expect: teamReads(),
  },
  {
    name: "case submit",
    file: "cases/[id]/submit",
    method: "POST",
    handler: submit.POST as Handler,
    prepare: async () => ({ params: { id: await draft() }, body: { lockVersion: 0 } }),
    expect: authorOnly(200),
  },
  {
    name: "case re-run (nothing newer)",
    file: "cases/[id]/rerun",
    method: "POST",
    handler: rerun.POST as Handler,
    prepare: async () => ({ params: { id: await draft() }, body: { lockVersion: 0 } }),
    expect: authorOnly(409),
  },
  {
    name: "snapshots",
    file: "cases/[id]/snapshots",
    method: "GET",
    handler: snapshots.GET as Handler,
    prepare: async () => ({ params: { id: await awaiting() } }),
    expect: teamReads(),
  },
  {
    name: "snapshot",
    file: "cases/[id]/snapshots/[revision]",
    method: "GET",
    handler: snapshot.GET as Handler,
    prepare: async () => ({ params: { id: await awaiting(), revision: "1" } }),
    expect: teamReads(),
  },
  {
    name: "snapshot diff",
    file: "cases/[id]/diff",
    method: "GET",
    handler: diff.GET as Handler,
    prepare: async () => ({ params: { id: await twoRevisions() } }),
    expect: teamReads(),
  },
  {
    name: "CSV export",
    file: "cases/[id]/export",
    method: "GET",
    handler: exportCsv.GET as Handler,
    prepare: async () => ({ params: { id: await awaiting() } }),
    expect: teamReads(),
  },
  { name: "comments", file: "cases/[id]/comments", method: "GET", handler: comments.GET as Handler, prepare: async () => ({ params: { id: await draft() } }), expect: teamReads() },
  {
    name: "comment",
    file: "cases/[id]/comments",
    method: "POST",
    handler: comments.POST as Handler,
    prepare: async () => ({ params: { id: await awaiting() }, body: { body: "Which pressure is the converter at?", revision: 1 } }),
    expect: teamReads(201),
  },
  {
    name: "reviews of a case",
    file: "cases/[id]/reviews",
    method: "GET",
    handler: reviews.GET as Handler,
    prepare: async () => ({ params: { id: await awaiting() } }),
    expect: teamReads(),
  },
  {
    name: "decide",
    file: "cases/[id]/reviews",
    method: "POST",
    handler: reviews.POST as Handler,
    prepare: async () => ({ params: { id: await awaiting() }, body: { decision: "approved", reason: "" } }),
    expect: { anonymous: 401, engineer: 403, steward: 403, reviewer: 201, admin: 201, other: 404 },
    // Four-eyes: an admin may decide cases, but not one they wrote.
    author: { who: "admin", prepare: async () => ({ params: { id: await awaitingBy("admin") }, body: { decision: "approved", reason: "" } }), expect: 403 },
  },
  {
    name: "review queue",
    file: "reviews",
    method: "GET",
    handler: queue.GET as Handler,
    expect: { anonymous: 401, engineer: 403, steward: 403, reviewer: 200, admin: 200, other: 200 },
  },
  { name: "pinnable versions", file: "pins", method: "GET", handler: pinsRoute.GET as Handler, expect: allowAll(200) },
];
