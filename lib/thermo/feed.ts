/**
 * Feed amounts of an equilibrium in one unit of amount: amounts or rates, mole or mass units
 * (mass through each species' molar mass from its formula).
 */
import { refuse } from "./errors";
import { parseFormula, parseSpeciesKey } from "./formula";
import { FEED_UNITS, type FeedUnit } from "./schema";

interface FeedUnitInfo {
  /** Amount (mol, or g for a mass unit) or rate (mol/s, or g/s). */
  rate: boolean;
  mass: boolean;
  /** Size in mol, mol/s, g or g/s. */
  factor: number;
}

const FEED_UNIT_INFO: Record<FeedUnit, FeedUnitInfo> = {
  mol: { rate: false, mass: false, factor: 1 },
  kmol: { rate: false, mass: false, factor: 1000 },
  "mol/s": { rate: true, mass: false, factor: 1 },
  "kmol/s": { rate: true, mass: false, factor: 1000 },
  "kmol/h": { rate: true, mass: false, factor: 1000 / 3600 },
  g: { rate: false, mass: true, factor: 1 },
  kg: { rate: false, mass: true, factor: 1000 },
  "kg/h": { rate: true, mass: true, factor: 1000 / 3600 },
  "t/h": { rate: true, mass: true, factor: 1e6 / 3600 },
};

/** The amount unit results are given in, for each feed unit. */
const AMOUNT_UNIT: Record<FeedUnit, FeedUnit> = {
  mol: "mol",
  kmol: "kmol",
  "mol/s": "mol/s",
  "kmol/s": "kmol/s",
  "kmol/h": "kmol/h",
  g: "mol",
  kg: "kmol",
  "kg/h": "kmol/h",
  "t/h": "kmol/h",
};

const FEED_AMOUNT = /^([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(\S+)$/;

/**
 * Feed amounts in the amount unit of `feedUnit`: bare numbers are in feedUnit; a string
 * carries its own unit of the same set (an amount when feedUnit is an amount, a rate when
 * it is a rate); mass units go through each species' molar mass (from its formula).
 */
export function feedAmounts(
  feed: Record<string, number | string>,
  feedUnit: string | undefined,
): { amounts: Record<string, number>; feedUnit: FeedUnit; amountUnit: FeedUnit; molarMass?: Record<string, number> } {
  const unit = (feedUnit ?? "mol") as FeedUnit;
  if (!Object.prototype.hasOwnProperty.call(FEED_UNIT_INFO, unit)) {
    refuse("invalid-request", `invalid request: equilibrium.feedUnit: expected one of ${FEED_UNITS.join(", ")}`);
  }
  const target = AMOUNT_UNIT[unit];
  const tInfo = FEED_UNIT_INFO[target];
  const amounts: Record<string, number> = {};
  let molarMass: Record<string, number> | undefined;
  for (const [key, raw] of Object.entries(feed)) {
    const field = `equilibrium.feed[${JSON.stringify(key)}]`;
    let value: number;
    let u: FeedUnit = unit;
    const text = typeof raw === "number" ? "" : raw.trim();
    if (typeof raw === "number") value = raw;
    else if (/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(text)) value = Number(text);
    else {
      const m = FEED_AMOUNT.exec(text);
      if (!m || !Object.prototype.hasOwnProperty.call(FEED_UNIT_INFO, m[2])) {
        refuse("unit-error", `${field}: cannot read "${raw}" as a feed amount; expected a number with one of ${FEED_UNITS.join(", ")}`, { field });
      }
      value = Number(m![1]);
      u = m![2] as FeedUnit;
    }
    if (!Number.isFinite(value!) || value! < 0) {
      refuse("invalid-request", `invalid request: ${field}: expected an amount of 0 or more (got ${JSON.stringify(raw)})`, { field });
    }
    const info = FEED_UNIT_INFO[u];
    if (info.rate !== tInfo.rate) {
      refuse(
        "unit-error",
        `${field}: "${raw}" is ${info.rate ? "a rate" : "an amount"} but feedUnit "${unit}" is ${tInfo.rate ? "a rate" : "an amount"}; give every feed amount as ${tInfo.rate ? "a rate" : "an amount"}`,
        { field },
      );
    }
    let base = value! * info.factor;
    if (info.mass) {
      const M = parseFormula(parseSpeciesKey(key).formula).molarMassGPerMol;
      molarMass = { ...(molarMass ?? {}), [key]: M };
      base /= M;
    }
    amounts[key] = base / tInfo.factor;
  }
  return { amounts, feedUnit: unit, amountUnit: target, molarMass };
}
