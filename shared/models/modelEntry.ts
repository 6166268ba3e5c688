/**
 * What Plotrate knows of one response model, in one typed value: its curve (names,
 * parameters and their units, value and slope), how it is fitted and estimated, its
 * curve from stored parameters, its closed-form optimum, how it is told apart on
 * charts and what it reduces to at its limit. Each model's file exports its entry;
 * shared/models/catalog.ts collects them, keyed by ModelName, and every other part
 * of Plotrate reads a model's facts from there.
 */
import type { CurveEstimate, FitOptions, ModelFit, ModelName } from './modelTypes';
import type { PreparedSite } from './prepareSite';

/**
 * The dimension of a curve parameter, which fixes how it converts to display units:
 * a yield (kg/ha), a yield per rate (kg grain per kg nutrient), per rate squared, a
 * rate (kg/ha) or a reciprocal rate (ha/kg).
 */
export type ParamDimension = 'yield' | 'yieldPerRate' | 'yieldPerRate2' | 'rate' | 'perRate';

/** How a model's curve is named, evaluated and differentiated. */
export interface CurveSpec {
  model: ModelName;
  /**
   * The model's one display name, sentence case ("Linear-plateau"), for the screen, the
   * grower page, the workbook and the JSON; running text lower-cases it ("the linear-plateau").
   */
  label: string;
  formula: string;
  /** Curve parameter names in the order of the parameter vector. */
  paramNames: string[];
  /** The dimension of each parameter, by name (unit conversion in shared/report/unitScale). */
  dimensions: Readonly<Record<string, ParamDimension>>;
  /** Curve value at rate x (kg/ha) for parameters p. */
  value: (x: number, p: Float64Array) => number;
  /**
   * The same at many rates at once (one call per curve rather than per point: the
   * call from finishFit sees all six models, so per-point calls cannot be inlined).
   */
  values: (xs: ArrayLike<number>, p: Float64Array, out: Float64Array) => void;
  /** ∂curve/∂p_k at x, written into out (length paramNames.length). */
  gradient: (x: number, p: Float64Array, out: Float64Array) => void;
  /** R² about the mean, or about zero for a curve through the origin. */
  r2Kind: 'centered' | 'uncentered';
}

/** A model's optimum before it is capped at the tested rates (shared/economics/economicOptimum). */
export interface ClosedFormOptimum {
  /** Where the curve's slope equals the price ratio, kg/ha (0 when it never does). */
  rateKgHa: number;
  /** Rate of the highest yield, kg/ha; null when the curve has none within reach. */
  agronomicMaxKgHa: number | null;
}

/** One response model's entry in the catalog. */
export interface ModelEntry {
  /** The curve: display name, formula, parameters with their dimensions, value and gradient. */
  spec: CurveSpec;
  /** The full fit (errors, residuals, curve, lack of fit) of a prepared site. */
  fit: (site: PreparedSite, options: FitOptions, store?: FitStore) => ModelFit;
  /** The fast path: status, parameters and SSE only (the bootstrap's refit). */
  estimate: (site: PreparedSite, options: FitOptions) => CurveEstimate;
  /**
   * The curve from stored parameters by name (no refit), kg/ha at a rate in kg/ha;
   * NaN when a parameter is missing or NaN.
   */
  curveValue: (params: Readonly<Record<string, number>>, rateKgHa: number) => number;
  /**
   * The closed-form economic optimum: the rate where the slope equals the price ratio
   * PR (kg grain per kg nutrient), before capping at the highest tested rate.
   */
  optimum: (
    params: Readonly<Record<string, number>>,
    priceRatio: number,
    highestKgHa: number,
  ) => ClosedFormOptimum;
  /**
   * False for a straight line: its constant slope gives only a corner optimum (no
   * nutrient or the highest tested rate), so a recommendation prefers any curve.
   */
  isCurve: boolean;
  /**
   * True when the model is linear in all its parameters: sites are then compared by
   * nested F tests (shared/analysis/commonResponseTests); otherwise by pooled-versus-
   * separate fits (shared/analysis/plateauModels).
   */
  linearInParameters: boolean;
  /** The model a fit reduces to when it reaches no plateau within the tested rates, or null. */
  limit: ModelName | null;
  /**
   * The line pattern that tells the model's curve apart without color: dash and gap
   * lengths in px at a line width of 1.5, e.g. "6 3" (SVG stroke-dasharray form).
   */
  dash: string;
}

/**
 * One buffer shared by the fits of one site (fitAllModelsPrepared makes it): each
 * finishFit takes its numbers from `byteOffset` on and moves it along.
 */
export interface FitStore {
  buffer: ArrayBuffer;
  byteOffset: number;
}
