/**
 * The phase a builder row shows after its species changes. Never a silent default:
 * - a phase the species has is kept;
 * - a species whose versions all share one phase gets that phase;
 * - otherwise the row falls back to "" ("stable phase", lowest G at each T), which the
 *   phase select shows as such, so what is stored is what is shown.
 */
export function phaseForSpecies(options: { formula: string; phases: string[] }[], formula: string, current: string): string {
  const phases = [...new Set(options.filter((o) => o.formula === formula).flatMap((o) => o.phases))];
  if (current && phases.includes(current)) return current;
  if (phases.length === 1) return phases[0];
  return "";
}
