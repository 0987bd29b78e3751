/**
 * Building a species model, in named stages: compile the segments into one chain per phase
 * (checking gaps and overlaps) → anchor segments with published constants → apply the stated
 * reference → read the transitions → propagate anchors by continuity and transitions →
 * check that every phase is anchored → check unused transitions against the G crossing →
 * record the H/S jumps between segments that were anchored on their own.
 */
import { R, STANDARD_PRESSURE_PA } from "./constants";
import { chainAt, segmentAt, segmentIndexFor, type Chain, type Segment } from "./chain";
import { refuse } from "./errors";
import { fmt } from "./format";
import { compileSegment } from "./forms";
import { requireTemperatureK } from "./grid";
import { Integrator } from "./integrate";
import { brent } from "./roots";
import { formatPath, type ParsedSpecies } from "./schema";
import { parseMolarEnergyKJ, parseMolarEntropyJ, parsePressurePa, parseTemperatureK } from "./units";

export interface EngineWarning {
  code: string;
  species?: string;
  tK?: number;
  message: string;
  [extra: string]: unknown;
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
  /** The request's integrator: every integral of this model is charged to its budget and uses its scratch. */
  integrator: Integrator;
}

/** Thresholds beyond which two values of one quantity "disagree" (beyond rounding of published tables). */
export const JUMP_H_KJ = 1e-3;
export const JUMP_S_J = 1e-3;
export const MISMATCH_T_K = 0.5;
export const MISMATCH_H_KJ = 0.1;
export const MISMATCH_S_J = 0.1;

export interface BuildOptions {
  /** The request's integrator (one per evaluate() call); a model built on its own gets an unbounded one. */
  integrator?: Integrator;
  /** Field path of the entry in messages (default `species["key"]`). */
  fieldPrefix?: string;
}

interface Transition {
  tK: number;
  from: Chain;
  to: Chain;
  dHJ: number;
  used: boolean;
}

/** What the stages share while one entry is built. */
interface Build {
  key: string;
  label: string;
  field: (rest: string) => string;
  ig: Integrator;
  chains: Map<string, Chain>;
  warnings: EngineWarning[];
  /** S°(1 bar) − S°(p0) of a phase: R ln(p0 / 1 bar) for an ideal gas, 0 for condensed phases. */
  sCorrection: (phase: string) => number;
  chainOf: (phase: string, at: string) => Chain;
}

/**
 * Compile and anchor a species entry. Refuses (EngineRefusal) a gap or overlap in a chain,
 * a phase without an anchor, and malformed references or transitions.
 */
export function buildSpeciesModel(key: string, entry: ParsedSpecies, referenceK: number, options: BuildOptions = {}): SpeciesModel {
  const label = `species "${key}"`;
  const field = (rest: string) => `${options.fieldPrefix ?? formatPath(["species", key])}${rest}`;
  const p0 = entry.standardPressurePa === undefined ? STANDARD_PRESSURE_PA : parseStandardPressurePa(entry.standardPressurePa, field(".standardPressurePa"));
  const chains = compileChains(key, label, field, entry);
  const b: Build = {
    key,
    label,
    field,
    chains,
    ig: options.integrator ?? new Integrator(),
    warnings: [],
    sCorrection: (phase) => (phase === "g" ? R * Math.log(p0 / STANDARD_PRESSURE_PA) : 0),
    chainOf: (phase, at) => {
      const c = chains.get(phase);
      if (!c) refuse("invalid-request", `${at}: ${label} has no segments for the ${phase} phase`, { species: key, phase });
      return c!;
    },
  };
  anchorFromConstants(b, referenceK);
  applyReference(b, entry);
  const transitions = readTransitions(b, entry);
  propagateAnchors(b, transitions);
  requireAnchors(b);
  checkUnusedTransitions(b, transitions);
  return { key, chains, warnings: b.warnings, jumps: segmentJumps(b), integrator: b.ig };
}

/** A source's standard pressure in Pa: a bare number is Pa, a string carries its unit ("1 atm"). */
function parseStandardPressurePa(value: number | string, field: string): number {
  const pa = parsePressurePa(value, field);
  if (!(pa > 0) || !Number.isFinite(pa)) refuse("invalid-request", `invalid request: ${field}: expected a positive pressure (got ${pa} Pa)`, { field });
  return pa;
}

