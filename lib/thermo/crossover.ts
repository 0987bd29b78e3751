/**
 * Stage 4a of evaluate(): where ΔrG changes sign (the corrected crossovers, from the reaction's
 * grid arrays: one walk of the grid for all terms together) and the sign case of the naive line.
 */
import { brent } from "./roots";
import { reactionAt, type ReactionValues, type Term } from "./reaction-grid";
import { termAt } from "./term";
import { SIGN_CASES, type EvaluateResult, type SignCaseCode } from "./evaluate-types";

/**
 * Rounding scale of ΔrG at T (J/mol): ΔrG is a sum of ν·(H − T·S) over the terms, each known
 * to about 1e-13 of its size from the integration and a few ulps from the arithmetic.
 */
function touchTolerance(terms: readonly Term[], T: number): number {
  let size = 0;
  for (const t of terms) {
    const v = termAt(t.model, t.phase, T);
    size += Math.abs(t.nu) * (Math.abs(v.hJ) + T * Math.abs(v.sJ));
  }
  return 1e-12 * size;
}

/**
 * Corrected crossovers: bracket on the grid and at the extrema of ΔrG (ΔrS = 0). The nodes
 * are the grid temperatures plus one per sign change of ΔrS between neighbours.
 */
export function correctedCrossovers(terms: readonly Term[], T: Float64Array, dS: Float64Array, dG: Float64Array): number[] {
  const n = T.length;
  const dGAt = (t: number) => reactionAt(terms, t).dG;
  const dSAt = (t: number) => reactionAt(terms, t).dS;
  let changes = 0;
  for (let i = 0; i + 1 < n; i++) if (dS[i] * dS[i + 1] < 0) changes++;
  const nodeT = new Float64Array(n + changes);
  const nodeG = new Float64Array(n + changes);
  const nodeExtremum = new Uint8Array(n + changes);
  let nn = 0;
  for (let i = 0; i < n; i++) {
    nodeT[nn] = T[i];
    nodeG[nn] = dG[i];
    nodeExtremum[nn++] = dS[i] === 0 ? 1 : 0;
    if (i + 1 < n && dS[i] * dS[i + 1] < 0) {
      const te = brent(dSAt, T[i], T[i + 1], dS[i], dS[i + 1]);
      if (te > T[i] && te < T[i + 1]) {
        nodeT[nn] = te;
        nodeG[nn] = dGAt(te);
        nodeExtremum[nn++] = 1;
      }
    }
  }
  // A double root: ΔrG touches zero at an extremum (ΔrS = 0) without changing sign. An extremum
  // whose |ΔrG| is within the rounding of the terms' H and T·S counts as a root there.
  for (let j = 0; j < nn; j++) {
    if (nodeG[j] !== 0 && nodeExtremum[j] && Math.abs(nodeG[j]) <= touchTolerance(terms, nodeT[j])) nodeG[j] = 0;
  }
  const roots: number[] = [];
  for (let j = 0; j < nn; j++) {
    const ga = nodeG[j];
    if (ga === 0) {
      roots.push(nodeT[j]);
      continue;
    }
    if (j + 1 < nn) {
      const gb = nodeG[j + 1];
      if (gb !== 0 && ga * gb < 0) roots.push(brent(dGAt, nodeT[j], nodeT[j + 1], ga, gb, 1e-9));
    }
  }
  return roots;
}

/** The naive crossover ΔrH/ΔrS, the sign case of the naive line, and whether the corrected curve agrees with it. */
export function signCaseOf(
  ref: ReactionValues,
  T: Float64Array,
  roots: number[],
  dG: Float64Array,
  naive: Float64Array,
): { crossover: EvaluateResult["crossover"]; signCase: EvaluateResult["signCase"] } {
  const n = T.length;
  const naiveK = ref.dH * ref.dS > 0 ? ref.dH / ref.dS : null;
  const naiveInSpan = naiveK !== null && naiveK >= T[0] && naiveK <= T[n - 1];
  const code: SignCaseCode = ref.dH <= 0 ? (ref.dS >= 0 ? "favourable-always" : "favourable-below") : ref.dS > 0 ? "favourable-above" : "favourable-never";
  let agrees = roots.length === (naiveInSpan ? 1 : 0);
  for (let i = 0; i < n && agrees; i++) if (dG[i] < 0 !== naive[i] < 0) agrees = false;
  return {
    crossover: { naiveK, naiveInSpan, correctedK: roots },
    signCase: { code, text: SIGN_CASES[code], correctedAgrees: agrees },
  };
}
