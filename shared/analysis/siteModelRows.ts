/**
 * The side-by-side table: one row per site and model, every site present (a
 * site that cannot be fitted has one row per model with status "not-fitted" and
 * the reason), and a plain sort and filter over the rows for screens and
 * reports, and the builder of one site's rows at given prices. Site-level columns (intercept test, CV, rate effect, groups) repeat
 * on each of the site's rows so that any row can be read, sorted or filtered
 * on its own.
 */
import { economicOptimum, type OptimumStatus } from '../economics/economicOptimum';
import type { Prices } from '../economics/priceRatio';
import { MODEL_NAMES, type FitStatus, type ModelName } from '../models/modelTypes';
import type { SiteAnalysis } from './analyzeSite';
import { SitesInputError } from './sitesInputError';

export interface SiteModelRow {
  site: string;
  model: ModelName;
  /** The fit's status, or "not-fitted" when the site had nothing to fit. */
  status: FitStatus | 'not-fitted';
  /** The fit's message, or why the site could not be fitted. */
  message: string;
  /** Economic optimum at the current prices, kg/ha; null when the fit gives none. */
  optimumRateKgHa: number | null;
  optimumStatus: OptimumStatus | 'not-fitted';
  /** Fitted yield at the optimum, kg/ha. */
  yieldAtOptimumKgHa: number | null;
  /** Net return over the zero-rate check at the optimum, currency/ha; null when there is none. */
  gainOverCheckPerHa: number | null;
  /** Plateau (or asymptote) yield, kg/ha; null when the model has none or it was not reached. */
  plateauYieldKgHa: number | null;
  aicc: number;
  /** 1 for the site's AICc winner; null when unranked. */
  aiccRank: number | null;
  aiccWinner: boolean;
  /** Two-sided p of the straight line's intercept (site level); null when not testable. */
  interceptP: number | null;
  interceptNeeded: boolean | null;
  /** CV of the site's block × rate ANOVA, %. */
  cvPct: number;
  /** p of the site's rate effect (rate as a factor); null when not testable. */
  rateEffectP: number | null;
  /** The site's rate effect is significant at the analysis' alpha. */
  responded: boolean;
  /** Grouping values of the site (previous crop, soil, year), null when mixed or missing. */
  groups: Record<string, string | null>;
}

/**
 * The side-by-side rows of a site at given prices.
 * @param s - the site's analysis
 * @param prices - canonical prices
 * @returns one row per model, in MODEL_NAMES order
 * @example
 * siteModelRows(analysis.sites[0], prices)[0].model // 'linear'
 */
export function siteModelRows(s: SiteAnalysis, prices: Prices): SiteModelRow[] {
  const interceptP = 'p' in s.intercept ? s.intercept.p : null;
  const interceptNeeded = 'p' in s.intercept ? s.intercept.needed : null;
  const rateEffectP = s.rateEffect.test.kind === 'f-test' ? s.rateEffect.test.p : null;
  // Every row is written out field by field: V8 builds object-spread copies of
  // the site columns slowly enough to dominate re-pricing thousands of rows.
  return MODEL_NAMES.map((model): SiteModelRow => {
    const fit = s.fits?.fits[model];
    const opt = s.fits && fit ? economicOptimum(fit, prices) : null;
    const rank = (fit && s.fits?.ranking.find((r) => r.model === model)?.rank) ?? null;
    return {
      site: s.site,
      model,
      status: fit ? fit.status : 'not-fitted',
      message: fit ? fit.message : (s.problem ?? 'not fitted'),
      optimumRateKgHa: opt ? opt.rateKgHa : null,
      optimumStatus: opt ? opt.status : 'not-fitted',
      yieldAtOptimumKgHa: opt ? opt.yieldKgHa : null,
      gainOverCheckPerHa: opt ? opt.gainOverCheckPerHa : null,
      plateauYieldKgHa: fit?.plateauYield?.estimate ?? null,
      aicc: fit ? fit.aicc : NaN,
      aiccRank: rank,
      aiccWinner: rank === 1,
      interceptP,
      interceptNeeded,
      cvPct: s.rateEffect.cvPct,
      rateEffectP,
      responded: s.responded,
      groups: s.groups,
    };
  });
}