/** Stage 1: one chain per phase, segments in order of temperature, without gaps or overlaps. */
function compileChains(key: string, label: string, field: (rest: string) => string, entry: ParsedSpecies): Map<string, Chain> {
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
          species: key,
          phase: chain.phase,
          fromK: prev.tmaxK,
          toK: next.tminK,
        });
      }
      if (next.tminK < prev.tmaxK - tol) {
        refuse("chain-overlap", `${label}: segments of the ${chain.phase} chain overlap between ${next.tminK} K and ${prev.tmaxK} K`, {
          species: key,
          phase: chain.phase,
        });
      }
    }
    chain.tminK = chain.segs[0].tminK;
    chain.tmaxK = chain.segs[chain.segs.length - 1].tmaxK;
  }
  return chains;
}

/** Stage 2: a segment with published constants is anchored by them, at the reference temperature clamped into its range. */
function anchorFromConstants(b: Build, referenceK: number): void {
  for (const chain of b.chains.values()) {
    for (const seg of chain.segs) {
      if (seg.constants) {
        chain.hasConstants = true;
        const ta = Math.min(Math.max(referenceK, seg.tminK), seg.tmaxK);
        seg.anchor = { tK: ta, hJ: seg.constants.hJ(ta), sJ: seg.constants.sJ(ta) + b.sCorrection(seg.phase), source: "constants" };
      }
    }
  }
}

/** Stage 3: the stated reference anchors its segment, or is checked against the segment's own constants. */
function applyReference(b: Build, entry: ParsedSpecies): void {
  if (!entry.reference) return;
  const { field, key } = b;
  const ref = entry.reference;
  const tK = requireTemperatureK(parseTemperatureK(ref.tK, field(".reference.tK")), field(".reference.tK"));
  const hJ = 1000 * parseMolarEnergyKJ(ref.hkJ, field(".reference.hkJ"));
  const sJ = parseMolarEntropyJ(ref.sJ, field(".reference.sJ")) + b.sCorrection(ref.phase);
  const chain = b.chainOf(ref.phase, field(".reference.phase"));
  const seg = chain.segs[segmentIndexFor(chain, tK)];
  if (!seg.anchor) {
    seg.anchor = { tK, hJ, sJ, source: "reference" };
    return;
  }
  const own = segmentAt(b.ig, seg, tK);
  const dH = (hJ - own.hJ) / 1000;
  const dS = sJ - own.sJ;
  if (Math.abs(dH) > MISMATCH_H_KJ || Math.abs(dS) > MISMATCH_S_J) {
    b.warnings.push({
      code: "reference-mismatch",
      species: key,
      tK,
      phase: ref.phase,
      dHkJ: dH,
      dSJ: dS,
      message: `the stated reference (H ${fmt(hJ / 1000)} kJ/mol, S ${fmt(sJ)} J/(mol·K) at ${fmt(tK)} K) differs from the ${ref.phase} model's own constants by ${fmt(dH)} kJ/mol and ${fmt(dS)} J/(mol·K); the model's constants are used`,
    });
  }
}

/** Stage 4: the stated phase transitions, parsed. */
function readTransitions(b: Build, entry: ParsedSpecies): Transition[] {
  return (entry.transitions ?? []).map((tr, i) => {
    const at = b.field(`.transitions[${i}]`);
    const tK = requireTemperatureK(parseTemperatureK(tr.tK, `${at}.tK`), `${at}.tK`);
    return {
      tK,
      from: b.chainOf(tr.from, `${at}.from`),
      to: b.chainOf(tr.to, `${at}.to`),
      dHJ: 1000 * parseMolarEnergyKJ(tr.dHkJ, `${at}.dHkJ`),
      used: false,
    };
  });
}

