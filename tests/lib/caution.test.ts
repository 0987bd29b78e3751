/**
 * The caution follows the gas model of the result it stands beside: ideal-gas activities, or
 * Peng–Robinson fugacity coefficients. The safety sentence is the same in both.
 */
import { renderToStaticMarkup } from "react-dom/server";
import { createElement } from "react";
import { describe, expect, it } from "vitest";
import { Caution } from "@/components/results/caution";
import { CAUTION_TEXT, cautionGasOf, cautionGasOfInputs, cautionText, equilibriumCautionText, noWarningsText } from "@/lib/cases/caution";

const SAFETY = "Decisions that affect safety follow the organisation's process-safety review, the applicable codes and licensed engineering judgement.";

describe("caution wording by gas model", () => {
  it("an ideal-gas result (or one without equilibrium) keeps the ideal-gas wording, word for word", () => {
    expect(CAUTION_TEXT).toBe(`Screening estimates for ideal standard states (1 bar, ideal-gas activities, pure condensed phases). ${SAFETY}`);
    expect(cautionText(cautionGasOf({}))).toBe(CAUTION_TEXT);
    expect(cautionText(cautionGasOf({ equilibriumInfo: { gas: "ideal" } }))).toBe(CAUTION_TEXT);
    expect(cautionGasOf(null)).toBe("ideal");
    expect(noWarningsText("ideal")).toBe("No warnings: every model is used inside its range, within the ideal-state assumptions (1 bar standard states, ideal-gas activities).");
    expect(equilibriumCautionText("ideal")).toContain("non-ideal gas behaviour at high pressure");
  });

  it("a Peng–Robinson result says its activities carry fugacity coefficients, not ideal-gas activities", () => {
    const gas = cautionGasOf({ equilibriumInfo: { gas: "peng-robinson" } });
    expect(gas).toBe("peng-robinson");
    expect(cautionGasOfInputs({ equilibrium: { gas: "peng-robinson" } })).toBe("peng-robinson");
    expect(cautionGasOfInputs({ equilibrium: null })).toBe("ideal");
    const text = cautionText(gas);
    expect(text).toContain("Peng–Robinson fugacity coefficients");
    expect(text).not.toContain("ideal-gas activities");
    expect(text.endsWith(SAFETY)).toBe(true);
    expect(noWarningsText(gas)).toContain("Peng–Robinson fugacity coefficients");
    expect(noWarningsText(gas)).not.toContain("ideal-gas activities");
    expect(equilibriumCautionText(gas)).toContain("beyond what the Peng–Robinson equation captures");
    expect(equilibriumCautionText(gas)).toContain("Carbon formation is judged only if a carbon-forming reaction is in the set.");
  });

  it("the component reads the same words as the plain text, for either gas model", () => {
    for (const gas of ["ideal", "peng-robinson"] as const) {
      const html = renderToStaticMarkup(createElement(Caution, { gas }));
      const text = html.replace(/<[^>]+>/g, "").replace(/&#x27;|&apos;/g, "'");
      expect(text).toBe(cautionText(gas));
    }
  });
});
