/**
 * Weighted linear least squares of measured Cp points to a Cp form (server side: pulls in
 * numeric). The design matrix is built on the scaled variable u = T/Ts (Ts the geometric
 * mean of the temperature range), its columns equilibrated, reduced by Householder QR and
 * solved through numeric's SVD of the small triangular factor.
 */
import numeric from "numeric";
import { R, T298 } from "./constants";
import { refuse } from "./errors";
import { ABOVE_ZERO_K, isAboveZeroK } from "./scales";
import { describeIssue, fitRequestSchema, missingIsRequired, type FitRequest, type SegmentInput } from "./schema";

export interface FitResult {
  form: "shomate" | "nasa7" | "maier-kelley" | "power";
  /** Named Cp coefficients in the form's own units (shomate A–E; nasa7 a1–a5; a, b, c; power `T^k`). */
  coefficients: Record<string, number>;
  /** Shomate F, G, H (kJ/mol, J/(mol·K), kJ/mol) or NASA a6, a7, from the given reference. */
  integrationConstants?: Record<string, number>;
  /** A segment ready for an evaluate request (shomate/nasa7 only with a reference). */
  segment?: SegmentInput;
  /** For forms without constants: the reference to put on the species entry. */
  reference?: { tK: number; phase: string; hkJ: number; sJ: number };
  residualsJ: number[];
  rmsJ: number;
  maxAbsJ: number;
  r2: number;
  /** 2-norm condition number of the scaled, equilibrated, weighted design matrix. */
  conditionNumber: number;
  tminK: number;
  tmaxK: number;
  points: number;
}

interface Basis {
  /** Exponents of T in each basis function. */
  k: number[];
  /** Cp = mult · Σ c_j (T/t0)^k_j */
  t0: number;
  mult: number;
  names: string[];
}

/** In-place Householder QR of the column-major n×p matrix A; applies Qᵀ to b. R ends up in A's upper triangle. */
function householderQR(A: Float64Array, b: Float64Array, n: number, p: number): void {
  for (let k = 0; k < p; k++) {
    const col = k * n;
    let norm = 0;
    for (let i = k; i < n; i++) norm += A[col + i] * A[col + i];
    norm = Math.sqrt(norm);
    if (norm === 0) continue;
    const alpha = A[col + k] > 0 ? -norm : norm;
    A[col + k] -= alpha;
    let vv = 0;
    for (let i = k; i < n; i++) vv += A[col + i] * A[col + i];
    // Reflect the remaining columns and b with v = A[k.., k].
    for (let j = k + 1; j < p; j++) {
      const cj = j * n;
      let dot = 0;
      for (let i = k; i < n; i++) dot += A[col + i] * A[cj + i];
      const f = (2 * dot) / vv;
      for (let i = k; i < n; i++) A[cj + i] -= f * A[col + i];
    }
    let dot = 0;
    for (let i = k; i < n; i++) dot += A[col + i] * b[i];
    const f = (2 * dot) / vv;
    for (let i = k; i < n; i++) b[i] -= f * A[col + i];
    A[col + k] = alpha;
    for (let i = k + 1; i < n; i++) A[col + i] = 0;
  }
}

function basisFor(form: FitResult["form"], exponents: number[] | undefined): Basis {
  switch (form) {
    case "shomate":
      return { k: [0, 1, 2, 3, -2], t0: 1000, mult: 1, names: ["A", "B", "C", "D", "E"] };
    case "nasa7":
      return { k: [0, 1, 2, 3, 4], t0: 1, mult: R, names: ["a1", "a2", "a3", "a4", "a5"] };
    case "maier-kelley":
      return { k: [0, 1, -2], t0: 1, mult: 1, names: ["a", "b", "c"] };
    case "power": {
      if (!exponents || exponents.length === 0) refuse("invalid-request", "fit: the power form needs exponents (integers from -3 to 4)");
      if (new Set(exponents).size !== exponents!.length) refuse("invalid-request", "fit: exponents must be distinct");
      return { k: [...exponents!], t0: 1, mult: 1, names: exponents!.map((k) => `T^${k}`) };
    }
  }
}

