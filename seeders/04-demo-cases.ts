import { Op, type Transaction } from "sequelize";
import { pinnedVersionOf } from "@/lib/cases/pin";
import { buildRequest } from "@/lib/cases/request";
import { snapshotContent, snapshotHash } from "@/lib/cases/snapshot";
import { evaluate, parseReaction, parseSpeciesKey } from "@/lib/thermo";
import { describeData } from "@/lib/thermo/curve";
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

/** A term per species of the reaction text, reactants first, in the order written. */
function termsOf(reaction: string): Term[] {
  return parseReaction(reaction).terms.map((t) => ({ formula: t.formula, phase: t.phase ?? null, coefficient: t.nu }));
}

/** A feed at a pressure with its key species; kmol/h, no extra reactions or species unless `more` says otherwise. */
function feed(flows: Record<string, number>, pressure: string, key: string, more: Partial<Omit<DemoEquilibrium, "extra">> & { extra?: string[] } = {}): DemoEquilibrium {
  const { extra = [], ...rest } = more;
  return {
    feed: flows,
    feedUnit: "kmol/h",
    pressure,
    key,
    reactions: [],
    ...rest,
    extra: extra.map((k) => ({ formula: parseSpeciesKey(k).formula, phase: parseSpeciesKey(k).phase ?? null })),
  };
}

/** One demo case: the reaction as text, the span as [from, to, step] (K, or quantities with their unit). */
type Row = Omit<Plan, "terms" | "temperatures"> & { reaction: string; span: [number, number, number] | [string, string, string] };

function demoCase({ reaction, span: [fromK, toK, stepK], ...rest }: Row): Plan {
  const { title, notes, ...more } = rest;
  return { title, notes, terms: termsOf(reaction), temperatures: { fromK, toK, stepK } as CaseInput["temperatures"], ...more };
}

const REFORMING = "CH4(g) + H2O(g) -> CO(g) + 3 H2(g)";
const SHIFT = "CO(g) + H2O(g) -> CO2(g) + H2(g)";
const AMMONIA = "N2(g) + 3 H2(g) -> 2 NH3(g)";
/** Converter inlet after the reformer and waste-heat boiler, 30 bar (invented). */
const SHIFT_INLET = { "CO(g)": 13, "H2O(g)": 38, "CO2(g)": 6, "H2(g)": 40, "CH4(g)": 3 };
/** Loop converter inlet with argon-free make-up (invented). */
const LOOP_INLET = { "N2(g)": 1, "H2(g)": 3, "NH3(g)": 0.04 };

