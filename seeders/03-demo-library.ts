import crypto from "node:crypto";
import { fitCp } from "@/lib/thermo/fit";
import { parseFormula } from "@/lib/thermo/formula";
import type { SpeciesInput } from "@/lib/thermo/schema";
import { DEMO_TEAM } from "./demo-accounts";
import type { SeedContext } from "./index";

/**
 * INVENTED demo data for Larkspur Hydrogen Works: a measured Cp dataset of a nickel–alumina
 * catalyst support (the numbers are made up for the demo, not measured anywhere), a rejected
 * first fit with its reason, a second fit proposed and waiting for a steward, and a team copy
 * of a reference model. Safe to repeat: nothing is added once the support's model exists.
 */
export const DEMO_SUPPORT = { formula: "NiAl2O4", displayName: "Ni–alumina catalyst support (invented demo data)" };
export const DEMO_MODEL_NAME = "NiAl2O4 · fitted to support lot 7 DSC (invented)";

/** Invented: Cp = a + bT + c/T² with a = 165, b = 0.022, c = −3.6e6, plus a fixed ripple. */
export function demoSupportPoints(): { tK: number; cpJ: number; sigmaJ: number }[] {
  const out = [];
  for (let i = 0; i <= 24; i++) {
    const tK = 300 + 25 * i;
    const cp = 165 + 0.022 * tK - 3.6e6 / tK ** 2 + 0.6 * Math.sin(1.7 * i);
    out.push({ tK, cpJ: Number(cp.toFixed(2)), sigmaJ: 0.8 });
  }
  return out;
}

/** Invented anchor for the support: ΔfH° and S° at 298.15 K. */
const DEMO_REFERENCE = { tK: 298.15, hkJ: -1925.0, sJ: 98.0 };

