/**
 * Library request shapes, shared by the API handlers, the services and the client forms.
 * Imports only zod and the engine's zod-only schema module, so client components may use it.
 */
import { z } from "zod";
import { strictObject } from "@/lib/validation/strict";
import { aboveZeroKSentence } from "@/lib/thermo/scales";
import { CP_FORMS, FIT_FORMS, phaseSchema, speciesSchema } from "@/lib/thermo/schema";
import { hasControl, ONE_LINE, oneLine, searchText } from "./text";

export const VERSION_STATUS_FILTERS = ["current", "approved", "proposed", "draft", "rejected", "superseded", "all"] as const;

/** Data families of the seeded reference library, and the team's own. */
export const FAMILY_LABELS: Record<string, string> = {
  "nasa7-2015": "NASA-7, third-millennium (2015)",
  "nasa7-gri30": "NASA-7, GRI-Mech 3.0",
  "shomate-janaf": "Shomate, NIST-JANAF fit",
  measured: "Fitted to measured data",
  custom: "Team model",
};

const text = (max: number, what: string) =>
  z
    .string({ error: `Enter ${what}.` })
    .trim()
    .min(1, `Enter ${what}.`)
    .max(max, `Use at most ${max} characters.`);
/** A name or title: one line. */
const line = (max: number, what: string) => oneLine(text(max, what));

export const listModelsQuerySchema = strictObject({
  q: searchText(80).optional().default(""),
  phase: z
    .union([z.literal(""), phaseSchema])
    .optional()
    .default(""),
  form: z
    .union([z.literal(""), z.enum(CP_FORMS, { error: `Choose a form: ${CP_FORMS.join(", ")}.` })])
    .optional()
    .default(""),
  status: z
    .enum(VERSION_STATUS_FILTERS, { error: `Choose a status: ${VERSION_STATUS_FILTERS.join(", ")}.` })
    .optional()
    .default("current"),
  scope: z.enum(["all", "reference", "team"], { error: "Choose a scope: all, reference or team." }).optional().default("all"),
  page: z.coerce.number({ error: "Expected a page number." }).int().min(1, "Pages start at 1.").optional().default(1),
  pageSize: z.coerce.number({ error: "Expected a page size." }).int().min(1).max(100, "At most 100 per page.").optional().default(20),
});
export type ListModelsQuery = z.infer<typeof listModelsQuerySchema>;

export const listSpeciesQuerySchema = strictObject({
  q: searchText(80).optional().default(""),
  page: z.coerce.number().int().min(1, "Pages start at 1.").optional().default(1),
  pageSize: z.coerce.number().int().min(1).max(100, "At most 100 per page.").optional().default(50),
});

export const formulaSchema = z
  .string({ error: "Enter a formula." })
  .trim()
  .min(1, "Enter a formula.")
  .max(60, "Use at most 60 characters.")
  .regex(/^[A-Za-z0-9().[\]]+$/, "Use element symbols, counts and brackets only, like NiAl2O4.");

export const createSpeciesSchema = strictObject({
  formula: formulaSchema,
  displayName: line(120, "a display name"),
});
export type CreateSpeciesInput = z.infer<typeof createSpeciesSchema>;

export const uncertaintySchema = strictObject({
  dfHkJ: z.number().nonnegative("An uncertainty cannot be negative.").optional(),
  sJ: z.number().nonnegative("An uncertainty cannot be negative.").optional(),
  cpRelative: z.number().nonnegative("An uncertainty cannot be negative.").max(1, "Give a fraction, e.g. 0.005 for 0.5 %.").optional(),
})
  .nullable()
  .optional();

/** What a steward types into the editor: the engine's species entry plus the record around it. */
export const versionInputSchema = strictObject({
  data: speciesSchema,
  citation: text(2000, "a citation (where the numbers come from)"),
  uncertainty: uncertaintySchema,
  changeNote: z.string().trim().max(2000, "Use at most 2000 characters.").nullable().optional(),
});
export type VersionInput = z.input<typeof versionInputSchema>;

export const editVersionSchema = versionInputSchema.partial().extend({
  lockVersion: z.number({ error: "Send the lockVersion you edited." }).int().nonnegative(),
});
export type EditVersionInput = z.input<typeof editVersionSchema>;

export const createModelSchema = strictObject({
  speciesId: z.number().int().positive().optional(),
  species: createSpeciesSchema.optional(),
  name: line(160, "a model name"),
  family: z.string().trim().min(1).max(40).optional().default("custom"),
  variant: oneLine(z.string().trim().max(40)).nullable().optional(),
  version: versionInputSchema,
}).refine((v) => v.speciesId !== undefined || v.species !== undefined, { message: "Choose a species or enter a new one.", path: ["speciesId"] });
export type CreateModelInput = z.input<typeof createModelSchema>;

export const newVersionSchema = z.union([strictObject({ fromVersionId: z.number().int().positive() }), versionInputSchema]);

export const rejectSchema = strictObject({
  reason: z.string({ error: "Give a reason for the author." }).trim().min(3, "Give a reason for the author.").max(2000, "Use at most 2000 characters."),
});
export const approveSchema = strictObject({ note: z.string().trim().max(2000).optional() });

export const PREVIEW_MAX_POINTS = 400;
export const previewSchema = strictObject({
  /** Validated by the engine, which names the field that is wrong. */
  data: z.unknown(),
  fromK: z.number().positive(aboveZeroKSentence()).optional(),
  toK: z.number().positive(aboveZeroKSentence()).optional(),
  points: z.number().int().min(2).max(PREVIEW_MAX_POINTS).optional(),
  phase: phaseSchema.optional(),
});
export type PreviewInput = z.infer<typeof previewSchema>;

