/**
 * Checks of the equilibrium panel's fields in plain words, shared by the panel (every field at
 * once, before anything is sent) and the case schema (so the API refuses the same things).
 * Pure and client-safe.
 */
import { elementBalance } from "./balance";
import { parseFormula, parseSpeciesKey } from "@/lib/thermo/formula";
import { FEED_UNITS, type FeedUnit } from "@/lib/thermo/schema";

const NUMBER = /^(?:\d+(?:\.\d*)?|\.\d+)(?:e[-+]?\d+)?(?:\/(?:\d+(?:\.\d*)?|\.\d+))?$/i;

/** Units of amount a feed may be given in: the engine's own closed set. */
export const FEED_UNIT_HINT = FEED_UNITS.join(", ");

/** Mass units and the amount unit the engine gives their moles in (tests/lib/equilibrium-form.test.ts holds it to the engine). */
export const MASS_FEED_UNITS: Partial<Record<FeedUnit, FeedUnit>> = { g: "mol", kg: "kmol", "kg/h": "kmol/h", "t/h": "kmol/h" };

/** What the outlet's amounts come back in for a feed in `unit`, in words for the field's hint. */
export function feedUnitHint(unit: string): string {
  const amount = MASS_FEED_UNITS[unit.trim() as FeedUnit];
  return amount ? `A mass: each species is converted with its molar mass (from its formula); moles come back in ${amount}.` : "Moles come back in the same unit.";
}
/** Pressure units the panel takes (absolute pressures; gauge units are refused). */
export const PRESSURE_PATTERN = /^\s*([-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:e[-+]?\d+)?)\s*(bar|mbar|Pa|kPa|MPa|atm|psi)?\s*$/;

/** A species key such as `N2(g)` or `H2O`: a formula of real elements with an optional phase marker. */
export function checkSpeciesKey(key: string): string | null {
  const k = key.trim();
  if (!k) return "Name a species, e.g. N2(g).";
  const { formula } = parseSpeciesKey(k);
  try {
    parseFormula(formula);
  } catch {
    return `“${k}” is not a species: use a formula of element symbols with a phase marker, e.g. N2(g) or H2O(l).`;
  }
  return null;
}

/** One line of the simultaneous set: two sides, numeric coefficients, real species, balanced. */
export function checkReactionLine(text: string): string | null {
  const line = text.trim();
  const sides = line.split(/->|=/);
  if (sides.length !== 2) return `“${line}” is not a reaction: write reactants -> products, e.g. CO(g) + H2O(g) -> CO2(g) + H2(g).`;
  const terms: { formula: string; coefficient: number }[] = [];
  for (const [i, side] of sides.entries()) {
    for (const raw of side.split("+")) {
      const term = raw.trim();
      if (!term) return `“${line}” has an empty term ${i === 0 ? "among the reactants" : "among the products"}.`;
      const m = /^(?:(\S+?)\s*\*?\s+)?(\S+)$/.exec(term);
      if (!m) return `“${term}” is not a term: write a number, a space and a species, e.g. 3 H2(g).`;
      const [, coef, key] = m;
      if (coef !== undefined && !NUMBER.test(coef)) return `The coefficient “${coef}” of ${key} is not a number.`;
      const bad = checkSpeciesKey(key);
      if (bad) return bad;
      const [a, b] = (coef ?? "1").split("/");
      const c = Number(a) / (b === undefined ? 1 : Number(b));
      if (!(c > 0) || !Number.isFinite(c)) return `The coefficient of ${key} must be a positive number.`;
      terms.push({ formula: parseSpeciesKey(key).formula, coefficient: i === 0 ? -c : c });
    }
  }
  const balance = elementBalance(terms);
  return balance.ok ? null : balance.message;
}

export function checkFeedUnit(unit: string): string | null {
  return (FEED_UNITS as readonly string[]).includes(unit.trim()) ? null : `“${unit.trim()}” is not a unit of amount: use ${FEED_UNIT_HINT}.`;
}

export function checkPressure(p: string | number): string | null {
  if (typeof p === "number") return p > 0 && Number.isFinite(p) ? null : "The pressure must be above 0.";
  const m = PRESSURE_PATTERN.exec(p);
  if (!m) return `“${p.trim()}” is not a pressure: give a number in bar, or with a unit (30 bar, 2.5 MPa, 450 psi).`;
  return Number(m[1]) > 0 ? null : "The pressure must be above 0.";
}

/** A feed amount as typed: a number, 0 or more. */
export function checkAmount(text: string): string | null {
  const t = text.trim();
  if (t === "" || !Number.isFinite(Number(t))) return `“${t}” is not a number.`;
  return Number(t) < 0 ? "An amount cannot be negative." : null;
}

export type EquilibriumForm = { amounts: Record<string, string>; feedUnit: string; pressure: string; key: string; reactions: string[] };

/**
 * Every field's problem at once, keyed as the panel names its fields: `feed.<key>`, `feedUnit`,
 * `pressure`, `key`, `reactions.<i>`, `feed`.
 */
export function checkEquilibriumForm(f: EquilibriumForm): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of Object.entries(f.amounts)) {
    const bad = checkSpeciesKey(k) ?? checkAmount(v);
    if (bad) out[`feed.${k}`] = bad;
  }
  if (!Object.keys(out).some((k) => k.startsWith("feed.")) && !Object.values(f.amounts).some((v) => Number(v) > 0)) out.feed = "Give at least one species a positive amount.";
  const unit = checkFeedUnit(f.feedUnit);
  if (unit) out.feedUnit = unit;
  const p = checkPressure(f.pressure);
  if (p) out.pressure = p;
  if (f.key && !(Number(f.amounts[f.key]) > 0)) out.key = `The key species ${f.key} needs an amount above 0 in the feed.`;
  f.reactions.forEach((r, i) => {
    const bad = checkReactionLine(r);
    if (bad) out[`reactions.${i}`] = bad;
  });
  return out;
}
