/** Route matrix rows for the impact of a model version on the team's pinned cases. */
import { models } from "@/lib/db";
import { actorOf } from "../../helpers/actors";
import type { Expect, Handler, Row } from "./types";
import * as impact from "@/app/api/v1/versions/[id]/impact/route";

// Constant Cp of a solid with an anchor: numbers invented for the test.
const solidData = {
  segments: [{ phase: "cr", form: "constant" as const, tminK: 250, tmaxK: 900, coeffs: { cpJ: 120 } }],
  reference: { tK: 298.15, phase: "cr", hkJ: -1000, sJ: 80 },
};

let n = 0;
/** A proposed Larkspur version (v2 of a fresh model whose v1 is approved). */
async function larkspurVersion(): Promise<string> {
  const sam = await actorOf("steward");
  const s = await models().Species.findOne({ where: { teamId: sam.teamId, formula: "NiAl2O4" } });
  const model = await models().CpModel.create({
    speciesId: s!.id,
    teamId: sam.teamId,
    name: `Impact matrix model ${++n}`,
    family: "custom",
    variant: null,
    copiedFromId: null,
    createdById: sam.userId,
  });
  const common = {
    modelId: model.id,
    teamId: sam.teamId,
    data: solidData,
    citation: "Matrix test (invented)",
    uncertainty: null,
    changeNote: null,
    decisionReason: null,
    datasetId: null,
    authorId: sam.userId,
    decidedById: null,
  };
  await models().ModelVersion.create({ ...common, versionNumber: 1, status: "approved", proposedAt: null, decidedAt: new Date() });
  const v = await models().ModelVersion.create({ ...common, versionNumber: 2, status: "proposed", proposedAt: new Date(), decidedAt: null });
  return String(v.id);
}

const teamReads: Expect = { anonymous: 401, engineer: 200, steward: 200, reviewer: 200, admin: 200, other: 404 };
const drafting: Expect = { anonymous: 401, engineer: 202, steward: 202, reviewer: 403, admin: 202, other: 404 };

export const ROWS: Row[] = [
  {
    name: "version impact",
    file: "versions/[id]/impact",
    method: "GET",
    handler: impact.GET as Handler,
    prepare: async () => ({ params: { id: await larkspurVersion() } }),
    expect: teamReads,
  },
  {
    name: "version impact run",
    file: "versions/[id]/impact",
    method: "POST",
    handler: impact.POST as Handler,
    prepare: async () => ({ params: { id: await larkspurVersion() } }),
    expect: drafting,
  },
];
