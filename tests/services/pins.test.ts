/**
 * Pin options read a version's phases and range from the one description of its data
 * (lib/thermo/curve.ts), so segment limits stored as quantities ("25 degC") give kelvin, not NaN.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { createModel } from "@/lib/services/library";
import { inertCriticalConstants, listPinOptions, loadPins } from "@/lib/services/pins";
import { actorOf } from "../helpers/actors";
import { freshDatabase } from "../helpers/db";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

// Constant-Cp liquid and gas of an invented species; synthetic, invented for this test.
const data = {
  segments: [
    { phase: "l", form: "constant" as const, tminK: "25 degC", tmaxK: "100 degC", coeffs: { cpJ: 75 } },
    { phase: "g", form: "constant" as const, tminK: "100 degC", tmaxK: 1200, coeffs: { cpJ: 34 } },
  ],
  reference: { tK: 298.15, phase: "l", hkJ: -250, sJ: 70 },
};

describe("pin options", () => {
  it("a range stored with units reads in kelvin (0 °C = 273.15 K, common practice), phases in segment order", async () => {
    const sam = await actorOf("steward");
    const { version } = await createModel(sam, {
      species: { formula: "H2Se", displayName: "Test selenide" },
      name: "Quantity limits",
      version: { data, citation: "Synthetic, invented for this test" },
    });
    const option = (await listPinOptions(sam, { formula: "H2Se" })).find((o) => o.versionId === version.id)!;
    expect(option.phases).toEqual(["l", "g"]);
    expect(option.tminK).toBeCloseTo(298.15, 9);
    expect(option.tmaxK).toBe(1200);
    // The case's pin check sees the same phases.
    const [pin] = await loadPins(sam.teamId, [{ formula: "H2Se", phase: "g", coefficient: 1, versionId: version.id }]);
    expect(pin.versionId).toBe(version.id);
    await expect(loadPins(sam.teamId, [{ formula: "H2Se", phase: "cr", coefficient: 1, versionId: version.id }])).rejects.toMatchObject({
      status: 422,
      message: "terms.0.versionId: Quantity limits v1 has no cr phase (it has l, g).",
    });
  });

  it("inert feed keys lose their phase marker to find the species' critical constants", async () => {
    const sam = await actorOf("steward");
    const out = await inertCriticalConstants(sam.teamId, ["N2(g)", "N2"]);
    expect(Object.keys(out).sort()).toEqual(["N2", "N2(g)"]);
    expect(out["N2(g)"]).toEqual(out.N2);
  });
});
