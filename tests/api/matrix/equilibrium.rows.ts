/** Route matrix rows for the equilibrium handlers. */
import type { Handler, Row } from "./types";
import { allowAll } from "./types";
import * as sources from "@/app/api/v1/equilibrium/sources/route";

// Reverse shift over the reference library's species: every approved family that covers them
// replaces the (empty) entries, so the body names only the keys.
const body = {
  reaction: "H2(g) + CO2(g) -> CO(g) + H2O(g)",
  species: { "H2(g)": {}, "CO2(g)": {}, "CO(g)": {}, "H2O(g)": {} },
  temperatures: { listK: [900] },
};

export const ROWS: Row[] = [
  { name: "equilibrium sources", file: "equilibrium/sources", method: "POST", handler: sources.POST as Handler, prepare: async () => ({ body }), expect: allowAll(200) },
];