/** Columns rows can be sorted on. */
export type SiteRowKey =
  | 'site'
  | 'model'
  | 'status'
  | 'optimumRateKgHa'
  | 'yieldAtOptimumKgHa'
  | 'plateauYieldKgHa'
  | 'aicc'
  | 'aiccRank'
  | 'interceptP'
  | 'cvPct'
  | 'rateEffectP';

const KEYS: readonly SiteRowKey[] = [
  'site',
  'model',
  'status',
  'optimumRateKgHa',
  'yieldAtOptimumKgHa',
  'plateauYieldKgHa',
  'aicc',
  'aiccRank',
  'interceptP',
  'cvPct',
  'rateEffectP',
];

/**
 * Rows sorted by one column; stable, so sorting by model then by site groups
 * models within sites. Empty values (null, NaN) go last in either direction.
 * @param rows - the rows (not modified)
 * @param key - the column
 * @param direction - "asc" (default) or "desc"
 * @returns a new array
 * @throws {SitesInputError} "bad-argument" for an unknown column
 * @example
 * sortSiteRows(rows, 'optimumRateKgHa', 'desc')[0].site // site with the highest optimum
 */
export function sortSiteRows(
  rows: readonly SiteModelRow[],
  key: SiteRowKey,
  direction: 'asc' | 'desc' = 'asc',
): SiteModelRow[] {
  if (!KEYS.includes(key)) {
    throw new SitesInputError(
      'bad-argument',
      `sortSiteRows: "${String(key)}" is not a column; use one of ${KEYS.join(', ')}.`,
    );
  }
  const sign = direction === 'desc' ? -1 : 1;
  const empty = (v: unknown) => v === null || (typeof v === 'number' && Number.isNaN(v));
  return rows
    .map((row, i) => ({ row, i }))
    .sort((a, b) => {
      const va = a.row[key];
      const vb = b.row[key];
      if (empty(va) || empty(vb)) return empty(va) === empty(vb) ? a.i - b.i : empty(va) ? 1 : -1;
      const c =
        typeof va === 'number' && typeof vb === 'number'
          ? va - vb
          : String(va).localeCompare(String(vb), undefined, { numeric: true });
      return c !== 0 ? sign * c : a.i - b.i;
    })
    .map((x) => x.row);
}

/** What to keep; every given condition must hold. */
export interface SiteRowFilter {
  /** Keep these sites only. */
  sites?: readonly string[];
  /** Keep these models only. */
  models?: readonly ModelName[];
  /** Keep rows with one of these statuses. */
  statuses?: readonly (FitStatus | 'not-fitted')[];
  /** Keep each site's AICc winner only. */
  aiccWinnersOnly?: boolean;
  /** Keep sites that responded (or, with false, those that did not). */
  responded?: boolean;
  /** Keep sites whose group column has this value, e.g. { key: 'previous crop', value: 'soybean' }. */
  group?: { key: string; value: string };
  /** Keep sites whose name contains this text (case-insensitive). */
  siteContains?: string;
  /** Keep rows whose optimum lies within [low, high], kg/ha. */
  optimumBetweenKgHa?: [number, number];
}

/**
 * Rows meeting every condition of the filter, in their order.
 * @param rows - the rows (not modified)
 * @param filter - the conditions; an empty filter keeps everything
 * @returns a new array
 * @example
 * filterSiteRows(rows, { aiccWinnersOnly: true, group: { key: 'previous crop', value: 'corn' } })
 */
export function filterSiteRows(
  rows: readonly SiteModelRow[],
  filter: SiteRowFilter,
): SiteModelRow[] {
  const text = filter.siteContains?.toLowerCase();
  return rows.filter(
    (r) =>
      (!filter.sites || filter.sites.includes(r.site)) &&
      (!filter.models || filter.models.includes(r.model)) &&
      (!filter.statuses || filter.statuses.includes(r.status)) &&
      (!filter.aiccWinnersOnly || r.aiccWinner) &&
      (filter.responded === undefined || r.responded === filter.responded) &&
      (!filter.group || r.groups[filter.group.key] === filter.group.value) &&
      (!text || r.site.toLowerCase().includes(text)) &&
      (!filter.optimumBetweenKgHa ||
        (r.optimumRateKgHa !== null &&
          r.optimumRateKgHa >= filter.optimumBetweenKgHa[0] &&
          r.optimumRateKgHa <= filter.optimumBetweenKgHa[1])),
  );
}
