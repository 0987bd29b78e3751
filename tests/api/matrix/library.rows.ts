/** Route matrix rows for the Cp library: species, models, versions, datasets, preview, import/export. */
import { models } from "@/lib/db";
import { copyReferenceVersion, editVersion, proposeVersion } from "@/lib/services/library";
import type { VersionStatus } from "@/models/model-version";
import { actorOf } from "../../helpers/actors";
import type { Expect, Handler, Row } from "./types";
import { allowAll } from "./types";

import * as species from "@/app/api/v1/species/route";
import * as speciesOne from "@/app/api/v1/species/[id]/route";
import * as cpModels from "@/app/api/v1/models/route";
import * as cpModel from "@/app/api/v1/models/[id]/route";
import * as modelVersions from "@/app/api/v1/models/[id]/versions/route";
import * as version from "@/app/api/v1/versions/[id]/route";
import * as propose from "@/app/api/v1/versions/[id]/propose/route";
import * as withdraw from "@/app/api/v1/versions/[id]/withdraw/route";
import * as approve from "@/app/api/v1/versions/[id]/approve/route";
import * as reject from "@/app/api/v1/versions/[id]/reject/route";
import * as copy from "@/app/api/v1/versions/[id]/copy/route";
import * as curve from "@/app/api/v1/versions/[id]/curve/route";
import * as audit from "@/app/api/v1/versions/[id]/audit/route";
import * as preview from "@/app/api/v1/preview/route";
import * as datasets from "@/app/api/v1/datasets/route";
import * as dataset from "@/app/api/v1/datasets/[id]/route";
import * as fit from "@/app/api/v1/datasets/[id]/fit/route";
import * as fitSave from "@/app/api/v1/datasets/[id]/versions/route";
import * as exportRoute from "@/app/api/v1/library/export/route";
import * as importRoute from "@/app/api/v1/library/import/route";

/** Larkspur read: everyone in the team; another team's record is 404. */
const teamRead = (status = 200): Expect => ({ ...allowAll(status), other: 404 });
/** Drafting roles (engineer, steward, admin); `other` acts in its own team unless a Larkspur record is named. */
const drafting = (status: number, other = status): Expect => ({ anonymous: 401, engineer: status, steward: status, reviewer: 403, admin: status, other });
/** Steward work (models.edit / models.fit / models.decide). */
const stewards = (status: number, other = 404): Expect => ({ anonymous: 401, engineer: 403, steward: status, reviewer: 403, admin: status, other });

// Constant Cp of a solid with an anchor: numbers invented for the test.
const solidData = {
  segments: [{ phase: "cr", form: "constant" as const, tminK: 250, tmaxK: 900, coeffs: { cpJ: 120 } }],
  reference: { tK: 298.15, phase: "cr", hkJ: -1000, sJ: 80 },
};

let n = 0;
async function larkspurModel() {
  const sam = await actorOf("steward");
  const s = await models().Species.findOne({ where: { teamId: sam.teamId, formula: "NiAl2O4" } });
  return models().CpModel.create({
    speciesId: s!.id,
    teamId: sam.teamId,
    name: `Matrix model ${++n}`,
    family: "custom",
    variant: null,
    copiedFromId: null,
    createdById: sam.userId,
  });
}
async function larkspurVersion(status: VersionStatus, author: "steward" | "engineer" = "steward"): Promise<string> {
  const who = await actorOf(author);
  const model = await larkspurModel();
  const v = await models().ModelVersion.create({
    modelId: model.id,
    teamId: who.teamId,
    versionNumber: 1,
    status,
    data: solidData,
    citation: "Matrix test (invented)",
    uncertainty: null,
    changeNote: null,
    decisionReason: null,
    datasetId: null,
    authorId: who.userId,
    decidedById: null,
    proposedAt: status === "proposed" ? new Date() : null,
    decidedAt: null,
  });
  return String(v.id);
}
async function referenceVersion(): Promise<string> {
  const v = await models().ModelVersion.findOne({ where: { teamId: null, status: "approved" }, order: [["id", "ASC"]] });
  return String(v!.id);
}
async function larkspurDataset(): Promise<string> {
  const team = (await actorOf("steward")).teamId;
  const d = await models().Dataset.findOne({ where: { teamId: team } });
  return String(d!.id);
}
async function larkspurSpecies(): Promise<string> {
  const team = (await actorOf("steward")).teamId;
  return String((await models().Species.findOne({ where: { teamId: team } }))!.id);
}

