/**
 * Critical constants of a team species (PATCH /api/v1/species/:id and the species page's form).
 * zod only, client-safe. The ranges are wide enough for any process gas and refuse slips:
 * Tc and Pc above zero and at most 5000 (K, bar), the acentric factor from −1 to 2 (as the
 * engine's own check, lib/thermo/schema.ts), every number finite.
 */
import { z } from "zod";
import { strictObject } from "@/lib/validation/strict";
import { oneLine } from "./text";

// zod 4 numbers refuse NaN and ±Infinity by themselves.
const finite = (what: string) => z.number({ error: `Enter ${what} as a number.` });

const CRITICAL_LIMITS = { tcK: 5000, pcBar: 5000, omegaMin: -1, omegaMax: 2 } as const;

const tcK = finite("the critical temperature")
  .gt(0, "A critical temperature must be above 0 K.")
  .max(CRITICAL_LIMITS.tcK, `A critical temperature above ${CRITICAL_LIMITS.tcK} K is not plausible.`);
const pcBar = finite("the critical pressure")
  .gt(0, "A critical pressure must be above 0 bar.")
  .max(CRITICAL_LIMITS.pcBar, `A critical pressure above ${CRITICAL_LIMITS.pcBar} bar is not plausible.`);
const omega = finite("the acentric factor")
  .min(CRITICAL_LIMITS.omegaMin, `An acentric factor runs from ${CRITICAL_LIMITS.omegaMin} to ${CRITICAL_LIMITS.omegaMax}.`)
  .max(CRITICAL_LIMITS.omegaMax, `An acentric factor runs from ${CRITICAL_LIMITS.omegaMin} to ${CRITICAL_LIMITS.omegaMax}.`);
const citation = oneLine(z.string({ error: "Name the source of the constants." }).trim().min(1, "Name the source of the constants.").max(300, "Use at most 300 characters."));

const criticalConstantsSchema = strictObject({ tcK, pcBar, omega, citation });

/** The body of PATCH /api/v1/species/:id: the constants with their source, or null to remove them. */
export const speciesPatchSchema = strictObject({ critical: criticalConstantsSchema.nullable() });
export type SpeciesPatchInput = z.infer<typeof speciesPatchSchema>;

/** A number typed into the form: blank is "missing", not 0. */
const typed = (inner: z.ZodType<number>) => z.preprocess((v) => (typeof v === "string" && v.trim() !== "" ? Number(v.trim()) : undefined), inner);

/** The species page's form (strings), its own id field included. */
export const criticalFormSchema = strictObject({
  speciesId: z.string({ error: "Expected a numeric id." }),
  tcK: typed(tcK),
  pcBar: typed(pcBar),
  omega: typed(omega),
  citation,
});
/** The form's remove button: the id only. */
export const criticalRemoveFormSchema = strictObject({ speciesId: z.string({ error: "Expected a numeric id." }) });
