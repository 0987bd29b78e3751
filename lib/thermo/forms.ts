/**
 * Cp forms. Each compiles to a Cp(T) function in J/(mol·K) over its stated range; the
 * forms that publish integration constants (shomate, nasa7, nasa9) also give H and S from
 * those constants, which the engine uses only to anchor a segment at one temperature.
 * To add a form: extend `segmentSchema` (and `CP_FORMS`) in schema.ts, add a case to
 * `compileForm` here, and (if it carries constants) a `constants` pair — a segment with
 * constants anchors itself (species-model.ts); `cpBatch` is optional (a loop over `cp` is the
 * default, `batchOf` in integrate-batch.ts) — the integrator needs nothing else.
 */
import { R as GAS_CONSTANT } from "./constants";

// A module-local copy: an imported binding is read through an accessor in some transpiled
// builds, which costs more than the polynomial itself in the integrator's inner loop.
const R = GAS_CONSTANT + 0;
import { refuse } from "./errors";
import { compileCpExpression } from "./expression";
import { requireAboveZeroK } from "./grid";
import { batchOf, type CpBatch } from "./integrate-batch";
import type { CpForm, ParsedSegment } from "./schema";
import { makeTableInterpolant } from "./table";
import { parseMolarEntropyJ, parseTemperatureK } from "./units";

export interface CompiledSegment {
  phase: string;
  form: CpForm;
  tminK: number;
  tmaxK: number;
  /** Cp in J/(mol·K). */
  cp: (tK: number) => number;
  /** Cp at many temperatures in one call (the integrator's batch path); same values as `cp`. */
  cpBatch: CpBatch;
  /** Temperatures inside the range where Cp has a kink (table points): integration break points. */
  breaks?: Float64Array;
  /** Σ|terms| of Cp at T (J/(mol·K)), the size of what is summed: the integrator's rounding floor. */
  magnitude?: (tK: number) => number;
  /** Work units per Cp evaluation (the request's work budget); 1 when absent. */
  cost?: number;
  /** H (J/mol, formation basis) and S (J/(mol·K), at the source's standard pressure) from the published constants. */
  constants?: { hJ: (tK: number) => number; sJ: (tK: number) => number };
}

/** Compile one validated segment; `label` names it in messages (e.g. `species "CO(g)" segment 1`). */
export function compileSegment(seg: ParsedSegment, label: string): CompiledSegment {
  const compiled = compileForm(seg, label);
  return { ...compiled, cpBatch: compiled.cpBatch ?? batchOf(compiled.cp) };
}