/** Erin's draft, edited by Sam (steward) and proposed by Erin: Sam changed the content. */
async function editedBySam(): Promise<string> {
  const id = await larkspurVersion("draft", "engineer");
  await editVersion(await actorOf("steward"), Number(id), { lockVersion: 0, data: { ...solidData, segments: [{ ...solidData.segments[0], coeffs: { cpJ: 999 } }] } });
  await proposeVersion(await actorOf("engineer"), Number(id));
  return id;
}
/** Erin's draft, proposed (unchanged) by Sam. */
async function proposedBySam(): Promise<string> {
  const id = await larkspurVersion("draft", "engineer");
  await proposeVersion(await actorOf("steward"), Number(id));
  return id;
}
/** A reference version copied by Alex (admin) and proposed by Sam: copy then propose. */
async function copiedByAlex(): Promise<string> {
  const copy = await copyReferenceVersion(await actorOf("admin"), Number(await referenceVersion()));
  await proposeVersion(await actorOf("steward"), copy.id);
  return String(copy.id);
}
const contributorRows = (body?: unknown): NonNullable<Row["contributors"]> => [
  { as: "editor who changed the content", who: "steward", prepare: async () => ({ params: { id: await editedBySam() }, body }), expect: 403 },
  { as: "proposer", who: "steward", prepare: async () => ({ params: { id: await proposedBySam() }, body }), expect: 403 },
  { as: "copier (copy then propose)", who: "admin", prepare: async () => ({ params: { id: await copiedByAlex() }, body }), expect: 403 },
  { as: "proposer of a copy", who: "steward", prepare: async () => ({ params: { id: await copiedByAlex() }, body }), expect: 403 },
];

const csv = "T (K),Cp (J/mol/K)\n300,100\n400,110\n500,118\n600,124\n";
const mkFit = { form: "maier-kelley", phase: "cr", reference: { tK: 298.15, hkJ: -1000, sJ: 80 } };

