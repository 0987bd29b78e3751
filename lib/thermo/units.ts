/**
 * Unit parsing for request fields (server side: pulls in mathjs).
 * SI inside: kelvin, J/mol (reported as kJ/mol), J/(mol·K), bar for the operating pressure.
 */
import { all, create, type Unit } from "mathjs";
import { refuse } from "./errors";
import { CALORIE_J } from "./scales";

const math = create(all, {});
// mathjs has no calorie; the thermochemical calorie comes from scales.ts (the one definition).
math.createUnit("cal", { definition: `${CALORIE_J} J`, prefixes: "short", aliases: ["calorie", "calories"] });

interface Dimension {
  /** Unit a bare number in this field is taken to be in, and the unit results are given in. */
  unit: string;
  /** Words for the message when the unit has the wrong dimension. */
  expected: string;
}

export const TEMPERATURE: Readonly<Dimension> = Object.freeze({ unit: "K", expected: "a temperature (K, degC or degF)" });
export const MOLAR_ENERGY_KJ: Readonly<Dimension> = Object.freeze({ unit: "kJ/mol", expected: "an energy per amount (J/mol, kJ/mol, cal/mol, kcal/mol)" });
export const MOLAR_ENTROPY_J: Readonly<Dimension> = Object.freeze({ unit: "J/(mol K)", expected: "an entropy or heat capacity per amount (J/(mol K), cal/(mol K))" });
export const PRESSURE_PA: Readonly<Dimension> = Object.freeze({ unit: "Pa", expected: "a pressure (Pa, kPa, bar, atm, psi)" });
export const PRESSURE_BAR: Readonly<Dimension> = Object.freeze({ unit: "bar", expected: "a pressure (bar, Pa, kPa, MPa, atm, psi)" });

const PLAIN_NUMBER = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

/** `°C`, `℃`, `°F`, `℉` and a bare `°K`/`K` as written by hand; `·` as a product. */
function normalise(value: string): string {
  return value
    .replace(/℃/g, "degC")
    .replace(/℉/g, "degF")
    .replace(/[°º˚]\s*C\b/g, "degC")
    .replace(/[°º˚]\s*F\b/g, "degF")
    .replace(/[°º˚]\s*K\b/g, "K")
    .replace(/[·⋅]/g, " ");
}

function toUnit(value: string, field: string, dim: Dimension): Unit {
  let u: Unit;
  try {
    u = math.unit(normalise(value));
  } catch {
    refuse("unit-error", `${field}: cannot read "${value}" as a quantity; expected ${dim.expected}`, { field });
  }
  if (!u.equalBase(math.unit(dim.unit))) {
    refuse("unit-error", `${field}: "${value}" is not ${dim.expected}`, { field, expected: dim.unit });
  }
  if (u.value === null) {
    refuse("unit-error", `${field}: "${value}" has a unit but no number; expected ${dim.expected}`, { field });
  }
  return u;
}

/**
 * A quantity in `dim.unit`: a finite number is taken as already in that unit, a string is
 * parsed with its unit. Throws EngineRefusal `unit-error` naming the field.
 */
export function parseQuantity(value: number | string, field: string, dim: Dimension): number {
  let out: number;
  if (typeof value === "number") out = value;
  else if (PLAIN_NUMBER.test(value.trim())) out = Number(value);
  else out = toUnit(value, field, dim).toNumber(dim.unit);
  if (!Number.isFinite(out)) refuse("unit-error", `${field}: "${value}" is not a finite number`, { field });
  return out;
}

/** An absolute temperature in K (`"25 degC"` → 298.15). */
export function parseTemperatureK(value: number | string, field: string): number {
  return parseQuantity(value, field, TEMPERATURE);
}

/**
 * A temperature difference in K: `"10 degC"` and `"18 degF"` are both 10 K, since a step
 * or span in °C or °F carries no offset.
 */
export function parseTemperatureDifferenceK(value: number | string, field: string): number {
  if (typeof value === "number" || PLAIN_NUMBER.test(value.trim())) return parseQuantity(value, field, TEMPERATURE);
  const u = toUnit(value, field, TEMPERATURE);
  const zero = math.unit(0, u.formatUnits());
  const out = u.toNumber("K") - zero.toNumber("K");
  if (!Number.isFinite(out)) refuse("unit-error", `${field}: "${value}" is not a finite number`, { field });
  return out;
}

/** kJ/mol (`"1.44 kcal/mol"` → 6.02496). */
export function parseMolarEnergyKJ(value: number | string, field: string): number {
  return parseQuantity(value, field, MOLAR_ENERGY_KJ);
}

/** J/(mol·K). */
export function parseMolarEntropyJ(value: number | string, field: string): number {
  return parseQuantity(value, field, MOLAR_ENTROPY_J);
}

/** Pa. */
export function parsePressurePa(value: number | string, field: string): number {
  return parseQuantity(value, field, PRESSURE_PA);
}

/** bar. */
export function parsePressureBar(value: number | string, field: string): number {
  return parseQuantity(value, field, PRESSURE_BAR);
}
