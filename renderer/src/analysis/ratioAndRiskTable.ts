/**
 * The price-ratio and risk tables as the screen shows them, for a site (from its PricedSite)
 * or for the region (from the priced regional analysis): the numbers are the priced view's
 * (shared/economics/priceRatioSensitivity and shortfallRisk), only written out here in the
 * display units and the locale, so the screen says what the workbook and the JSON say.
 */
import type { PricedSite } from '../../../shared/analysis/priceTrial';
import type { RegionalAnalysis } from '../../../shared/analysis/regionalAnalysis';
import { recommendedRateKgHa } from '../../../shared/economics/economicOptimum';
import type { RatioMultiple } from '../../../shared/economics/priceRatioSensitivity';
import {
  DEFAULT_TOLERANCE_N_KG_HA,
  sameRate,
  type ShortfallRisk,
} from '../../../shared/economics/shortfallRule';
import type { CropId } from '../../../shared/table/plotTable';
import { rateFromKgHa } from '../../../shared/units/convertRate';
import {
  displayUnits,
  formatMoneyPerArea,
  formatNumber,
  formatRate,
  formatSignificant,
  rateDecimalsFor,
  type UnitSystem,
} from '../lib/format';
import { priceRatioDisplay } from './priceInputs';

/** How the tables are written: units, crop, currency, locale, and whether the tolerance is the default. */
export interface TableContext {
  system: UnitSystem;
  crop: CropId;
  currency: string;
  locale: string;
  toleranceIsDefault: boolean;
}

/** One row of the price-ratio table, as text. */
export interface RatioRowView {
  /** e.g. "0.5×". */
  multiple: string;
  /** The price ratio of the row, e.g. "0.0628 bu/lb N". */
  ratio: string;
  /** The recommended (site) or regional rate at that ratio. */
  rate: string;
  /** The interval (site) or profitable range (region), e.g. "124 – 183 lb/ac". */
  range: string;
  /** True on the row of the prices in force (1×). */
  current: boolean;
}

/** One row of the risk table, as text. */
export interface RiskRowView {
  /**
   * The rate in kg/ha: the rows' key. The text may repeat (a regional rate of 89.7 kg/ha and a
   * tested 89.66 both read "80 lb/ac"), and a keyed list with a repeated key stops the window
   * from updating at all.
   */
  rateKgHa: number;
  rate: string;
  /** e.g. "27 %", "< 1 %". */
  share: string;
  /** True on the recommended (site) or regional (region) rate. */
  recommended: boolean;
}

/** Both tables of one site or of the region. */
export interface RatioAndRiskView {
  ratioRows: RatioRowView[];
  /** What the range column holds: "90 % interval" or "Profitable range". */
  rangeLabel: string;
  riskRows: RiskRowView[];
  /** The sentence above the risk table: what is counted and against which tolerance. */
  riskNote: string;
}

/** A share as a whole percent; "< 1 %" for a share that is not 0 but rounds to it. */
function percent(share: number, locale: string): string {
  if (share > 0 && share < 0.005) return '< 1 %';
  return `${formatNumber(share * 100, 0, locale)} %`;
}

function ratioRows(
  rows: (RatioMultiple & { rateKgHa: number | null; pair: [number, number] | null })[],
  c: TableContext,
): RatioRowView[] {
  const rate = displayUnits(c.system).rate;
  return rows.map((r) => {
    const quoted = priceRatioDisplay(r.priceRatio, c.system, c.crop);
    return {
      multiple: `${formatSignificant(r.ratioMultiplier, 3, c.locale)}×`,
      ratio: `${formatSignificant(quoted.value, 3, c.locale)} ${quoted.unit}`,
      rate: formatRate(r.rateKgHa, rate, c.locale),
      range: r.pair
        ? `${formatNumber(rateFromKgHa(r.pair[0], rate), rateDecimalsFor(rate), c.locale)} – ${formatRate(r.pair[1], rate, c.locale)}`
        : '–',
      current: r.ratioMultiplier === 1,
    };
  });
}

function riskView(
  risk: ShortfallRisk,
  recommendedKgHa: number | null,
  c: TableContext,
): RiskRowView[] {
  const rate = displayUnits(c.system).rate;
  return risk.rows.map((r) => ({
    rateKgHa: r.rateKgHa,
    rate: formatRate(r.rateKgHa, rate, c.locale),
    share: percent(r.share, c.locale),
    recommended: sameRate(r.rateKgHa, recommendedKgHa),
  }));
}

/** "by more than $5.04/ac (the cost of 10 kg N/ha at these prices)". */
function toleranceText(risk: ShortfallRisk, c: TableContext): string {
  const money = formatMoneyPerArea(
    risk.tolerancePerHa,
    c.currency,
    displayUnits(c.system).rate,
    c.locale,
  );
  return c.toleranceIsDefault
    ? `by more than ${money} (the cost of ${DEFAULT_TOLERANCE_N_KG_HA} kg N/ha at these prices)`
    : `by more than ${money} (your tolerance)`;
}

/**
 * A site's tables.
 * @param site - the site's priced view
 * @param level - the interval level, e.g. 0.9
 * @param c - units, crop, currency, locale, whether the tolerance is the default
 * @returns the rows as text; null without a leading model
 * @example
 * siteRatioAndRisk(priced.sites[0], 0.9, context)?.ratioRows[2].current // true
 */
export function siteRatioAndRisk(
  site: PricedSite,
  level: number,
  c: TableContext,
): RatioAndRiskView | null {
  if (!site.priceRatioSensitivity) return null;
  const risk = site.shortfallRisk;
  return {
    ratioRows: ratioRows(
      site.priceRatioSensitivity.map((r) => ({ ...r, pair: r.intervalKgHa })),
      c,
    ),
    rangeLabel: `${Math.round(level * 100)} % interval`,
    riskRows: risk ? riskView(risk, recommendedRateKgHa(site.optimum), c) : [],
    riskNote: risk
      ? `Share of the ${risk.count} resamples in which a rate returns less than that resample’s own best rate ${toleranceText(risk, c)}.`
      : 'No resamples: no risk to show.',
  };
}

/**
 * The region's tables (a between-site risk: the share of sites a rate leaves short).
 * @param region - the priced regional analysis
 * @param c - units, crop, currency, locale, whether the tolerance is the default
 * @returns the rows as text; null with no site in the regional rate
 * @example
 * regionalRatioAndRisk(priced.across.regional, context)?.riskRows.find((r) => r.recommended)
 */
export function regionalRatioAndRisk(
  region: RegionalAnalysis,
  c: TableContext,
): RatioAndRiskView | null {
  const risk = region.shortfallRisk;
  if (!risk) return null;
  return {
    ratioRows: ratioRows(
      region.priceRatioSensitivity.map((r) => ({ ...r, pair: r.profitableRangeKgHa })),
      c,
    ),
    rangeLabel: 'Profitable range',
    riskRows: riskView(risk, region.regional.bestRateKgHa, c),
    riskNote: `Share of the ${risk.count} sites at which a rate returns less than the site’s own best rate ${toleranceText(risk, c)}, both from the site’s fitted curve: a risk between sites, not the uncertainty of any one curve.`,
  };
}
