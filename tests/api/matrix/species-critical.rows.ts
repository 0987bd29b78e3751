/** Route matrix rows for the critical constants of a species (PATCH /api/v1/species/:id). */
import { models } from "@/lib/db";
import { actorOf } from "../../helpers/actors";
import type { Expect, Handler, Row } from "./types";
import * as speciesOne from "@/app/api/v1/species/[id]/route";

// Butane's constants: Poling, Prausnitz & O'Connell, The Properties of Gases and Liquids, 5th ed., Appendix A (from memory).
const BUTANE = { tcK: 425.12, pcBar: 37.96, omega: 0.2, citation: "Poling, Prausnitz & O'Connell, 5th ed., Appendix A (from memory)" };

async function larkspurSpecies(): Promise<string> {
  const team = (await actorOf("steward")).teamId;
  return String((await models().Species.findOne({ where: { teamId: team } }))!.id);
}
async function referenceSpecies(): Promise<string> {
  return String((await models().Species.findOne({ where: { teamId: null, formula: "N2" } }))!.id);
}

/** Stewards and admins of the owning team; another team's species is 404. */
const stewards: Expect = { anonymous: 401, engineer: 403, steward: 200, reviewer: 403, admin: 200, other: 404 };
/** The reference library is read-only for every role (the other team's admin included). */
const readOnly: Expect = { anonymous: 401, engineer: 403, steward: 403, reviewer: 403, admin: 403, other: 403 };

export const ROWS: Row[] = [
  {
    name: "species critical constants",
    file: "species/[id]",
    method: "PATCH",
    handler: speciesOne.PATCH as Handler,
    prepare: async () => ({ params: { id: await larkspurSpecies() }, body: { critical: BUTANE } }),
    expect: stewards,
  },
  {
    name: "species critical constants removed",
    file: "species/[id]",
    method: "PATCH",
    handler: speciesOne.PATCH as Handler,
    prepare: async () => ({ params: { id: await larkspurSpecies() }, body: { critical: null } }),
    expect: stewards,
  },
  {
    name: "reference species critical constants",
    file: "species/[id]",
    method: "PATCH",
    handler: speciesOne.PATCH as Handler,
    prepare: async () => ({ params: { id: await referenceSpecies() }, body: { critical: BUTANE } }),
    expect: readOnly,
  },
];
