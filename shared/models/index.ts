/**
 * Yield-response models for one site: seven models fitted by least squares with
 * no starting values, ranked by AICc.
 *
 * ```ts
 * fitAllModels(data: SiteData, options?: FitOptions & { models?: ModelName[] }): AllModelsFit
 *   data    = { rateKgHa: number[], yieldKgHa: number[], block?: (string | null)[] }  // one entry per plot
 *   options = { blocks?: 'none' | 'fixed', confidence?: 0.95, exponentialIntercept?: 'free' | 'zero', curvePoints?: 61,
 *               rateFormat?: RateFormat }   // how messages write rates; default kg/ha rounded
 *   result  = { fits: Record<ModelName, ModelFit>, ranking: ModelRank[], best: ModelName | null, n, distinctRates }
 * ```
 *
 * | model              | formula                     | params (units)                         |
 * | ------------------ | --------------------------- | -------------------------------------- |
 * | `linear`           | a + b·x                     | a kg/ha, b kg/kg                       |
 * | `proportional`     | b·x (R² uncentered)         | b kg/kg                                |
 * | `quadratic`        | a + b·x + c·x²              | a kg/ha, b kg/kg, c kg/kg per kg/ha    |
 * | `linearPlateau`    | a + b·min(x, x0)            | a kg/ha, b kg/kg, x0 kg/ha             |
 * | `quadraticPlateau` | P + c·min(x − x0, 0)², c<0  | P kg/ha, c, x0 kg/ha                   |
 * | `exponential`      | a + b·(1 − e^(−k·x))        | a kg/ha, b kg/ha, k ha/kg              |
 *
 * Every `ModelFit` has: `status` (FitStatus: "ok" or a data finding such as
 * "no-plateau", "full-response-at-lowest-rate", "convex", "no-response",
 * "too-few-rates", with `message`), `params`, `stdErrors`, `confidenceIntervals`
 * (by parameter name; NaN for a parameter the rates do not identify), `joinPoint`
 * and `plateauYield` (IntervalEstimate or null), `sse`, `dfResidual`, `rmse`, `r2`
 * with `r2Kind`, `aicc`, `bic`, `lackOfFit`, `residuals`, `fitted`, `curve`
 * (grid), `predict(rateKgHa)`, `blockOffsets`, `testedRates`.
 * For the JSON report: {model, status, params, stdErrors, sse, dfResidual, aicc}
 * come straight from a ModelFit; optimumRate, optimumCI and yieldAtOptimum from
 * shared/economics (economicOptimum, bootstrapOptimum).
 *
 * Other entries:
 * - `fitLinear`, `fitProportional`, `fitQuadratic`, `fitLinearPlateau`, `fitQuadraticPlateau`,
 *   `fitExponential`: each `(data: SiteData, options?: FitOptions) → ModelFit`
 * - `estimateCurve(site: PreparedSite, model, options?) → CurveEstimate`: status, params and
 *   SSE only (no errors/residuals/curve), ~5× cheaper; what the bootstrap refits
 * - `curveValue(model, params, rateKgHa) → kg/ha`: a curve from stored parameters
 * - `MODEL_CURVES[model]` (shared/models/curves, no fitting code): one model's curve —
 *   display name, formula, parameters with their dimensions, curve from stored parameters,
 *   closed-form optimum, whether it is a curve, its limit model and its chart dash;
 *   `modelLabel(model)` and `modelLabelInText(model)` for its name
 * - `MODEL_CATALOG[model]` (shared/models/catalog): the same with its fit and estimate
 * - `joinProfileInterval(site, fit, level) → RateProfileInterval | null`: the F-based profile
 *   interval of the plateau models' join, open where it runs off the tested rates
 * - `prepareSite(data, blocks) → PreparedSite` + `fitAllModelsPrepared(site, options)`:
 *   prepare once and refit; `rankByAicc(fits)`
 *
 * Blocks: 'fixed' adds effect-coded block offsets (they sum to zero, so `params` and
 * `predict` are the block-average curve). Balanced blocks are handled on group sums;
 * unbalanced ones with the full design. Exponential with `exponentialIntercept: 'zero'`
 * fits y = b(1 − e^(−k x)) (NIST StRD Misra1a); `params.a` is then 0.
 *
 * Method: the one nonlinear parameter (x0, or ln k) is profiled exactly with the
 * inner linear fit by QR least squares; each interval between distinct rates is
 * searched by Brent's method (shared/optimize) and the best kept, then compared
 * with the limits. See /work/shared/DESIGN.md "Curve models".
 */
export * from './modelTypes';
export { fitAllModels, fitAllModelsPrepared, rankByAicc } from './fitAllModels';
export type { AllModelsFit, ModelRank } from './fitAllModels';
export { fitLinear } from './linear';
export { fitProportional } from './proportional';
export { fitQuadratic } from './quadratic';
export { fitLinearPlateau } from './linearPlateau';
export { fitQuadraticPlateau } from './quadraticPlateau';
export { fitExponential } from './exponential';
export { curveValue } from './curveValue';
export { MODEL_CATALOG, modelEntry } from './catalog';
export {
  MODEL_CURVES,
  modelLabel,
  modelLabelInText,
  paramDimension,
  PLATEAU_MODELS,
} from './curves';
export type { PlateauModel } from './curves';
export type { ClosedFormOptimum, CurveSpec, ModelCurve, ParamDimension } from './modelCurve';
export type { ModelEntry } from './modelEntry';
export { prepareSite } from './prepareSite';
export type { PreparedSite } from './prepareSite';
export { estimateCurve } from './estimateCurve';
export { joinProfileInterval } from './joinProfile';
export type { RateProfileInterval } from './joinProfile';
export { KG_HA_FORMAT, rateRangeText, rateText, roundedKgHa } from './rateFormat';
export type { RateFormat } from './rateFormat';
