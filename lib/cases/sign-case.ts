/**
 * The sign-case sentence under "What the numbers say": whether the corrected ΔrG(T) agrees
 * with the naive sign case over the span and, where it does not, what differs, in the reader's
 * temperature unit. Pure and client-safe.
 */
import { differenceFromKelvin, formatTemperature, type DisplayUnit } from "./display-unit";
import { UNIT_LABELS } from "./temperature";

export type SignCaseInput = {
  signCase: { code: string; correctedAgrees: boolean };
  crossover: { naiveK: number | null; naiveInSpan: boolean; correctedK: number[] };
  points: readonly { tK: number; dGkJ: number; naiveDGkJ: number }[];
};

/** "68 K", "68 °C", "122.4 °F": a temperature difference to 0.1 of the unit (°C and K differences are equal). */
function gap(dK: number, unit: DisplayUnit): string {
  const v = Math.abs(differenceFromKelvin(dK, unit));
  return `${Number(v.toFixed(1))} ${unit === "K" ? "K" : UNIT_LABELS[unit]}`;
}

const list = (ts: readonly number[], unit: DisplayUnit) => ts.map((t) => formatTemperature(t, unit)).join(", ");

/** How the nearest corrected crossover sits against the naive one. */
function shift(corrected: number, naive: number, unit: DisplayUnit): string {
  const d = corrected - naive;
  if (Math.abs(d) < 0.05) return `the corrected crossover (${formatTemperature(corrected, unit)}) matches the naive one`;
  return `the corrected crossover is ${gap(d, unit)} ${d < 0 ? "lower" : "higher"} than the naive one (${formatTemperature(corrected, unit)} against ${formatTemperature(naive, unit)})`;
}

export function signCaseSentence(r: SignCaseInput, unit: DisplayUnit = "K"): string {
  const { naiveK, naiveInSpan, correctedK } = r.crossover;
  const nearest = naiveK === null || correctedK.length === 0 ? null : correctedK.reduce((a, t) => (Math.abs(t - naiveK) < Math.abs(a - naiveK) ? t : a), correctedK[0]);
  if (r.signCase.correctedAgrees) {
    const tail = nearest !== null && naiveK !== null && naiveInSpan ? `; ${shift(nearest, naiveK, unit)}` : "";
    return `The corrected curve agrees with this over the span${tail}.`;
  }
  const parts: string[] = [];
  if (correctedK.length > 1) parts.push(`the corrected ΔrG changes sign ${correctedK.length} times in the span (at ${list(correctedK, unit)})`);
  if (naiveK === null) {
    if (correctedK.length === 1) parts.push(`the corrected ΔrG crosses zero at ${formatTemperature(correctedK[0], unit)}, which the naive line never does`);
    else if (correctedK.length > 1) parts.push("the naive line never crosses zero");
  } else if (correctedK.length === 0) {
    parts.push(
      naiveInSpan
        ? `the naive line crosses zero at ${formatTemperature(naiveK, unit)}, but the corrected ΔrG keeps one sign over the whole span`
        : `neither crosses zero in the span, yet the corrected ΔrG has the other sign from the naive line`,
    );
  } else if (naiveInSpan && nearest !== null) {
    parts.push(shift(nearest, naiveK, unit));
  } else if (nearest !== null) {
    parts.push(`the corrected ΔrG crosses zero at ${list(correctedK, unit)} inside the span; the naive crossover (${formatTemperature(naiveK, unit)}) lies outside it`);
  }
  if (parts.length === 0) {
    const opposite = r.points.filter((p) => Math.sign(p.dGkJ) !== Math.sign(p.naiveDGkJ) && p.dGkJ !== 0 && p.naiveDGkJ !== 0);
    if (opposite.length)
      parts.push(`the corrected and naive ΔrG have opposite signs from ${formatTemperature(opposite[0].tK, unit)} to ${formatTemperature(opposite[opposite.length - 1].tK, unit)}`);
    else parts.push("the sign of the corrected ΔrG departs from what the naive sign case says");
  }
  const text = parts.join("; ");
  return `The corrected curve does not agree with this over the span: ${text}.`;
}
