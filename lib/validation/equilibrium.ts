/** The equilibrium part of a case (feed, pressure, key species, optional simultaneous set), shared by the panel form and the services. zod only. */
import { z } from "zod";
import { checkFeedUnit, checkPressure, checkReactionLine, checkSpeciesKey } from "@/lib/cases/equilibrium-form";
import { PHASE_NAME } from "@/lib/thermo/formula";
import { strictObject } from "@/lib/validation/strict";
import { aboveZeroKSentence } from "@/lib/thermo/scales";

const speciesKey = z.string().trim().min(1, "Name a species.").max(80, "Use at most 80 characters.");

export const extraTermSchema = strictObject({
  formula: z.string({ error: "Pick a species." }).trim().min(1, "Pick a species.").max(60, "Use at most 60 characters."),
  phase: z.string().regex(PHASE_NAME, { error: 'Use a phase of "cr", "l" or "g", or none for the stable phase.' }).nullable(),
  versionId: z.number({ error: "Pick a model version." }).int({ error: "Pick a model version." }).positive({ error: "Pick a model version." }),
});
export type ExtraTerm = z.infer<typeof extraTermSchema>;

export const caseEquilibriumSchema = strictObject({
  /** Feed amounts per species key (formula with phase marker, as in the reaction). */
  feed: z.record(speciesKey, z.number({ error: "Enter an amount." }).min(0, "An amount cannot be negative.").max(1e12, "Use at most 1e12.")),
  feedUnit: z.string().trim().min(1, "Name the unit of amount.").max(24, "Use at most 24 characters.").default("mol"),
  /** Total pressure: a number in bar, or a number with a unit ("30 bar", "2.5 MPa"). */
  pressure: z.union([z.number({ error: "Enter a pressure." }), z.string().trim().min(1, "Enter a pressure.").max(40)]).default(1),
  key: speciesKey.nullable().default(null),
  /** A simultaneous set; empty means the case's own reaction. */
  reactions: z.array(z.string().trim().min(1, "Write the reaction.").max(400, "Use at most 400 characters.")).max(12, "Use at most 12 reactions.").default([]),
  /** Pinned versions for species that appear only in the extra reactions (or inert species that carry heat in the adiabatic balance). */
  extraTerms: z.array(extraTermSchema).max(20, "Use at most 20 extra species.").default([]),
  /** Gas-phase model: ideal-gas activities (absent or "ideal"), or Peng–Robinson fugacity coefficients. */
  gas: z.enum(["ideal", "peng-robinson"], { error: "Pick ideal gas or Peng–Robinson." }).optional(),
  /** Adiabatic outlet: the feed's inlet temperature (K, or with a unit); null for none. */
  adiabaticInletK: z
    .union([z.number({ error: "Enter a temperature." }).positive(aboveZeroKSentence()), z.string().trim().min(1, "Enter a temperature.").max(40)])
    .nullable()
    .optional(),
  /** Feed species that take no part in any reaction and only ride along (N2(g) in a reformer). */
  inert: z.array(speciesKey).max(20, "Use at most 20 inert species.").default([]),
}).superRefine((v, ctx) => {
  // The panel's own checks, so the API refuses an unknown element, unit or a malformed line too.
  for (const k of Object.keys(v.feed)) {
    const bad = checkSpeciesKey(k);
    if (bad) ctx.addIssue({ code: "custom", path: ["feed", k], message: bad });
  }
  const unit = checkFeedUnit(v.feedUnit);
  if (unit) ctx.addIssue({ code: "custom", path: ["feedUnit"], message: unit });
  const pressure = checkPressure(v.pressure);
  if (pressure) ctx.addIssue({ code: "custom", path: ["pressure"], message: pressure });
  v.reactions.forEach((r, i) => {
    const bad = checkReactionLine(r);
    if (bad) ctx.addIssue({ code: "custom", path: ["reactions", i], message: bad });
  });
  if (!Object.values(v.feed).some((n) => n > 0)) ctx.addIssue({ code: "custom", path: ["feed"], message: "Give at least one species a positive amount." });
  if (v.key !== null && !(v.feed[v.key] > 0)) ctx.addIssue({ code: "custom", path: ["key"], message: "The key species needs an amount in the feed." });
});
export type CaseEquilibrium = z.infer<typeof caseEquilibriumSchema>;

/**
 * Feed keys must name a species of the case's reaction, of the extra reactions (their pinned
 * extraTerms), or a stated inert; anything else (a typo such as "C0(g)") is refused, one field
 * error per key. `reactionKeys` are the case's own term keys, formula(phase).
 */
export function feedKeyIssues(reactionKeys: readonly string[], eq: Pick<CaseEquilibrium, "feed" | "extraTerms" | "inert">): { path: (string | number)[]; message: string }[] {
  const known = new Set([...reactionKeys, ...eq.extraTerms.map((t) => (t.phase ? `${t.formula}(${t.phase})` : t.formula))]);
  const inert = new Set(eq.inert);
  const issues: { path: (string | number)[]; message: string }[] = [];
  for (const key of Object.keys(eq.feed)) {
    if (known.has(key) || inert.has(key)) continue;
    issues.push({ path: ["feed", key], message: `"${key}" is not a species of the reaction(s); list it as an inert species if it only rides along.` });
  }
  eq.inert.forEach((key, i) => {
    if (known.has(key)) issues.push({ path: ["inert", i], message: `"${key}" takes part in the reaction(s), so it cannot be inert.` });
    else if (!(key in eq.feed)) issues.push({ path: ["inert", i], message: `"${key}" has no amount in the feed.` });
  });
  return issues;
}
