/**
 * Stage 5 of evaluate(), per temperature: the point objects, built once from the reaction's
 * typed arrays (one object shape per call), and the refusal of a value that overflowed.
 */
import { R as GAS_CONSTANT } from "./constants";
import { refuse } from "./errors";
import type { PointColumns } from "./columns";
import type { EvaluatePoint } from "./evaluate-types";
import { fmt } from "./format";
import type { ReactionGrid, ReactionValues } from "./reaction-grid";
import type { Sigmas } from "./reaction-uncertainty";

const LN10 = Math.LN10;
/** R read once: under a CommonJS transform an imported binding is an accessor, read on every use in the per-point loops. */
const R = GAS_CONSTANT;

/** The point objects of the grid T; `tolJ`/`tolLn` decide exceedsTolerance, `sigmas` adds the uncertainty fields. */
export function buildPoints(T: Float64Array, rg: ReactionGrid, tolJ: number, tolLn: number, sigmas: Sigmas | null): EvaluatePoint[] {
  const n = T.length;
  const { dCp, dH, dS, dG, naive } = rg;
  const points: EvaluatePoint[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const g = dG[i];
    const gn = naive[i];
    const t = T[i];
    const lnK = -g / (R * t);
    const naiveLnK = -gn / (R * t);
    const K = Math.exp(lnK);
    const exceedsTolerance = Math.abs(gn - g) > tolJ || Math.abs(naiveLnK - lnK) > tolLn;
    points[i] =
      sigmas === null
        ? {
            tK: t,
            dCpJ: dCp[i],
            dHkJ: dH[i] / 1000,
            dSJ: dS[i],
            dGkJ: g / 1000,
            lnK,
            log10K: lnK / LN10,
            K: Number.isFinite(K) && K > 0 ? K : null,
            naiveDGkJ: gn / 1000,
            naiveLnK,
            naiveLog10K: naiveLnK / LN10,
            diffKJ: (gn - g) / 1000,
            exceedsTolerance,
          }
        : {
            tK: t,
            dCpJ: dCp[i],
            dHkJ: dH[i] / 1000,
            dSJ: dS[i],
            dGkJ: g / 1000,
            lnK,
            log10K: lnK / LN10,
            K: Number.isFinite(K) && K > 0 ? K : null,
            naiveDGkJ: gn / 1000,
            naiveLnK,
            naiveLog10K: naiveLnK / LN10,
            diffKJ: (gn - g) / 1000,
            exceedsTolerance,
            sigmaDGkJ: sigmas.dGkJ[i],
            sigmaLog10K: sigmas.log10K[i],
            naiveSigmaDGkJ: sigmas.naiveDGkJ[i],
            naiveExceedsUncertainty: sigmas.exceeds[i] === 1,
          };
  }
  return points;
}

/**
 * The same values as columns, straight from the typed arrays (no point objects): what
 * `pointsToColumns(buildPoints(…))` gives, field for field and in the same key order, at a
 * fraction of the cost (a column of numbers is one array of doubles, not one object per point).
 */
export function buildColumns(T: Float64Array, rg: ReactionGrid, tolJ: number, tolLn: number, sigmas: Sigmas | null): Partial<PointColumns> {
  const n = T.length;
  if (n === 0) return {};
  const { dCp, dH, dS, dG, naive } = rg;
  const tK = new Array<number>(n);
  const dCpJ = new Array<number>(n);
  const dHkJ = new Array<number>(n);
  const dSJ = new Array<number>(n);
  const dGkJ = new Array<number>(n);
  const lnKs = new Array<number>(n);
  const log10K = new Array<number>(n);
  const Ks = new Array<number | null>(n);
  const naiveDGkJ = new Array<number>(n);
  const naiveLnKs = new Array<number>(n);
  const naiveLog10K = new Array<number>(n);
  const diffKJ = new Array<number>(n);
  const exceedsTolerance = new Array<boolean>(n);
  for (let i = 0; i < n; i++) {
    const g = dG[i];
    const gn = naive[i];
    const t = T[i];
    const lnK = -g / (R * t);
    const naiveLnK = -gn / (R * t);
    const K = Math.exp(lnK);
    tK[i] = t;
    dCpJ[i] = dCp[i];
    dHkJ[i] = dH[i] / 1000;
    dSJ[i] = dS[i];
    dGkJ[i] = g / 1000;
    lnKs[i] = lnK;
    log10K[i] = lnK / LN10;
    Ks[i] = Number.isFinite(K) && K > 0 ? K : null;
    naiveDGkJ[i] = gn / 1000;
    naiveLnKs[i] = naiveLnK;
    naiveLog10K[i] = naiveLnK / LN10;
    diffKJ[i] = (gn - g) / 1000;
    exceedsTolerance[i] = Math.abs(gn - g) > tolJ || Math.abs(naiveLnK - lnK) > tolLn;
  }
  const columns: Partial<PointColumns> = {
    tK,
    dCpJ,
    dHkJ,
    dSJ,
    dGkJ,
    lnK: lnKs,
    log10K,
    K: Ks,
    naiveDGkJ,
    naiveLnK: naiveLnKs,
    naiveLog10K,
    diffKJ,
    exceedsTolerance,
  };
  if (sigmas === null) return columns;
  return {
    ...columns,
    sigmaDGkJ: Array.from(sigmas.dGkJ),
    sigmaLog10K: Array.from(sigmas.log10K),
    naiveSigmaDGkJ: Array.from(sigmas.naiveDGkJ),
    naiveExceedsUncertainty: Array.from(sigmas.exceeds, (v) => v === 1),
  };
}

/** Refuses (`nonfinite-value`) a reaction value that overflowed although every species' values are finite; names the first. */
export function refuseNonfinitePoints(T: Float64Array, rg: ReactionGrid): void {
  const ref: ReactionValues = rg.ref;
  const refBad = (["dCp", "dH", "dS", "dG"] as const).find((f) => !Number.isFinite(ref[f]));
  if (refBad) {
    refuse("nonfinite-value", `reference: Δr${refBad.slice(1)} is not finite in double precision; the models' coefficients are outside any physical range`, { field: refBad });
  }
  const fields = ["dCpJ", "dHkJ", "dSJ", "dGkJ", "lnK", "log10K", "naiveDGkJ", "naiveLnK", "diffKJ"] as const;
  for (const p of buildPoints(T, rg, Infinity, Infinity, null)) {
    const bad = fields.find((f) => !Number.isFinite(p[f]));
    if (bad) {
      refuse("nonfinite-value", `points at ${fmt(p.tK)} K: ${bad} is not finite in double precision; the models' coefficients are outside any physical range`, {
        tK: p.tK,
        field: bad,
      });
    }
  }
}
