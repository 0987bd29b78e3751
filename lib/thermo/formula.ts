/** Chemical formulas, species keys and reaction strings. */
import { refuse } from "./errors";

/**
 * Standard atomic weights, g/mol: IUPAC abridged / conventional values (from memory, 2021
 * table). Elements without a standard atomic weight carry the mass number of their
 * longest-lived isotope, as the IUPAC table does in brackets. D is deuterium.
 */
export const ATOMIC_WEIGHTS: Readonly<Record<string, number>> = Object.freeze({
  H: 1.008,
  D: 2.0141,
  He: 4.0026,
  Li: 6.94,
  Be: 9.0122,
  B: 10.81,
  C: 12.011,
  N: 14.007,
  O: 15.999,
  F: 18.998,
  Ne: 20.18,
  Na: 22.99,
  Mg: 24.305,
  Al: 26.982,
  Si: 28.085,
  P: 30.974,
  S: 32.06,
  Cl: 35.45,
  Ar: 39.95,
  K: 39.098,
  Ca: 40.078,
  Sc: 44.956,
  Ti: 47.867,
  V: 50.942,
  Cr: 51.996,
  Mn: 54.938,
  Fe: 55.845,
  Co: 58.933,
  Ni: 58.693,
  Cu: 63.546,
  Zn: 65.38,
  Ga: 69.723,
  Ge: 72.63,
  As: 74.922,
  Se: 78.971,
  Br: 79.904,
  Kr: 83.798,
  Rb: 85.468,
  Sr: 87.62,
  Y: 88.906,
  Zr: 91.224,
  Nb: 92.906,
  Mo: 95.95,
  Tc: 97,
  Ru: 101.07,
  Rh: 102.91,
  Pd: 106.42,
  Ag: 107.87,
  Cd: 112.41,
  In: 114.82,
  Sn: 118.71,
  Sb: 121.76,
  Te: 127.6,
  I: 126.9,
  Xe: 131.29,
  Cs: 132.91,
  Ba: 137.33,
  La: 138.91,
  Ce: 140.12,
  Pr: 140.91,
  Nd: 144.24,
  Pm: 145,
  Sm: 150.36,
  Eu: 151.96,
  Gd: 157.25,
  Tb: 158.93,
  Dy: 162.5,
  Ho: 164.93,
  Er: 167.26,
  Tm: 168.93,
  Yb: 173.05,
  Lu: 174.97,
  Hf: 178.49,
  Ta: 180.95,
  W: 183.84,
  Re: 186.21,
  Os: 190.23,
  Ir: 192.22,
  Pt: 195.08,
  Au: 196.97,
  Hg: 200.59,
  Tl: 204.38,
  Pb: 207.2,
  Bi: 208.98,
  Po: 209,
  At: 210,
  Rn: 222,
  Fr: 223,
  Ra: 226,
  Ac: 227,
  Th: 232.04,
  Pa: 231.04,
  U: 238.03,
  Np: 237,
  Pu: 244,
});

export interface ParsedFormula {
  elements: Record<string, number>;
  molarMassGPerMol: number;
}

/**
 * Element counts and molar mass of a formula such as `H2O`, `Ca(OH)2` or `CH3(CH2)2CH3`.
 * Counts may be decimal (`Fe0.947O`). Throws EngineRefusal `invalid-formula`.
 */
/** Longest formula and deepest group nesting read (the group reader recurses). */
export const MAX_FORMULA_CHARS = 200;
export const MAX_FORMULA_DEPTH = 16;

export function parseFormula(formula: string): ParsedFormula {
  const text = formula.trim();
  let pos = 0;
  const shown = formula.length > 60 ? `${formula.slice(0, 60)}…` : formula;
  const fail = (why: string): never => refuse("invalid-formula", `formula "${shown}": ${why}`);
  if (text.length > MAX_FORMULA_CHARS) fail(`is ${text.length} characters long; at most ${MAX_FORMULA_CHARS} are allowed`);
  let depth = 0;

  const readCount = (): number => {
    const m = /^(\d+(?:\.\d+)?|\.\d+)/.exec(text.slice(pos));
    if (!m) return 1;
    pos += m[0].length;
    return Number(m[0]);
  };

  const readGroup = (close: string | null): Record<string, number> => {
    const counts: Record<string, number> = {};
    const add = (el: string, n: number) => (counts[el] = (counts[el] ?? 0) + n);
    while (pos < text.length) {
      const ch = text[pos];
      if (ch === "(" || ch === "[") {
        pos++;
        if (++depth > MAX_FORMULA_DEPTH) fail(`groups nest more than ${MAX_FORMULA_DEPTH} deep`);
        const inner = readGroup(ch === "(" ? ")" : "]");
        depth--;
        const n = readCount();
        for (const [el, c] of Object.entries(inner)) add(el, c * n);
      } else if (ch === ")" || ch === "]") {
        if (ch !== close) fail(`unexpected "${ch}" at position ${pos + 1}`);
        pos++;
        return counts;
      } else {
        const m = /^[A-Z][a-z]?/.exec(text.slice(pos));
        if (!m) fail(`unexpected "${ch}" at position ${pos + 1}`);
        const el = m![0];
        if (!(el in ATOMIC_WEIGHTS)) fail(`unknown element "${el}"`);
        pos += el.length;
        add(el, readCount());
      }
    }
    if (close) fail(`missing "${close}"`);
    return counts;
  };

  if (!text) fail("empty formula");
  const elements = readGroup(null);
  if (Object.keys(elements).length === 0) fail("no elements");
  let molarMassGPerMol = 0;
  for (const [el, n] of Object.entries(elements)) molarMassGPerMol += ATOMIC_WEIGHTS[el] * n;
  return { elements, molarMassGPerMol };
}

