/**
 * One phase of a species as a chain of segments, each anchored at one temperature; H and S
 * by numerical integration of Cp from the anchor, with the request's Integrator.
 */
import type { CompiledSegment } from "./forms";
import { integrateIntervals } from "./integrate-batch";
import type { Integrator } from "./integrate";

export type AnchorSource = "constants" | "reference" | "continuity-below" | "continuity-above" | "transition";

export interface Anchor {
  tK: number;
  hJ: number;
  sJ: number;
  source: AnchorSource;
}

export interface Segment extends CompiledSegment {
  anchor?: Anchor;
  /** Position in the species' `segments` array, for messages. */
  inputIndex: number;
  /** The species key, for messages (work budget, non-finite Cp). */
  species: string;
}

export interface Chain {
  phase: string;
  segs: Segment[];
  tminK: number;
  tmaxK: number;
  hasConstants: boolean;
}

/** Grid intervals integrated per batch call: bounds the scratch of a grid walk (a few tens of kB). */
const BLOCK = 1024;

/** Cp (J/(mol·K)), H (J/mol) and S (J/(mol·K)) at one temperature. */
export interface PointValues {
  cpJ: number;
  hJ: number;
  sJ: number;
}

/** ∫ Cp dT → ig.h and ∫ Cp/T dT → ig.s over [a, b] (a ≤ b) of one segment, split at table knots so each piece is smooth. */
function integrateSeg(ig: Integrator, seg: Segment, a: number, b: number): void {
  ig.site = seg;
  const br = seg.breaks;
  if (!br) {
    ig.integrateCp(seg.cp, a, b);
    return;
  }
  let h = 0;
  let s = 0;
  let lo = a;
  for (let i = 0; i < br.length; i++) {
    const x = br[i];
    if (x <= lo) continue;
    if (x >= b) break;
    ig.integrateCp(seg.cp, lo, x);
    h += ig.h;
    s += ig.s;
    lo = x;
  }
  ig.integrateCp(seg.cp, lo, b);
  ig.h += h;
  ig.s += s;
}

/** H and S of one segment at T (integrated from its anchor), and Cp there. */
export function segmentAt(ig: Integrator, seg: Segment, T: number): PointValues {
  const a = seg.anchor!;
  let hJ: number;
  let sJ: number;
  if (T >= a.tK) {
    integrateSeg(ig, seg, a.tK, T);
    hJ = a.hJ + ig.h;
    sJ = a.sJ + ig.s;
  } else {
    integrateSeg(ig, seg, T, a.tK);
    hJ = a.hJ - ig.h;
    sJ = a.sJ - ig.s;
  }
  return { cpJ: seg.cp(T), hJ, sJ };
}

/** The segment that evaluates T: the first whose upper edge is ≥ T (an edge belongs to the lower segment); the end segments extend beyond the chain. */
export function segmentIndexFor(chain: Chain, T: number): number {
  const segs = chain.segs;
  for (let i = 0; i < segs.length - 1; i++) if (T <= segs[i].tmaxK) return i;
  return segs.length - 1;
}

export function chainAt(ig: Integrator, chain: Chain, T: number): PointValues {
  return segmentAt(ig, chain.segs[segmentIndexFor(chain, T)], T);
}

/**
 * Cp, H, S of a chain on an ascending grid, one pass: within each segment the engine walks
 * outward from the anchor, integrating between neighbouring grid temperatures.
 */
