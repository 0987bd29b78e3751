/** Server-action matrix rows for the species page's critical-constants form. */
import { removeCriticalAction, saveCriticalAction } from "@/app/(app)/library/species/[id]/actions";
import { models } from "@/lib/db";
import { actorOf } from "../helpers/actors";
import type { ActionExpect, ActionRow } from "./types";

async function larkspurSpecies(): Promise<string> {
  const team = (await actorOf("steward")).teamId;
  return String((await models().Species.findOne({ where: { teamId: team } }))!.id);
}
async function referenceSpecies(): Promise<string> {
  return String((await models().Species.findOne({ where: { teamId: null, formula: "N2" } }))!.id);
}

const stewardsOnLarkspur: ActionExpect = { anonymous: 401, engineer: 403, steward: "ok", reviewer: 403, admin: "ok", other: 404 };
const readOnly: ActionExpect = { anonymous: 401, engineer: 403, steward: 403, reviewer: 403, admin: 403, other: 403 };
// Butane: Poling, Prausnitz & O'Connell, The Properties of Gases and Liquids, 5th ed., Appendix A (from memory).
const butane = { tcK: "425.12", pcBar: "37.96", omega: "0.200", citation: "Poling, Prausnitz & O'Connell, 5th ed., Appendix A (from memory)" };

const FILE = "app/(app)/library/species/[id]/actions.ts";
export const ACTIONS: ActionRow[] = [
  { id: `${FILE}#saveCriticalAction`, action: saveCriticalAction, prepare: async () => ({ speciesId: await larkspurSpecies(), ...butane }), expect: stewardsOnLarkspur },
  { id: `${FILE}#saveCriticalAction (reference species)`, action: saveCriticalAction, prepare: async () => ({ speciesId: await referenceSpecies(), ...butane }), expect: readOnly },
  { id: `${FILE}#removeCriticalAction`, action: removeCriticalAction, prepare: async () => ({ speciesId: await larkspurSpecies() }), expect: stewardsOnLarkspur },
];
