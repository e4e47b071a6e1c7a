// The evaluation set (npm run eval): re-exports only.
export { besselJIntegral, toneFmObw99Hz, toneAmObw99Hz, raisedCosineShape, rrcObw99PerBaud, expectedEvmPercent, evmComparable, MIN_DISTANCE } from "./theory.js";
export {
  TRUE_LABELS, VARIANT_LABEL, VARIANTS, QUANTITIES, QUANTITY_PATH,
  type TrueLabel, type Variant, type FileFormat, type Quantity, type CaseTruth, type EvalCase,
} from "./truth.js";
export { BUILDERS, durationSOf, type BuiltEmission, type BuildContext } from "./emissions.js";
export { SNR_BANDS, planCases, generateCase, writeCase, captureFileName, mixSeed, type CaseSpec, type GeneratedCapture } from "./generator.js";
export { measureCase, measuredLabelOf, type CaseResult, type Compared } from "./measureCase.js";
export {
  isCorrect, bandOf, bandName, confusion, reliability, coverage, coverages, targetCheck,
  CONFIDENCE_EDGES, CONFIDENT_HIGH_SNR, CONFIDENT_LOW_SNR,
  type Confusion, type ReliabilityBin, type Coverage, type CoverageMiss, type TargetCheck,
} from "./score.js";
export { evalMarkdown, replaceDocTables, DOC_BEGIN, DOC_END, type RunInfo } from "./markdown.js";
export { runCase, runCases, defaultWorkers, type RunOptions } from "./runner.js";
export { FULL_COUNTS, QUICK_COUNTS, DEFAULT_SEED, SUBSET_SEED, fullPlan, quickPlan, subsetPlan } from "./plans.js";
