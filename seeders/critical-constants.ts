/**
 * Critical constants of the reference species (seeders/data/critical-constants.json):
 * Poling, Prausnitz & O'Connell, The Properties of Gases and Liquids, 5th ed., Appendix A
 * (from memory). Seeded into species.critical by 02-reference-library and read by tests.
 */
import data from "./data/critical-constants.json";

export type Critical = { tcK: number; pcBar: number; omega: number };

export const CRITICAL_SOURCE: string = data.source;
export const CRITICAL_CITATION = `${data.source}. ${data.note}`;
export const CRITICAL_CONSTANTS: Record<string, Critical> = data.species;
