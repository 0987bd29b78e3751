/**
 * The one request schema shared by the engine, the route handler, the CLI and client forms.
 * Imports only zod, so a client component can use these shapes without pulling in the
 * unit parser (mathjs) or the fitter (numeric).
 */
import { z } from "zod";
import { PHASE_NAME } from "./formula";

/** Edit distance (insertions, deletions, substitutions), for "did you mean" suggestions. */
export function levenshtein(a: string, b: string): number {
  const prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    let diag = prev[0];
    prev[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const up = prev[j];
      prev[j] = Math.min(prev[j] + 1, prev[j - 1] + 1, diag + (a[i - 1] === b[j - 1] ? 0 : 1));
      diag = up;
    }
  }
  return prev[b.length];
}

/** The known name nearest to `name` (case-insensitive edit distance), or null when none is close. */
export function nearestName(name: string, known: readonly string[]): string | null {
  let best: string | null = null;
  let bestD = Infinity;
  for (const k of known) {
    const d = levenshtein(name.toLowerCase(), k.toLowerCase());
    if (d < bestD) {
      bestD = d;
      best = k;
    }
  }
  if (best === null) return null;
  const close = bestD <= Math.max(1, Math.floor(Math.max(name.length, best.length) / 3)) && bestD < Math.min(name.length, best.length);
  return close ? best : null;
}

/** `unknown field "presureBar" (did you mean "pressureBar"?)`, or the list of known fields when none is close. */
export function unknownFieldsMessage(keys: readonly string[], known: readonly string[]): string {
  return keys
    .map((k) => {
      const near = nearestName(k, known);
      return near ? `unknown field "${k}" (did you mean "${near}"?)` : `unknown field "${k}" (known fields: ${known.join(", ")})`;
    })
    .join("; ");
}

/** A strict object: an unknown field is refused, naming it and the nearest known name. */
function strict<T extends z.ZodRawShape>(shape: T) {
  const known = Object.keys(shape);
  return z.strictObject(shape, {
    error: (issue) => (issue.code === "unrecognized_keys" ? unknownFieldsMessage(issue.keys, known) : undefined),
  });
}

/** A number in the unit its field name carries (…K kelvin, …kJ kJ/mol, …J J/(mol·K)), or a string with a unit. */
export const quantitySchema = z.union([z.number(), z.string().trim().min(1)], {
  error: (issue) => (issue.input === undefined ? "required" : "expected a number or a string with a unit"),
});

/** `cr`, `l`, `g` or a named solid form `cr-name`. */
export const phaseSchema = z.string().regex(PHASE_NAME, { error: 'expected a phase: "cr", "l", "g" or "cr-name"' });

export const CP_FORMS = ["constant", "shomate", "nasa7", "nasa9", "maier-kelley", "power", "table", "expression"] as const;
export type CpForm = (typeof CP_FORMS)[number];

const range = { phase: phaseSchema, tminK: quantitySchema, tmaxK: quantitySchema };
const num = z.number({ error: "expected a finite number" });

export const segmentSchema = z.discriminatedUnion(
  "form",
  [
    strict({ ...range, form: z.literal("constant"), coeffs: strict({ cpJ: quantitySchema }) }),
    strict({
      ...range,
      form: z.literal("shomate"),
      coeffs: strict({ A: num, B: num, C: num, D: num, E: num, F: num, G: num, H: num }),
    }),
    strict({ ...range, form: z.literal("nasa7"), coeffs: z.array(num).length(7, { error: "expected 7 coefficients a1..a7" }) }),
    strict({
      ...range,
      form: z.literal("nasa9"),
      coeffs: z.array(num).length(9, { error: "expected 9 coefficients a1..a7, b1, b2" }),
    }),
    strict({ ...range, form: z.literal("maier-kelley"), coeffs: strict({ a: num, b: num, c: num }) }),
    strict({
      ...range,
      form: z.literal("power"),
      coeffs: strict({
        terms: z
          .array(
            strict({
              k: z.int({ error: "expected an integer exponent" }).min(-3, { error: "exponents run from -3 to 4" }).max(4, { error: "exponents run from -3 to 4" }),
              c: num,
            }),
          )
          .min(1, { error: "expected at least one term" }),
      }),
    }),
    strict({
      ...range,
      form: z.literal("table"),
      coeffs: strict({
        points: z.array(z.tuple([num, num])).min(2, { error: "expected at least two [tK, cpJ] points" }),
        interpolation: z.enum(["pchip", "linear"]).optional(),
      }),
    }),
    strict({ ...range, form: z.literal("expression"), coeffs: strict({ cp: z.string().trim().min(1) }) }),
  ],
  { error: `expected form to be one of ${CP_FORMS.join(", ")}` },
);

export const transitionSchema = strict({
  tK: quantitySchema,
  from: phaseSchema,
  to: phaseSchema,
  dHkJ: quantitySchema,
});

export const referenceSchema = strict({
  tK: quantitySchema,
  phase: phaseSchema,
  hkJ: quantitySchema,
  sJ: quantitySchema,
});

/** Standard uncertainties (1σ) of a species' data, from its model version. */
export const speciesUncertaintySchema = strict({
  dfHkJ: quantitySchema.optional(),
  sJ: quantitySchema.optional(),
  cpRelative: z.number({ error: "expected a finite number" }).nonnegative({ error: "an uncertainty must not be negative" }).optional(),
});

