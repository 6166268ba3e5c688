/**
 * Fits every response model of the catalog to one site and ranks them by AICc (Hurvich &
 * Tsai 1989; smaller is better). Every model is shown; models whose fit reduces
 * to another one ("no-plateau": the straight line or quadratic; "no-response":
 * flat) or could not be made are listed after the ranked ones, unranked, with
 * their reason. AICc is comparable across them because all are fitted to the
 * same yields by least squares; the proportional model's R² is not (uncentered).
 */
import { MODEL_CATALOG } from './catalog';
import { fitStoreDoubles, type FitStore } from './finishFit';
import type { FitOptions, ModelFit, ModelName, SiteData } from './modelTypes';
import { MODEL_NAMES } from './modelTypes';
import { prepareSite, type PreparedSite } from './prepareSite';

/** One line of the AICc ranking. */
export interface ModelRank {
  model: ModelName;
  /** 1 for the best; null when the model is not ranked (see `reason`). */
  rank: number | null;
  aicc: number;
  /** AICc − the best AICc (0 for the best); NaN when unranked. */
  deltaAicc: number;
  /** Akaike weight exp(−Δ/2) / Σ exp(−Δ/2) among the ranked models; 0 when unranked. */
  weight: number;
  /** Why a model is unranked, or "". */
  reason: string;
}

export interface AllModelsFit {
  /** Every model's fit, keyed by name. */
  fits: Record<ModelName, ModelFit>;
  /** All of them, ranked ones first (best first), then the unranked ones. */
  ranking: ModelRank[];
  /** Name of the best-ranked model, or null when none could be ranked. */
  best: ModelName | null;
  n: number;
  distinctRates: number;
}

/** Statuses whose fit describes the data in its own right and takes part in the ranking. */
const RANKED = new Set<ModelFit['status']>(['ok', 'full-response-at-lowest-rate', 'convex']);

/**
 * Fits every model (or the ones named) to a site and ranks them by AICc.
 * @param data - rates (kg/ha), yields (kg/ha at standard moisture), optional block labels
 * @param options - blocks ('none' | 'fixed'), confidence level, curve grid; `models` to fit a subset
 * @returns fits by name, the AICc ranking and the best model
 * @throws {StatsInputError} for mismatched lengths, non-finite or negative values, missing block labels
 * @example
 * const all = fitAllModels({ rateKgHa: [0, 0, 60, 60, 120, 120, 180, 180], yieldKgHa: [5.1, 5.3, 7.9, 8.2, 9.0, 9.1, 9.0, 9.2] });
 * all.best // e.g. 'quadraticPlateau'
 * all.fits.linearPlateau.joinPoint?.estimate // kg/ha
 */
export function fitAllModels(
  data: SiteData,
  options: FitOptions & { models?: readonly ModelName[] } = {},
): AllModelsFit {
  const site = prepareSite(data, options.blocks ?? 'none');
  return fitAllModelsPrepared(site, options);
}

/**
 * fitAllModels for an already prepared site (the bootstrap and the across-site
 * code prepare once and refit).
 * @param site - from prepareSite
 * @param options - as for fitAllModels
 * @returns fits by name, ranking, best
 * @example
 * const site = prepareSite(data, 'none');
 * fitAllModelsPrepared(site, { models: ['linearPlateau'] }).fits.linearPlateau.status // e.g. 'ok'
 */
export function fitAllModelsPrepared(
  site: PreparedSite,
  options: FitOptions & { models?: readonly ModelName[] } = {},
): AllModelsFit {
  const names = options.models ?? MODEL_NAMES;
  const fits = {} as Record<ModelName, ModelFit>;
  // One buffer for the fitted values, residuals and curves of all the site's fits:
  // every typed array with its own store costs an allocation the GC must track.
  const store: FitStore = {
    buffer: new ArrayBuffer(8 * fitStoreDoubles(site.n, options) * names.length),
    byteOffset: 0,
  };
  for (const name of names) fits[name] = MODEL_CATALOG[name].fit(site, options, store);
  return { fits, ...rankByAicc(fits), n: site.n, distinctRates: site.rates.length };
}

function unrankedReason(fit: ModelFit): string {
  switch (fit.status) {
    case 'no-plateau':
      return 'No plateau within the tested rates: this fit is the straight line (or quadratic) again.';
    case 'no-response':
      return 'The best fit is flat.';
    case 'too-few-rates':
      return fit.message;
    default:
      return '';
  }
}

/**
 * Ranks fits by AICc.
 * @param fits - fits by model name (any subset)
 * @returns the ranking (ranked first, best first) and the best model
 * @example
 * rankByAicc(fitAllModels(data).fits).best // e.g. 'quadraticPlateau'
 */
export function rankByAicc(fits: Partial<Record<ModelName, ModelFit>>): {
  ranking: ModelRank[];
  best: ModelName | null;
} {
  const all = Object.values(fits).filter((f): f is ModelFit => f !== undefined);
  const ranked = all
    .filter((f) => RANKED.has(f.status) && Number.isFinite(f.aicc))
    .sort((a, b) => a.aicc - b.aicc);
  const bestAicc = ranked.length > 0 ? ranked[0].aicc : NaN;
  let total = 0;
  for (const f of ranked) total += Math.exp(-(f.aicc - bestAicc) / 2);
  const ranking: ModelRank[] = ranked.map((f, i) => ({
    model: f.model,
    rank: i + 1,
    aicc: f.aicc,
    deltaAicc: f.aicc - bestAicc,
    weight: Math.exp(-(f.aicc - bestAicc) / 2) / total,
    reason: '',
  }));
  for (const f of all) {
    if (ranked.includes(f)) continue;
    ranking.push({
      model: f.model,
      rank: null,
      aicc: f.aicc,
      deltaAicc: NaN,
      weight: 0,
      reason: unrankedReason(f),
    });
  }
  return { ranking, best: ranked.length > 0 ? ranked[0].model : null };
}
