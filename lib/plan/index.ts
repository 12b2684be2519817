/**
 * Stria's planner: what a beta-plane turbulence run with given parameters will give, whether it is
 * worth its cost, and a matched cheap run to try first. Pure TypeScript (no DOM, no Node APIs).
 *
 *   analysePlan(input)        validate → resolve → predict → check → cost → matched run, in one call
 *   planReportMarkdown/Html   the printable report of an analysis
 *   serializePlanFile/parsePlanFile   the versioned plan file
 *   PLAN_PRESETS              demonstration scenarios on real planetary constants
 *
 * Units, formulas and thresholds: docs/plan.md.
 */
export { analysePlan, type PlanAnalysis } from './analysePlan';
export { checkPlan, type CheckId, type CheckNumber, type PlanCheck, type Severity } from './checks';
export { annulusModeCount, flopsPerStep, forcedModesForCost, MEASURED_STEP, modelMemory, parseMeasuredStep, runCost, stepSeconds, type MeasuredStep, type MemoryEstimate, type RunCost } from './cost';
export { bytes, duration, fmt, unitLabel, withUnit } from './format';
export { DEFAULT_TARGET_SECONDS, matchedRun, RATIO_LABELS, type MatchedRatio, type MatchedRun, type MatchedRunOptions } from './matchedRun';
export { parsePlanFile, planFile, PlanFileError, PlanFileSchema, PLAN_FILE_FORMAT, PLAN_FILE_VERSION, serializePlanFile, type PlanFile } from './planFile';
export {
  PLAN_SIZE_MAX,
  PLAN_SIZE_MIN,
  PlanInputError,
  PlanInputSchema,
  pointsForSpacing,
  validatePlanInput,
  type DeformationInput,
  type DriveInput,
  type GridInput,
  type PlanInput,
  type PlanIssue,
  type RotationInput,
  type UnitSystem,
  type ValidPlanInput,
} from './planInput';
export { omegaFromRotationRate, PLANETS, type Planet, type PlanetId } from './planets';
export { PLAN_PRESETS, planPreset, type PlanPreset } from './planPresets';
export { planReportBlocks, planReportHtml, planReportMarkdown } from './planReport';
export { cflStep, predictPlan, regimeLabel, type PlanPredictions, type Prediction, type PredictionId, type Quantity } from './predictions';
export { planRatios, type RatioId, type RatioSet } from './ratios';
export { REFERENCES } from './references';
export { resolvePlan, type ResolvedPlan } from './resolvePlan';
export { ladderMarks, scaleLadderSvg, type LadderMark, type LadderOptions } from './scaleLadderSvg';
export { betaParameter, coriolisParameter, tangentPlane, type TangentPlane } from './tangentPlane';
export { THRESHOLDS } from './thresholds';
export { DIM, hyperviscosityDimension, IDENTITY_SCALING, planModelParams, planScaling, toModel, toPhysical, unitOf, type Dimension, type UnitScaling } from './units';