/** Critical constants for the real-gas equation of state: Tc (K), Pc (bar), acentric factor ω. */
export const criticalSchema = strict({
  tcK: z.number({ error: "expected a finite number" }).positive({ error: "a critical temperature must be above 0 K" }),
  pcBar: z.number({ error: "expected a finite number" }).positive({ error: "a critical pressure must be above 0 bar" }),
  omega: z.number({ error: "expected a finite number" }).min(-1, { error: "an acentric factor runs from -1 to 2" }).max(2, { error: "an acentric factor runs from -1 to 2" }),
});

/** Gas-phase models of the equilibrium: ideal-gas activities, or Peng–Robinson fugacity coefficients. */
export const GAS_MODELS = ["ideal", "peng-robinson"] as const;

export const speciesSchema = strict({
  segments: z.array(segmentSchema).min(1, { error: "expected at least one segment" }),
  transitions: z.array(transitionSchema).optional(),
  reference: referenceSchema.optional(),
  /** Standard pressure of the source (Pa when a bare number; "1 atm" is read). */
  standardPressurePa: quantitySchema.optional(),
  uncertainty: speciesUncertaintySchema.optional(),
  /** Normal boiling point (at 1 atm), K or a string with a unit; screens gas use below it (lib/thermo/condensation.ts). */
  boilingPointK: quantitySchema.optional(),
  /** Triple point, K or a string with a unit; below it the condensed phase is a solid. */
  triplePointK: quantitySchema.optional(),
  critical: criticalSchema.optional(),
});

export const temperaturesSchema = z.union(
  [
    strict({ fromK: quantitySchema, toK: quantitySchema, stepK: quantitySchema }),
    strict({ listK: z.array(quantitySchema).min(1, { error: "expected at least one temperature" }) }),
  ],
  {
    error: (issue) => {
      const input = issue.input;
      if (input === undefined) return "required";
      if (input && typeof input === "object" && !Array.isArray(input)) {
        const keys = Object.keys(input);
        const known = ["fromK", "toK", "stepK", "listK"];
        const unknown = keys.filter((k) => !known.includes(k));
        if (unknown.length > 0) return unknownFieldsMessage(unknown, known);
        if (keys.includes("listK") && keys.some((k) => k !== "listK")) {
          return "give either listK or fromK, toK and stepK, not both";
        }
      }
      return "expected {fromK, toK, stepK} or {listK: [...]}";
    },
  },
);

/** Units of the equilibrium feed: amounts, amount rates, and masses converted through each species' molar mass. */
export const FEED_UNITS = ["mol", "kmol", "mol/s", "kmol/s", "kmol/h", "g", "kg", "kg/h", "t/h"] as const;
export type FeedUnit = (typeof FEED_UNITS)[number];

export const evaluateRequestSchema = strict({
  reaction: z.string().trim().min(1, { error: "expected a reaction" }),
  species: z.record(z.string(), speciesSchema),
  temperatures: temperaturesSchema,
  referenceK: quantitySchema.optional(),
  toleranceKJ: quantitySchema.optional(),
  toleranceKFactor: z.number().gt(1, { error: "expected a factor above 1" }).optional(),
  include: z.array(z.enum(["species", "contributions"])).optional(),
  /** Operating pressure, used only for the `high-pressure` warning (K stays the ideal-gas, 1 bar one). */
  pressureBar: quantitySchema.optional(),
  equilibrium: strict({
    /** Feed amounts per species key, in `feedUnit` (default "mol") when bare numbers, or strings with a unit of the set. */
    feed: z.record(
      z.string(),
      z.union([z.number().nonnegative({ error: "expected an amount of 0 or more" }), z.string().trim().min(1)], {
        error: 'expected an amount (a number of 0 or more, or a string such as "2 kmol/h")',
      }),
    ),
    // A string in the input type (case forms store free text); the engine takes only the closed set.
    feedUnit: z
      .string({ error: `expected one of ${FEED_UNITS.join(", ")}` })
      .trim()
      .refine((v) => (FEED_UNITS as readonly string[]).includes(v), { error: `expected one of ${FEED_UNITS.join(", ")}` })
      .optional(),
    /** Total pressure; bar when a bare number (default 1 bar). */
    pressureBar: quantitySchema.optional(),
    /** Species whose conversion is reported; default the first reactant of the first reaction present in the feed. */
    key: z.string().trim().min(1).optional(),
    /** A simultaneous set; without it the request's `reaction`. */
    reactions: z
      .array(z.string().trim().min(1, { error: "expected a reaction" }))
      .min(1, { error: "expected at least one reaction" })
      .max(12, { error: "at most 12 reactions" })
      .optional(),
    /** Gas-phase model (default "ideal"). */
    gas: z.enum(GAS_MODELS, { error: 'expected "ideal" or "peng-robinson"' }).optional(),
    /** Critical constants of inert feed species that have no entry in species. */
    critical: z.record(z.string(), criticalSchema).optional(),
    /** Binary interaction parameters of the van der Waals mixing rule (0 for a pair not listed). */
    kij: z
      .array(
        strict({
          species: z.tuple([z.string().trim().min(1), z.string().trim().min(1)]),
          value: z.number({ error: "expected a finite number" }).min(-1, { error: "k_ij runs from -1 to 1" }).max(1, { error: "k_ij runs from -1 to 1" }),
        }),
      )
      .max(300, { error: "at most 300 pairs" })
      .optional(),
  }).optional(),
  /** Adiabatic outlet temperature of the equilibrium feed entering at inletK. */
  adiabatic: strict({ inletK: quantitySchema }).optional(),
});

export type EvaluateRequest = z.input<typeof evaluateRequestSchema>;
export type SpeciesInput = z.input<typeof speciesSchema>;
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
