/**
 * Requests for the engine pool's tests and `npm run bench:api` (synthetic, invented for
 * these tests): H2 + Cl2 → 2 HCl, every species with one invented Cp is an expression Cp form, so the cost grows
 * with the number of terms and the grid. Not chemistry; only the load matters.
 */
export function expressionRequest(terms: number, points: number) {
  const cp = ["29", ...Array.from({ length: terms }, (_, i) => `0.0001*T*${(i % 7) + 1}`)].join(" + ");
  const species = (hkJ: number) => ({
    segments: [{ phase: "g", form: "expression", tminK: 200, tmaxK: 2000, coeffs: { cp } }],
    reference: { tK: 298.15, phase: "g", hkJ, sJ: 200 },
  });
  return {
    reaction: "H2(g) + Cl2(g) = 2 HCl(g)",
    species: { "H2(g)": species(0), "Cl2(g)": species(0), "HCl(g)": species(-92.3) },
    temperatures: { fromK: 300, toK: Number((300 + (points - 1) * 0.01).toFixed(2)), stepK: 0.01 },
  };
}

/**
 * Heavy but allowed by the engine's budgets (docs/engine.md: nesting, integration work): an
 * expression of 40 terms on 10 000 temperatures, seconds of engine work.
 */
export const heavyRequest = () => expressionRequest(40, 10_000);

/** A small, quick request of the same shape. */
export const smallRequest = () => expressionRequest(1, 20);
