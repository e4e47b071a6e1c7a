/**
 * The decision rule of a check: ILAC-G8:09/2019 §4.2.3, the non-binary rule with guard band
 * w = U, the expanded uncertainty (k = 2) of the measured value (REFERENCES.md §4 "Decision
 * rules", status V2). For an upper limit TL:
 *
 *   pass               measured < TL − w
 *   conditional pass   TL − w ≤ measured ≤ TL
 *   conditional fail   TL < measured ≤ TL + w
 *   fail               measured > TL + w
 *
 * mirrored for a lower limit. Without an uncertainty (U null or 0) w = 0 and the rule is simple
 * acceptance (ILAC-G8 §4.2.1): pass up to and including the limit, fail beyond it. `pass` is
 * always simple acceptance, so a conditional pass passes and a conditional fail fails.
 */
import { ParameterError } from "../errors.js";

export type Decision = "pass" | "conditional-pass" | "conditional-fail" | "fail";

export interface DecisionResult {
  /** Simple acceptance: inside the limit or touching it. */
  pass: boolean;
  decision: Decision;
  /** limit − measured (upper) or measured − limit (lower), in the measured value's unit: positive inside. */
  margin: number;
  /** 100 · margin / |limit|, or null when the limit is 0. */
  marginPercent: number | null;
  /** w, in the measured value's unit (0 without an uncertainty). */
  guardBand: number;
  /** False when U was null or 0, so the decision is binary. */
  uncertaintyKnown: boolean;
}

/**
 * The decision for `measured` against `limit` with expanded uncertainty `uncertainty` (same
 * unit, >= 0, or null), where `kind` "upper" means measured must be <= limit and "lower" means
 * measured must be >= limit. Throws ParameterError for non-finite values or a negative U.
 */
export function decide(measured: number, limit: number, uncertainty: number | null, kind: "upper" | "lower"): DecisionResult {
  if (!Number.isFinite(measured)) throw new ParameterError("measured", `must be a finite number, not ${measured}`);
  if (!Number.isFinite(limit)) throw new ParameterError("limit", `must be a finite number, not ${limit}`);
  if (uncertainty !== null && !(Number.isFinite(uncertainty) && uncertainty >= 0)) {
    throw new ParameterError("uncertainty", `must be a finite number >= 0 or null, not ${uncertainty}`);
  }
  const w = uncertainty ?? 0;
  const margin = kind === "upper" ? limit - measured : measured - limit;
  return {
    pass: kind === "upper" ? measured <= limit : measured >= limit,
    decision: decisionOf(measured, limit, w, kind),
    margin,
    marginPercent: limit === 0 ? null : (100 * margin) / Math.abs(limit),
    guardBand: w,
    uncertaintyKnown: w > 0,
  };
}

/**
 * The four states, compared with TL − w, TL and TL + w as the rule states them (not through the
 * margin, whose subtraction could move a value that sits exactly on TL − w across it).
 */
function decisionOf(measured: number, limit: number, w: number, kind: "upper" | "lower"): Decision {
  // Mirror a lower limit onto an upper one: measured >= TL ⇔ −measured <= −TL.
  const x = kind === "upper" ? measured : -measured;
  const tl = kind === "upper" ? limit : -limit;
  if (w === 0) return x <= tl ? "pass" : "fail";
  if (x < tl - w) return "pass";
  if (x <= tl) return "conditional-pass";
  if (x <= tl + w) return "conditional-fail";
  return "fail";
}

const ORDER: readonly Decision[] = ["pass", "conditional-pass", "conditional-fail", "fail"];

/** The worst of several decisions (pass < conditional-pass < conditional-fail < fail); "pass" for none. */
export function worstDecision(ds: readonly Decision[]): Decision {
  return ds.reduce<Decision>((worst, d) => (ORDER.indexOf(d) > ORDER.indexOf(worst) ? d : worst), "pass");
}
