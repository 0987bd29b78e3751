import { Op, type Transaction } from "sequelize";
import { canonicalSha256 } from "@/lib/cases/hash";
import { evaluate, type EvaluateRequest } from "@/lib/thermo";
import { equilibriumRequestOf, phasePointsOf, speciesOfPin } from "@/lib/cases/equilibrium";
import type { CaseInput } from "@/lib/validation/cases";
import type { CaseEquilibrium } from "@/lib/validation/equilibrium";
import type { PinnedVersion } from "@/models/case-snapshot";
import { DEMO_TEAM } from "./demo-accounts";
import type { SeedContext } from "./index";

/**
 * INVENTED demo cases for Larkspur Hydrogen Works, authored by Erin (engineer): the reformer
 * (approved), the shift converter (awaiting Rory's review), the ammonia loop (returned with
 * a reason), the cold box (a draft whose models are extrapolated far below their ranges, with
 * methane below its boiling point), a reformer start-up sweep in °C (a draft), methanol
 * synthesis (awaiting review), two carbon-deposition drafts for the reformer tubes, and two
 * drafts with a Peng–Robinson gas and an adiabatic inlet (the shift bed and the ammonia bed
 * temperature rise). The reactions are real; the plant, titles, notes
 * and decisions are made up. Pins the published NASA-7 (2015) reference versions loaded by
 * 02-reference-library. Safe to repeat: a case whose title exists is left alone.
 */
type Term = { formula: string; phase: string | null; coefficient: number };
/** An invented feed for the equilibrium panel; `extra` names species only the extra reactions use. */
type DemoEquilibrium = Omit<CaseEquilibrium, "extraTerms" | "inert"> & { extra: { formula: string; phase: string | null }[]; inert?: string[] };
export type Plan = {
  title: string;
  notes: string;
  terms: Term[];
  temperatures: CaseInput["temperatures"];
  toleranceKJ: number;
  flow: "draft" | "submitted" | "returned" | "approved";
  reason?: string;
  equilibrium?: DemoEquilibrium;
  /** Erin's comment on a submitted case. */
  comment?: string;
  /** Reference family to pin (default nasa7-2015; the 2015 database has no methanol set). */
  family?: string;
};

