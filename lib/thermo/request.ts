/**
 * Stage 1 of evaluate(): the request normalised, every field checked once at the entry —
 * schema, reaction (species present, balanced), referenceK, the grid, the tolerances and the
 * operating pressure — in SI numbers. Later stages take these numbers and check nothing again.
 */
import { T298 } from "./constants";
import { refuse } from "./errors";
import { fmt } from "./format";
import { checkBalance, parseReaction, type ReactionTerm } from "./formula";
import { parseTemperatureGrid, requireTemperatureK } from "./grid";
import { describeIssue, evaluateRequestSchema, missingIsRequired, type EvaluateRequest } from "./schema";
import { parseMolarEnergyKJ, parsePressureBar, parseTemperatureK } from "./units";

export interface NormalisedRequest {
  /** The validated request (species entries parsed by the schema). */
  req: EvaluateRequest;
  terms: ReactionTerm[];
  referenceK: number;
  /** The grid in K, ascending, without duplicates. */
  T: Float64Array;
  /** |naive − corrected| ΔrG beyond which a point exceeds the tolerance, J/mol (Infinity when not asked). */
  tolJ: number;
  /** The same for ln K (ln of toleranceKFactor; Infinity when not asked). */
  tolLn: number;
  /** The operating pressure (pressureBar, else equilibrium.pressureBar), bar; undefined when neither is given. */
  pressureBar: number | undefined;
}

export function normaliseRequest(request: unknown): NormalisedRequest {
  const parsed = evaluateRequestSchema.safeParse(request, { error: missingIsRequired });
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    refuse("invalid-request", `invalid request: ${describeIssue(issue)}`, {
      issues: parsed.error.issues.map((i) => ({ path: i.path.map(String), message: i.message })),
    });
  }
  const req = parsed.data!;
  const reaction = parseReaction(req.reaction);
  for (const t of reaction.terms) {
    if (!Object.prototype.hasOwnProperty.call(req.species, t.key)) {
      refuse("missing-species", `species "${t.key}" is used in the reaction but has no entry in species`, { species: t.key });
    }
  }
  checkBalance(reaction.terms);
  const referenceK = requireTemperatureK(parseTemperatureK(req.referenceK ?? T298, "referenceK"), "referenceK");
  const T = parseTemperatureGrid(req.temperatures);
  let tolJ = Infinity;
  if (req.toleranceKJ !== undefined) {
    const kJ = parseMolarEnergyKJ(req.toleranceKJ, "toleranceKJ");
    if (!(kJ >= 0)) refuse("invalid-request", `invalid request: toleranceKJ: expected a tolerance of 0 or more (got ${fmt(kJ)} kJ/mol)`);
    tolJ = kJ * 1000;
  }
  const tolLn = req.toleranceKFactor === undefined ? Infinity : Math.log(req.toleranceKFactor);
  const pressureBar =
    req.pressureBar !== undefined
      ? parsePressureBar(req.pressureBar, "pressureBar")
      : req.equilibrium?.pressureBar !== undefined
        ? parsePressureBar(req.equilibrium.pressureBar, "equilibrium.pressureBar")
        : undefined;
  if (req.adiabatic && !req.equilibrium) {
    refuse("adiabatic-needs-equilibrium", "adiabatic: an adiabatic outlet needs an equilibrium feed; add equilibrium { feed, pressureBar }");
  }
  return { req, terms: reaction.terms, referenceK, T, tolJ, tolLn, pressureBar };
}
