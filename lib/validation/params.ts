import { z } from "zod";

/** A record id in a route segment (`/api/v1/cases/12`) or a form field: a positive integer. */
export const idParamSchema = z.coerce.number({ error: "Expected a numeric id." }).int().positive("Expected a numeric id.");
