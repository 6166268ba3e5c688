/**
 * Every response model's curve facts (shared/models/modelCurve) by name, in display order:
 * the one place Plotrate asks what a model is called, what its parameters are, its curve
 * and closed-form optimum, whether it is a curve, what it reduces to at its limit and how
 * its line is drawn. The model names are this list's keys. Nothing here fits: the fits are
 * in the model catalog (shared/models/catalog), which adds them to these entries, so the
 * report and the chart code can read a model's facts without loading a fitter.
 */
import { exponentialCurve } from './curves/exponential';
import { linearCurve } from './curves/linear';
import { linearPlateauCurve } from './curves/linearPlateau';
import { proportionalCurve } from './curves/proportional';
import { quadraticCurve } from './curves/quadratic';
import { quadraticPlateauCurve } from './curves/quadraticPlateau';
import { stepCurve } from './curves/step';
import type { ModelCurve, ParamDimension } from './modelCurve';

const CURVES = {
  linear: linearCurve,
  proportional: proportionalCurve,
  quadratic: quadraticCurve,
  linearPlateau: linearPlateauCurve,
  quadraticPlateau: quadraticPlateauCurve,
  exponential: exponentialCurve,
  step: stepCurve,
};

/** A response model's name (one of MODEL_NAMES). */
export type ModelName = keyof typeof CURVES;

/**
 * Every model's curve, keyed by its name. An entry whose `spec.model` is not its key or
 * whose `limit` names no model is a compile error.
 */
export const MODEL_CURVES = CURVES satisfies {
  readonly [M in ModelName]: ModelCurve<M, ModelName | null>;
};

/** The response models in display order, by the name every other part of Plotrate uses. */
export const MODEL_NAMES = Object.keys(MODEL_CURVES) as readonly ModelName[];

/**
 * The models that are not linear in all their parameters (one profiled parameter: a join
 * point or a rate constant). Sites are compared on them by pooled-versus-separate fits.
 */
export type PlateauModel = {
  [M in ModelName]: (typeof MODEL_CURVES)[M]['linearInParameters'] extends false ? M : never;
}[ModelName];

/** The models compared across sites by pooled-versus-separate fits, in display order. */
export const PLATEAU_MODELS: readonly PlateauModel[] = MODEL_NAMES.filter(
  (m): m is PlateauModel => !MODEL_CURVES[m].linearInParameters,
);

/**
 * A model's display name, for headings, legends, tables and the JSON.
 * @param model - the model name
 * @returns the name in sentence case
 * @example
 * modelLabel('proportional') // 'Line through the origin'
 */
export function modelLabel(model: ModelName): string {
  return MODEL_CURVES[model].spec.label;
}

/**
 * The name of the model a site's recommendation follows, as legends and tables mark it: the
 * screen's "Leads" column, the charts and the workbook say the same word.
 * @param model - the model name
 * @returns e.g. "Quadratic-plateau (leading)"
 * @example leadingModelLabel('quadratic') // 'Quadratic (leading)'
 */
export function leadingModelLabel(model: ModelName): string {
  return `${modelLabel(model)} (leading)`;
}

/**
 * A model's display name in running text, after "the".
 * @param model - the model name
 * @returns the name in lower case
 * @example
 * `the ${modelLabelInText('exponential')}` // 'the exponential rise'
 */
export function modelLabelInText(model: ModelName): string {
  return MODEL_CURVES[model].spec.label.toLowerCase();
}

/**
 * The dimension of one parameter of one model (what unit it converts to).
 * @param model - the model
 * @param name - the parameter name as the model reports it ("a", "b", "c", "P", "x0", "k")
 * @returns its dimension
 * @throws {Error} for a name the model does not have (a programming mistake)
 * @example
 * paramDimension('exponential', 'b') // 'yield' (the rise to the asymptote)
 */
export function paramDimension(model: ModelName, name: string): ParamDimension {
  const dimensions: Readonly<Record<string, ParamDimension>> = MODEL_CURVES[model].spec.dimensions;
  const dimension = dimensions[name];
  if (!dimension) throw new Error(`paramDimension: the ${model} model has no parameter "${name}".`);
  return dimension;
}