export const DEMO_CASES: Plan[] = [
  {
    title: "Reformer outlet near 1100 K",
    notes: "Primary reformer, outlet around 1100 K (invented plant data). Checks where methane reforming turns favourable and how far the naive line is off there.",
    terms: [
      { formula: "CH4", phase: "g", coefficient: -1 },
      { formula: "H2O", phase: "g", coefficient: -1 },
      { formula: "CO", phase: "g", coefficient: 1 },
      { formula: "H2", phase: "g", coefficient: 3 },
    ],
    temperatures: { fromK: 800, toK: 1300, stepK: 5 },
    toleranceKJ: 2,
    flow: "approved",
    reason: "Crossover and outlet K agree with the design basis; naive error noted in the summary.",
    // Steam-to-carbon 3 at 25 bar, reforming and shift together (invented plant data).
    equilibrium: {
      feed: { "CH4(g)": 100, "H2O(g)": 300, "CO(g)": 0, "H2(g)": 0 },
      feedUnit: "kmol/h",
      pressure: "25 bar",
      key: "CH4(g)",
      reactions: ["CH4(g) + H2O(g) -> CO(g) + 3 H2(g)", "CO(g) + H2O(g) -> CO2(g) + H2(g)"],
      extra: [{ formula: "CO2", phase: "g" }],
    },
  },
  {
    title: "Shift converter 480–700 K",
    notes: "High- and low-temperature shift beds (invented). Does the naive line stay within 1 kJ/mol over the beds?",
    terms: [
      { formula: "CO", phase: "g", coefficient: -1 },
      { formula: "H2O", phase: "g", coefficient: -1 },
      { formula: "CO2", phase: "g", coefficient: 1 },
      { formula: "H2", phase: "g", coefficient: 1 },
    ],
    temperatures: { fromK: 480, toK: 700, stepK: 2 },
    toleranceKJ: 1,
    flow: "submitted",
    comment: "Steam-to-carbon ratio of the beds is in the notes of the reformer case.",
    // Converter inlet after the reformer and waste-heat boiler, 30 bar (invented); methane rides along.
    equilibrium: {
      feed: { "CO(g)": 13, "H2O(g)": 38, "CO2(g)": 6, "H2(g)": 40, "CH4(g)": 3 },
      feedUnit: "kmol/h",
      pressure: "30 bar",
      key: "CO(g)",
      reactions: [],
      extra: [],
      inert: ["CH4(g)"],
    },
  },
  {
    title: "Ammonia loop near 700 K",
    notes: "Synthesis loop converter around 700 K (invented).",
    terms: [
      { formula: "N2", phase: "g", coefficient: -1 },
      { formula: "H2", phase: "g", coefficient: -3 },
      { formula: "NH3", phase: "g", coefficient: 2 },
    ],
    temperatures: { fromK: 600, toK: 800, stepK: 5 },
    toleranceKJ: 1,
    flow: "returned",
    // Loop converter inlet at 150 bar with argon-free make-up (invented).
    equilibrium: { feed: { "N2(g)": 1, "H2(g)": 3, "NH3(g)": 0.04 }, feedUnit: "kmol/s", pressure: "150 bar", key: "N2(g)", reactions: [], extra: [] },
    reason: "The loop runs near 150 bar: state the pressure in the notes and say that K here is the ideal-gas, 1 bar constant before I sign it off.",
  },
  {
    title: "Cold box CO trace near 90 K",
    notes: "Would CO traces methanate in the cold box around 90 K (invented)? The pinned models start at 200 K, so every species is extrapolated: read the warnings.",
    terms: [
      { formula: "CO", phase: "g", coefficient: -1 },
      { formula: "H2", phase: "g", coefficient: -3 },
      { formula: "CH4", phase: "g", coefficient: 1 },
      { formula: "H2O", phase: "cr", coefficient: 1 },
    ],
    temperatures: { fromK: 80, toK: 120, stepK: 1 },
    toleranceKJ: 1,
    flow: "draft",
    // Cold box feed at 30 bar: hydrogen with methane and a CO trace (invented).
    equilibrium: { feed: { "CO(g)": 0.2, "H2(g)": 90, "CH4(g)": 9.8, "H2O(cr)": 0 }, feedUnit: "kmol/h", pressure: "30 bar", key: "CO(g)", reactions: [], extra: [] },
  },
  {
    title: "Reformer start-up sweep (°C)",
    notes: "Start-up heating from 400 °C to 900 °C, entered in °C (invented).",
    terms: [
      { formula: "CH4", phase: "g", coefficient: -1 },
      { formula: "H2O", phase: "g", coefficient: -2 },
      { formula: "CO2", phase: "g", coefficient: 1 },
      { formula: "H2", phase: "g", coefficient: 4 },
    ],
    temperatures: { fromK: "400 degC", toK: "900 degC", stepK: "10 degC" },
    toleranceKJ: 2,
    flow: "draft",
  },
  {
    title: "Methanol synthesis loop 450–600 K",
    notes: "Methanol converter on a CO-rich side stream around 500 K and 80 bar (invented). GRI-Mech 3.0 sets throughout: the 2015 database's methanol record is left out of the library.",
    terms: [
      { formula: "CO", phase: "g", coefficient: -1 },
      { formula: "H2", phase: "g", coefficient: -2 },
      { formula: "CH3OH", phase: "g", coefficient: 1 },
    ],
    temperatures: { fromK: 450, toK: 600, stepK: 2 },
    toleranceKJ: 1,
    flow: "submitted",
    family: "nasa7-gri30",
    // H2/CO 2.5 at 80 bar (invented).
    equilibrium: { feed: { "CO(g)": 10, "H2(g)": 25, "CH3OH(g)": 0 }, feedUnit: "kmol/h", pressure: "80 bar", key: "CO(g)", reactions: [], extra: [] },
  },
  {
    title: "Reformer tubes: carbon from CO (Boudouard)",
    notes: "Could carbon deposit from CO on the cooler tube sections (invented)? Graphite is the condensed product; where K > 1 CO disproportionates.",
    terms: [
      { formula: "CO", phase: "g", coefficient: -2 },
      { formula: "C", phase: "cr", coefficient: 1 },
      { formula: "CO2", phase: "g", coefficient: 1 },
    ],
    temperatures: { fromK: 600, toK: 1300, stepK: 5 },
    toleranceKJ: 1,
    flow: "draft",
    // A CO-rich pocket at 25 bar (invented).
    equilibrium: { feed: { "CO(g)": 1, "C(cr)": 0, "CO2(g)": 0.2 }, feedUnit: "kmol/h", pressure: "25 bar", key: "CO(g)", reactions: [], extra: [] },
  },
  {
    title: "Reformer tubes: carbon from methane cracking",
    notes: "Could methane crack to carbon on the hot tube wall (invented)? The corrected crossover sits about 100 K below the naive one.",
    terms: [
      { formula: "CH4", phase: "g", coefficient: -1 },
      { formula: "C", phase: "cr", coefficient: 1 },
      { formula: "H2", phase: "g", coefficient: 2 },
    ],
    temperatures: { fromK: 600, toK: 1300, stepK: 5 },
    toleranceKJ: 1,
    flow: "draft",
    // Equal CH4 and H2 at 25 bar (invented).
    equilibrium: { feed: { "CH4(g)": 1, "C(cr)": 0, "H2(g)": 1 }, feedUnit: "kmol/h", pressure: "25 bar", key: "CH4(g)", reactions: [], extra: [] },
  },
  {
    title: "Shift converter bed temperature rise",
    notes: "High-temperature shift bed, inlet 600 K at 30 bar (invented). How hot does the bed run if it reaches equilibrium, and how far off is the constant-ΔrH estimate?",
    terms: [
      { formula: "CO", phase: "g", coefficient: -1 },
      { formula: "H2O", phase: "g", coefficient: -1 },
      { formula: "CO2", phase: "g", coefficient: 1 },
      { formula: "H2", phase: "g", coefficient: 1 },
    ],
    temperatures: { fromK: 600, toK: 760, stepK: 5 },
    toleranceKJ: 1,
    flow: "draft",
    // The methane that rides along carries heat, so it is pinned too (invented feed, as the converter case).
    equilibrium: {
      feed: { "CO(g)": 13, "H2O(g)": 38, "CO2(g)": 6, "H2(g)": 40, "CH4(g)": 3 },
      feedUnit: "kmol/h",
      pressure: "30 bar",
      key: "CO(g)",
      reactions: [],
      extra: [{ formula: "CH4", phase: "g" }],
      inert: [],
      gas: "peng-robinson",
      adiabaticInletK: 600,
    },
  },
  {
    title: "Ammonia bed temperature rise at 150 bar",
    notes: "First bed of the synthesis converter, inlet 653 K at 150 bar (invented). Peng–Robinson fugacities; outlet temperature if the bed reached equilibrium.",
    terms: [
      { formula: "N2", phase: "g", coefficient: -1 },
      { formula: "H2", phase: "g", coefficient: -3 },
      { formula: "NH3", phase: "g", coefficient: 2 },
    ],
    temperatures: { fromK: 640, toK: 840, stepK: 5 },
    toleranceKJ: 1,
    flow: "draft",
    equilibrium: {
      feed: { "N2(g)": 1, "H2(g)": 3, "NH3(g)": 0.04 },
      feedUnit: "kmol/s",
      pressure: "150 bar",
      key: "N2(g)",
      reactions: [],
      extra: [],
      inert: [],
      gas: "peng-robinson",
      adiabaticInletK: 653,
    },
  },
];

