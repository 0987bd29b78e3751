/** Numbers in messages: 6 significant figures, no trailing zeros. */
export function fmt(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  return String(Number(x.toPrecision(6)));
}
