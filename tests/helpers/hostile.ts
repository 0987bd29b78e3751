import fc from "fast-check";

/** Strings a careless parser trips on: formulas for spreadsheets, path tricks, odd Unicode, markup. */
export const nastyString = fc.oneof(
  fc.string(),
  fc.string({ unit: "grapheme", maxLength: 40 }),
  fc.constantFrom(
    "=HYPERLINK(\"http://evil.example.test\")",
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

/** Raw JSON text (or not-JSON) that is wrong in one of many ways, around a loosely right shape. */
export function hostileBody(shape: Record<string, fc.Arbitrary<unknown>>): fc.Arbitrary<string> {
  const mutated = fc.record(
    Object.fromEntries(Object.entries(shape).map(([k, a]) => [k, fc.oneof(a, nastyString, numberish, fc.constant(null), fc.anything())])),
    { requiredKeys: [] },
  );
  return fc.oneof(
    mutated.map((v) => JSON.stringify(v)),
    fc.anything().map((v) => JSON.stringify(v) ?? "null"),
    fc.constantFrom("NaN", "Infinity", "-Infinity", "{\"a\": NaN}", "{\"fromK\": 1e999}", "", "{", "}", "[]", "null", "\"\"", "{\"__proto__\": {\"polluted\": true}}", "{\"constructor\": {\"prototype\": {\"x\": 1}}}"),
    fc.integer({ min: 1000, max: 20000 }).map((depth) => "[".repeat(depth) + "]".repeat(depth)),
    fc.integer({ min: 100, max: 3000 }).map((depth) => "{\"a\":".repeat(depth) + "1" + "}".repeat(depth)),
    fc.string({ unit: "binary" }),
  );
}