const PHASE = "cr(?:-[A-Za-z0-9_.]+)?|l|g";
/** A phase name: `cr`, `l`, `g` or a named solid `cr-name`. Every check of a phase uses this one pattern. */
export const PHASE_NAME = new RegExp(`^(?:${PHASE})$`);
/** A species key's phase marker at its end: `(g)` in `H2O(g)`; group 1 is the phase. */
const PHASE_MARKER = new RegExp(`\\((${PHASE})\\)$`);

/** `H2O(g)` → { formula: "H2O", phase: "g" }; `H2O` → { formula: "H2O", phase: undefined }. */
export function parseSpeciesKey(key: string): { formula: string; phase?: string } {
  const m = PHASE_MARKER.exec(key.trim());
  if (!m) return { formula: key.trim() };
  return { formula: key.trim().slice(0, m.index), phase: m[1] };
}

export interface ReactionTerm {
  key: string;
  /** Stoichiometric coefficient, products positive. */
  nu: number;
  formula: string;
  phase?: string;
}

export interface ParsedReaction {
  reactants: { key: string; coefficient: number }[];
  products: { key: string; coefficient: number }[];
  /** One entry per distinct key, ν summed (products positive). */
  terms: ReactionTerm[];
}

/** Arrows between reactants and products: `->`, `=`, `=>`, `<=>`, `<->`, `→`, `⇌`, `⇄`, `↔`. */
const ARROW = /<=>|<->|=>|->|=|→|⇌|⇄|↔/;
/** Largest stoichiometric coefficient accepted. */
export const MAX_COEFFICIENT = 1000;
// A coefficient before a key: integer, decimal, exponent or a/b, signed (a sign is refused with
// its own message), separated from the key by spaces or `*`; or a plain number written against
// the key (`2CO(g)`, no exponent, so `1e3CO` is not read as 1000 CO).
const COEFF_SPACED = /^([-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?(?:\/\d+(?:\.\d+)?)?)(?:\s+|\s*\*\s*)(\S.*)$/;
const COEFF_TIGHT = /^([-+]?(?:\d+(?:\.\d+)?(?:\/\d+(?:\.\d+)?)?|\.\d+))\s*\*?\s*([A-Z(\[].*)$/;

/**
 * `N2(g) + 3 H2(g) -> 2 NH3(g)` (arrow `->` or `=`, also `=>`, `<=>`, `→`, `⇌`; integer,
 * decimal, exponent or a/b coefficients up to 1000). Throws EngineRefusal `invalid-reaction`.
 */
export function parseReaction(text: string): ParsedReaction {
  const parts = text.split(ARROW);
  if (parts.length !== 2) {
    refuse("invalid-reaction", `reaction "${text}": expected reactants and products separated by one "->" or "="`);
  }
  const side = (s: string, which: string) => {
    const out: { key: string; coefficient: number }[] = [];
    for (const raw of s.split(/\s*\+\s*(?![^()]*\))/)) {
      const term = raw.trim();
      if (!term) refuse("invalid-reaction", `reaction "${text}": empty term among the ${which}`);
      const m = COEFF_SPACED.exec(term) ?? COEFF_TIGHT.exec(term);
      let coefficient = 1;
      let key = term;
      if (m) {
        const [a, b] = m[1].split("/");
        coefficient = Number(a) / (b === undefined ? 1 : Number(b));
        key = m[2].trim();
      } else if (/^[-+]/.test(term)) {
        // "-CO2(g)": a bare sign is a negative (or explicit) coefficient of 1.
        coefficient = term[0] === "-" ? -1 : 1;
        key = term.slice(1).trim();
      }
      if (!(coefficient > 0) || !Number.isFinite(coefficient)) {
        refuse("invalid-reaction", `reaction "${text}": coefficient of ${key} must be positive`);
      }
      if (coefficient > MAX_COEFFICIENT) {
        refuse("invalid-reaction", `reaction "${text}": coefficient of ${key} is ${coefficient}; coefficients above ${MAX_COEFFICIENT} are refused`);
      }
      out.push({ key, coefficient });
    }
    return out;
  };
  const reactants = side(parts[0], "reactants");
  const products = side(parts[1], "products");
  const byKey = new Map<string, ReactionTerm>();
  for (const [list, sign] of [
    [reactants, -1],
    [products, 1],
  ] as const) {
    for (const { key, coefficient } of list) {
      const prev = byKey.get(key);
      if (prev) prev.nu += sign * coefficient;
      else byKey.set(key, { key, nu: sign * coefficient, ...parseSpeciesKey(key) });
    }
  }
  const terms = [...byKey.values()].filter((t) => t.nu !== 0);
  if (terms.length === 0) refuse("invalid-reaction", `reaction "${text}": every species cancels out`);
  return { reactants, products, terms };
}

/**
 * Throws EngineRefusal `unbalanced-reaction` naming each element whose totals differ
 * (products minus reactants).
 */
export function checkBalance(terms: readonly ReactionTerm[]): void {
  const total: Record<string, number> = {};
  for (const t of terms) {
    for (const [el, n] of Object.entries(parseFormula(t.formula).elements)) total[el] = (total[el] ?? 0) + t.nu * n;
  }
  const off = Object.entries(total).filter(([, n]) => Math.abs(n) > 1e-9);
  if (off.length > 0) {
    const list = off.map(([el, n]) => `${el} ${n > 0 ? "+" : ""}${Number(n.toPrecision(12))}`).join(", ");
    refuse("unbalanced-reaction", `the reaction is not balanced: ${list} (products minus reactants)`, {
      elements: Object.fromEntries(off.map(([el, n]) => [el, Number(n.toPrecision(12))])),
    });
  }
}
