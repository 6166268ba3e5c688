/**
 * What Plotrate knows of one response model, in one typed value: its curve facts
 * (shared/models/modelCurve: names, parameters and their units, value and slope,
 * closed-form optimum, limit, chart dash) and how it is fitted and estimated. Each
 * model's file exports its entry; shared/models/catalog.ts collects them, keyed by
 * ModelName. Code that fits reads the catalog; code that only names, draws or prices a
 * curve reads shared/models/curves, which loads no fitter.
 */
import type { ModelCurve } from './modelCurve';
import type { CurveEstimate, FitOptions, ModelFit, ModelName } from './modelTypes';
import type { PreparedSite } from './prepareSite';

/** One response model's entry in the catalog: its curve and its fits. */
export interface ModelEntry extends ModelCurve<ModelName, ModelName | null> {
  /** The full fit (errors, residuals, curve, lack of fit) of a prepared site. */
  fit: (site: PreparedSite, options: FitOptions, store?: FitStore) => ModelFit;
  /** The fast path: status, parameters and SSE only (the bootstrap's refit). */
  estimate: (site: PreparedSite, options: FitOptions) => CurveEstimate;
}

/**
 * One buffer shared by the fits of one site (fitAllModelsPrepared makes it): each
 * finishFit takes its numbers from `byteOffset` on and moves it along.
 */
export interface FitStore {
  buffer: ArrayBuffer;
  byteOffset: number;
}
