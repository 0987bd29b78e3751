import { describe, expect, it } from "vitest";
import { fieldErrorsOf } from "@/lib/cases/zod-errors";
import { caseInputSchema } from "@/lib/validation/cases";

// Synthetic inputs, invented for this test.
const base = {
  title: "Flagged together",
  notes: "",
  terms: [
    { formula: "H2O", phase: "l", coefficient: -1, versionId: 1 },
    { formula: "H2O", phase: "g", coefficient: 1, versionId: 2 },
  ],
  referenceK: 298.15,
  toleranceKJ: 1,
  toleranceKFactor: null,
};

describe("case inputs are checked in one pass", () => {
  it("flags From, To and Step together, even when another field has the wrong type", () => {
    const r = caseInputSchema.safeParse({
      ...base,
      terms: [base.terms[0], { ...base.terms[1], coefficient: Number.NaN }],
      temperatures: { fromK: "-300 degC", toK: "NaN degC", stepK: "0 degC" },
    });
    expect(r.success).toBe(false);
    const errors = fieldErrorsOf(r.error!.issues);
    expect(errors["temperatures.fromK"]).toBe("Temperatures must be above 0 K (this is -26.85 K).");
    expect(errors["temperatures.toK"]).toBe("Use a number with K, degC or degF.");
    expect(errors["temperatures.stepK"]).toBe("The step must be positive.");
    expect(errors["terms.1.coefficient"]).toBeDefined();
  });

  it("still checks the span as a whole and the reference temperature", () => {
    const r = caseInputSchema.safeParse({ ...base, referenceK: "-500 degF", temperatures: { fromK: 700, toK: 500, stepK: 10 } });
    const errors = fieldErrorsOf(r.error!.issues);
    expect(errors["temperatures.toK"]).toBe("The span must end above where it starts.");
    expect(errors.referenceK).toMatch(/^Temperatures must be above 0 K/);
    expect(caseInputSchema.safeParse({ ...base, temperatures: { fromK: 300, toK: 1e6, stepK: 1 } }).error!.issues[0].message).toContain("more than 100000 points");
    expect(caseInputSchema.safeParse({ ...base, temperatures: { fromK: "400 degC", toK: "900 degC", stepK: "10 degC" } }).success).toBe(true);
  });
});
