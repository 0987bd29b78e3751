/** Case, review and comment shapes, shared by the builder form, the route handlers and the services. zod only. */
import { z } from "zod";
import { strictObject } from "@/lib/validation/strict";
import { aboveZeroKSentence, isAboveZeroK } from "@/lib/thermo/scales";
import { elementBalance, termKey } from "@/lib/cases/balance";
import { PHASE_NAME } from "@/lib/thermo/formula";
import { splitQuantity, toKelvin, toKelvinDifference, type Quantity } from "@/lib/cases/temperature";
import { caseEquilibriumSchema, feedKeyIssues } from "./equilibrium";
import { oneLine, searchText } from "./text";

export const CASE_STATUSES = ["draft", "submitted", "approved", "returned"] as const;
export type CaseStatus = (typeof CASE_STATUSES)[number];
export const DECISIONS = ["approved", "returned"] as const;
export type Decision = (typeof DECISIONS)[number];

/** Largest grid a case may ask for (the engine's own limit). */
export const MAX_CASE_POINTS = 100_000;

const quantity = z
  .union([z.number({ error: "Enter a number." }), z.string().trim().min(1, "Enter a temperature.")], {
    error: "Enter a temperature.",
  })
  .refine((q) => splitQuantity(q as Quantity) !== null, { error: "Use a number with K, degC or degF." });

export const termSchema = strictObject({
  formula: z.string({ error: "Pick a species." }).trim().min(1, "Pick a species.").max(60, "Use at most 60 characters."),
  phase: z.string().regex(PHASE_NAME, { error: 'Use a phase of "cr", "l" or "g", or none for the stable phase.' }).nullable(),
  coefficient: z
    .number({ error: "Enter a coefficient." })
    .refine((n) => n !== 0, { error: "A coefficient cannot be zero; remove the row instead." })
    .refine((n) => Math.abs(n) <= 1000, { error: "Use a coefficient between −1000 and 1000." }),
  versionId: z.number({ error: "Pick a model version." }).int({ error: "Pick a model version." }).positive({ error: "Pick a model version." }),
});
export type CaseTerm = z.infer<typeof termSchema>;

/*
 * Each temperature is checked on its own field, so every wrong field is flagged in one pass
 * (an object-level refinement would wait until every field had the right type).
 */
const absolute = quantity.superRefine((q, ctx) => {
  if (splitQuantity(q as Quantity) === null) return;
  const k = toKelvin(q as Quantity);
  if (!isAboveZeroK(k)) ctx.addIssue({ code: "custom", message: aboveZeroKSentence(k) });
});
const difference = quantity.superRefine((q, ctx) => {
  if (splitQuantity(q as Quantity) === null) return;
  if (!(toKelvinDifference(q as Quantity) > 0)) ctx.addIssue({ code: "custom", message: "The step must be positive." });
});

const spanSchema = strictObject({ fromK: absolute, toK: absolute, stepK: difference }).superRefine((v, ctx) => {
  const from = toKelvin(v.fromK as Quantity);
  const to = toKelvin(v.toK as Quantity);
  const step = toKelvinDifference(v.stepK as Quantity);
  if (from > 0 && to > 0 && to < from) ctx.addIssue({ code: "custom", path: ["toK"], message: "The span must end above where it starts." });
  if (step > 0 && to >= from && (to - from) / step + 2 > MAX_CASE_POINTS) {
    ctx.addIssue({ code: "custom", path: ["stepK"], message: `That gives more than ${MAX_CASE_POINTS} points; use a larger step.` });
  }
});
const listSchema = strictObject({ listK: z.array(absolute).min(1, "Enter at least one temperature.").max(MAX_CASE_POINTS, `Use at most ${MAX_CASE_POINTS} temperatures.`) });
export const caseTemperaturesSchema = z.union([spanSchema, listSchema], { error: "Give a span (from, to, step) or a list of temperatures." });

/** Each field of a case once, without defaults: a create fills the defaults in, a PATCH names only what changes. */
const caseFields = {
  title: oneLine(z.string({ error: "Give the case a title." }).trim().min(1, "Give the case a title.").max(160, "Use at most 160 characters.")),
  notes: z.string().trim().max(5000, "Use at most 5000 characters."),
  terms: z.array(termSchema).min(2, "A reaction needs at least two species.").max(20, "Use at most 20 species."),
  temperatures: caseTemperaturesSchema,
  referenceK: absolute,
  toleranceKJ: z.number({ error: "Enter a tolerance in kJ/mol." }).min(0, "The tolerance cannot be negative.").max(1000, "Use at most 1000 kJ/mol."),
  toleranceKFactor: z.number({ error: "Enter a factor above 1." }).gt(1, "A factor on K must be above 1.").max(1e6, "Use at most 1e6.").nullable(),
  /** How far the reaction goes from a feed (optional; see lib/validation/equilibrium.ts). */
  equilibrium: caseEquilibriumSchema.nullable(),
};

