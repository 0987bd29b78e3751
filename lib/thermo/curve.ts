/**
 * A species model's data described (phases, forms, temperature range) and drawn as a curve
 * (Cp, H, S, G on a grid). Pure: the library, the case builder's pin options and the dataset
 * fits all read a version's phases and range from `describeData`, the one place that reads
 * segment limits (which may be quantities such as "25 degC").
 */
import { EngineRefusal, parseTemperatureK, speciesProperties, type EngineWarning, type SpeciesInput } from "./index";

/** One phase's chain of segments: the lowest and highest temperature its segments cover (K). */
type ChainRange = { phase: string; tminK: number; tmaxK: number };

type DataDescription = {
  /** Phases in the order their first segment appears. */
  phases: string[];
  forms: string[];
  /** The lowest and highest temperature any segment covers (K); null without segments. */
  rangeK: [number, number] | null;
  /** One per phase, lowest first. */
  chains: ChainRange[];
};

type CurvePoint = { tK: number; cpJ: number; hkJ: number; sJ: number; gkJ: number; phase: string; extrapolated: boolean };
/** Where the stable phase changes along the curve (lowest G, or the stated transition), from the engine's phase-change-in-span warnings. */
type PhaseChange = { tK: number; from: string; to: string };
export type Curve = { points: CurvePoint[]; chains: ChainRange[]; phaseChanges: PhaseChange[]; warnings: EngineWarning[]; fromK: number; toK: number };
type CurveOptions = { fromK?: number; toK?: number; points?: number; phase?: string; edges?: boolean };

const kelvin = (q: number | string): number => (typeof q === "number" ? q : parseTemperatureK(q, "tK"));

/**
 * Phases, forms and the overall temperature range (K) of a model's data. Accepts stored data
 * as it is: a segment whose limits do not read as temperatures counts for its form only.
 */
export function describeData(data: unknown): DataDescription {
  const chains = new Map<string, ChainRange>();
  const forms = new Set<string>();
  for (const seg of (data as Partial<SpeciesInput> | null | undefined)?.segments ?? []) {
    forms.add(seg.form);
    let lo: number;
    let hi: number;
    try {
      lo = kelvin(seg.tminK);
      hi = kelvin(seg.tmaxK);
    } catch {
      continue;
    }
    const c = chains.get(seg.phase);
    if (!c) chains.set(seg.phase, { phase: seg.phase, tminK: lo, tmaxK: hi });
    else {
      c.tminK = Math.min(c.tminK, lo);
      c.tmaxK = Math.max(c.tmaxK, hi);
    }
  }
  const list = [...chains.values()].sort((a, b) => a.tminK - b.tminK);
  const rangeK: [number, number] | null = list.length ? [Math.min(...list.map((c) => c.tminK)), Math.max(...list.map((c) => c.tmaxK))] : null;
  return { phases: [...chains.keys()], forms: [...forms], rangeK, chains: list };
}

/** A plotting range (K) around the model's own range: a little beyond it, so extrapolated stretches show. */
export function defaultRange(data: SpeciesInput): [number, number] {
  const r = describeData(data).rangeK ?? [200, 1000];
  const from = Math.max(10, Math.round(r[0] * 0.8));
  const to = Math.round(Math.min(r[1] * 1.1, Math.max(r[0] * 3, 1500)));
  return [from, Math.max(to, from + 50)];
}

/**
 * Cp (J/(mol·K)), H and G (kJ/mol) and S (J/(mol·K)) of one species on `points` evenly spaced
 * temperatures from `fromK` to `toK` (default: `defaultRange`), plus each chain edge inside the
 * span unless `edges` is false, so the validity marks fall on a point. Each point says whether
 * it lies outside its phase's own range. Throws `EngineRefusal` (`invalid-request` when the
 * span is empty, or the engine's own refusal of the data).
 */
export function computeCurve(data: SpeciesInput, options: CurveOptions = {}): Curve {
  const [f, t] = defaultRange(data);
  const fromK = options.fromK ?? f;
  const toK = options.toK ?? t;
  if (!(toK > fromK)) throw new EngineRefusal("invalid-request", "toK: the upper temperature must be above the lower one.");
  const n = options.points ?? 160;
  const { chains } = describeData(data);
  const grid = new Set<number>();
  for (let i = 0; i < n; i++) grid.add(Number((fromK + ((toK - fromK) * i) / (n - 1)).toFixed(6)));
  if (options.edges !== false) for (const c of chains) for (const e of [c.tminK, c.tmaxK]) if (e > fromK && e < toK) grid.add(e);
  const temps = [...grid].sort((a, b) => a - b);
  const { rows, warnings } = speciesProperties(data, temps, options.phase ? { phase: options.phase } : {});
  const points = rows.map((r) => {
    const chain = chains.find((c) => c.phase === r.phase);
    return { tK: r.tK, cpJ: r.cpJ, hkJ: r.hkJ, sJ: r.sJ, gkJ: r.gkJ, phase: r.phase, extrapolated: !chain || r.tK < chain.tminK - 1e-9 || r.tK > chain.tmaxK + 1e-9 };
  });
  // The engine names each change of the stable phase it makes inside the span (lowest G, or the stated transition).
  const phaseChanges: PhaseChange[] = warnings.flatMap((w) => {
    const x = w as { code: string; tK?: number; from?: string; to?: string };
    return x.code === "phase-change-in-span" && x.tK !== undefined && x.from && x.to ? [{ tK: x.tK, from: x.from, to: x.to }] : [];
  });
  return { points, chains, phaseChanges, warnings, fromK, toK };
}
