/**
 * Server-action matrix rows for the version page's decisions, with the four-eyes rows:
 * an editor, a proposer and a copier of a version each try to approve or reject it.
 */
import { approveVersionAction, rejectVersionAction } from "@/app/(app)/library/versions/[id]/actions";
import { models } from "@/lib/db";
import { copyReferenceVersion, editVersion, proposeVersion } from "@/lib/services/library";
import { actorOf } from "../helpers/actors";
import type { ActionExpect, ActionRow } from "./types";

// Constant Cp of a solid with an anchor: synthetic, invented for this test.
const solidData = {
  segments: [{ phase: "cr", form: "constant" as const, tminK: 250, tmaxK: 900, coeffs: { cpJ: 120 } }],
  reference: { tK: 298.15, phase: "cr", hkJ: -1000, sJ: 80 },
};

let n = 0;
/** A Larkspur draft written by Erin (engineer) through the service, so contributors are recorded. */
async function erinsDraft(): Promise<number> {
  const erin = await actorOf("engineer");
  const s = await models().Species.findOne({ where: { teamId: erin.teamId, formula: "NiAl2O4" } });
  const model = await models().CpModel.create({
    speciesId: s!.id,
    teamId: erin.teamId,
    name: `Action model ${++n}`,
    family: "custom",
    variant: null,
    copiedFromId: null,
    createdById: erin.userId,
  });
  const v = await models().ModelVersion.create({
    modelId: model.id,
    teamId: erin.teamId,
    versionNumber: 1,
    status: "draft",
    data: solidData,
    citation: "Action matrix (invented)",
    uncertainty: null,
    changeNote: null,
    decisionReason: null,
    datasetId: null,
    authorId: erin.userId,
    decidedById: null,
    proposedAt: null,
    decidedAt: null,
  });
  return v.id;
}
/** Proposed by Erin, decided by whoever has the role. */
async function proposedByErin(): Promise<string> {
  const id = await erinsDraft();
  await proposeVersion(await actorOf("engineer"), id);
  return String(id);
}
async function editedBySam(): Promise<string> {
  const id = await erinsDraft();
  await editVersion(await actorOf("steward"), id, { lockVersion: 0, data: { ...solidData, segments: [{ ...solidData.segments[0], coeffs: { cpJ: 999 } }] } });
  await proposeVersion(await actorOf("engineer"), id);
  return String(id);
}
async function proposedBySam(): Promise<string> {
  const id = await erinsDraft();
  await proposeVersion(await actorOf("steward"), id);
  return String(id);
}
async function copiedByAlexProposedBySam(): Promise<string> {
  const ref = await models().ModelVersion.findOne({ where: { teamId: null, status: "approved" }, order: [["id", "ASC"]] });
  const copy = await copyReferenceVersion(await actorOf("admin"), ref!.id);
  await proposeVersion(await actorOf("steward"), copy.id);
  return String(copy.id);
}

const stewardsOnLarkspur: ActionExpect = { anonymous: 401, engineer: 403, steward: "ok", reviewer: 403, admin: "ok", other: 404 };
/** Whoever the caller, a contributor's refusal is what this row checks; non-contributors are not called. */
const contributorRefused = (who: "steward" | "admin"): ActionExpect => ({
  anonymous: 401,
  engineer: 403,
  steward: who === "steward" ? 403 : "ok",
  reviewer: 403,
  admin: who === "admin" ? 403 : "ok",
  other: 404,
});

const reason = "Range too short for the reformer.";
const decisions = (name: string, action: ActionRow["action"], extra: Record<string, string>): ActionRow[] => [
  { id: `app/(app)/library/versions/[id]/actions.ts#${name}`, action, prepare: async () => ({ versionId: await proposedByErin(), ...extra }), expect: stewardsOnLarkspur },
  // Four-eyes: Sam changed the content (Erin proposed): Sam is refused, Alex (admin) may decide.
  {
    id: `app/(app)/library/versions/[id]/actions.ts#${name} (editor tries)`,
    action,
    prepare: async () => ({ versionId: await editedBySam(), ...extra }),
    expect: contributorRefused("steward"),
  },
  {
    id: `app/(app)/library/versions/[id]/actions.ts#${name} (proposer tries)`,
    action,
    prepare: async () => ({ versionId: await proposedBySam(), ...extra }),
    expect: contributorRefused("steward"),
  },
  // Copy then propose: Alex copied, Sam proposed; both are refused.
  {
    id: `app/(app)/library/versions/[id]/actions.ts#${name} (copier and proposer try)`,
    action,
    prepare: async () => ({ versionId: await copiedByAlexProposedBySam(), ...extra }),
    expect: { anonymous: 401, engineer: 403, steward: 403, reviewer: 403, admin: 403, other: 404 },
  },
];

export const ACTIONS: ActionRow[] = [
  ...decisions("approveVersionAction", approveVersionAction as ActionRow["action"], {}),
  ...decisions("rejectVersionAction", rejectVersionAction as ActionRow["action"], { reason }),
];
