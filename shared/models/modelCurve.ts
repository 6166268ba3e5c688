/**
 * What Plotrate knows of one response model's curve, apart from how it is fitted: its
 * display name, formula, parameters with their dimensions, value and slope, closed-form
 * optimum, whether it is a curve or a straight line, what it reduces to at its limit and
 * how its line is drawn. Each model's file in shared/models/curves/ exports one;
 * shared/models/curves.ts collects them. Nothing here fits, so the report and the
 * chart code can read a model's facts without loading a fitter.
 */

/**
 * The dimension of a curve parameter, which fixes how it converts to display units:
 * a yield (kg/ha), a yield per rate (kg grain per kg nutrient), per rate squared, a
 * rate (kg/ha) or a reciprocal rate (ha/kg).
 */
export type ParamDimension = 'yield' | 'yieldPerRate' | 'yieldPerRate2' | 'rate' | 'perRate';

/**
 * How a model's curve is named, evaluated and differentiated.
 * Name: the model's name (a ModelName once the curve is listed in shared/models/curves).
 */
export interface CurveSpec<Name extends string = string> {
  model: Name;
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
   * call from finishFit sees every model, so per-point calls cannot be inlined).
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

/**
 * One response model's curve facts. Name is the model's name and Limit the name of the
 * model it reduces to (or null); a curve file writes both, `satisfies
 * ModelCurve<'linearPlateau', 'linear'>`, so shared/models/curves can check them.
 */
export interface ModelCurve<
  Name extends string = string,
  Limit extends string | null = string | null,
> {
  /** The curve: display name, formula, parameters with their dimensions, value and gradient. */
  spec: CurveSpec<Name>;
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
  limit: Limit;
  /**
   * The line pattern that tells the model's curve apart without color: dash and gap
   * lengths in px at a line width of 1.5, e.g. "6 3" (SVG stroke-dasharray form).
   */
  dash: string;
}
