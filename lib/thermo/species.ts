/**
 * Species models: one chain of segments per phase, each segment anchored at one
 * temperature, H and S by numerical integration of Cp from the anchor.
 */
import { R, STANDARD_PRESSURE_PA, T298 } from "./constants";
import { refuse } from "./errors";
import { compileSegment, type CompiledSegment } from "./forms";
import { integrateCp, integrateIntervals, quad, site, withWorkBudget, WORK_BUDGET } from "./integrate";
import { brent } from "./roots";
import { formatPath, missingIsRequired, speciesSchema, type ParsedSpecies, type SpeciesInput } from "./schema";
import { parseMolarEnergyKJ, parseMolarEntropyJ, parsePressurePa, parseTemperatureK } from "./units";

/** A source's standard pressure in Pa: a bare number is Pa, a string carries its unit ("1 atm"). */
function parseStandardPressurePa(value: number | string, field: string): number {
  const pa = parsePressurePa(value, field);
  if (!(pa > 0) || !Number.isFinite(pa)) refuse("invalid-request", `invalid request: ${field}: expected a positive pressure (got ${pa} Pa)`, { field });
  return pa;
}
import { EngineRefusal } from "./errors";
import { inSupportedRange } from "./grid";

export interface EngineWarning {
  code: string;
  species?: string;
  tK?: number;
  message: string;
  [extra: string]: unknown;
}

type AnchorSource = "constants" | "reference" | "continuity-below" | "continuity-above" | "transition";

interface Anchor {
  tK: number;
  hJ: number;
  sJ: number;
  source: AnchorSource;
}

interface Segment extends CompiledSegment {
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

export interface SegmentJump {
  phase: string;
  tK: number;
  dHkJ: number;
  dSJ: number;
  dCpJ: number;
}

export interface SpeciesModel {
  key: string;
  chains: Map<string, Chain>;
  /** Build-time warnings (reference-mismatch, transition-mismatch). */
  warnings: EngineWarning[];
  jumps: SegmentJump[];
}

/** Thresholds beyond which two values of one quantity "disagree" (beyond rounding of published tables). */
export const JUMP_H_KJ = 1e-3;
export const JUMP_S_J = 1e-3;
export const MISMATCH_T_K = 0.5;
export const MISMATCH_H_KJ = 0.1;
export const MISMATCH_S_J = 0.1;

// ---------------------------------------------------------------- evaluation primitives

function integrateSeg(seg: Segment, a: number, b: number): void {
  // a ≤ b; splits at table knots so each piece is smooth.
  site.current = seg;
  const br = seg.breaks;
  if (!br) {
    integrateCp(seg.cp, a, b);
    return;
  }
  let h = 0;
  let s = 0;
  let lo = a;
  for (let i = 0; i < br.length; i++) {
    const x = br[i];
    if (x <= lo) continue;
    if (x >= b) break;
    integrateCp(seg.cp, lo, x);
    h += quad.h;
    s += quad.s;
    lo = x;
  }
  integrateCp(seg.cp, lo, b);
  quad.h += h;
  quad.s += s;
}

const point = { cp: 0, h: 0, s: 0 };

/** H and S of one segment at T (integrated from its anchor) → `point`. */
function segmentAt(seg: Segment, T: number): void {
  const a = seg.anchor!;
  if (T >= a.tK) {
    integrateSeg(seg, a.tK, T);
    point.h = a.hJ + quad.h;
    point.s = a.sJ + quad.s;
  } else {
    integrateSeg(seg, T, a.tK);
    point.h = a.hJ - quad.h;
    point.s = a.sJ - quad.s;
  }
  point.cp = seg.cp(T);
}

/** The segment that evaluates T: the first whose upper edge is ≥ T (an edge belongs to the lower segment); the end segments extend beyond the chain. */
function segmentIndexFor(chain: Chain, T: number): number {
  const segs = chain.segs;
  for (let i = 0; i < segs.length - 1; i++) if (T <= segs[i].tmaxK) return i;
  return segs.length - 1;
}

export function chainAt(chain: Chain, T: number): { cpJ: number; hJ: number; sJ: number } {
  segmentAt(chain.segs[segmentIndexFor(chain, T)], T);
  return { cpJ: point.cp, hJ: point.h, sJ: point.s };
}

/**
 * Cp, H, S of a chain on an ascending grid, one pass: within each segment the engine walks
 * outward from the anchor, integrating between neighbouring grid temperatures.
 */
let bufA = new Float64Array(0);
let bufB = new Float64Array(0);
let bufH = new Float64Array(0);
let bufS = new Float64Array(0);
let bufCA = new Float64Array(0);
let bufCB = new Float64Array(0);

function ensure(n: number): void {
  if (bufA.length < n) {
    bufA = new Float64Array(n);
    bufB = new Float64Array(n);
    bufH = new Float64Array(n);
    bufS = new Float64Array(n);
    bufCA = new Float64Array(n);
    bufCB = new Float64Array(n);
  }
}

export function chainOnGrid(chain: Chain, T: Float64Array, cp: Float64Array, h: Float64Array, s: Float64Array): void {
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
      walkPointwise(seg, T, i0, i1, split, h, s);
    } else {
      // Interval j covers [T[j-1], T[j]] going up from the anchor, [T[j], T[j+1]] going down.
      ensure(m);
      for (let j = i0; j < i1; j++) {
        const q = j - i0;
        if (j >= split) {
          bufA[q] = j === split ? a.tK : T[j - 1];
          bufB[q] = T[j];
        } else {
          bufA[q] = T[j];
          bufB[q] = j === split - 1 ? a.tK : T[j + 1];
        }
      }
      site.current = seg;
      integrateIntervals(seg.cpBatch, seg.cp, bufA, bufB, m, bufH, bufS, bufCA, bufCB);
      let hh = a.hJ;
      let ss = a.sJ;
      for (let j = split; j < i1; j++) {
        hh += bufH[j - i0];
        ss += bufS[j - i0];
        h[j] = hh;
        s[j] = ss;
      }
      hh = a.hJ;
      ss = a.sJ;
      for (let j = split - 1; j >= i0; j--) {
        hh -= bufH[j - i0];
        ss -= bufS[j - i0];
        h[j] = hh;
        s[j] = ss;
      }
    }
    if (seg.breaks) {
      for (let j = i0; j < i1; j++) bufA[j - i0] = T[j];
      seg.cpBatch(bufA.subarray(0, m), cp.subarray(i0, i1), m);
    } else {
      // The interval ends are the grid temperatures: their Cp came with the integration.
      for (let j = i0; j < i1; j++) cp[j] = j >= split ? bufCB[j - i0] : bufCA[j - i0];
    }
    i0 = i1;
  }
}