export function chainOnGrid(ig: Integrator, chain: Chain, T: Float64Array, cp: Float64Array, h: Float64Array, s: Float64Array): void {
  const n = T.length;
  const segs = chain.segs;
  let i0 = 0;
  for (let k = 0; k < segs.length && i0 < n; k++) {
    const seg = segs[k];
    let i1 = i0;
    if (k === segs.length - 1) i1 = n;
    else while (i1 < n && T[i1] <= seg.tmaxK) i1++;
    if (i1 === i0) continue;
    const a = seg.anchor!;
    let split = i0;
    while (split < i1 && T[split] < a.tK) split++;
    const m = i1 - i0;
    if (seg.breaks) {
      const bufA = ig.scratch.float("gridA", m);
      walkPointwise(ig, seg, T, i0, i1, split, h, s);
      for (let j = i0; j < i1; j++) bufA[j - i0] = T[j];
      seg.cpBatch(bufA.subarray(0, m), cp.subarray(i0, i1), m);
      i0 = i1;
      continue;
    }
    // Interval j covers [T[j-1], T[j]] going up from the anchor, [T[j], T[j+1]] going down.
    // Integrated in blocks of at most BLOCK intervals, so the scratch stays small (and in cache)
    // whatever the grid size; every interval's integral depends on its own nodes only.
    const b = Math.min(m, BLOCK);
    const bufA = ig.scratch.float("gridA", b);
    const bufB = ig.scratch.float("gridB", b);
    const bufH = ig.scratch.float("gridH", b);
    const bufS = ig.scratch.float("gridS", b);
    const bufCA = ig.scratch.float("gridCA", b);
    const bufCB = ig.scratch.float("gridCB", b);
    ig.site = seg;
    for (let q0 = i0; q0 < i1; q0 += BLOCK) {
      const q1 = Math.min(q0 + BLOCK, i1);
      for (let j = q0; j < q1; j++) {
        const q = j - q0;
        if (j >= split) {
          bufA[q] = j === split ? a.tK : T[j - 1];
          bufB[q] = T[j];
        } else {
          bufA[q] = T[j];
          bufB[q] = j === split - 1 ? a.tK : T[j + 1];
        }
      }
      integrateIntervals(ig, seg.cpBatch, seg.cp, bufA, bufB, q1 - q0, bufH, bufS, bufCA, bufCB);
      for (let j = q0; j < q1; j++) {
        const q = j - q0;
        h[j] = bufH[q];
        s[j] = bufS[q];
        // The interval ends are the grid temperatures: their Cp came with the integration.
        cp[j] = j >= split ? bufCB[q] : bufCA[q];
      }
    }
    // Cumulative sums outward from the anchor, in place (h and s held the per-interval integrals).
    let hh = a.hJ;
    let ss = a.sJ;
    for (let j = split; j < i1; j++) {
      hh += h[j];
      ss += s[j];
      h[j] = hh;
      s[j] = ss;
    }
    hh = a.hJ;
    ss = a.sJ;
    for (let j = split - 1; j >= i0; j--) {
      hh -= h[j];
      ss -= s[j];
      h[j] = hh;
      s[j] = ss;
    }
    i0 = i1;
  }
}

/** Segments with kinks (tables) integrate interval by interval, split at their knots. */
function walkPointwise(ig: Integrator, seg: Segment, T: Float64Array, i0: number, i1: number, split: number, h: Float64Array, s: Float64Array): void {
  const a = seg.anchor!;
  let prev = a.tK;
  let hh = a.hJ;
  let ss = a.sJ;
  for (let j = split; j < i1; j++) {
    const t = T[j];
    if (t > prev) {
      integrateSeg(ig, seg, prev, t);
      hh += ig.h;
      ss += ig.s;
      prev = t;
    }
    h[j] = hh;
    s[j] = ss;
  }
  prev = a.tK;
  hh = a.hJ;
  ss = a.sJ;
  for (let j = split - 1; j >= i0; j--) {
    const t = T[j];
    if (t < prev) {
      integrateSeg(ig, seg, t, prev);
      hh -= ig.h;
      ss -= ig.s;
      prev = t;
    }
    h[j] = hh;
    s[j] = ss;
  }
}

export function covers(chain: Chain, T: number): boolean {
  const eps = 1e-9 * Math.max(1, T);
  return T >= chain.tminK - eps && T <= chain.tmaxK + eps;
}