/**
 * Fit Cp(T) (J/(mol·K), T in K) to a form by weighted least squares (weights 1/σ² when
 * sigmaJ is given). Refusals: fewer points than coefficients, too few distinct temperatures,
 * non-finite values, temperatures at or below 0 K.
 */
export function fitCp(request: FitRequest): FitResult {
  const parsed = fitRequestSchema.safeParse(request, { error: missingIsRequired });
  if (!parsed.success) refuse("invalid-request", `invalid fit request: ${describeIssue(parsed.error.issues[0])}`);
  const req = parsed.data!;
  const basis = basisFor(req.form, req.exponents);
  const p = basis.k.length;
  const pts = req.points;
  const n = pts.length;
  pts.forEach((pt, i) => {
    if (!Number.isFinite(pt.tK) || !Number.isFinite(pt.cpJ) || (pt.sigmaJ !== undefined && !Number.isFinite(pt.sigmaJ))) {
      refuse("fit-nonfinite", `fit: point ${i + 1} has a non-finite value`, { point: i + 1 });
    }
    if (!isAboveZeroK(pt.tK)) {
      refuse("fit-nonpositive-temperature", `fit: point ${i + 1} is at ${pt.tK} K; ${ABOVE_ZERO_K}`, { point: i + 1 });
    }
    if (pt.sigmaJ !== undefined && pt.sigmaJ <= 0) {
      refuse("fit-invalid-sigma", `fit: point ${i + 1} has sigmaJ ${pt.sigmaJ}; an uncertainty must be positive`, { point: i + 1 });
    }
  });
  if (n < p) {
    refuse("fit-too-few-points", `fit: ${n} points cannot determine the ${p} coefficients of the ${req.form} form`, { points: n, coefficients: p });
  }
  const distinct = new Set(pts.map((pt) => pt.tK)).size;
  if (distinct < p) {
    refuse(
      "fit-duplicate-temperatures",
      `fit: only ${distinct} distinct temperature${distinct === 1 ? "" : "s"} for the ${p} coefficients of the ${req.form} form; repeated temperatures add no information`,
      { distinct, coefficients: p },
    );
  }

  let tmin = Infinity;
  let tmax = -Infinity;
  for (const pt of pts) {
    if (pt.tK < tmin) tmin = pt.tK;
    if (pt.tK > tmax) tmax = pt.tK;
  }
  const ts = Math.sqrt(tmin * tmax);
  // Column-major design matrix (weighted, on u = T/ts), then column equilibration.
  const A = new Float64Array(n * p);
  const b = new Float64Array(n);
  const norms = new Float64Array(p);
  for (let i = 0; i < n; i++) {
    const u = pts[i].tK / ts;
    const w = pts[i].sigmaJ === undefined ? 1 : 1 / pts[i].sigmaJ!;
    for (let j = 0; j < p; j++) {
      const v = w * u ** basis.k[j];
      A[j * n + i] = v;
      norms[j] += v * v;
    }
    b[i] = w * pts[i].cpJ;
  }
  for (let j = 0; j < p; j++) {
    norms[j] = Math.sqrt(norms[j]);
    for (let i = 0; i < n; i++) A[j * n + i] /= norms[j];
  }
  // Householder QR reduces the n×p problem to p×p (R x = Qᵀb); numeric's SVD of R then
  // gives the singular values of the design matrix and the solution x = V Σ⁻¹ Uᵀ Qᵀb.
  householderQR(A, b, n, p);
  const Rm: number[][] = Array.from({ length: p }, (_, i) => Array.from({ length: p }, (_, j) => (j >= i ? A[j * n + i] : 0)));
  const { U, S, V } = numeric.svd(Rm);
  const smax = Math.max(...S);
  const smin = Math.min(...S);
  const conditionNumber = smax / smin;
  if (!(smin > smax * 1e-13)) {
    refuse("fit-singular", `fit: the ${req.form} coefficients cannot be separated by these points (condition number ${conditionNumber.toExponential(2)})`);
  }
  const utb = new Float64Array(p);
  for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) utb[j] += U[i][j] * b[i];
  const coefficients: Record<string, number> = {};
  const c = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    let x = 0;
    for (let k = 0; k < p; k++) x += (V[j][k] * utb[k]) / S[k];
    const d = x / norms[j];
    // Cp = Σ d_j u^k = mult · Σ c_j (T/t0)^k  ⇒  c_j = d_j (t0/ts)^k / mult
    c[j] = (d * (basis.t0 / ts) ** basis.k[j]) / basis.mult;
    coefficients[basis.names[j]] = c[j];
  }
  const model = (T: number) => {
    let sum = 0;
    for (let j = 0; j < p; j++) sum += c[j] * (T / basis.t0) ** basis.k[j];
    return basis.mult * sum;
  };
  const residualsJ = new Array<number>(n);
  let ss = 0;
  let maxAbsJ = 0;
  let mean = 0;
  for (const pt of pts) mean += pt.cpJ / n;
  let tot = 0;
  for (let i = 0; i < n; i++) {
    const r = pts[i].cpJ - model(pts[i].tK);
    residualsJ[i] = r;
    ss += r * r;
    tot += (pts[i].cpJ - mean) ** 2;
    if (Math.abs(r) > maxAbsJ) maxAbsJ = Math.abs(r);
  }
  const result: FitResult = {
    form: req.form,
    coefficients,
    residualsJ,
    rmsJ: Math.sqrt(ss / n),
    maxAbsJ,
    r2: tot > 0 ? 1 - ss / tot : 1,
    conditionNumber,
    tminK: tmin,
    tmaxK: tmax,
    points: n,
  };
  const phase = req.phase ?? "g";
  const range = { phase, tminK: tmin, tmaxK: tmax };
  const ref = req.reference;
  const tr = ref?.tK ?? T298;
  if (req.form === "shomate") {
    if (ref) {
      const [A_, B_, C_, D_, E_] = c;
      const hPoly = (t: number) => A_ * t + (B_ * t * t) / 2 + (C_ * t ** 3) / 3 + (D_ * t ** 4) / 4 - E_ / t;
      const t = tr / 1000;
      const F = ref.hkJ - hPoly(t);
      const G = ref.sJ - (A_ * Math.log(t) + B_ * t + (C_ * t * t) / 2 + (D_ * t ** 3) / 3 - E_ / (2 * t * t));
      const H = hPoly(T298 / 1000) + F;
      result.integrationConstants = { F, G, H };
      result.segment = { ...range, form: "shomate", coeffs: { A: A_, B: B_, C: C_, D: D_, E: E_, F, G, H } };
    }
  } else if (req.form === "nasa7") {
    if (ref) {
      const [a1, a2, a3, a4, a5] = c;
      const a6 = (ref.hkJ * 1000) / R - (a1 * tr + (a2 * tr ** 2) / 2 + (a3 * tr ** 3) / 3 + (a4 * tr ** 4) / 4 + (a5 * tr ** 5) / 5);
      const a7 = ref.sJ / R - (a1 * Math.log(tr) + a2 * tr + (a3 * tr ** 2) / 2 + (a4 * tr ** 3) / 3 + (a5 * tr ** 4) / 4);
      result.integrationConstants = { a6, a7 };
      result.segment = { ...range, form: "nasa7", coeffs: [a1, a2, a3, a4, a5, a6, a7] };
    }
  } else if (req.form === "maier-kelley") {
    result.segment = { ...range, form: "maier-kelley", coeffs: { a: c[0], b: c[1], c: c[2] } };
  } else {
    result.segment = { ...range, form: "power", coeffs: { terms: basis.k.map((k, j) => ({ k, c: c[j] })) } };
  }
  if (ref && (req.form === "maier-kelley" || req.form === "power")) {
    result.reference = { tK: tr, phase, hkJ: ref.hkJ, sJ: ref.sJ };
  }
  return result;
}