const FAMILY = "nasa7-2015";

async function pinFor(ctx: SeedContext, formula: string, phase: string | null, transaction: Transaction, family = FAMILY): Promise<PinnedVersion | null> {
  const { Species, CpModel, ModelVersion } = ctx.models;
  const species = await Species.findOne({ where: { teamId: null, formula }, transaction });
  if (!species) return null;
  const cpModels = await CpModel.findAll({ where: { teamId: null, speciesId: species.id, family }, order: [["id", "ASC"]], transaction });
  for (const m of cpModels) {
    const v = await ModelVersion.findOne({ where: { modelId: m.id, status: "approved" }, order: [["versionNumber", "DESC"]], transaction });
    const phases = ((v?.data as { segments?: { phase: string }[] })?.segments ?? []).map((s) => s.phase);
    if (v && (!phase || phases.includes(phase))) {
      return {
        key: phase ? `${formula}(${phase})` : formula,
        formula,
        phase,
        versionId: v.id,
        modelId: m.id,
        speciesName: species.displayName,
        modelName: m.name,
        family: m.family,
        versionNumber: v.versionNumber,
        status: v.status,
        citation: v.citation,
        data: v.data,
        uncertainty: v.uncertainty ?? null,
        phasePoints: phasePointsOf(species),
      };
    }
  }
  return null;
}

function reactionOf(terms: Term[]): string {
  const side = (list: Term[]) => list.map((t) => `${Math.abs(t.coefficient) === 1 ? "" : `${Math.abs(t.coefficient)} `}${t.phase ? `${t.formula}(${t.phase})` : t.formula}`).join(" + ");
  return `${side(terms.filter((t) => t.coefficient < 0))} -> ${side(terms.filter((t) => t.coefficient > 0))}`;
}

