/**
 * Text rules shared by every boundary. zod only, client-safe.
 * Titles and names are one line: a CR/LF (or any control character) in a title breaks
 * mail subjects, CSV exports and printed reports, so it is refused with a field error.
 * Search text is refused when it holds control characters (a NUL byte cannot reach SQL).
 */
import { z } from "zod";

const CONTROL = /[\u0000-\u001f\u007f\u2028\u2029]/;
export const hasControl = (s: string) => CONTROL.test(s);

export const ONE_LINE = "Use one line: no line breaks or control characters.";
export const SEARCH_CONTROL = "Search text cannot hold control characters (such as a NUL byte).";

/** A search box: trimmed, at most `max` characters, no control characters. */
export const searchText = (max = 80) =>
  z
    .string()
    .trim()
    .max(max, `Use at most ${max} characters.`)
    .refine((s) => !hasControl(s), SEARCH_CONTROL);

/** Refine an already-trimmed string schema to one line. */
export const oneLine = <T extends z.ZodString>(schema: T) => schema.refine((s) => !hasControl(s), ONE_LINE);
