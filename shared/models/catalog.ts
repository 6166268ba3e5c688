/**
 * The model catalog: every response model's entry (shared/models/modelEntry) by name,
 * its curve facts (shared/models/curves) with how it is fitted and estimated. Code that
 * fits reads a model from here; code that only names, draws or prices a curve reads
 * shared/models/curves, which loads no fitter. A model in the curve list without an
 * entry here, or an entry for no listed model, is a compile error.
 */
import { exponentialModel } from './exponential';
import { linearModel } from './linear';
import { linearPlateauModel } from './linearPlateau';
import type { ModelEntry } from './modelEntry';
import type { ModelName } from './modelTypes';
import { proportionalModel } from './proportional';
import { quadraticModel } from './quadratic';
import { quadraticPlateauModel } from './quadraticPlateau';
import { stepModel } from './step';

/** Every model's entry, keyed by its name. */
export const MODEL_CATALOG = {
  linear: linearModel,
  proportional: proportionalModel,
  quadratic: quadraticModel,
  linearPlateau: linearPlateauModel,
  quadraticPlateau: quadraticPlateauModel,
  exponential: exponentialModel,
  step: stepModel,
} satisfies Record<ModelName, ModelEntry>;

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
