/** Route matrix rows for the equilibrium handlers. */
import { createCase } from "@/lib/services/cases";
import { caseInputSchema } from "@/lib/validation/cases";
import { actorOf } from "../../helpers/actors";
import { shiftCase } from "../../helpers/cases";
import { ensureReferenceLibrary, type RefFormula } from "../../helpers/reference-library";
import type { Expect, Handler, Row } from "./types";
import { allowAll } from "./types";
import * as sources from "@/app/api/v1/equilibrium/sources/route";
import * as preview from "@/app/api/v1/equilibrium/preview/route";
import * as saveRoute from "@/app/api/v1/equilibrium/cases/[id]/route";

let library: Promise<Record<RefFormula, number>> | undefined;
const pins = () => (library ??= ensureReferenceLibrary());

/** A fresh draft shift case by Erin (engineer, Larkspur). */
async function draft(): Promise<number> {
  const c = await createCase(await actorOf("engineer"), caseInputSchema.parse(shiftCase(await pins())));
  return c.id;
}

// Larkspur Hydrogen Works shift converter (invented demo scenario).
const equilibrium = { feed: { "CO(g)": 1, "H2O(g)": 3 }, pressure: "30 bar", key: "CO(g)" };

// Reverse shift over the reference library's species: every approved family that covers them
// replaces the (empty) entries, so the body names only the keys.
const sourcesBody = {
  reaction: "H2(g) + CO2(g) -> CO(g) + H2O(g)",
  species: { "H2(g)": {}, "CO2(g)": {}, "CO(g)": {}, "H2O(g)": {} },
  temperatures: { listK: [900] },
};

const teamReads: Expect = { ...allowAll(200), other: 404 };
const authorOnly: Expect = { anonymous: 401, engineer: 200, steward: 403, reviewer: 403, admin: 403, other: 404 };

export const ROWS: Row[] = [
  {
    name: "equilibrium sources",
    file: "equilibrium/sources",
    method: "POST",
    handler: sources.POST as Handler,
    prepare: async () => ({ body: sourcesBody }),
    expect: allowAll(200),
  },
  {
    name: "equilibrium preview",
    file: "equilibrium/preview",
    method: "POST",
    handler: preview.POST as Handler,
    prepare: async () => ({ body: { caseId: await draft(), equilibrium } }),
    expect: teamReads,
  },
  {
    name: "equilibrium save",
    file: "equilibrium/cases/[id]",
    method: "PUT",
    handler: saveRoute.PUT as Handler,
    prepare: async () => ({ params: { id: String(await draft()) }, body: { lockVersion: 0, equilibrium } }),
    expect: authorOnly,
  },
];
