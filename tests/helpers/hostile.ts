import fc from "fast-check";
import { expect } from "vitest";
import { signInAs, type Who } from "./actors";
import { databaseChecksum } from "./checksum";
import { bodyOf, ctx, jsonRequest } from "./request";

export type Handler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;

/** Strings a careless parser trips on: formulas for spreadsheets, path tricks, odd Unicode, markup. */
export const nastyString = fc.oneof(
  fc.string(),
  fc.string({ unit: "grapheme", maxLength: 40 }),
  fc.constantFrom(
    '=HYPERLINK("http://evil.example.test")',
    "+cmd|' /C calc'!A0",
    "-2+3",
    "@SUM(1)",
    "../../../etc/passwd",
    "..\\..\\windows\\system32",
    "\u0000",
    "\u202e\u0645\u0631\u062d\u0628\u0627",
    "𝔥𝔢𝔞𝔱",
    "<script>alert(1)</script>",
    "'; DROP TABLE users; --",
    "%00%2e%2e%2f",
  ),
  fc.integer({ min: 1000, max: 60000 }).map((n) => "x".repeat(n)),
);

const numberish = fc.oneof(fc.double(), fc.integer(), fc.constantFrom(1e308, -1e308, 0, -0, -273.15, -1, 2 ** 53 + 1));

/**
 * Raw JSON text (or not-JSON) that is wrong in one of many ways, around a loosely right shape.
 * With `exact`, field values come only from the given arbitraries (for fields where a random
 * string could be a valid answer, such as a free-text reason).
 */
export function hostileBody(shape: Record<string, fc.Arbitrary<unknown>>, options: { exact?: boolean } = {}): fc.Arbitrary<string> {
  const mutated = fc.record(
    Object.fromEntries(Object.entries(shape).map(([k, a]) => [k, options.exact ? a : fc.oneof(a, nastyString, numberish, fc.constant(null), fc.anything())])),
    { requiredKeys: [] },
  );
  return fc.oneof(
    mutated.map((v) => JSON.stringify(v)),
    fc
      .anything()
      .filter((v) => typeof v !== "object" || v === null || Array.isArray(v))
      .map((v) => JSON.stringify(v) ?? "null"),
    fc.constantFrom(
      "NaN",
      "Infinity",
      "-Infinity",
      '{"a": NaN}',
      '{"fromK": 1e999}',
      "",
      "{",
      "}",
      "[]",
      "null",
      '""',
      '{"__proto__": {"polluted": true}}',
      '{"constructor": {"prototype": {"x": 1}}}',
    ),
    fc.integer({ min: 1000, max: 20000 }).map((depth) => "[".repeat(depth) + "]".repeat(depth)),
    fc.integer({ min: 100, max: 3000 }).map((depth) => '{"a":'.repeat(depth) + "1" + "}".repeat(depth)),
    fc.string({ unit: "binary" }),
  );
}

/** Send each generated body; every answer must be a 4xx in the error shape, and the database must not change. */
export async function hammer(name: string, who: Who, handler: Handler, url: string, method: string, params: Record<string, string>, body: fc.Arbitrary<string>, runs = 300) {
  await signInAs(who);
  const before = await databaseChecksum();
  const seen = new Map<number, number>();
  await fc.assert(
    fc.asyncProperty(body, async (text) => {
      const response = await handler(jsonRequest(method, url, text), ctx(params));
      seen.set(response.status, (seen.get(response.status) ?? 0) + 1);
      expect(response.status, `${name}: ${text.slice(0, 200)}`).toBeGreaterThanOrEqual(400);
      expect(response.status, `${name}: ${text.slice(0, 200)}`).toBeLessThan(500);
      expect(await bodyOf(response)).toMatchObject({ error: { code: expect.any(String), message: expect.any(String) } });
    }),
    { numRuns: runs, seed: 20261201 },
  );
  expect(await databaseChecksum()).toBe(before);
  return seen;
}