/** `plans` exist for the upgrade test, which seeds the cases as they were and then seeds again. */
export async function seed(ctx: SeedContext, options: { plans?: Plan[] } = {}): Promise<void> {
  const plans = options.plans ?? DEMO_CASES;
  const { models, sequelize } = ctx;
  const { Team, User, Case, CaseSnapshot, Review, Comment, AuditEvent } = models;
  await sequelize.transaction(async (transaction) => {
    const team = await Team.findOne({ where: { slug: DEMO_TEAM.slug }, transaction });
    if (!team) throw new Error("04-demo-cases needs 01-demo-team first");
    const erin = await User.findOne({ where: { email: "erin.engineer@example.test" }, transaction });
    const rory = await User.findOne({ where: { email: "rory.reviewer@example.test" }, transaction });
    if (!erin || !rory) throw new Error("04-demo-cases needs the demo accounts");
    const existing = new Set((await Case.findAll({ where: { teamId: team.id, title: { [Op.in]: plans.map((c) => c.title) } }, transaction })).map((c) => c.title));
    const audit = (action: string, entityId: number, actorId: number, after: unknown) =>
      AuditEvent.create({ teamId: team.id, actorId, action, entityType: "case", entityId: String(entityId), before: null, after }, { transaction });

    for (const plan of plans) {
      if (existing.has(plan.title)) continue;
      const pins: PinnedVersion[] = [];
      for (const t of [...plan.terms, ...(plan.equilibrium?.extra ?? [])]) {
        const p = await pinFor(ctx, t.formula, t.phase, transaction, plan.family);
        if (!p) {
          console.log(`04-demo-cases: skipped: no approved ${plan.family ?? FAMILY} reference version of ${t.formula}${t.phase ? `(${t.phase})` : ""}; run 02-reference-library first`);
          return;
        }
        pins.push(p);
      }
      const inputs: CaseInput = {
        title: plan.title,
        notes: plan.notes,
        terms: plan.terms.map((t, i) => ({ ...t, versionId: pins[i].versionId })),
        temperatures: plan.temperatures,
        referenceK: 298.15,
        toleranceKJ: plan.toleranceKJ,
        toleranceKFactor: null,
      };
      if (plan.equilibrium) {
        const { extra, ...eq } = plan.equilibrium;
        const extraPins = pins.slice(plan.terms.length);
        inputs.equilibrium = { ...eq, inert: eq.inert ?? [], extraTerms: extra.map((t, i) => ({ ...t, versionId: extraPins[i].versionId })) };
      }
      const { title: _t, notes: _n, ...stored } = inputs;
      const row = await Case.create({ teamId: team.id, authorId: erin.id, title: plan.title, notes: plan.notes, status: plan.flow, inputs: stored, lockVersion: plan.flow === "draft" ? 0 : plan.flow === "submitted" ? 1 : 2 }, { transaction });
      await audit("case.created", row.id, erin.id, { title: plan.title, seeded: true });
      if (plan.flow === "draft") continue;

      const species: EvaluateRequest["species"] = {};
      // As the case services build it (lib/services/cases.ts buildRequest).
      for (const p of pins) species[p.key] = speciesOfPin(p);
      const request: EvaluateRequest = { reaction: reactionOf(plan.terms), species, temperatures: plan.temperatures, referenceK: 298.15, toleranceKJ: plan.toleranceKJ, include: ["contributions"] };
      const equilibrium = equilibriumRequestOf(inputs.equilibrium);
      if (equilibrium) request.equilibrium = equilibrium;
      const result = evaluate(request);
      const content = JSON.parse(JSON.stringify({ inputs, pins, engineVersion: result.engine.version, request, result }));
      const snap = await CaseSnapshot.create({ caseId: row.id, teamId: team.id, revision: 1, ...content, hash: canonicalSha256(content), createdById: erin.id }, { transaction });
      await audit("case.submitted", row.id, erin.id, { status: "submitted", revision: 1, hash: snap.hash });
      if (plan.flow === "submitted") {
        if (plan.comment) await Comment.create({ caseId: row.id, snapshotId: snap.id, authorId: erin.id, body: plan.comment }, { transaction });
        continue;
      }
      await Review.create({ caseId: row.id, snapshotId: snap.id, reviewerId: rory.id, decision: plan.flow, reason: plan.reason ?? null }, { transaction });
      await audit(plan.flow === "approved" ? "case.approved" : "case.returned", row.id, rory.id, { status: plan.flow, revision: 1, hash: snap.hash, reason: plan.reason ?? null });
    }
  });
}