export const DEMO_CASES: Plan[] = (
  [
    {
      title: "Reformer outlet near 1100 K",
      notes: "Primary reformer, outlet around 1100 K (invented plant data). Checks where methane reforming turns favourable and how far the naive line is off there.",
      reaction: REFORMING,
      span: [800, 1300, 5],
      toleranceKJ: 2,
      flow: "approved",
      reason: "Crossover and outlet K agree with the design basis; naive error noted in the summary.",
      // Steam-to-carbon 3 at 25 bar, reforming and shift together (invented plant data).
      equilibrium: feed({ "CH4(g)": 100, "H2O(g)": 300, "CO(g)": 0, "H2(g)": 0 }, "25 bar", "CH4(g)", { reactions: [REFORMING, SHIFT], extra: ["CO2(g)"] }),
    },
    {
      title: "Shift converter 480–700 K",
      notes: "High- and low-temperature shift beds (invented). Does the naive line stay within 1 kJ/mol over the beds?",
      reaction: SHIFT,
      span: [480, 700, 2],
      toleranceKJ: 1,
      flow: "submitted",
      comment: "Steam-to-carbon ratio of the beds is in the notes of the reformer case.",
      // Methane rides along, inert.
      equilibrium: feed(SHIFT_INLET, "30 bar", "CO(g)", { inert: ["CH4(g)"] }),
    },
    {
      title: "Ammonia loop near 700 K",
      notes: "Synthesis loop converter around 700 K (invented).",
      reaction: AMMONIA,
      span: [600, 800, 5],
      toleranceKJ: 1,
      flow: "returned",
      equilibrium: feed(LOOP_INLET, "150 bar", "N2(g)", { feedUnit: "kmol/s" }),
      reason: "The loop runs near 150 bar: state the pressure in the notes and say that K here is the ideal-gas, 1 bar constant before I sign it off.",
    },
    {
      title: "Cold box CO trace near 90 K",
      notes: "Would CO traces methanate in the cold box around 90 K (invented)? The pinned models start at 200 K, so every species is extrapolated: read the warnings.",
      reaction: "CO(g) + 3 H2(g) -> CH4(g) + H2O(cr)",
      span: [80, 120, 1],
      toleranceKJ: 1,
      flow: "draft",
      // Cold box feed at 30 bar: hydrogen with methane and a CO trace (invented).
      equilibrium: feed({ "CO(g)": 0.2, "H2(g)": 90, "CH4(g)": 9.8, "H2O(cr)": 0 }, "30 bar", "CO(g)"),
    },
    {
      title: "Reformer start-up sweep (°C)",
      notes: "Start-up heating from 400 °C to 900 °C, entered in °C (invented).",
      reaction: "CH4(g) + 2 H2O(g) -> CO2(g) + 4 H2(g)",
      span: ["400 degC", "900 degC", "10 degC"],
      toleranceKJ: 2,
      flow: "draft",
    },
    {
      title: "Methanol synthesis loop 450–600 K",
      notes:
        "Methanol converter on a CO-rich side stream around 500 K and 80 bar (invented). GRI-Mech 3.0 sets throughout: the 2015 database's methanol record is left out of the library.",
      reaction: "CO(g) + 2 H2(g) -> CH3OH(g)",
      span: [450, 600, 2],
      toleranceKJ: 1,
      flow: "submitted",
      family: "nasa7-gri30",
      // H2/CO 2.5 at 80 bar (invented).
      equilibrium: feed({ "CO(g)": 10, "H2(g)": 25, "CH3OH(g)": 0 }, "80 bar", "CO(g)"),
    },
    {
      title: "Reformer tubes: carbon from CO (Boudouard)",
      notes: "Could carbon deposit from CO on the cooler tube sections (invented)? Graphite is the condensed product; where K > 1 CO disproportionates.",
      reaction: "2 CO(g) -> C(cr) + CO2(g)",
      span: [600, 1300, 5],
      toleranceKJ: 1,
      flow: "draft",
      // A CO-rich pocket at 25 bar (invented).
      equilibrium: feed({ "CO(g)": 1, "C(cr)": 0, "CO2(g)": 0.2 }, "25 bar", "CO(g)"),
    },
    {
      title: "Reformer tubes: carbon from methane cracking",
      notes: "Could methane crack to carbon on the hot tube wall (invented)? The corrected crossover sits about 100 K below the naive one.",
      reaction: "CH4(g) -> C(cr) + 2 H2(g)",
      span: [600, 1300, 5],
      toleranceKJ: 1,
      flow: "draft",
      // Equal CH4 and H2 at 25 bar (invented).
      equilibrium: feed({ "CH4(g)": 1, "C(cr)": 0, "H2(g)": 1 }, "25 bar", "CH4(g)"),
    },
    {
      title: "Shift converter bed temperature rise",
      notes: "High-temperature shift bed, inlet 600 K at 30 bar (invented). How hot does the bed run if it reaches equilibrium, and how far off is the constant-ΔrH estimate?",
      reaction: SHIFT,
      span: [600, 760, 5],
      toleranceKJ: 1,
      flow: "draft",
      // The methane that rides along carries heat, so it is pinned too (invented feed, as the converter case).
      equilibrium: feed(SHIFT_INLET, "30 bar", "CO(g)", { extra: ["CH4(g)"], inert: [], gas: "peng-robinson", adiabaticInletK: 600 }),
    },
    {
      title: "Ammonia bed temperature rise at 150 bar",
      notes: "First bed of the synthesis converter, inlet 653 K at 150 bar (invented). Peng–Robinson fugacities; outlet temperature if the bed reached equilibrium.",
      reaction: AMMONIA,
      span: [640, 840, 5],
      toleranceKJ: 1,
      flow: "draft",
      equilibrium: feed(LOOP_INLET, "150 bar", "N2(g)", { feedUnit: "kmol/s", inert: [], gas: "peng-robinson", adiabaticInletK: 653 }),
    },
  ] satisfies Row[]
).map(demoCase);

const FAMILY = "nasa7-2015";

/**
 * The newest approved reference version of the family with the term's phase. The pin is made
 * as the case services make it (lib/cases/pin.ts), without the species' critical constants:
 * the seeded snapshots were frozen without them and their hashes stay as they were.
 */
async function pinFor(ctx: SeedContext, formula: string, phase: string | null, transaction: Transaction, family = FAMILY): Promise<PinnedVersion | null> {
  const { Species, CpModel, ModelVersion } = ctx.models;
  const species = await Species.findOne({ where: { teamId: null, formula }, transaction });
  if (!species) return null;
  const cpModels = await CpModel.findAll({ where: { teamId: null, speciesId: species.id, family }, order: [["id", "ASC"]], transaction });
  for (const m of cpModels) {
    const v = await ModelVersion.findOne({ where: { modelId: m.id, status: "approved" }, order: [["versionNumber", "DESC"]], transaction });
    const phases = describeData(v?.data).phases;
    if (v && (!phase || phases.includes(phase))) {
      return pinnedVersionOf({ formula, phase }, v, m, { ...species.get({ plain: true }), critical: null });
    }
  }
  return null;
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
          console.log(
            `04-demo-cases: skipped: no approved ${plan.family ?? FAMILY} reference version of ${t.formula}${t.phase ? `(${t.phase})` : ""}; run 02-reference-library first`,
          );
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
      const row = await Case.create(
        {
          teamId: team.id,
          authorId: erin.id,
          title: plan.title,
          notes: plan.notes,
          status: plan.flow,
          inputs: stored,
          lockVersion: plan.flow === "draft" ? 0 : plan.flow === "submitted" ? 1 : 2,
        },
        { transaction },
      );
      await audit("case.created", row.id, erin.id, { title: plan.title, seeded: true });
      if (plan.flow === "draft") continue;

      const request = buildRequest(inputs, pins);
      const content = snapshotContent({ inputs, pins, request, result: evaluate(request) });
      const snap = await CaseSnapshot.create({ caseId: row.id, teamId: team.id, revision: 1, ...content, hash: snapshotHash(content), createdById: erin.id }, { transaction });
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
