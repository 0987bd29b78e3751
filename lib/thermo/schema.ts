/**
 * The one request schema shared by the engine, the route handler, the CLI and client forms.
 * Imports only zod, so a client component can use these shapes without pulling in the
 * unit parser (mathjs) or the fitter (numeric).
 */
import { z } from "zod";

/** A number in the unit its field name carries (…K kelvin, …kJ kJ/mol, …J J/(mol·K)), or a string with a unit. */
export const quantitySchema = z.union([z.number(), z.string().trim().min(1)], {
  error: (issue) => (issue.input === undefined ? "required" : "expected a number or a string with a unit"),
});

/** `cr`, `l`, `g` or a named solid form `cr-name`. */
export const phaseSchema = z
  .string()
  .regex(/^(cr(-[A-Za-z0-9_.]+)?|l|g)$/, { error: 'expected a phase: "cr", "l", "g" or "cr-name"' });

export const CP_FORMS = [
  "constant",
  "shomate",
  "nasa7",
  "nasa9",
  "maier-kelley",
  "power",
  "table",
  "expression",
] as const;
export type CpForm = (typeof CP_FORMS)[number];

const range = { phase: phaseSchema, tminK: quantitySchema, tmaxK: quantitySchema };
const num = z.number({ error: "expected a finite number" });

export const segmentSchema = z.discriminatedUnion(
  "form",
  [
    z.object({ ...range, form: z.literal("constant"), coeffs: z.object({ cpJ: quantitySchema }) }),
    z.object({
      ...range,
      form: z.literal("shomate"),
      coeffs: z.object({ A: num, B: num, C: num, D: num, E: num, F: num, G: num, H: num }),
    }),
    z.object({ ...range, form: z.literal("nasa7"), coeffs: z.array(num).length(7, { error: "expected 7 coefficients a1..a7" }) }),
    z.object({
      ...range,
      form: z.literal("nasa9"),
      coeffs: z.array(num).length(9, { error: "expected 9 coefficients a1..a7, b1, b2" }),
    }),
    z.object({ ...range, form: z.literal("maier-kelley"), coeffs: z.object({ a: num, b: num, c: num }) }),
    z.object({
      ...range,
      form: z.literal("power"),
      coeffs: z.object({
        terms: z
          .array(
            z.object({
              k: z.int({ error: "expected an integer exponent" }).min(-3, { error: "exponents run from -3 to 4" }).max(4, { error: "exponents run from -3 to 4" }),
              c: num,
            }),
          )
          .min(1, { error: "expected at least one term" }),
      }),
    }),
    z.object({
      ...range,
      form: z.literal("table"),
      coeffs: z.object({
        points: z.array(z.tuple([num, num])).min(2, { error: "expected at least two [tK, cpJ] points" }),
        interpolation: z.enum(["pchip", "linear"]).optional(),
      }),
    }),
    z.object({ ...range, form: z.literal("expression"), coeffs: z.object({ cp: z.string().trim().min(1) }) }),
  ],
  { error: `expected form to be one of ${CP_FORMS.join(", ")}` },
);

export const transitionSchema = z.object({
  tK: quantitySchema,
  from: phaseSchema,
  to: phaseSchema,
  dHkJ: quantitySchema,
});

export const referenceSchema = z.object({
  tK: quantitySchema,
  phase: phaseSchema,
  hkJ: quantitySchema,
  sJ: quantitySchema,
});

/** Standard uncertainties (1σ) of a species' data, from its model version. */
export const speciesUncertaintySchema = z.object({
  dfHkJ: quantitySchema.optional(),
  sJ: quantitySchema.optional(),
  cpRelative: z.number({ error: "expected a finite number" }).nonnegative({ error: "an uncertainty must not be negative" }).optional(),
});

export const speciesSchema = z.object({
  segments: z.array(segmentSchema).min(1, { error: "expected at least one segment" }),
  transitions: z.array(transitionSchema).optional(),
  reference: referenceSchema.optional(),
  standardPressurePa: z.number().positive().optional(),
  uncertainty: speciesUncertaintySchema.optional(),
  /** Normal boiling point (at 1 atm), K or a string with a unit; screens gas use below it (lib/thermo/condensation.ts). */
  boilingPointK: quantitySchema.optional(),
  /** Triple point, K or a string with a unit; below it the condensed phase is a solid. */
  triplePointK: quantitySchema.optional(),
});