export async function seed({ models, sequelize }: SeedContext): Promise<void> {
  const { Team, User, Species, CpModel, ModelVersion, Dataset, AuditEvent } = models;
  await sequelize.transaction(async (transaction) => {
    const team = await Team.findOne({ where: { slug: DEMO_TEAM.slug }, transaction });
    if (!team) throw new Error("03-demo-library needs 01-demo-team first");
    const user = async (email: string) => (await User.findOne({ where: { email }, transaction }))!;
    const sam = await user("sam.steward@example.test");
    const stella = await user("stella.steward@example.test");
    const audit = (action: string, entityType: string, entityId: number, actorId: number, after: unknown) =>
      AuditEvent.create({ teamId: team.id, actorId, action, entityType, entityId: String(entityId), before: null, after }, { transaction });

    const parsed = parseFormula(DEMO_SUPPORT.formula);
    const [species] = await Species.findOrCreate({
      where: { teamId: team.id, formula: DEMO_SUPPORT.formula },
      defaults: {
        teamId: team.id,
        formula: DEMO_SUPPORT.formula,
        displayName: DEMO_SUPPORT.displayName,
        elements: parsed.elements,
        molarMassGPerMol: parsed.molarMassGPerMol,
        identifiers: null,
      },
      transaction,
    });
    if (await CpModel.findOne({ where: { teamId: team.id, speciesId: species.id, name: DEMO_MODEL_NAME }, transaction })) return;

    const points = demoSupportPoints();
    const csv = ["T (K),Cp (J/mol/K),sigma", ...points.map((p) => `${p.tK},${p.cpJ},${p.sigmaJ}`)].join("\n") + "\n";
    const dataset = await Dataset.create(
      {
        teamId: team.id,
        speciesId: species.id,
        name: "Support lot 7, DSC run 2 (invented)",
        originalFilename: "support-lot7-dsc.csv",
        sizeBytes: Buffer.byteLength(csv),
        sha256: crypto.createHash("sha256").update(csv).digest("hex"),
        tUnit: "K",
        cpUnit: "J/(mol*K)",
        points,
        uploadedById: sam.id,
      },
      { transaction },
    );
    await audit("dataset.uploaded", "dataset", dataset.id, sam.id, { name: dataset.name, points: points.length });

    const model = await CpModel.create(
      { speciesId: species.id, teamId: team.id, name: DEMO_MODEL_NAME, family: "measured", variant: null, copiedFromId: null, createdById: sam.id },
      { transaction },
    );
    await audit("cp-model.created", "cp-model", model.id, sam.id, { name: model.name });
    const citation = "Larkspur Hydrogen Works lab, DSC of catalyst support lot 7 (invented demo data)";

    // Version 1: a five-term power series, rejected.
    const power = fitCp({ form: "power", exponents: [0, 1, 2, 3, 4], points, phase: "cr", reference: DEMO_REFERENCE });
    const powerData: SpeciesInput = { segments: [power.segment!], reference: power.reference };
    const t0 = new Date(Date.now() - 3 * 86_400_000);
    const rejected = await ModelVersion.create(
      {
        modelId: model.id,
        teamId: team.id,
        versionNumber: 1,
        status: "rejected",
        data: powerData,
        citation,
        uncertainty: null,
        changeNote: `Power series T^0..T^4 fitted to ${points.length} points, 300–900 K, RMS ${power.rmsJ.toFixed(2)} J/(mol·K).`,
        decisionReason: "Five free terms follow the scatter of one DSC run and bend away beyond 900 K; refit with the three-term Maier–Kelley form over the measured range.",
        datasetId: dataset.id,
        authorId: sam.id,
        decidedById: stella.id,
        proposedAt: t0,
        decidedAt: new Date(t0.getTime() + 3_600_000),
      },
      { transaction },
    );
    await audit("model-version.fitted", "model-version", rejected.id, sam.id, { status: "draft", form: "power", datasetId: dataset.id });
    await audit("model-version.proposed", "model-version", rejected.id, sam.id, { status: "proposed" });
    await audit("model-version.rejected", "model-version", rejected.id, stella.id, { status: "rejected", reason: rejected.decisionReason });

    // Version 2: Maier–Kelley, proposed by Sam, waiting for Stella (four-eyes).
    const mk = fitCp({ form: "maier-kelley", points, phase: "cr", reference: DEMO_REFERENCE });
    const proposed = await ModelVersion.create(
      {
        modelId: model.id,
        teamId: team.id,
        versionNumber: 2,
        status: "proposed",
        data: { segments: [mk.segment!], reference: mk.reference },
        citation,
        uncertainty: { cpRelative: 0.005 },
        changeNote: `Maier–Kelley fitted to ${points.length} points, 300–900 K, RMS ${mk.rmsJ.toFixed(2)} J/(mol·K); anchor ΔfH° and S° at 298.15 K invented for the demo.`,
        decisionReason: null,
        datasetId: dataset.id,
        authorId: sam.id,
        decidedById: null,
        proposedAt: new Date(Date.now() - 86_400_000),
        decidedAt: null,
      },
      { transaction },
    );
    await audit("model-version.fitted", "model-version", proposed.id, sam.id, { status: "draft", form: "maier-kelley", datasetId: dataset.id });
    await audit("model-version.proposed", "model-version", proposed.id, sam.id, { status: "proposed" });

    // A team copy of the reference CH4 Shomate model, approved for the reformer work.
    const methane = await Species.findOne({ where: { teamId: null, formula: "CH4" }, transaction });
    const refModel = methane && (await CpModel.findOne({ where: { teamId: null, speciesId: methane.id, family: "shomate-janaf" }, transaction }));
    const refVersion = refModel && (await ModelVersion.findOne({ where: { modelId: refModel.id, status: "approved" }, transaction }));
    if (refModel && refVersion) {
      const copy = await CpModel.create(
        {
          speciesId: methane!.id,
          teamId: team.id,
          name: `${refModel.name} (team copy)`,
          family: refModel.family,
          variant: refModel.variant,
          copiedFromId: refModel.id,
          createdById: sam.id,
        },
        { transaction },
      );
      await audit("cp-model.created", "cp-model", copy.id, sam.id, { name: copy.name, copiedFromId: refModel.id });
      const v = await ModelVersion.create(
        {
          modelId: copy.id,
          teamId: team.id,
          versionNumber: 1,
          status: "approved",
          data: refVersion.data,
          citation: refVersion.citation,
          uncertainty: refVersion.uncertainty,
          changeNote: `Copied from reference version ${refVersion.versionNumber} of ${refModel.name} for the steam reformer check.`,
          decisionReason: "Unchanged reference set; approved for team use.",
          datasetId: null,
          authorId: sam.id,
          decidedById: stella.id,
          proposedAt: new Date(Date.now() - 5 * 86_400_000),
          decidedAt: new Date(Date.now() - 4 * 86_400_000),
        },
        { transaction },
      );
      await audit("model-version.copied", "model-version", v.id, sam.id, { status: "draft", fromVersionId: refVersion.id });
      await audit("model-version.proposed", "model-version", v.id, sam.id, { status: "proposed" });
      await audit("model-version.approved", "model-version", v.id, stella.id, { status: "approved" });
    }
  });
}
