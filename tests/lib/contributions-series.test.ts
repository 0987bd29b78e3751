/** Chart and report rows from an evaluate result's contributions (lib/cases/contributions.ts). */
import { describe, expect, it } from "vitest";
import { columnOf, contributionSeries } from "@/lib/cases/contributions";
import { evaluate } from "@/lib/thermo";
import { speciesEntry } from "../thermo/reference-data";

// Water–gas shift on the third-millennium NASA-7 sets (2015 update), ../shared/reference/cp-coefficients.json.
const request = (include: ("contributions" | "species")[]) => ({
  reaction: "CO(g) + H2O(g) -> CO2(g) + H2(g)",
  species: Object.fromEntries(["CO", "H2O", "CO2", "H2"].map((f) => [`${f}(g)`, speciesEntry("nasa7-2015", f, "g")])),
  temperatures: { fromK: 300, toK: 1500, stepK: 1 },
  include,
});

describe("contributionSeries", () => {
  it("is null for a result without contributions (a snapshot frozen before them), so the page says so instead of recomputing", () => {
    expect(contributionSeries(evaluate(request([])))).toBeNull();
  });

  it("gives one column per species whose sum is the total line, thinned for drawing, and the widest gap's shares", () => {
    const r = evaluate(request(["contributions"]));
    const s = contributionSeries(r, 300)!;
    expect(s.species).toEqual(["CO(g)", "H2O(g)", "CO2(g)", "H2(g)"]);
    expect(s.rows.length).toBeLessThanOrEqual(300);
    expect(s.rows[0].tK).toBe(300);
    expect(s.rows[s.rows.length - 1].tK).toBe(1500);
    for (const row of s.rows) {
      const sum = s.species.reduce((a, _, i) => a + row[columnOf(i)], 0);
      expect(Math.abs(sum - row.total)).toBeLessThanOrEqual(1e-9);
    }
    const widest = r.points.reduce((a, p) => (Math.abs(p.diffKJ) > Math.abs(a.diffKJ) ? p : a));
    expect(s.worst!.tK).toBe(widest.tK);
    expect(s.worst!.totalKJ).toBe(-widest.diffKJ);
    // Largest share first.
    const mags = s.worst!.shares.map((x) => Math.abs(x.kJ));
    expect([...mags].sort((a, b) => b - a)).toEqual(mags);
    expect(s.sigmaRows).toBeNull();
  });
});