export const ROWS: Row[] = [
  { name: "species list", file: "species", method: "GET", handler: species.GET as Handler, expect: allowAll(200) },
  {
    name: "species create",
    file: "species",
    method: "POST",
    handler: species.POST as Handler,
    prepare: async () => ({ body: { formula: `C${++n}H${2 * n + 2}`, displayName: `Alkane ${n}` } }),
    expect: drafting(201),
  },
  {
    name: "species page",
    file: "species/[id]",
    method: "GET",
    handler: speciesOne.GET as Handler,
    prepare: async () => ({ params: { id: await larkspurSpecies() } }),
    expect: teamRead(),
  },
  { name: "models list", file: "models", method: "GET", handler: cpModels.GET as Handler, expect: allowAll(200) },
  {
    name: "model create",
    file: "models",
    method: "POST",
    handler: cpModels.POST as Handler,
    prepare: async () => ({
      body: { species: { formula: "Al2O3", displayName: "Alumina" }, name: `Alumina ${++n}`, version: { data: solidData, citation: "Matrix test (invented)" } },
    }),
    expect: drafting(201),
  },
  {
    name: "model page",
    file: "models/[id]",
    method: "GET",
    handler: cpModel.GET as Handler,
    prepare: async () => ({ params: { id: String((await larkspurModel()).id) } }),
    expect: teamRead(),
  },
  {
    name: "new draft from a version",
    file: "models/[id]/versions",
    method: "POST",
    handler: modelVersions.POST as Handler,
    prepare: async () => {
      const id = await larkspurVersion("approved");
      const v = await models().ModelVersion.findByPk(Number(id));
      return { params: { id: String(v!.modelId) }, body: { fromVersionId: v!.id } };
    },
    expect: drafting(201, 404),
  },
  {
    name: "version page",
    file: "versions/[id]",
    method: "GET",
    handler: version.GET as Handler,
    prepare: async () => ({ params: { id: await larkspurVersion("draft") } }),
    expect: teamRead(),
  },
  {
    name: "edit draft",
    file: "versions/[id]",
    method: "PATCH",
    handler: version.PATCH as Handler,
    prepare: async () => ({ params: { id: await larkspurVersion("draft") }, body: { lockVersion: 0, changeNote: "edited" } }),
    // Sam wrote it; Erin may edit only her own drafts.
    expect: stewards(200),
  },
  {
    name: "propose",
    file: "versions/[id]/propose",
    method: "POST",
    handler: propose.POST as Handler,
    prepare: async () => ({ params: { id: await larkspurVersion("draft") } }),
    expect: stewards(200),
  },
  // Sam wrote them: he or another steward (or an admin) takes them back; Erin may only take back her own.
  {
    name: "withdraw",
    file: "versions/[id]/withdraw",
    method: "POST",
    handler: withdraw.POST as Handler,
    prepare: async () => ({ params: { id: await larkspurVersion("proposed") } }),
    expect: stewards(200),
  },
  {
    name: "version delete",
    file: "versions/[id]",
    method: "DELETE",
    handler: version.DELETE as Handler,
    prepare: async () => ({ params: { id: await larkspurVersion("draft") } }),
    expect: stewards(200),
  },
  {
    name: "approve",
    file: "versions/[id]/approve",
    method: "POST",
    handler: approve.POST as Handler,
    prepare: async () => ({ params: { id: await larkspurVersion("proposed", "engineer") } }),
    expect: stewards(200),
    // Four-eyes: a steward may approve, but not their own proposal.
    author: { who: "steward", prepare: async () => ({ params: { id: await larkspurVersion("proposed", "steward") } }), expect: 403 },
    contributors: contributorRows(),
  },
  {
    name: "reject",
    file: "versions/[id]/reject",
    method: "POST",
    handler: reject.POST as Handler,
    prepare: async () => ({ params: { id: await larkspurVersion("proposed", "engineer") }, body: { reason: "Range too short." } }),
    expect: stewards(200),
    author: { who: "steward", prepare: async () => ({ params: { id: await larkspurVersion("proposed", "steward") }, body: { reason: "Range too short." } }), expect: 403 },
    contributors: contributorRows({ reason: "Range too short." }),
  },
  {
    name: "copy reference",
    file: "versions/[id]/copy",
    method: "POST",
    handler: copy.POST as Handler,
    prepare: async () => ({ params: { id: await referenceVersion() } }),
    expect: stewards(201, 201),
  },
  {
    name: "version curve",
    file: "versions/[id]/curve",
    method: "GET",
    handler: curve.GET as Handler,
    prepare: async () => ({ params: { id: await larkspurVersion("draft") } }),
    expect: teamRead(),
  },
  {
    name: "version audit",
    file: "versions/[id]/audit",
    method: "GET",
    handler: audit.GET as Handler,
    prepare: async () => ({ params: { id: await larkspurVersion("draft") } }),
    expect: teamRead(),
  },
  { name: "preview", file: "preview", method: "POST", handler: preview.POST as Handler, prepare: async () => ({ body: { data: solidData, points: 20 } }), expect: allowAll(200) },
  { name: "datasets list", file: "datasets", method: "GET", handler: datasets.GET as Handler, expect: allowAll(200) },
  {
    name: "dataset upload",
    file: "datasets",
    method: "POST",
    handler: datasets.POST as Handler,
    prepare: async () => ({ body: { name: `Run ${++n}`, text: csv } }),
    expect: drafting(201),
  },
  {
    name: "dataset page",
    file: "datasets/[id]",
    method: "GET",
    handler: dataset.GET as Handler,
    prepare: async () => ({ params: { id: await larkspurDataset() } }),
    expect: teamRead(),
  },
  {
    name: "fit",
    file: "datasets/[id]/fit",
    method: "POST",
    handler: fit.POST as Handler,
    prepare: async () => ({ params: { id: await larkspurDataset() }, body: mkFit }),
    expect: stewards(200),
  },
  {
    name: "save fit as draft",
    file: "datasets/[id]/versions",
    method: "POST",
    handler: fitSave.POST as Handler,
    prepare: async () => ({ params: { id: await larkspurDataset() }, body: { fit: mkFit, citation: "Matrix test (invented)" } }),
    expect: stewards(201),
  },
  { name: "export", file: "library/export", method: "GET", handler: exportRoute.GET as Handler, expect: allowAll(200) },
  {
    name: "import",
    file: "library/import",
    method: "POST",
    handler: importRoute.POST as Handler,
    prepare: async () => ({
      body: {
        format: "heatpath.cp-library",
        formatVersion: 1,
        models: [
          {
            species: { formula: "SiO2", displayName: "Silica" },
            name: `Silica ${++n}`,
            family: "custom",
            versions: [{ versionNumber: 1, status: "approved", data: solidData, citation: "Matrix test (invented)" }],
          },
        ],
      },
    }),
    expect: stewards(201, 201),
  },
];
