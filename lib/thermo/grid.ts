/** Temperature grids with units. */
import { MAX_POINTS, MAX_TEMPERATURE_K, MIN_TEMPERATURE_K } from "./constants";
import { refuse } from "./errors";
import type { EvaluateRequest } from "./schema";
import { ABOVE_ZERO_K, isAboveZeroK } from "./scales";
import { parseTemperatureDifferenceK, parseTemperatureK } from "./units";

/**
 * The engine's one check of an absolute temperature: refuses T ≤ 0 K (and NaN) as
 * `nonpositive-temperature`, `${field}: temperatures must be above 0 K (got … K)`; `shown`
 * is how the value is written in the message.
 */
export function requireAboveZeroK(tK: number, field: string, details?: unknown, shown: string = String(tK)): number {
  if (!isAboveZeroK(tK)) refuse("nonpositive-temperature", `${field}: ${ABOVE_ZERO_K} (got ${shown} K)`, details);
  return tK;
}

/** Above 0 K and inside the supported 1 K to 100 000 K: a grid temperature, referenceK, a reference or transition temperature. */
export function requireTemperatureK(tK: number, field: string, details?: unknown): number {
  return inSupportedRange(requireAboveZeroK(tK, field, details), field);
}

function positive(tK: number, field: string): number {
  return requireTemperatureK(tK, field, { field });
}

/** Refuses a temperature outside the supported 1 K to 100 000 K (`temperature-out-of-range`). */
export function inSupportedRange(tK: number, field: string): number {
  if (!(tK >= MIN_TEMPERATURE_K && tK <= MAX_TEMPERATURE_K)) {
    refuse("temperature-out-of-range", `${field}: ${tK} K is outside the supported range of ${MIN_TEMPERATURE_K} K to ${MAX_TEMPERATURE_K} K`, {
      field,
      tK,
      minK: MIN_TEMPERATURE_K,
      maxK: MAX_TEMPERATURE_K,
    });
  }
  return tK;
}

/**
 * The evaluation grid in K, ascending, without duplicates. `{fromK, toK, stepK}` includes
 * both ends (toK is added when the step does not land on it); a step in degC/degF is a
 * difference. Refuses T ≤ 0 K and more than 100 000 points.
 */
export function parseTemperatureGrid(spec: EvaluateRequest["temperatures"]): Float64Array {
  if ("listK" in spec) {
    if (spec.listK.length > MAX_POINTS) {
      refuse("too-many-points", `temperatures.listK: ${spec.listK.length} temperatures exceed the limit of ${MAX_POINTS}`);
    }
    const values = spec.listK.map((v, i) => positive(parseTemperatureK(v, `temperatures.listK[${i}]`), `temperatures.listK[${i}]`));
    const sorted = Float64Array.from(values).sort();
    const out: number[] = [];
    for (const t of sorted) if (out.length === 0 || t !== out[out.length - 1]) out.push(t);
    return Float64Array.from(out);
  }
  const from = positive(parseTemperatureK(spec.fromK, "temperatures.fromK"), "temperatures.fromK");
  const to = positive(parseTemperatureK(spec.toK, "temperatures.toK"), "temperatures.toK");
  const step = parseTemperatureDifferenceK(spec.stepK, "temperatures.stepK");
  if (to < from) refuse("invalid-request", `temperatures.toK: ${to} K is below temperatures.fromK (${from} K)`);
  if (!(step > 0)) refuse("invalid-request", `temperatures.stepK: the step must be positive (got ${step} K)`);
  const span = to - from;
  const whole = Math.floor(span / step + 1e-9);
  const landsOnEnd = Math.abs(from + whole * step - to) <= 1e-9 * Math.max(1, to);
  const count = whole + 1 + (landsOnEnd ? 0 : 1);
  if (count > MAX_POINTS) {
    refuse("too-many-points", `temperatures: ${count} points exceed the limit of ${MAX_POINTS}; use a larger stepK`, { points: count });
  }
  const out = new Float64Array(count);
  for (let i = 0; i <= whole; i++) out[i] = from + i * step;
  if (landsOnEnd) out[whole] = to;
  else out[count - 1] = to;
  return out;
}
