/**
 * The plans of the evaluation: the full set, the quick subset (--quick) and the fixed subset
 * the test runs (test/eval/evalSubset.test.ts). Counts per variant; cases go round the SNR bands.
 */
import { planCases, type CaseSpec } from "./generator.js";
import { VARIANTS, type Variant } from "./truth.js";

const each = (n: number): Record<Variant, number> => Object.fromEntries(VARIANTS.map((v) => [v, n])) as Record<Variant, number>;

/**
 * Full set: 20 cases of each variant (4 per SNR band), 25 of each AM and FM variant so that the
 * FM deviation and the AM depth have 50 cases each: 380 captures.
 */
export const FULL_COUNTS: Readonly<Record<Variant, number>> = {
  ...each(20), "am-tone": 25, "am-speech": 25, "fm-tone": 25, "fm-speech": 25,
};

/** Quick subset: one case of each variant per SNR band, 90 captures. */
export const QUICK_COUNTS: Readonly<Record<Variant, number>> = each(5);

export const DEFAULT_SEED = 1;

export function fullPlan(seed = DEFAULT_SEED): CaseSpec[] {
  return planCases(seed, FULL_COUNTS);
}

export function quickPlan(seed = DEFAULT_SEED): CaseSpec[] {
  return planCases(seed, QUICK_COUNTS);
}

/**
 * The test's fixed subset: three cases of each variant, in the 5–10, 15–20 and 20–30 dB bands
 * (54 captures), from a seed of its own.
 */
export const SUBSET_SEED = 20_251;

export function subsetPlan(): CaseSpec[] {
  return planCases(SUBSET_SEED, each(3), [0, 2, 3]);
}