/** Segments with kinks (tables) integrate interval by interval, split at their knots. */
function walkPointwise(seg: Segment, T: Float64Array, i0: number, i1: number, split: number, h: Float64Array, s: Float64Array): void {
  ensure(i1 - i0);
  const a = seg.anchor!;
  let prev = a.tK;
  let hh = a.hJ;
  let ss = a.sJ;
  for (let j = split; j < i1; j++) {
    const t = T[j];
    if (t > prev) {
      integrateSeg(seg, prev, t);
      hh += quad.h;
      ss += quad.s;
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
      integrateSeg(seg, t, prev);
      hh -= quad.h;
      ss -= quad.s;
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

// ---------------------------------------------------------------- building a model

/**
 * Compile and anchor a species entry. Refuses (EngineRefusal) a gap or overlap in a chain,
 * a phase without an anchor, and malformed references or transitions.
 */
export function buildSpeciesModel(key: string, entry: ParsedSpecies, referenceK: number, fieldPrefix?: string): SpeciesModel {
  const label = `species "${key}"`;
  const field = (rest: string) => `${fieldPrefix ?? formatPath(["species", key])}${rest}`;
  const warnings: EngineWarning[] = [];
  const p0 = entry.standardPressurePa === undefined ? STANDARD_PRESSURE_PA : parseStandardPressurePa(entry.standardPressurePa, field(".standardPressurePa"));
  // S°(1 bar) = S°(p0) + R ln(p0 / 1 bar) for an ideal gas; condensed phases are left alone.
  const sCorrection = (phase: string) => (phase === "g" ? R * Math.log(p0 / STANDARD_PRESSURE_PA) : 0);

  const chains = new Map<string, Chain>();
  entry.segments.forEach((raw, i) => {
    const seg: Segment = { ...compileSegment(raw, field(`.segments[${i}]`)), inputIndex: i, species: key };
    let chain = chains.get(seg.phase);
    if (!chain) {
      chain = { phase: seg.phase, segs: [], tminK: 0, tmaxK: 0, hasConstants: false };
      chains.set(seg.phase, chain);
    }
    chain.segs.push(seg);
  });
  for (const chain of chains.values()) {
    chain.segs.sort((a, b) => a.tminK - b.tminK);
    for (let i = 1; i < chain.segs.length; i++) {
      const prev = chain.segs[i - 1];
      const next = chain.segs[i];
      const tol = 1e-9 * Math.max(1, prev.tmaxK);
      if (next.tminK > prev.tmaxK + tol) {
        refuse("chain-gap", `${label}: gap in the ${chain.phase} chain between ${prev.tmaxK} K and ${next.tminK} K`, {
          species: key, phase: chain.phase, fromK: prev.tmaxK, toK: next.tminK,
        });
      }
      if (next.tminK < prev.tmaxK - tol) {
        refuse("chain-overlap", `${label}: segments of the ${chain.phase} chain overlap between ${next.tminK} K and ${prev.tmaxK} K`, {
          species: key, phase: chain.phase,
        });
      }
    }
    chain.tminK = chain.segs[0].tminK;
    chain.tmaxK = chain.segs[chain.segs.length - 1].tmaxK;
    for (const seg of chain.segs) {
      if (seg.constants) {
        chain.hasConstants = true;
        const ta = Math.min(Math.max(referenceK, seg.tminK), seg.tmaxK);
        seg.anchor = { tK: ta, hJ: seg.constants.hJ(ta), sJ: seg.constants.sJ(ta) + sCorrection(seg.phase), source: "constants" };
      }
    }
  }

  const chainOf = (phase: string, at: string): Chain => {
    const c = chains.get(phase);
    if (!c) refuse("invalid-request", `${at}: ${label} has no segments for the ${phase} phase`, { species: key, phase });
    return c!;
  };

  if (entry.reference) {
    const ref = entry.reference;
    const tK = parseTemperatureK(ref.tK, field(".reference.tK"));
    if (!(tK > 0)) refuse("nonpositive-temperature", `${field(".reference.tK")}: temperatures must be above 0 K (got ${tK} K)`);
    inSupportedRange(tK, field(".reference.tK"));
    const hJ = 1000 * parseMolarEnergyKJ(ref.hkJ, field(".reference.hkJ"));
    const sJ = parseMolarEntropyJ(ref.sJ, field(".reference.sJ")) + sCorrection(ref.phase);
    const chain = chainOf(ref.phase, field(".reference.phase"));
    const seg = chain.segs[segmentIndexFor(chain, tK)];
    if (seg.anchor) {
      segmentAt(seg, tK);
      const dH = (hJ - point.h) / 1000;
      const dS = sJ - point.s;
      if (Math.abs(dH) > MISMATCH_H_KJ || Math.abs(dS) > MISMATCH_S_J) {
        warnings.push({
          code: "reference-mismatch", species: key, tK, phase: ref.phase, dHkJ: dH, dSJ: dS,
          message: `the stated reference (H ${fmt(hJ / 1000)} kJ/mol, S ${fmt(sJ)} J/(mol·K) at ${fmt(tK)} K) differs from the ${ref.phase} model's own constants by ${fmt(dH)} kJ/mol and ${fmt(dS)} J/(mol·K); the model's constants are used`,
        });
      }
    } else {
      seg.anchor = { tK, hJ, sJ, source: "reference" };
    }
  }

  const transitions = (entry.transitions ?? []).map((tr, i) => {
    const at = field(`.transitions[${i}]`);
    const tK = parseTemperatureK(tr.tK, `${at}.tK`);
    if (!(tK > 0)) refuse("nonpositive-temperature", `${at}.tK: temperatures must be above 0 K (got ${tK} K)`);
    inSupportedRange(tK, `${at}.tK`);
    return {
      tK, from: chainOf(tr.from, `${at}.from`), to: chainOf(tr.to, `${at}.to`),
      dHJ: 1000 * parseMolarEnergyKJ(tr.dHkJ, `${at}.dHkJ`), used: false,
    };
  });

  for (let changed = true; changed; ) {
    changed = false;
    for (const chain of chains.values()) {
      const segs = chain.segs;
      for (let i = 0; i < segs.length; i++) {
        const seg = segs[i];
        if (seg.anchor) continue;
        if (i > 0 && segs[i - 1].anchor) {
          segmentAt(segs[i - 1], seg.tminK);
          seg.anchor = { tK: seg.tminK, hJ: point.h, sJ: point.s, source: "continuity-below" };
          changed = true;
        } else if (i < segs.length - 1 && segs[i + 1].anchor) {
          segmentAt(segs[i + 1], seg.tmaxK);
          seg.anchor = { tK: seg.tmaxK, hJ: point.h, sJ: point.s, source: "continuity-above" };
          changed = true;
        }
      }
    }
    for (const tr of transitions) {
      const fromSeg = tr.from.segs[segmentIndexFor(tr.from, tr.tK)];
      const toSeg = tr.to.segs[segmentIndexFor(tr.to, tr.tK)];
      if (fromSeg.anchor && !toSeg.anchor) {
        segmentAt(fromSeg, tr.tK);
        toSeg.anchor = { tK: tr.tK, hJ: point.h + tr.dHJ, sJ: point.s + tr.dHJ / tr.tK, source: "transition" };
        tr.used = changed = true;
      } else if (toSeg.anchor && !fromSeg.anchor) {
        segmentAt(toSeg, tr.tK);
        fromSeg.anchor = { tK: tr.tK, hJ: point.h - tr.dHJ, sJ: point.s - tr.dHJ / tr.tK, source: "transition" };
        tr.used = changed = true;
      }
    }
  }

  for (const chain of chains.values()) {
    if (chain.segs.some((s) => !s.anchor)) {
      refuse(
        "no-anchor",
        `${label}: the ${chain.phase} phase has no anchor; its forms carry no integration constants, so give a reference {tK, phase, hkJ, sJ} or a transition to a phase that has one`,
        { species: key, phase: chain.phase },
      );
    }
  }

  // Stated transitions that were not needed as anchors are checked against the G crossing.
  for (const tr of transitions) {
    if (tr.used) continue;
    const gDiff = (T: number) => {
      const a = chainAt(tr.from, T);
      const b = chainAt(tr.to, T);
      return b.hJ - T * b.sJ - (a.hJ - T * a.sJ);
    };
    const derived = findCrossing(gDiff, tr.tK, 50);
    let dHJ = Number.NaN;
    if (derived !== null) dHJ = chainAt(tr.to, derived).hJ - chainAt(tr.from, derived).hJ;
    const off =
      derived === null || Math.abs(derived - tr.tK) > MISMATCH_T_K || Math.abs(dHJ - tr.dHJ) / 1000 > MISMATCH_H_KJ;
    if (off) {
      warnings.push({
        code: "transition-mismatch", species: key, tK: tr.tK, from: tr.from.phase, to: tr.to.phase,
        statedDHkJ: tr.dHJ / 1000, derivedK: derived, derivedDHkJ: derived === null ? null : dHJ / 1000,
        message:
          derived === null
            ? `the stated ${tr.from.phase} → ${tr.to.phase} transition at ${fmt(tr.tK)} K is not where the two phases' G curves cross (no crossing within 50 K)`
            : `the stated ${tr.from.phase} → ${tr.to.phase} transition (${fmt(tr.tK)} K, ${fmt(tr.dHJ / 1000)} kJ/mol) differs from the G crossing of the two phases' models (${fmt(derived)} K, ${fmt(dHJ / 1000)} kJ/mol)`,
      });
    }
  }

  const jumps: SegmentJump[] = [];
  for (const chain of chains.values()) {
    for (let i = 1; i < chain.segs.length; i++) {
      const lo = chain.segs[i - 1];
      const hi = chain.segs[i];
      if (hi.anchor!.source === "continuity-below" || lo.anchor!.source === "continuity-above") continue;
      const edge = lo.tmaxK;
      segmentAt(lo, edge);
      const below = { ...point };
      segmentAt(hi, edge);
      const dHkJ = (point.h - below.h) / 1000;
      const dSJ = point.s - below.s;
      if (Math.abs(dHkJ) > JUMP_H_KJ || Math.abs(dSJ) > JUMP_S_J) {
        jumps.push({ phase: chain.phase, tK: edge, dHkJ, dSJ, dCpJ: point.cp - below.cp });
      }
    }
  }
  return { key, chains, warnings, jumps };
}

/** A root of f near `centre` (scan ±halfWidth K, then Brent), or null. */
function findCrossing(f: (T: number) => number, centre: number, halfWidth: number): number | null {
  const lo = Math.max(centre - halfWidth, 1e-3);
  const steps = 100;
  let best: number | null = null;
  let xPrev = lo;
  let fPrev = f(lo);
  for (let i = 1; i <= steps; i++) {
    const x = lo + ((centre + halfWidth - lo) * i) / steps;
    const fx = f(x);
    if (fPrev === 0 || fPrev * fx < 0) {
      const root = fPrev === 0 ? xPrev : brent(f, xPrev, x, fPrev, fx);
      if (best === null || Math.abs(root - centre) < Math.abs(best - centre)) best = root;
    }
    xPrev = x;
    fPrev = fx;
  }
  return best;
}

// ---------------------------------------------------------------- terms: a key with or without a phase

export interface TermGrid {
  cp: Float64Array;
  h: Float64Array;
  s: Float64Array;
  /** Index into `phases` of the phase used at each grid temperature. */
  phaseIndex: Uint8Array;
  phases: string[];
  /** Per phase: G (J/mol) on the grid, when several phases were evaluated. */
  gByPhase?: Float64Array[];
}

/** The chains a term may use: only the marked phase, or all phases. */
export function termChains(model: SpeciesModel, phase: string | undefined): Chain[] {
  if (phase === undefined) return [...model.chains.values()];
  const chain = model.chains.get(phase);
  if (!chain) {
    refuse("missing-phase", `species "${model.key}": the key asks for the ${phase} phase but no segment has phase "${phase}"`, {
      species: model.key, phase,
    });
  }
  return [chain!];
}

/**
 * Properties of a term on an ascending grid. A marked term uses its phase only; an unmarked
 * term takes, at each T, the lowest-G phase among those whose range covers T (all phases
 * if none covers it).
 */
export function termOnGrid(model: SpeciesModel, phase: string | undefined, T: Float64Array, withOthers = false): TermGrid {
  const n = T.length;
  const all = phase === undefined || withOthers ? [...model.chains.values()] : termChains(model, phase);
  const own = phase === undefined ? -1 : all.findIndex((c) => c.phase === phase);
  if (phase !== undefined && own < 0) termChains(model, phase);
  const cps: Float64Array[] = [];
  const hs: Float64Array[] = [];
  const ss: Float64Array[] = [];
  for (const chain of all) {
    const cp = new Float64Array(n);
    const h = new Float64Array(n);
    const s = new Float64Array(n);
    chainOnGrid(chain, T, cp, h, s);
    cps.push(cp);
    hs.push(h);
    ss.push(s);
  }
  const phases = all.map((c) => c.phase);
  if (all.length === 1) return { cp: cps[0], h: hs[0], s: ss[0], phaseIndex: new Uint8Array(n), phases };
  const gByPhase = all.map((_, k) => {
    const g = new Float64Array(n);
    for (let i = 0; i < n; i++) g[i] = hs[k][i] - T[i] * ss[k][i];
    return g;
  });
  if (own >= 0) {
    return { cp: cps[own], h: hs[own], s: ss[own], phaseIndex: new Uint8Array(n).fill(own), phases, gByPhase };
  }
  const cp = new Float64Array(n);
  const h = new Float64Array(n);
  const s = new Float64Array(n);
  const phaseIndex = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const k = lowestG(all, gByPhase, i, T[i]);
    cp[i] = cps[k][i];
    h[i] = hs[k][i];
    s[i] = ss[k][i];
    phaseIndex[i] = k;
  }
  return { cp, h, s, phaseIndex, phases, gByPhase };
}

function lowestG(all: Chain[], g: Float64Array[], i: number, T: number): number {
  let best = -1;
  for (let k = 0; k < all.length; k++) {
    if (covers(all[k], T) && (best < 0 || g[k][i] < g[best][i])) best = k;
  }
  if (best >= 0) return best;
  best = 0;
  for (let k = 1; k < all.length; k++) if (g[k][i] < g[best][i]) best = k;
  return best;
}

/** Properties of a term at one temperature (used by root finding and at the reference temperature). */
export function termAt(model: SpeciesModel, phase: string | undefined, T: number): { cpJ: number; hJ: number; sJ: number; phase: string } {
  const chains = termChains(model, phase);
  let best: { cpJ: number; hJ: number; sJ: number; phase: string } | null = null;
  let bestCovers = false;
  for (const chain of chains) {
    const v = { ...chainAt(chain, T), phase: chain.phase };
    const c = covers(chain, T);
    const g = v.hJ - T * v.sJ;
    if (
      best === null ||
      (c && !bestCovers) ||
      (c === bestCovers && g < best.hJ - T * best.sJ)
    ) {
      best = v;
      bestCovers = c;
    }
  }
  return best!;
}

// ---------------------------------------------------------------- warnings about a term

/**
 * Warnings for one term over a grid span: extrapolation, reference-extrapolation,
 * metastable-phase, phase-change-in-span, nonphysical-cp, segment-jump (edges inside the span).
 */
export function termWarnings(
  model: SpeciesModel,
  phase: string | undefined,
  T: Float64Array,
  grid: TermGrid,
  referenceK: number | null,
): EngineWarning[] {
  const key = model.key;
  const out: EngineWarning[] = [];
  const n = T.length;
  const chainsByName = model.chains;
  // The grid in runs of one phase (one run when the term has one phase): the warnings below
  // look at run ends, not at every grid temperature.
  const runChains = grid.phases.map((p) => chainsByName.get(p)!);
  const runStart: number[] = [];
  const runPhase: number[] = [];
  if (grid.phases.length === 1) {
    if (n > 0) {
      runStart.push(0);
      runPhase.push(grid.phaseIndex[0]);
    }
  } else {
    const pi = grid.phaseIndex;
    for (let i = 0; i < n; i++) {
      if (i === 0 || pi[i] !== pi[i - 1]) {
        runStart.push(i);
        runPhase.push(pi[i]);
      }
    }
  }
  runStart.push(n);
  // Extrapolation: per side, the furthest grid temperature outside the chain in use there. The
  // grid ascends, so within a run that is its first (below) or last (above) temperature.
  const worst: Record<"below" | "above", { by: number; tK: number; limit: number; phase: string } | null> = { below: null, above: null };
  for (let r = 0; r + 1 < runStart.length; r++) {
    const chain = runChains[runPhase[r]];
    const tLo = T[runStart[r]];
    const tHi = T[runStart[r + 1] - 1];
    if (tLo < chain.tminK && !covers(chain, tLo)) {
      const by = chain.tminK - tLo;
      if (!worst.below || by > worst.below.by) worst.below = { by, tK: tLo, limit: chain.tminK, phase: chain.phase };
    }
    if (tHi > chain.tmaxK && !covers(chain, tHi)) {
      const by = tHi - chain.tmaxK;
      if (!worst.above || by > worst.above.by) worst.above = { by, tK: tHi, limit: chain.tmaxK, phase: chain.phase };
    }
  }
  for (const side of ["below", "above"] as const) {
    const w = worst[side];
    if (!w) continue;
    out.push({
      code: "extrapolation", species: key, tK: w.tK, side, byK: w.by, limitK: w.limit, phase: w.phase,
      message: `${side} the ${fmt(w.limit)} K ${side === "below" ? "lower" : "upper"} limit of the model by ${fmt(w.by)} K`,
    });
  }
  if (referenceK !== null) {
    const at = termAt(model, phase, referenceK);
    const chain = chainsByName.get(at.phase)!;
    if (!covers(chain, referenceK)) {
      const below = referenceK < chain.tminK;
      out.push({
        code: "reference-extrapolation", species: key, tK: referenceK, phase: chain.phase,
        side: below ? "below" : "above", byK: below ? chain.tminK - referenceK : referenceK - chain.tmaxK,
        message: `the reference temperature ${fmt(referenceK)} K is ${below ? "below" : "above"} the ${fmt(below ? chain.tminK : chain.tmaxK)} K ${below ? "lower" : "upper"} limit of the ${chain.phase} model, so the naive curve starts from extrapolated values`,
      });
    }
  }
  if (grid.gByPhase && phase !== undefined) {
    const own = grid.phases.indexOf(phase);
    let first = -1;
    let worstGap = 0;
    let worstPhase = "";
    let last = -1;
    for (let i = 0; i < n; i++) {
      for (let k = 0; k < grid.phases.length; k++) {
        if (k === own || !covers(chainsByName.get(grid.phases[k])!, T[i])) continue;
        const gap = grid.gByPhase[own][i] - grid.gByPhase[k][i];
        if (gap > 1e-6) {
          if (first < 0) first = i;
          last = i;
          if (gap > worstGap) {
            worstGap = gap;
            worstPhase = grid.phases[k];
          }
        }
      }
    }
    if (first >= 0) {
      out.push({
        code: "metastable-phase", species: key, tK: T[first], toK: T[last], phase, stablePhase: worstPhase, dGkJ: worstGap / 1000,
        message: `${phase} is not the stable phase from ${fmt(T[first])} K to ${fmt(T[last])} K (${worstPhase} is lower in G by up to ${fmt(worstGap / 1000)} kJ/mol); the term keeps the ${phase} phase as written`,
      });
    }
  }
  if (phase === undefined) {
    for (let r = 1; r + 1 < runStart.length; r++) {
      const i = runStart[r];
      const a = runPhase[r - 1];
      const b = runPhase[r];
      const ca = chainsByName.get(grid.phases[a])!;
      const cb = chainsByName.get(grid.phases[b])!;
      const f = (t: number) => {
        const x = chainAt(cb, t);
        const y = chainAt(ca, t);
        return x.hJ - t * x.sJ - (y.hJ - t * y.sJ);
      };
      let at: number | null = null;
      const f0 = f(T[i - 1]);
      const f1 = f(T[i]);
      if (f0 * f1 <= 0) at = brent(f, T[i - 1], T[i], f0, f1);
      else {
        // The switch came from a range edge, not a G crossing.
        at = ca.tmaxK >= T[i - 1] && ca.tmaxK <= T[i] ? ca.tmaxK : cb.tminK >= T[i - 1] && cb.tminK <= T[i] ? cb.tminK : null;
      }
      const hb = chainAt(cb, at ?? T[i]);
      const ha = chainAt(ca, at ?? T[i]);
      out.push({
        code: "phase-change-in-span", species: key, tK: at ?? T[i], from: ca.phase, to: cb.phase, dHkJ: (hb.hJ - ha.hJ) / 1000,
        message: `changes from ${ca.phase} to ${cb.phase} at ${fmt(at ?? T[i])} K inside the span (ΔH ${fmt((hb.hJ - ha.hJ) / 1000)} kJ/mol); the lowest-G phase is used on each side`,
      });
    }
  }
  let bad = -1;
  let minCp = Infinity;
  for (let i = 0; i < n; i++) {
    if (!(grid.cp[i] > 0)) {
      if (bad < 0) bad = i;
      if (grid.cp[i] < minCp) minCp = grid.cp[i];
    }
  }
  if (bad >= 0) {
    out.push({
      code: "nonphysical-cp", species: key, tK: T[bad], minCpJ: minCp,
      message: `Cp is not positive from ${fmt(T[bad])} K (lowest ${fmt(minCp)} J/(mol·K)); the model is outside the range where it means anything`,
    });
  }
  const lo = Math.min(T[0], referenceK ?? T[0]);
  const hi = Math.max(T[n - 1], referenceK ?? T[n - 1]);
  const used = new Set(phase === undefined ? runPhase.map((k) => grid.phases[k]) : [phase]);
  for (const j of model.jumps) {
    if (!used.has(j.phase) || j.tK < lo || j.tK > hi) continue;
    out.push({
      code: "segment-jump", species: key, tK: j.tK, phase: j.phase, dHkJ: j.dHkJ, dSJ: j.dSJ, dCpJ: j.dCpJ,
      message: `the two ${j.phase} segments meeting at ${fmt(j.tK)} K disagree there: H jumps by ${fmt(j.dHkJ)} kJ/mol, S by ${fmt(j.dSJ)} J/(mol·K), Cp by ${fmt(j.dCpJ)} J/(mol·K)`,
    });
  }
  for (const w of model.warnings) out.push(w);
  return out;
}

/**
 * Refuses (`nonfinite-value`) a term whose Cp, H or S is not a finite double at some grid
 * temperature (coefficients so large that the values overflow), so that no result carries null.
 */
export function checkFiniteGrid(key: string, grid: TermGrid, T: Float64Array): void {
  for (let i = 0; i < T.length; i++) {
    const bad = !Number.isFinite(grid.cp[i]) ? "Cp" : !Number.isFinite(grid.h[i]) ? "H" : !Number.isFinite(grid.s[i]) ? "S" : null;
    if (bad) {
      refuse(
        "nonfinite-value",
        `species "${key}": ${bad} is not finite at ${fmt(T[i])} K (got ${bad === "Cp" ? grid.cp[i] : bad === "H" ? grid.h[i] : grid.s[i]}); the model's coefficients are outside any physical range`,
        { species: key, tK: T[i], quantity: bad },
      );
    }
  }
}

/** Numbers in messages: 6 significant figures, no trailing zeros. */
export function fmt(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  return String(Number(x.toPrecision(6)));
}

// ---------------------------------------------------------------- public: one species

export interface SpeciesRow {
  tK: number;
  phase: string;
  cpJ: number;
  hkJ: number;
  sJ: number;
  /** H − T·S in kJ/mol (not ΔfG°). */
  gkJ: number;
}

/**
 * Cp (J/(mol·K)), H on the formation basis (kJ/mol), S (J/(mol·K)) and G = H − TS (kJ/mol,
 * not ΔfG°) of one species at the given temperatures (K), with warnings. `phase` restricts
 * to one chain; without it the lowest-G phase is taken at each T. Rows come back in the
 * order of `temperaturesK`.
 */
export function speciesProperties(
  species: SpeciesInput,
  temperaturesK: number[],
  options: { phase?: string; referenceK?: number; key?: string } = {},
): { rows: SpeciesRow[]; warnings: EngineWarning[] } {
  return withWorkBudget(WORK_BUDGET, () => speciesPropertiesWithin(species, temperaturesK, options));
}

function speciesPropertiesWithin(
  species: SpeciesInput,
  temperaturesK: number[],
  options: { phase?: string; referenceK?: number; key?: string },
): { rows: SpeciesRow[]; warnings: EngineWarning[] } {
  const parsed = speciesSchema.safeParse(species, { error: missingIsRequired });
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    refuse("invalid-request", `${formatPath(["species", ...issue.path])}: ${issue.message}`, { issues: parsed.error.issues });
  }
  const referenceK = options.referenceK ?? T298;
  for (const t of [...temperaturesK, referenceK]) {
    if (!(t > 0) || !Number.isFinite(t)) refuse("nonpositive-temperature", `temperaturesK: temperatures must be finite and above 0 K (got ${t} K)`);
    inSupportedRange(t, "temperaturesK");
  }
  const key = options.key ?? "species";
  const model = buildSpeciesModel(key, parsed.data!, referenceK, "species");
  const order = temperaturesK.map((t, i) => i).sort((a, b) => temperaturesK[a] - temperaturesK[b]);
  const T = Float64Array.from(order, (i) => temperaturesK[i]);
  const grid = termOnGrid(model, options.phase, T, options.phase !== undefined);
  const rows: SpeciesRow[] = new Array(T.length);
  for (let j = 0; j < T.length; j++) {
    const hkJ = grid.h[j] / 1000;
    rows[order[j]] = {
      tK: T[j], phase: grid.phases[grid.phaseIndex[j]], cpJ: grid.cp[j], hkJ, sJ: grid.s[j], gkJ: hkJ - (T[j] * grid.s[j]) / 1000,
    };
  }
  const warnings = T.length ? termWarnings(model, options.phase, T, grid, options.referenceK ?? null) : [...model.warnings];
  return { rows, warnings };
}

export { EngineRefusal };
