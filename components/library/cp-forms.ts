/**
 * The editor's description of each Cp form: which fields it has, their units, and how the
 * typed strings become the engine's `coeffs`. Adding a form to the editor = one entry here
 * (the engine's schema in lib/thermo/schema.ts decides what is valid).
 */
import type { CpForm } from "@/lib/thermo/schema";

export type FormField = { name: string; unit: string };
export type FormSpec = {
  label: string;
  /** One input per named coefficient, in spreadsheet order. */
  fields?: FormField[];
  /** Or one free-text area (power terms, table points, expression). */
  text?: { name: string; label: string; placeholder: string };
  toCoeffs: (v: Record<string, string>) => unknown;
  fromCoeffs: (c: unknown) => Record<string, string>;
  hint: string;
};

const n = (s: string | undefined) => (s === undefined || s.trim() === "" ? Number.NaN : Number(s.trim()));
const named = (names: string[]) => (v: Record<string, string>) => Object.fromEntries(names.map((k) => [k, n(v[k])]));
const fromNamed = (c: unknown) => Object.fromEntries(Object.entries((c ?? {}) as Record<string, unknown>).map(([k, x]) => [k, String(x)]));
const list = (names: string[]) => (v: Record<string, string>) => names.map((k) => n(v[k]));
const fromList = (names: string[]) => (c: unknown) => Object.fromEntries(names.map((k, i) => [k, Array.isArray(c) && c[i] !== undefined ? String(c[i]) : ""]));
const lines = (s: string | undefined) =>
  (s ?? "")
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter(Boolean)
    .map((l) => l.split(/[\s,;\t]+/).map(Number));

const A7 = ["a1", "a2", "a3", "a4", "a5", "a6", "a7"];
const A9 = [...A7, "b1", "b2"];

export const FORM_SPECS: Record<CpForm, FormSpec> = {
  constant: {
    label: "Constant",
    fields: [{ name: "cpJ", unit: "J/(mol·K)" }],
    toCoeffs: (v) => ({ cpJ: n(v.cpJ) }),
    fromCoeffs: fromNamed,
    hint: "Cp = constant. Needs an anchor (H and S at one temperature).",
  },
  shomate: {
    label: "Shomate",
    fields: [
      { name: "A", unit: "J/(mol·K)" },
      { name: "B", unit: "J/(mol·K)" },
      { name: "C", unit: "J/(mol·K)" },
      { name: "D", unit: "J/(mol·K)" },
      { name: "E", unit: "J·K/mol" },
      { name: "F", unit: "kJ/mol" },
      { name: "G", unit: "J/(mol·K)" },
      { name: "H", unit: "kJ/mol" },
    ],
    toCoeffs: named(["A", "B", "C", "D", "E", "F", "G", "H"]),
    fromCoeffs: fromNamed,
    hint: "t = T/1000; Cp = A + Bt + Ct² + Dt³ + E/t². F, G, H carry the integration constants.",
  },
  nasa7: {
    label: "NASA 7-coefficient",
    fields: A7.map((name) => ({ name, unit: name === "a6" ? "K" : "—" })),
    toCoeffs: list(A7),
    fromCoeffs: fromList(A7),
    hint: "Cp/R = a1 + a2T + a3T² + a4T³ + a5T⁴; a6 = H/R constant (K), a7 = S/R constant.",
  },
  nasa9: {
    label: "NASA 9-coefficient",
    fields: A9.map((name) => ({ name, unit: name === "b1" ? "K" : "—" })),
    toCoeffs: list(A9),
    fromCoeffs: fromList(A9),
    hint: "Cp/R = a1/T² + a2/T + a3 + a4T + a5T² + a6T³ + a7T⁴; b1, b2 integration constants.",
  },
  "maier-kelley": {
    label: "Maier–Kelley",
    fields: [
      { name: "a", unit: "J/(mol·K)" },
      { name: "b", unit: "J/(mol·K²)" },
      { name: "c", unit: "J·K/mol" },
    ],
    toCoeffs: named(["a", "b", "c"]),
    fromCoeffs: fromNamed,
    hint: "Cp = a + bT + c/T². Needs an anchor.",
  },
  power: {
    label: "Power series",
    text: { name: "terms", label: "Terms, one per line: exponent k and coefficient c", placeholder: "0 25.1\n1 0.012\n-2 -150000" },
    toCoeffs: (v) => ({ terms: lines(v.terms).map(([k, c]) => ({ k, c })) }),
    fromCoeffs: (c) => ({ terms: ((c as { terms?: { k: number; c: number }[] })?.terms ?? []).map((t) => `${t.k} ${t.c}`).join("\n") }),
    hint: "Cp = Σ c·T^k with k from −3 to 4, J/(mol·K). Needs an anchor.",
  },
  table: {
    label: "Tabulated points",
    text: { name: "points", label: "Points, one per line: T (K) and Cp (J/(mol·K))", placeholder: "300 29.1\n400 29.3\n500 29.6" },
    toCoeffs: (v) => ({ points: lines(v.points).map(([t, cp]) => [t, cp]) }),
    fromCoeffs: (c) => ({ points: ((c as { points?: [number, number][] })?.points ?? []).map(([t, cp]) => `${t} ${cp}`).join("\n") }),
    hint: "Interpolated between points; beyond them only with a warning. Needs an anchor.",
  },
  expression: {
    label: "Expression in T",
    text: { name: "cp", label: "Cp(T) in J/(mol·K)", placeholder: "28.9 + 0.0041*T" },
    toCoeffs: (v) => ({ cp: v.cp ?? "" }),
    fromCoeffs: (c) => ({ cp: String((c as { cp?: string })?.cp ?? "") }),
    hint: "T is the only variable; common functions (exp, log, sqrt…) are allowed. Needs an anchor.",
  },
};

/** Split a row pasted from a spreadsheet (tabs, commas, semicolons or spaces). */
export const splitRow = (text: string) =>
  text
    .trim()
    .split(/[\t,;\s]+/)
    .filter(Boolean);