function compileForm(seg: ParsedSegment, label: string): Omit<CompiledSegment, "cpBatch"> & { cpBatch?: CpBatch } {
  const tminK = parseTemperatureK(seg.tminK, `${label}.tminK`);
  const tmaxK = parseTemperatureK(seg.tmaxK, `${label}.tmaxK`);
  requireAboveZeroK(tminK, `${label}.tminK`);
  if (!(tmaxK > tminK)) refuse("invalid-segment", `${label}: tmaxK (${tmaxK} K) must be above tminK (${tminK} K)`);
  const base = { phase: seg.phase, form: seg.form, tminK, tmaxK };
  switch (seg.form) {
    case "constant": {
      const c = parseMolarEntropyJ(seg.coeffs.cpJ, `${label}.coeffs.cpJ`);
      return {
        ...base,
        cp: () => c,
        magnitude: () => Math.abs(c),
        cpBatch: (_x, f, n) => {
          for (let i = 0; i < n; i++) f[i] = c;
        },
      };
    }
    case "shomate": {
      const { A, B, C, D, E, F, G } = seg.coeffs;
      return {
        ...base,
        cp: (T) => {
          const t = T * 1e-3;
          return A + t * (B + t * (C + t * D)) + E / (t * t);
        },
        magnitude: (T) => {
          const t = T * 1e-3;
          return Math.abs(A) + Math.abs(B * t) + Math.abs(C * t * t) + Math.abs(D * t * t * t) + Math.abs(E / (t * t));
        },
        cpBatch: (x, f, n) => {
          for (let i = 0; i < n; i++) {
            const t = x[i] * 1e-3;
            f[i] = A + t * (B + t * (C + t * D)) + E / (t * t);
          }
        },
        constants: {
          // H on the formation basis: (H − H298) + H = A t + B t²/2 + C t³/3 + D t⁴/4 − E/t + F  [kJ/mol]
          hJ: (T) => {
            const t = T * 1e-3;
            return 1000 * (t * (A + t * (B / 2 + t * (C / 3 + t * (D / 4)))) - E / t + F);
          },
          sJ: (T) => {
            const t = T * 1e-3;
            return A * Math.log(t) + t * (B + t * (C / 2 + t * (D / 3))) - E / (2 * t * t) + G;
          },
        },
      };
    }
    case "nasa7": {
      const [a1, a2, a3, a4, a5, a6, a7] = seg.coeffs;
      return {
        ...base,
        cp: (T) => R * (a1 + T * (a2 + T * (a3 + T * (a4 + T * a5)))),
        magnitude: (T) => R * (Math.abs(a1) + Math.abs(a2 * T) + Math.abs(a3 * T * T) + Math.abs(a4 * T ** 3) + Math.abs(a5 * T ** 4)),
        cpBatch: (x, f, n) => {
          for (let i = 0; i < n; i++) {
            const T = x[i];
            f[i] = R * (a1 + T * (a2 + T * (a3 + T * (a4 + T * a5))));
          }
        },
        constants: {
          hJ: (T) => R * (T * (a1 + T * (a2 / 2 + T * (a3 / 3 + T * (a4 / 4 + T * (a5 / 5))))) + a6),
          sJ: (T) => R * (a1 * Math.log(T) + T * (a2 + T * (a3 / 2 + T * (a4 / 3 + T * (a5 / 4)))) + a7),
        },
      };
    }
    case "nasa9": {
      const [a1, a2, a3, a4, a5, a6, a7, b1, b2] = seg.coeffs;
      return {
        ...base,
        cp: (T) => R * (a1 / (T * T) + a2 / T + a3 + T * (a4 + T * (a5 + T * (a6 + T * a7)))),
        magnitude: (T) => R * (Math.abs(a1 / (T * T)) + Math.abs(a2 / T) + Math.abs(a3) + Math.abs(a4 * T) + Math.abs(a5 * T * T) + Math.abs(a6 * T ** 3) + Math.abs(a7 * T ** 4)),
        cpBatch: (x, f, n) => {
          for (let i = 0; i < n; i++) {
            const T = x[i];
            f[i] = R * (a1 / (T * T) + a2 / T + a3 + T * (a4 + T * (a5 + T * (a6 + T * a7))));
          }
        },
        constants: {
          hJ: (T) => R * (-a1 / T + a2 * Math.log(T) + T * (a3 + T * (a4 / 2 + T * (a5 / 3 + T * (a6 / 4 + T * (a7 / 5))))) + b1),
          sJ: (T) => R * (-a1 / (2 * T * T) - a2 / T + a3 * Math.log(T) + T * (a4 + T * (a5 / 2 + T * (a6 / 3 + T * (a7 / 4)))) + b2),
        },
      };
    }
    case "maier-kelley": {
      const { a, b, c } = seg.coeffs;
      return {
        ...base,
        cp: (T) => a + b * T + c / (T * T),
        magnitude: (T) => Math.abs(a) + Math.abs(b * T) + Math.abs(c / (T * T)),
        cpBatch: (x, f, n) => {
          for (let i = 0; i < n; i++) {
            const T = x[i];
            f[i] = a + b * T + c / (T * T);
          }
        },
      };
    }
    case "power": {
      const ks = Int32Array.from(seg.coeffs.terms.map((t) => t.k));
      const cs = Float64Array.from(seg.coeffs.terms.map((t) => t.c));
      const n = ks.length;
      return {
        ...base,
        cp: (T) => {
          let sum = 0;
          for (let i = 0; i < n; i++) sum += cs[i] * T ** ks[i];
          return sum;
        },
        magnitude: (T) => {
          let sum = 0;
          for (let i = 0; i < n; i++) sum += Math.abs(cs[i] * T ** ks[i]);
          return sum;
        },
      };
    }
    case "table": {
      const pts = seg.coeffs.points;
      for (let i = 1; i < pts.length; i++) {
        if (!(pts[i][0] > pts[i - 1][0])) {
          refuse("invalid-table", `${label}.coeffs.points: temperatures must increase strictly (point ${i + 1}: ${pts[i][0]} K after ${pts[i - 1][0]} K)`);
        }
      }
      requireAboveZeroK(pts[0][0], `${label}.coeffs.points`);
      const first = pts[0][0];
      const last = pts[pts.length - 1][0];
      if (tminK < first - 1e-9 || tmaxK > last + 1e-9) {
        refuse("invalid-table", `${label}: the range ${tminK}–${tmaxK} K runs beyond the table points (${first}–${last} K); a table is not extrapolated silently`);
      }
      const f = makeTableInterpolant(pts, seg.coeffs.interpolation ?? "pchip");
      const inside = f.knots.filter((x) => x > tminK && x < tmaxK);
      return { ...base, cp: f, breaks: inside.length ? Float64Array.from(inside) : undefined };
    }
    case "expression": {
      const f = compileCpExpression(seg.coeffs.cp, `${label}.coeffs.cp`);
      // Work per evaluation grows with the expression's size (a polynomial evaluation is 1).
      return { ...base, cp: f, cost: Math.max(1, Math.ceil(f.nodes / 2)) };
    }
  }
}
