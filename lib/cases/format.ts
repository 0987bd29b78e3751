/** Display formatting of result numbers (the numbers themselves stay as the API gives them). Client-safe. */
export function fixed(x: number | null | undefined, digits: number): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return "—";
  const s = x.toFixed(digits);
  return s.startsWith("-") ? `−${s.slice(1)}` : s;
}

export function sci(x: number | null | undefined, digits = 4): string {
  if (x === null || x === undefined) return "overflow";
  if (!Number.isFinite(x)) return "—";
  if (x !== 0 && (Math.abs(x) >= 1e5 || Math.abs(x) < 1e-3))
    return x
      .toExponential(digits - 1)
      .replace("e+", "e")
      .replace("-", "−");
  return fixed(x, Math.max(0, digits - 1 - Math.floor(Math.log10(Math.abs(x) || 1))));
}

export const kelvin = (x: number | null | undefined) => (x === null || x === undefined ? "—" : `${fixed(x, 2)} K`);
