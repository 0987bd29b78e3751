/** Element balance of a case's terms, for the builder's live check and the schema. Client-safe. */
import { parseFormula } from "@/lib/thermo/formula";

export type BalanceTerm = { formula: string; coefficient: number };
export type Balance =
  { ok: true; elements: Record<string, number> } | { ok: false; off: Record<string, number>; message: string } | { ok: false; invalid: string; message: string };

/** Products minus reactants per element; coefficients are signed (products positive). */
export function elementBalance(terms: readonly BalanceTerm[]): Balance {
  const total: Record<string, number> = {};
  for (const t of terms) {
    let elements: Record<string, number>;
    try {
      elements = parseFormula(t.formula).elements;
    } catch (e) {
      return { ok: false, invalid: t.formula, message: e instanceof Error ? e.message : `formula "${t.formula}" is not valid` };
    }
    for (const [el, n] of Object.entries(elements)) total[el] = (total[el] ?? 0) + t.coefficient * n;
  }
  const off = Object.fromEntries(
    Object.entries(total)
      .filter(([, n]) => Math.abs(n) > 1e-9)
      .map(([el, n]) => [el, Number(n.toPrecision(12))]),
  );
  if (Object.keys(off).length > 0) {
    const list = Object.entries(off)
      .map(([el, n]) => `${el} ${n > 0 ? "+" : ""}${n}`)
      .join(", ");
    return { ok: false, off, message: `Not balanced: ${list} (products minus reactants).` };
  }
  return { ok: true, elements: total };
}

/** "CH4 + H2O → CO + 3 H2" from signed terms. */
export function reactionText(terms: readonly { key: string; coefficient: number }[], arrow = "→"): string {
  const side = (list: { key: string; coefficient: number }[]) =>
    list.map((t) => (Math.abs(t.coefficient) === 1 ? t.key : `${Number(Math.abs(t.coefficient).toPrecision(12))} ${t.key}`)).join(" + ");
  return `${side(terms.filter((t) => t.coefficient < 0))} ${arrow} ${side(terms.filter((t) => t.coefficient > 0))}`;
}

/** The engine's species key: formula plus phase marker, or the bare formula for lowest-G. */
export function termKey(t: { formula: string; phase: string | null }): string {
  return t.phase ? `${t.formula}(${t.phase})` : t.formula;
}