export const caseInputSchema = strictObject({
  ...caseFields,
  notes: caseFields.notes.default(""),
  referenceK: caseFields.referenceK.default(298.15),
  toleranceKJ: caseFields.toleranceKJ.default(1),
  toleranceKFactor: caseFields.toleranceKFactor.default(null),
  equilibrium: caseEquilibriumSchema.nullish(),
}).superRefine((v, ctx) => {
  const keys = new Set<string>();
  v.terms.forEach((t, i) => {
    const key = termKey(t);
    if (keys.has(key)) ctx.addIssue({ code: "custom", path: ["terms", i, "formula"], message: `${key} appears twice; combine the coefficients.` });
    keys.add(key);
  });
  if (v.terms.length >= 2 && !v.terms.some((t) => t.coefficient < 0))
    ctx.addIssue({ code: "custom", path: ["terms"], message: "Give at least one reactant a negative coefficient." });
  if (v.terms.length >= 2 && !v.terms.some((t) => t.coefficient > 0))
    ctx.addIssue({ code: "custom", path: ["terms"], message: "Give at least one product a positive coefficient." });
  // Rows without a species already say "Pick a species."; the balance waits for them.
  const balance = v.terms.every((t) => t.formula) ? elementBalance(v.terms) : null;
  if (balance && !balance.ok) ctx.addIssue({ code: "custom", path: ["terms"], message: balance.message });
  if (v.equilibrium) {
    for (const issue of feedKeyIssues(v.terms.map(termKey), v.equilibrium)) ctx.addIssue({ code: "custom", path: ["equilibrium", ...issue.path], message: issue.message });
  }
});
export type CaseInput = z.infer<typeof caseInputSchema>;
/** What a case stores as its inputs (title and notes live on the case row). */
export type CaseInputs = Omit<CaseInput, "title" | "notes">;

export const lockSchema = strictObject({ lockVersion: z.number({ error: "Send the lockVersion you loaded." }).int().min(0) });

/**
 * A PATCH names only what changes: every field is optional and a field the body leaves out
 * keeps its stored value (the saved equilibrium feed too); `equilibrium: null` clears it.
 * The service checks the merged case against caseInputSchema.
 */
export const caseUpdateSchema = strictObject({
  title: caseFields.title.optional(),
  notes: caseFields.notes.optional(),
  terms: caseFields.terms.optional(),
  temperatures: caseFields.temperatures.optional(),
  referenceK: caseFields.referenceK.optional(),
  toleranceKJ: caseFields.toleranceKJ.optional(),
  toleranceKFactor: caseFields.toleranceKFactor.optional(),
  equilibrium: caseFields.equilibrium.optional(),
  lockVersion: lockSchema.shape.lockVersion,
}).strict();
export type CaseUpdate = z.infer<typeof caseUpdateSchema>;

export const caseListQuerySchema = strictObject({
  status: z.enum(CASE_STATUSES, { error: "Use a status of draft, submitted, approved or returned." }).optional(),
  mine: z.enum(["1", "0"]).optional(),
});

export const decisionSchema = strictObject({
  decision: z.enum(DECISIONS, { error: "Decide approved or returned." }),
  reason: z.string().trim().max(2000, "Use at most 2000 characters.").default(""),
  /** The revision the reviewer looked at; a newer submission makes the decision stale. */
  revision: z.number().int().positive().optional(),
}).superRefine((v, ctx) => {
  if (v.decision === "returned" && v.reason.length < 5) {
    ctx.addIssue({ code: "custom", path: ["reason"], message: "Say what needs to change (at least 5 characters)." });
  }
});
export type DecisionInput = z.infer<typeof decisionSchema>;

export const commentSchema = strictObject({
  body: z.string({ error: "Write a comment." }).trim().min(1, "Write a comment.").max(4000, "Use at most 4000 characters."),
  revision: z.number().int().positive().optional(),
});
export type CommentInput = z.infer<typeof commentSchema>;

export const revisionParamSchema = z.coerce.number({ error: "Expected a revision number." }).int().positive("Expected a revision number.");
/** Without from/to: the last two revisions. */
export const diffQuerySchema = strictObject({ from: revisionParamSchema.optional(), to: revisionParamSchema.optional() });
export const exportQuerySchema = strictObject({
  revision: revisionParamSchema.optional(),
  /** Temperature column of the CSV: K (tK, the default), degC (tDegC) or degF (tDegF). */
  unit: z.enum(["K", "degC", "degF"], { error: "Use a unit of K, degC or degF." }).optional(),
});
const wholeNumber = (name: string, min: number, max: number) =>
  z.coerce
    .number({ error: `Expected a whole number for ${name}.` })
    .int(`Expected a whole number for ${name}.`)
    .min(min, `Use a ${name} from ${min} to ${max}.`)
    .max(max, `Use a ${name} from ${min} to ${max}.`);
/** Most points the drawing sample may ask for, and most rows of one table page. */
export const MAX_SAMPLE_POINTS = 5000;
export const MAX_PAGE_ROWS = 1000;
/**
 * GET …/results: `format=columns` gives `result.columns` instead of `result.points` (lib/thermo/columns.ts);
 * with it, `points` asks for the drawing sample and `offset` with `limit` for one page of rows (lib/cases/results-view.ts).
 */
export const resultsQuerySchema = strictObject({
  revision: revisionParamSchema.optional(),
  format: z.enum(["rows", "columns"]).optional(),
  points: wholeNumber("points", 2, MAX_SAMPLE_POINTS).optional(),
  offset: wholeNumber("offset", 0, MAX_CASE_POINTS).optional(),
  limit: wholeNumber("limit", 1, MAX_PAGE_ROWS).optional(),
}).superRefine((q, ctx) => {
  for (const name of ["points", "offset", "limit"] as const) {
    if (q[name] !== undefined && q.format !== "columns") ctx.addIssue({ code: "custom", path: [name], message: `${name} is only read with format=columns.` });
  }
  if ((q.offset === undefined) !== (q.limit === undefined)) {
    ctx.addIssue({ code: "custom", path: [q.offset === undefined ? "offset" : "limit"], message: "Give offset and limit together." });
  }
});
export const pinQuerySchema = strictObject({ formula: searchText(60).pipe(z.string().min(1)).optional() });
