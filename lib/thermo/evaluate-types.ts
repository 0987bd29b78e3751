/** The shape of an evaluation's answer (EVALUATE.md), shared by the pipeline's stages. */
import type { AdiabaticResult } from "./adiabatic";
import type { EquilibriumInfo, EquilibriumPoint } from "./equilibrium";
import type { EngineWarning, SpeciesRow } from "./species";
import type { SpeciesUncertainty } from "./uncertainty";

export interface EvaluatePoint {
  tK: number;
  dCpJ: number;
  dHkJ: number;
  dSJ: number;
  dGkJ: number;
  lnK: number;
  log10K: number;
  K: number | null;
  naiveDGkJ: number;
  naiveLnK: number;
  naiveLog10K: number;
  diffKJ: number;
  exceedsTolerance: boolean;
  /** 1σ of dGkJ (kJ/mol) and log10K, when species carry uncertainties. */
  sigmaDGkJ?: number;
  sigmaLog10K?: number;
  naiveSigmaDGkJ?: number;
  /** |diffKJ| > sigmaDGkJ: the naive error exceeds the data's own uncertainty. */
  naiveExceedsUncertainty?: boolean;
}

export interface UncertaintySummary {
  basis: string;
  species: Record<string, SpeciesUncertainty>;
  /** Grid temperatures where |naive − corrected| ΔrG exceeds the 1σ of the corrected ΔrG. */
  naiveExceedsK: number[];
}

export type SignCaseCode = "favourable-always" | "favourable-above" | "favourable-below" | "favourable-never";

export interface EvaluateResult {
  points: EvaluatePoint[];
  reference: { tK: number; dCpJ: number; dHkJ: number; dSJ: number; dGkJ: number; lnK: number; log10K: number };
  crossover: { naiveK: number | null; naiveInSpan: boolean; correctedK: number[] };
  signCase: { code: SignCaseCode; text: string; correctedAgrees: boolean };
  species?: Record<string, SpeciesRow[]>;
  /** With include "contributions": per species key, kJ/mol per grid point (lib/thermo/contributions.ts). */
  contributions?: Record<string, number[]>;
  contributionsSigma?: Record<string, number[]>;
  uncertainty?: UncertaintySummary;
  equilibrium?: EquilibriumPoint[];
  equilibriumInfo?: EquilibriumInfo;
  adiabatic?: AdiabaticResult;
  warnings: EngineWarning[];
  engine: { version: string };
}

export const UNCERTAINTY_BASIS = "1σ standard uncertainties by linear propagation of each species' ΔfH°, S° and relative Cp uncertainty, taken as independent";

export const SIGN_CASES: Readonly<Record<SignCaseCode, string>> = Object.freeze({
  "favourable-always": "K > 1 at all T",
  "favourable-above": "K > 1 only above the crossover temperature",
  "favourable-below": "K > 1 only below the crossover temperature",
  "favourable-never": "K > 1 at no T",
});