/** Stage 5: anchors spread to neighbouring segments (continuity of H and S) and across transitions until nothing changes. */
function propagateAnchors(b: Build, transitions: Transition[]): void {
  const ig = b.ig;
  for (let changed = true; changed;) {
    changed = false;
    for (const chain of b.chains.values()) {
      const segs = chain.segs;
      for (let i = 0; i < segs.length; i++) {
        const seg = segs[i];
        if (seg.anchor) continue;
        if (i > 0 && segs[i - 1].anchor) {
          const v = segmentAt(ig, segs[i - 1], seg.tminK);
          seg.anchor = { tK: seg.tminK, hJ: v.hJ, sJ: v.sJ, source: "continuity-below" };
          changed = true;
        } else if (i < segs.length - 1 && segs[i + 1].anchor) {
          const v = segmentAt(ig, segs[i + 1], seg.tmaxK);
          seg.anchor = { tK: seg.tmaxK, hJ: v.hJ, sJ: v.sJ, source: "continuity-above" };
          changed = true;
        }
      }
    }
    for (const tr of transitions) {
      const fromSeg = tr.from.segs[segmentIndexFor(tr.from, tr.tK)];
      const toSeg = tr.to.segs[segmentIndexFor(tr.to, tr.tK)];
      if (fromSeg.anchor && !toSeg.anchor) {
        const v = segmentAt(ig, fromSeg, tr.tK);
        toSeg.anchor = { tK: tr.tK, hJ: v.hJ + tr.dHJ, sJ: v.sJ + tr.dHJ / tr.tK, source: "transition" };
        tr.used = changed = true;
      } else if (toSeg.anchor && !fromSeg.anchor) {
        const v = segmentAt(ig, toSeg, tr.tK);
        fromSeg.anchor = { tK: tr.tK, hJ: v.hJ - tr.dHJ, sJ: v.sJ - tr.dHJ / tr.tK, source: "transition" };
        tr.used = changed = true;
      }
    }
  }
}

/** Stage 6: a phase with an unanchored segment is refused (`no-anchor`). */
function requireAnchors(b: Build): void {
  for (const chain of b.chains.values()) {
    if (chain.segs.some((s) => !s.anchor)) {
      refuse(
        "no-anchor",
        `${b.label}: the ${chain.phase} phase has no anchor; its forms carry no integration constants, so give a reference {tK, phase, hkJ, sJ} or a transition to a phase that has one`,
        { species: b.key, phase: chain.phase },
      );
    }
  }
}

/** Stage 7: stated transitions that were not needed as anchors are checked against the G crossing. */
function checkUnusedTransitions(b: Build, transitions: Transition[]): void {
  const ig = b.ig;
  for (const tr of transitions) {
    if (tr.used) continue;
    const gDiff = (T: number) => {
      const x = chainAt(ig, tr.from, T);
      const y = chainAt(ig, tr.to, T);
      return y.hJ - T * y.sJ - (x.hJ - T * x.sJ);
    };
    const derived = findCrossing(gDiff, tr.tK, 50);
    let dHJ = Number.NaN;
    if (derived !== null) dHJ = chainAt(ig, tr.to, derived).hJ - chainAt(ig, tr.from, derived).hJ;
    const off = derived === null || Math.abs(derived - tr.tK) > MISMATCH_T_K || Math.abs(dHJ - tr.dHJ) / 1000 > MISMATCH_H_KJ;
    if (off) {
      b.warnings.push({
        code: "transition-mismatch",
        species: b.key,
        tK: tr.tK,
        from: tr.from.phase,
        to: tr.to.phase,
        statedDHkJ: tr.dHJ / 1000,
        derivedK: derived,
        derivedDHkJ: derived === null ? null : dHJ / 1000,
        message:
          derived === null
            ? `the stated ${tr.from.phase} → ${tr.to.phase} transition at ${fmt(tr.tK)} K is not where the two phases' G curves cross (no crossing within 50 K)`
            : `the stated ${tr.from.phase} → ${tr.to.phase} transition (${fmt(tr.tK)} K, ${fmt(tr.dHJ / 1000)} kJ/mol) differs from the G crossing of the two phases' models (${fmt(derived)} K, ${fmt(dHJ / 1000)} kJ/mol)`,
      });
    }
  }
}

/** Stage 8: where two segments anchored on their own meet, the jump in H, S and Cp (for `segment-jump` warnings). */
function segmentJumps(b: Build): SegmentJump[] {
  const jumps: SegmentJump[] = [];
  for (const chain of b.chains.values()) {
    for (let i = 1; i < chain.segs.length; i++) {
      const lo = chain.segs[i - 1];
      const hi = chain.segs[i];
      if (hi.anchor!.source === "continuity-below" || lo.anchor!.source === "continuity-above") continue;
      const edge = lo.tmaxK;
      const below = segmentAt(b.ig, lo, edge);
      const above = segmentAt(b.ig, hi, edge);
      const dHkJ = (above.hJ - below.hJ) / 1000;
      const dSJ = above.sJ - below.sJ;
      if (Math.abs(dHkJ) > JUMP_H_KJ || Math.abs(dSJ) > JUMP_S_J) {
        jumps.push({ phase: chain.phase, tK: edge, dHkJ, dSJ, dCpJ: above.cpJ - below.cpJ });
      }
    }
  }
  return jumps;
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
