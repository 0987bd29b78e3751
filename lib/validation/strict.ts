/**
 * Every request object is strict: an unknown or misspelt field is refused (422), never ignored.
 * `strictObject` is z.strictObject with a message that names the unknown field and, when one is
 * close, the known field that was probably meant. zod only, client-safe.
 */
import { z } from "zod";

/** Edit distance (insertions, deletions, substitutions, adjacent swaps), case-insensitive. */
function distance(a: string, b: string): number {
  a = a.toLowerCase();
  b = b.toLowerCase();
  const d: number[][] = Array.from({ length: a.length + 1 }, (_, i) => [i, ...Array<number>(b.length).fill(0)]);
  for (let j = 1; j <= b.length; j++) d[0][j] = j;
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      d[i][j] = Math.min(d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d[i][j] = Math.min(d[i][j], d[i - 2][j - 2] + 1);
    }
  }
  return d[a.length][b.length];
}

/** The known name closest to `key`, when it is close enough to be a slip (at most a third of its letters off). */
export function nearestName(key: string, known: readonly string[]): string | null {
  let best: string | null = null;
  let bestD = Infinity;
  for (const k of known) {
    const dd = distance(key, k);
    if (dd < bestD) [best, bestD] = [k, dd];
  }
  return best !== null && bestD <= Math.max(1, Math.floor(Math.max(key.length, best.length) / 3)) ? best : null;
}

/** How every unknown-field message starts (forms show it in the banner, having no field for it). */
export const UNKNOWN_FIELD = "Unknown field";

/** The message for unknown fields of an object whose known fields are `known`. */
export function unknownFieldsMessage(keys: readonly string[], known: readonly string[]): string {
  const one = (k: string) => {
    const near = nearestName(k, known);
    return near ? `"${k}" (did you mean "${near}"?)` : `"${k}"`;
  };
  return keys.length === 1 ? `${UNKNOWN_FIELD} ${one(keys[0])}.` : `${UNKNOWN_FIELD}s ${keys.map(one).join(", ")}.`;
}

type RawIssue = { code: string; keys?: string[]; inst?: unknown };

/** zod error map for strict objects: names the unknown fields; any other issue keeps its own message. */
export function unknownFieldError(issue: RawIssue): string | undefined {
  if (issue.code !== "unrecognized_keys" || !issue.keys) return undefined;
  const shape = (issue.inst as { _zod?: { def?: { shape?: Record<string, unknown> } } } | undefined)?._zod?.def?.shape ?? {};
  return unknownFieldsMessage(issue.keys, Object.keys(shape));
}

/** A request object that refuses fields it does not know. Use it for every body, query and form. */
export function strictObject<T extends z.core.$ZodLooseShape>(shape: T) {
  return z.strictObject(shape, { error: unknownFieldError });
}
