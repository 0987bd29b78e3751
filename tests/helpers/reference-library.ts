/**
 * Approved global reference versions for case tests, built from the published
 * nasa7-2015 sets in ../shared/reference/cp-coefficients.json (NASA-7, third-millennium
 * database, 2015 update). Reuses what the library seeders loaded when they ran; creates the rest.
 */
import { models } from "@/lib/db";
import { parseFormula, type SegmentInput } from "@/lib/thermo";
import { familyOf, records, type CoefficientRecord } from "../thermo/reference-data";

export const FAMILY = "nasa7-2015";
const FORMULAS = ["H2", "O2", "N2", "H2O", "CO", "CO2", "CH4", "NH3"] as const;
export type RefFormula = (typeof FORMULAS)[number];

function segments(r: CoefficientRecord): SegmentInput[] {
  if (r.tmid != null) {
    return [
      { phase: r.phase, form: "nasa7", tminK: r.tmin, tmaxK: r.tmid, coeffs: r.coeffs.low! },
      { phase: r.phase, form: "nasa7", tminK: r.tmid, tmaxK: r.tmax, coeffs: r.coeffs.high! },
    ];
  }
  return [{ phase: r.phase, form: "nasa7", tminK: r.tmin, tmaxK: r.tmax, coeffs: r.coeffs.low! }];
}

/** formula → id of an approved global version of that species' nasa7-2015 model. */
export async function ensureReferenceLibrary(): Promise<Record<RefFormula, number>> {
  const { Species, CpModel, ModelVersion } = models();
  const sets = records().filter((r) => familyOf(r) === FAMILY);
  const out = {} as Record<RefFormula, number>;
  for (const formula of FORMULAS) {
    const [species] = await Species.findOrCreate({
      where: { teamId: null, formula },
      defaults: {
        teamId: null,
        formula,
        displayName: formula,
        elements: parseFormula(formula).elements,
        molarMassGPerMol: parseFormula(formula).molarMassGPerMol,
        identifiers: null,
      },
    });
    const existing = await CpModel.findOne({ where: { speciesId: species.id, teamId: null, family: FAMILY }, order: [["id", "ASC"]] });
    const model =
      existing ?? (await CpModel.create({ speciesId: species.id, teamId: null, name: `${formula}, NASA-7 (2015)`, family: FAMILY, copiedFromId: null, createdById: null }));
    const approved = await ModelVersion.findOne({ where: { modelId: model.id, status: "approved" }, order: [["versionNumber", "DESC"]] });
    if (approved) {
      out[formula] = approved.id;
      continue;
    }
    const mine = sets.filter((r) => r.species === formula);
    const seen = new Set<string>();
    const segs = mine.filter((r) => !seen.has(r.phase) && seen.add(r.phase)).flatMap(segments);
    const v = await ModelVersion.create({
      modelId: model.id,
      teamId: null,
      versionNumber: 1,
      status: "approved",
      data: { segments: segs, standardPressurePa: 100000 },
      citation: mine[0].source,
      uncertainty: null,
      changeNote: null,
      decisionReason: null,
      datasetId: null,
      authorId: null,
      decidedById: null,
      proposedAt: null,
      decidedAt: new Date(),
    });
    out[formula] = v.id;
  }
  return out;
}