// ------------------------------------------------------------------ datasets

export const DATASET_MAX_BYTES = 1024 * 1024;
export const DATASET_MAX_ROWS = 5000;
export const T_UNITS = ["K", "degC", "degF"] as const;
export const CP_UNITS = ["J/(mol*K)", "kJ/(mol*K)", "cal/(mol*K)"] as const;
export const T_UNIT_LABELS: Record<(typeof T_UNITS)[number], string> = { K: "K", degC: "°C", degF: "°F" };
export const CP_UNIT_LABELS: Record<(typeof CP_UNITS)[number], string> = {
  "J/(mol*K)": "J/(mol·K)",
  "kJ/(mol*K)": "kJ/(mol·K)",
  "cal/(mol*K)": "cal/(mol·K) (thermochemical)",
};

export const datasetUploadSchema = strictObject({
  name: line(160, "a name for the dataset"),
  filename: z.string().trim().max(255).nullable().optional(),
  text: z.string({ error: "Choose a file or paste the data." }).min(1, "Choose a file or paste the data."),
  /** Units when the header does not say; "" = read them from the header. */
  tUnit: z
    .union([z.literal(""), z.enum(T_UNITS)])
    .optional()
    .default(""),
  cpUnit: z
    .union([z.literal(""), z.enum(CP_UNITS)])
    .optional()
    .default(""),
  speciesId: z.number().int().positive().nullable().optional(),
  /** A new team species, when the measured solid is not in the library yet. */
  species: createSpeciesSchema.optional(),
  /** The phase measured; the fit defaults to it. */
  phase: phaseSchema.nullable().optional(),
});
export type DatasetUploadInput = z.input<typeof datasetUploadSchema>;

const positiveK = z.number({ error: "Enter a temperature in K." }).positive(aboveZeroKSentence());

export const fitParamsSchema = strictObject({
  form: z.enum(FIT_FORMS, { error: `Choose a form to fit: ${FIT_FORMS.join(", ")}.` }),
  tminK: positiveK.optional(),
  tmaxK: positiveK.optional(),
  exponents: z.array(z.int().min(-3).max(4)).optional(),
  /** Without it: the dataset's phase, else the species' one phase; never a silent "cr". */
  phase: phaseSchema.optional(),
  reference: strictObject({ tK: positiveK.optional(), hkJ: z.number({ error: "Enter H in kJ/mol." }), sJ: z.number({ error: "Enter S in J/(mol·K)." }) }).optional(),
}).refine((v) => v.tminK === undefined || v.tmaxK === undefined || v.tminK < v.tmaxK, { message: "The lower limit must be below the upper one.", path: ["tmaxK"] });
export type FitParams = z.input<typeof fitParamsSchema>;

export const saveFitSchema = strictObject({
  fit: fitParamsSchema,
  modelId: z.number().int().positive().optional(),
  modelName: oneLine(z.string().trim().max(160)).optional(),
  citation: text(2000, "a citation (where the measurements come from)"),
  changeNote: z.string().trim().max(2000).nullable().optional(),
});
export type SaveFitInput = z.input<typeof saveFitSchema>;

// ------------------------------------------------------------------ export / import

export const EXPORT_FORMAT = "heatpath.cp-library";
export const EXPORT_FORMAT_VERSION = 1;

export const exportedVersionSchema = strictObject({
  versionNumber: z.number().int().positive(),
  status: z.string(),
  data: speciesSchema,
  citation: z.string().min(1, "Every version needs a citation."),
  uncertainty: uncertaintySchema,
  changeNote: z.string().nullable().optional(),
});

export const exportedModelSchema = strictObject({
  species: strictObject({
    formula: formulaSchema,
    displayName: z
      .string()
      .min(1)
      .refine((s) => !hasControl(s), ONE_LINE),
  }),
  name: z
    .string()
    .min(1)
    .refine((s) => !hasControl(s), ONE_LINE),
  family: z.string().min(1).max(40),
  variant: z.string().max(40).nullable().optional(),
  versions: z.array(exportedVersionSchema).min(1, "A model needs at least one version."),
});

export const exportFileSchema = strictObject({
  format: z.literal(EXPORT_FORMAT, { error: `Not a Heatpath library file: "format" must be "${EXPORT_FORMAT}".` }),
  formatVersion: z.literal(EXPORT_FORMAT_VERSION, { error: `Unsupported formatVersion: this Heatpath reads version ${EXPORT_FORMAT_VERSION}.` }),
  exportedAt: z.string().optional(),
  models: z.array(exportedModelSchema).min(1, "The file holds no models.").max(500, "At most 500 models per file."),
});
export type ExportFile = z.infer<typeof exportFileSchema>;

export const exportQuerySchema = strictObject({
  /** Comma-separated model ids; empty = every model visible with an approved version. */
  models: z
    .string()
    .optional()
    .default("")
    .transform((s, ctx) => {
      const ids = s
        .split(",")
        .map((x) => x.trim())
        .filter(Boolean)
        .map(Number);
      if (ids.some((n) => !Number.isInteger(n) || n <= 0)) {
        ctx.addIssue({ code: "custom", message: "Give model ids separated by commas." });
        return z.NEVER;
      }
      return ids;
    }),
  /** "approved" (default) exports the approved version of each model; "all" every visible version. */
  versions: z.enum(["approved", "all"]).optional().default("approved"),
});