export const temperaturesSchema = z.union(
  [
    z.object({ fromK: quantitySchema, toK: quantitySchema, stepK: quantitySchema }),
    z.object({ listK: z.array(quantitySchema).min(1, { error: "expected at least one temperature" }) }),
  ],
  { error: (issue) => (issue.input === undefined ? "required" : "expected {fromK, toK, stepK} or {listK: [...]}") },
);

export const evaluateRequestSchema = z.object({
  reaction: z.string().trim().min(1, { error: "expected a reaction" }),
  species: z.record(z.string(), speciesSchema),
  temperatures: temperaturesSchema,
  referenceK: quantitySchema.optional(),
  toleranceKJ: z.number().nonnegative().optional(),
  toleranceKFactor: z.number().gt(1, { error: "expected a factor above 1" }).optional(),
  include: z.array(z.enum(["species", "contributions"])).optional(),
  /** Operating pressure, used only for the `high-pressure` warning (K stays the ideal-gas, 1 bar one). */
  pressureBar: quantitySchema.optional(),
  equilibrium: z
    .object({
      /** Feed amounts per species key, in one unit of amount (`feedUnit`, default "mol"). */
      feed: z.record(
        z.string(),
        z.number({ error: "expected a finite number" }).nonnegative({ error: "expected an amount of 0 or more" }),
      ),
      feedUnit: z.string().trim().min(1).max(24).optional(),
      /** Total pressure; bar when a bare number (default 1 bar). */
      pressureBar: quantitySchema.optional(),
      /** Species whose conversion is reported; default the first reactant of the first reaction present in the feed. */
      key: z.string().trim().min(1).optional(),
      /** A simultaneous set; without it the request's `reaction`. */
      reactions: z.array(z.string().trim().min(1, { error: "expected a reaction" })).min(1, { error: "expected at least one reaction" }).max(12, { error: "at most 12 reactions" }).optional(),
    })
    .optional(),
});

export type EvaluateRequest = z.input<typeof evaluateRequestSchema>;
export type SpeciesInput = z.input<typeof speciesSchema>;
export type EquilibriumRequest = z.input<typeof evaluateRequestSchema>["equilibrium"];
export type SegmentInput = z.input<typeof segmentSchema>;
export type ParsedSpecies = z.output<typeof speciesSchema>;
export type ParsedSegment = z.output<typeof segmentSchema>;

/** A number that may be NaN or infinite, so that the fitter can refuse it with its own message. */
const anyNumber = z.custom<number>((v) => typeof v === "number", { error: "expected a number" });

export const FIT_FORMS = ["shomate", "nasa7", "maier-kelley", "power"] as const;

export const fitRequestSchema = z.object({
  form: z.enum(FIT_FORMS),
  points: z.array(z.object({ tK: anyNumber, cpJ: anyNumber, sigmaJ: anyNumber.optional() })),
  /** Exponents for the `power` form, integers from −3 to 4. */
  exponents: z.array(z.int().min(-3).max(4)).optional(),
  phase: phaseSchema.optional(),
  /** ΔfH° (kJ/mol) and S° (J/(mol·K)) at tK, for the integration constants. */
  reference: z.object({ tK: z.number().positive().optional(), hkJ: z.number(), sJ: z.number() }).optional(),
});
export type FitRequest = z.input<typeof fitRequestSchema>;

/** Per-parse error map: a missing field says so plainly. */
export const missingIsRequired = (issue: { code?: string; input?: unknown }): string | undefined =>
  issue.code === "invalid_type" && issue.input === undefined ? "required" : undefined;

/** One-line description of the first problem zod found, naming the field path. */
export function describeIssue(issue: { path: PropertyKey[]; message: string }): string {
  return `${formatPath(issue.path) || "request"}: ${issue.message}`;
}

export function formatPath(path: readonly PropertyKey[]): string {
  let out = "";
  for (const key of path) {
    if (typeof key === "number") out += `[${key}]`;
    else if (typeof key === "string" && /^[A-Za-z_$][\w$]*$/.test(key)) out += out ? `.${key}` : key;
    else out += `[${JSON.stringify(String(key))}]`;
  }
  return out;
}
