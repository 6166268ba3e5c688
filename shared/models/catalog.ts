/**
 * The model catalog: every response model's entry (shared/models/modelEntry) by
 * name, the one place the rest of Plotrate asks what a model is called, how it
 * is fitted, estimated and priced, whether it is a curve, what it reduces to at
 * its limit and how its line is drawn. A name in MODEL_NAMES without an entry
 * here is a compile error.
 */
import { exponentialModel } from './exponential';
import { linearModel } from './linear';
import { linearPlateauModel } from './linearPlateau';
import type { ModelEntry, ParamDimension } from './modelEntry';
import { MODEL_NAMES, type ModelName } from './modelTypes';
import { proportionalModel } from './proportional';
import { quadraticModel } from './quadratic';
import { quadraticPlateauModel } from './quadraticPlateau';

/** Every model's entry, keyed by its name. */
export const MODEL_CATALOG = {
  linear: linearModel,
  proportional: proportionalModel,
  quadratic: quadraticModel,
  linearPlateau: linearPlateauModel,
  quadraticPlateau: quadraticPlateauModel,
  exponential: exponentialModel,
} satisfies Record<ModelName, ModelEntry>;

/**
 * The models that are not linear in all their parameters (one profiled parameter: a join
 * point or a rate constant). Sites are compared on them by pooled-versus-separate fits.
 */
export type PlateauModel = {
  [M in ModelName]: (typeof MODEL_CATALOG)[M]['linearInParameters'] extends false ? M : never;
}[ModelName];

/** The models compared across sites by pooled-versus-separate fits, in display order. */
export const PLATEAU_MODELS: readonly PlateauModel[] = MODEL_NAMES.filter(
  (m): m is PlateauModel => !MODEL_CATALOG[m].linearInParameters,
);

/**
 * A model's entry.
 * @param model - the model name
 * @returns its catalog entry
 * @example
 * modelEntry('linearPlateau').limit // 'linear'
 */
export function modelEntry(model: ModelName): ModelEntry {
  return MODEL_CATALOG[model];
}

/**
 * A model's display name, for headings, legends, tables and the JSON.
 * @param model - the model name
 * @returns the name in sentence case
 * @example
 * modelLabel('proportional') // 'Line through the origin'
 */
export function modelLabel(model: ModelName): string {
  return MODEL_CATALOG[model].spec.label;
}

/**
 * A model's display name in running text, after "the".
 * @param model - the model name
 * @returns the name in lower case
 * @example
 * `the ${modelLabelInText('exponential')}` // 'the exponential rise'
 */
export function modelLabelInText(model: ModelName): string {
  return MODEL_CATALOG[model].spec.label.toLowerCase();
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
  const dimension = MODEL_CATALOG[model].spec.dimensions[name];
  if (!dimension) throw new Error(`paramDimension: the ${model} model has no parameter "${name}".`);
  return dimension;
}
