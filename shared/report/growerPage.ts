/**
 * The printable grower recommendation as structured content: what to apply,
 * what it should yield, which rates pay nearly as well, the prices assumed,
 * how sure the estimate is in plain words, what data it rests on, and the
 * cautions. The PDF (cli/ through pdfkit, laid out by growerPageLayout), the
 * workbook's print sheet and the screen's HTML preview all draw this one value.
 */
import { namesListed } from './namesListed';
import { paperSize, type PaperSize } from './paperSize';
import { recommendationCautions } from '../economics/recommendationCautions';
import { crops } from '../units/crops';
import { formatQuantity } from '../units/formatQuantity';
import { applicationRate, applicationRateDown, formatShownRate } from '../units/rateRounding';
import { formatMoney, formatMoneyPerArea } from '../units/formatMoney';
import { pageFieldRows } from './pageFields';
import { products } from '../units/products';
import { priceWeightName } from '../units/unitWeights';
import type { TrialReport, YearComparisonReport } from './trialReport';
import { formatP } from '../analysis/describeFTest';
import { bestLevelSentence, levelTestSentence } from './levelSentences';
import { fullResponseSentence } from '../economics/decisionSentences';
import { atHighestTestedRate } from './highestTestedRate';
import { unitScale } from './unitScale';
import { formatNutrientRate, nutrientRateUnit } from '../units/convertRate';

/** A label and its value, one line of a facts table. */
export interface GrowerFact {
  label: string;
  value: string;
}

export interface GrowerPage {
  /** Which page this is, as growerPage was asked: a site's name, "region" or a group's page id. */
  id: string;
  /** "Nitrogen rate recommendation". */
  heading: string;
  /** The site, or "Region (6 sites)". */
  subject: string;
  /** Grower, field, season and advisor as the user typed them (pageFields); "" where blank. */
  addressedTo: GrowerFact[];
  cropLabel: string;
  /** The headline: "Apply about 150 lb N/ac". */
  recommendation: string;
  /** The same in product, e.g. "≈ 325 lb/ac of Urea 46-0-0"; "" without a product. */
  productRecommendation: string;
  /** The recommended rate in display units (rounded as shown); null when there is none. */
  rate: number | null;
  rateUnit: string;
  /** Expected yield, profitable range, return: label/value pairs. */
  facts: GrowerFact[];
  /** Grain and nutrient prices and the price ratio used. */
  prices: GrowerFact[];
  /** How sure: a short label and a plain sentence built from the bootstrap interval. */
  certainty: {
    level: 'fairly sure' | 'moderately sure' | 'not very sure' | 'unknown';
    text: string;
  };
  /** What the estimate rests on, one sentence each. */
  basis: string[];
  /** Findings the grower must see (no optimum, capped, defaulted prices). */
  warnings: string[];
  cautions: readonly string[];
  /** Small print: tool, version, date, source files. */
  footer: string;
  /** The report's paper (paperSize). */
  paper: PaperSize;
  /**
   * A rate × factor site (source, timing…): per factor, the recommended rate of each level and
   * the plain sentences on whether the levels differ and which returns most; also written into
   * `facts` and at the head of `basis`, so every layout of the page shows them. Absent otherwise.
   */
  levels?: { factor: string; rates: GrowerFact[]; sentences: string[] }[];
}

/**
 * Half an interval's width against the rate, up to which a page says "fairly sure" and
 * "moderately sure" (Plotrate's reading for growers; common practice has no fixed cut-off).
 */
const FAIRLY_SURE = 0.15;
const MODERATELY_SURE = 0.35;

/** The certainty of a best rate at the highest rate tested: where the trial stopped. */
function notLocated(highest: string): GrowerPage['certainty'] {
  return {
    level: 'not very sure',
    text: `Not located: the best rate came out at the highest rate tested, ${highest}, so this trial cannot say whether more would pay; a trial with higher rates would.`,
  };
}

/** How sure the optimum is, in words a grower uses, from its interval (display units). */
function certaintyOf(
  opt: number,
  ci: [number, number] | null,
  fmt: (v: number) => string,
  level: number,
  highestRate: number,
): GrowerPage['certainty'] {
  // A best rate at the highest rate tested is where the trial stopped, not where the return
  // peaked: resamples counted there (no plateau) make it look certain when it is not located.
  if (atHighestTestedRate(opt, highestRate)) return notLocated(fmt(highestRate));
  if (!ci) {
    return {
      level: 'unknown',
      text: 'The data did not allow an uncertainty range for this rate; treat it as a rough guide.',
    };
  }
  const half = (ci[1] - ci[0]) / 2;
  // Relative to the rate, but never to less than a quarter of the tested range: an
  // optimum of 0 with an interval of 0 to 0 is a sure answer, not an infinitely wide one.
  const rel = half / Math.max(opt, 0.25 * highestRate, 1e-9);
  const pct = Math.round(level * 100);
  const range =
    fmt(ci[0]) === fmt(ci[1]) ? `at ${fmt(ci[0])}` : `between ${fmt(ci[0])} and ${fmt(ci[1])}`;
  if (rel <= FAIRLY_SURE) {
    return {
      level: 'fairly sure',
      text: `Fairly sure: resampling the plots put the best rate ${range} in ${pct} of 100 cases.`,
    };
  }
  if (rel <= MODERATELY_SURE) {
    return {
      level: 'moderately sure',
      text: `Moderately sure: resampling the plots put the best rate ${range} in ${pct} of 100 cases; the trial cannot pin it down more closely.`,
    };
  }
  return {
    level: 'not very sure',
    text: `Not very sure: resampling the plots put the best rate anywhere ${range} in ${pct} of 100 cases. More site-years would narrow this.`,
  };
}

/**
 * Builds the grower page for one site or for the region.
 * @param report - the assembled analysis
 * @param which - a site name, or "region" for the across-site rate
 * @returns the structured page
 * @throws {RangeError} when the site is not in the report, or "region" is asked without an across-site result
 * @example
 * growerPage(report, 'Cedar Bend').recommendation // "Apply about 150 lb N/ac"
 */
export function growerPage(report: TrialReport, which: string | 'region'): GrowerPage {
  const page = pageOf(report, which);
  const factors = which === 'region' ? [] : report.levels.filter((l) => l.site === which);
  if (factors.length === 0) return page;
  // As on the rest of the page: a level's rate to apply to the spreader's step, its interval and
  // differences as reported rates; money in the user's currency.
  const { fmtRate, fmtApply, fmtApplyDown, money } = pageFormats(report);
  const levels = factors.map((f) => ({
    factor: f.factor,
    rates: f.levels.map((l): GrowerFact => {
      const r = l.report.recommendation;
      const ci = r.ciKgHa;
      const range = ci
        ? ` (${Math.round(r.level * 100)} % range ${fmtRate(ci[0])} to ${fmtRate(ci[1])})`
        : '';
      const value =
        r.basis === 'no-response'
          ? 'no N: no response found'
          : r.rateKgHa === null
            ? 'no rate can be recommended'
            : r.basis === 'full-response'
              ? `no more than ${fmtApplyDown(r.rateKgHa)}${range}`
              : `about ${fmtApply(r.rateKgHa)}${range}`;
      return { label: `${f.factor}: ${l.level}`, value };
    }),
    sentences: [levelTestSentence(f), bestLevelSentence(f, { rate: fmtRate, money })],
  }));
  return {
    ...page,
    facts: [...page.facts, ...levels.flatMap((l) => l.rates)],
    basis: [
      ...levels.flatMap((l) => [
        `Each ${l.factor.toLowerCase()} level was fitted on its own plots and the zero-rate check plots they share; the headline rate treats all levels as one; each level's own rate is listed with the facts.`,
        ...l.sentences,
      ]),
      ...page.basis,
    ],
    levels,
  };
}

/** The page of a site or of the region, before any treatment levels are added. */
function pageOf(report: TrialReport, which: string | 'region'): GrowerPage {
  const u = unitScale(report.settings.units, report.crop);
  const ru = report.settings.units.rate;
  const yu = report.settings.units.yield;
  const { shown, fmtRate, fmtApply, fmtApplyDown, money } = pageFormats(report);
  const fmtYield = (kgHa: number): string => formatQuantity(u.yield(kgHa), yu);
  const { settings, prices } = report;
  const { currency, locale } = settings;
  const price = (amount: number, decimals: number): string =>
    formatMoney(amount, currency, locale, decimals);
  const product = settings.prices.product ? products(settings.prices.product.id) : null;
  const priceFacts: GrowerFact[] = [
    {
      label: 'Grain price',
      value: `${price(settings.prices.grainPrice, 2)} per ${priceWeightName(yu)}`,
    },
    product
      ? {
          label: 'Product price',
          value: `${price(settings.prices.product!.price, 3)} per ${priceWeightName(ru)} of ${product.label} (${price(prices.nutrientPriceDisplay, 3)} per ${priceWeightName(ru)} N)`,
        }
      : {
          label: 'Nitrogen price',
          value: `${price(prices.nutrientPriceDisplay, 3)} per ${priceWeightName(ru)} N`,
        },
    {
      label: 'Price ratio (N : grain)',
      value: `${prices.priceRatioDisplay.toPrecision(3)} ${prices.priceRatioUnit}`,
    },
  ];
  const footer = `${report.tool.name} ${report.tool.version} · ${report.createdAt.slice(0, 10)} · data: ${report.sources.map((s) => s.name).join(', ')}`;
  const paper: GrowerPage['paper'] = report.settings.paper ?? paperSize(report.settings.units);
  const warnings = [...report.warnings];
  const base = {
    id: which,
    heading: 'Nitrogen rate recommendation',
    cropLabel: crops(report.crop).label,
    rateUnit: nutrientRateUnit(ru),
    prices: priceFacts,
    cautions: recommendationCautions,
    footer,
    addressedTo: pageFieldRows(settings.pageFields),
    paper,
  };
  // The headline; a rate at the highest tested one says so (where the trial stopped).
  const applyAbout = (rateKgHa: number, atHighest = false): string =>
    `Apply about ${fmtApply(rateKgHa)}${atHighest ? ', the highest rate tested' : ''}`;
  const productText = (rateKgHa: number): string => {
    if (!product) return '';
    const p = applicationRate(u.rate(rateKgHa) / (product.nitrogenPct / 100), ru);
    return `≈ ${formatQuantity(p, ru, 0)} of ${product.label}`;
  };

  const group = groupOfPage(which);
  if (group) {
    const g = report.acrossSites?.groups.find((x) => x.key === group.key);
    const v = g?.values.find((x) => x.value === group.value);
    if (!g || !v)
      throw new RangeError(`growerPage: the report has no group "${group.key}: ${group.value}".`);
    const ci = v.bestRateIntervalKgHa;
    return {
      ...base,
      subject: `${g.key}: ${v.value} (${v.sites.length} site${v.sites.length === 1 ? '' : 's'})`,
      recommendation:
        v.bestRateKgHa === null
          ? 'No rate can be recommended for this group'
          : applyAbout(v.bestRateKgHa),
      productRecommendation: v.bestRateKgHa === null ? '' : productText(v.bestRateKgHa),
      rate: v.bestRateKgHa === null ? null : applicationRate(u.rate(v.bestRateKgHa), ru),
      facts: v.profitableRangeKgHa
        ? [
            {
              label: 'Profitable range',
              value: `${fmtRate(v.profitableRangeKgHa[0])} to ${fmtRate(v.profitableRangeKgHa[1])}`,
            },
          ]
        : [],
      certainty: ci
        ? {
            // The same reading of width as the region's spread (spreadCertainty): half the
            // interval against the rate, within 15 % fairly sure, within 35 % moderately.
            level: widthLevel(ci, v.bestRateKgHa),
            text: `With other site-years like these the group's rate could have come out anywhere from ${fmtRate(ci[0])} to ${fmtRate(ci[1])}; ${v.sites.length} site${v.sites.length === 1 ? '' : 's'} stand behind it.`,
          }
        : {
            level: 'unknown',
            text: 'Too few site-years in this group to say how sure its rate is.',
          },
      basis: [
        `${v.sites.length} site${v.sites.length === 1 ? '' : 's'} with ${g.key.toLowerCase()} ${v.value}: ${v.sites.join(', ')}.`,
        `The rate with the highest net return averaged over these sites' fitted curves; rates within ${money(report.acrossSites!.bandPerHa)} of that best return count as profitable.`,
        ...(g.differ ? [g.differ.sentence] : []),
      ],
      warnings,
    };
  }

  if (which === 'region') {
    const a = report.acrossSites;
    if (!a)
      throw new RangeError('growerPage: the report has no across-site result to recommend from.');
    const rate = applicationRate(u.rate(a.bestRateKgHa), ru);
    // The regional curve ends at the highest rate tested: a best rate there is not located
    // (sites all still rising agree at that rate, which is no sign of certainty).
    const regionTop = a.chart.rateKgHa.at(-1);
    const atTop = regionTop !== undefined && atHighestTestedRate(a.bestRateKgHa, regionTop);
    return {
      ...base,
      subject: `Region (${a.sites.length} sites)`,
      recommendation: applyAbout(a.bestRateKgHa, atTop),
      productRecommendation: productText(a.bestRateKgHa),
      rate,
      facts: [
        {
          label: 'Profitable range',
          value: `${fmtRate(a.profitableRangeKgHa[0])} to ${fmtRate(a.profitableRangeKgHa[1])}`,
        },
        { label: 'Mean yield gain over no N', value: fmtYield(a.meanYieldGainAtBestKgHa) },
        { label: 'Mean net return over no N', value: money(a.bestMeanReturnPerHa) },
      ],
      certainty: atTop
        ? notLocated(fmtRate(regionTop))
        : withSiteYearInterval(
            spreadCertainty(
              a.siteOptima.map((o) => o.rateKgHa),
              fmtRate,
            ),
            a.bestRateInterval,
            fmtRate,
          ),
      basis: [
        `${a.sites.length} sites: ${namesListed(a.sites)}.`,
        `The rate with the highest net return averaged over the sites' fitted curves (maximum return to N across sites); rates within ${money(a.bandPerHa)} of that best return, the tolerance set with the prices, count as profitable.`,
        ...a.notes,
      ],
      warnings,
    };
  }

  const s = report.sites.find((x) => x.site === which);
  if (!s) throw new RangeError(`growerPage: there is no site "${which}" in the report.`);
  const best = s.models.find((m) => m.model === s.bestModel) ?? null;
  warnings.push(...s.warnings);
  const nExcl = s.plots.filter((p) => p.excluded).length;
  const rates = s.ratesKgHa;
  const basis = [
    `${s.n} plots (${s.designText}) at rates from ${fmtRate(rates[0] ?? 0)} to ${fmtRate(rates[rates.length - 1] ?? 0)}.`,
    nExcl > 0
      ? `${nExcl} plot${nExcl === 1 ? '' : 's'} left out: ${[...new Set(s.plots.filter((p) => p.excluded).map((p) => p.excluded!.reason))].join('; ')}.`
      : 'No plots were left out.',
    best
      ? `Response curve: ${best.label.toLowerCase()}, ${s.bestModelPicked ? s.bestModelReason : `chosen for the ${s.bestModelReason}`}.`
      : 'No response curve leads the recommendation (see the notes below).',
  ];
  const seasons = report.yearsCompared.find((c) => c.siteYears.includes(s.site));
  if (seasons) basis.push(seasonSentence(seasons, s.year));
  const rec = s.recommendation;
  const recCertainty = (rate: number) => {
    const ci = s.bootstrap?.ciKgHa ?? null;
    return certaintyOf(
      u.rate(rate),
      ci ? [u.rate(ci[0]), u.rate(ci[1])] : null,
      shown,
      s.bootstrap?.level ?? 0.9,
      u.rate(rates[rates.length - 1] ?? 0),
    );
  };
  if (best && rec.basis === 'no-response') {
    // siteDecision: the rate effect was tested and not significant, so no N from this trial.
    return {
      ...base,
      subject: s.site,
      recommendation:
        'Apply no N on the strength of this trial: it found no yield response to N here',
      productRecommendation: '',
      rate: 0,
      facts: [],
      certainty: recCertainty(0),
      basis,
      warnings: [rec.sentence, ...warnings],
    };
  }
  if (best && rec.basis === 'full-response' && rec.rangeKgHa && rec.rateKgHa !== null) {
    const [low, high] = rec.rangeKgHa;
    // "No more than": the top of the range rounded down to a spreader setting.
    const top = applicationRateDown(u.rate(high), ru);
    const topText = fmtApplyDown(high);
    const facts: GrowerFact[] = [
      { label: 'Best rate lies between', value: `${fmtRate(low)} and ${topText}` },
    ];
    if (s.returnAtOptimumPerHa !== null)
      facts.push({
        label: 'Net return over no N',
        value: money(s.returnAtOptimumPerHa),
      });
    return {
      ...base,
      subject: s.site,
      recommendation: `Apply no more than ${topText}`,
      productRecommendation: productText(high),
      rate: top,
      facts,
      certainty: recCertainty(high),
      basis,
      warnings: [fullResponseSentence(fmtRate(low), topText), ...warnings],
    };
  }
  if (!best || best.optimumRateKgHa === null) {
    return {
      ...base,
      subject: s.site,
      recommendation: 'No rate can be recommended from this trial',
      productRecommendation: '',
      rate: null,
      facts: [],
      certainty: { level: 'unknown', text: 'There is no estimate to be sure about.' },
      basis,
      // Without a leading curve the site's own warnings say why (no replication, no fit, one rate).
      warnings: best
        ? [
            ...warnings,
            best.optimumNote ||
              'Yield did not respond to nitrogen in a way a curve could describe.',
          ]
        : warnings,
    };
  }
  const opt = best.optimumRateKgHa;
  const facts: GrowerFact[] = [];
  if (best.yieldAtOptimumKgHa !== null)
    facts.push({ label: 'Expected yield', value: fmtYield(best.yieldAtOptimumKgHa) });
  if (s.profitableRangeKgHa) {
    facts.push({
      label: 'Profitable range',
      value: `${fmtRate(s.profitableRangeKgHa[0])} to ${fmtRate(s.profitableRangeKgHa[1])}`,
    });
  }
  if (s.returnAtOptimumPerHa !== null)
    facts.push({ label: 'Net return over no N', value: money(s.returnAtOptimumPerHa) });
  if (best.optimumNote) warnings.push(best.optimumNote);
  const ci = s.bootstrap?.ciKgHa ?? null;
  const cert = certaintyOf(
    u.rate(opt),
    ci ? [u.rate(ci[0]), u.rate(ci[1])] : null,
    shown,
    s.bootstrap?.level ?? 0.9,
    u.rate(rates[rates.length - 1] ?? 0),
  );
  const roundedRate = applicationRate(u.rate(opt), ru);
  return {
    ...base,
    subject: s.site,
    recommendation:
      roundedRate === 0
        ? 'Apply no N: at these prices it did not pay here'
        : applyAbout(opt, atHighestTestedRate(opt, rates.at(-1))),
    productRecommendation: roundedRate === 0 ? '' : productText(opt),
    rate: roundedRate,
    facts,
    certainty: cert,
    basis,
    warnings,
  };
}

/**
 * How a page writes rates and money, one set for every part of it: reported rates (ranges,
 * intervals, tested rates) as every view rounds them; a rate to apply to the spreader's step
 * (down for a rate not to be exceeded; shared/units/rateRounding); money in the user's currency
 * per the display area.
 */
function pageFormats(report: TrialReport) {
  const u = unitScale(report.settings.units, report.crop);
  const ru = report.settings.units.rate;
  const { currency, locale } = report.settings;
  const withUnit = (v: number, decimals: number): string => formatNutrientRate(v, ru, decimals);
  const shown = (v: number): string => formatShownRate(v, ru);
  return {
    /** A rate already in display units, rounded as reported. */
    shown,
    fmtRate: (kgHa: number): string => shown(u.rate(kgHa)),
    fmtApply: (kgHa: number): string => withUnit(applicationRate(u.rate(kgHa), ru), 0),
    fmtApplyDown: (kgHa: number): string => withUnit(applicationRateDown(u.rate(kgHa), ru), 0),
    money: (perHa: number): string => formatMoneyPerArea(perHa, currency, ru, locale),
  };
}

/** For the region: how far apart the site optima are, in words. */
function spreadCertainty(
  optimaKgHa: number[],
  fmt: (v: number) => string,
): GrowerPage['certainty'] {
  if (optimaKgHa.length < 2)
    return { level: 'unknown', text: 'Only one site: no spread between sites to judge by.' };
  const sorted = [...optimaKgHa].sort((a, b) => a - b);
  const lo = sorted[0];
  const hi = sorted[sorted.length - 1];
  const mid = sorted[Math.floor(sorted.length / 2)];
  const rel = mid > 0 ? (hi - lo) / 2 / mid : Infinity;
  const text = `The best rate at single sites ranged from ${fmt(lo)} to ${fmt(hi)}.`;
  if (rel <= FAIRLY_SURE)
    return { level: 'fairly sure', text: `Fairly sure: ${text} The sites agree closely.` };
  if (rel <= MODERATELY_SURE) return { level: 'moderately sure', text: `Moderately sure: ${text}` };
  return {
    level: 'not very sure',
    text: `Not very sure: ${text} Fields differ a lot; a field's own trial or test tells more.`,
  };
}

/**
 * The regional certainty with the regional rate's own interval from resampling site-years added
 * in plain words, where there is one: the spread of single sites says how much fields differ, the
 * interval how well these site-years pin down the average.
 */
function withSiteYearInterval(
  certainty: GrowerPage['certainty'],
  interval: { lowKgHa: number; highKgHa: number; level: number } | null,
  fmt: (v: number) => string,
): GrowerPage['certainty'] {
  if (!interval) return certainty;
  return {
    ...certainty,
    text: `${certainty.text} With other site-years like these the regional rate could have come out anywhere from ${fmt(interval.lowKgHa)} to ${fmt(interval.highKgHa)} (a ${Math.round(interval.level * 100)} % interval from resampling the site-years).`,
  };
}

/** How sure, from an interval's half-width against the rate (the thresholds of spreadCertainty). */
function widthLevel(
  ci: [number, number],
  rateKgHa: number | null,
): GrowerPage['certainty']['level'] {
  const rel = rateKgHa && rateKgHa > 0 ? (ci[1] - ci[0]) / 2 / rateKgHa : Infinity;
  return rel <= FAIRLY_SURE
    ? 'fairly sure'
    : rel <= MODERATELY_SURE
      ? 'moderately sure'
      : 'not very sure';
}

/** The page id of one group of sites, for growerPage and the page picker: "group:Previous crop=soybean". */
export function groupPageId(key: string, value: string): string {
  return `group:${key}=${value}`;
}

/**
 * The group pages a report offers, in the order the page picker and the printed packet list
 * them: each value of each grouping column that has two sites or more. A group of one site
 * would repeat that site's own page under another title.
 * @param report - the analysis
 * @returns page ids (for growerPage) with their labels
 * @example
 * groupPages(report)[0] // { id: 'group:Previous crop=corn', label: 'Previous crop: corn' }
 */
export function groupPages(report: TrialReport): { id: string; label: string }[] {
  return (report.acrossSites?.groups ?? []).flatMap((g) =>
    g.values
      .filter((v) => v.sites.length >= 2)
      .map((v) => ({ id: groupPageId(g.key, v.value), label: `${g.key}: ${v.value}` })),
  );
}

/**
 * The group a page id names, or null for a site or the region.
 * @param which - a page id (groupPageId), a site name or "region"
 * @returns the grouping column and value
 * @example groupOfPage('group:Previous crop=corn') // { key: 'Previous crop', value: 'corn' }
 */
export function groupOfPage(which: string): { key: string; value: string } | null {
  if (!which.startsWith('group:')) return null;
  const body = which.slice('group:'.length);
  const eq = body.indexOf('=');
  return eq < 0 ? null : { key: body.slice(0, eq), value: body.slice(eq + 1) };
}

/** One season of a site tried over several: whether its response to N matched the others'. */
function seasonSentence(c: YearComparisonReport, year: number | null): string {
  const all = c.years.map((y) => y ?? 'no year').join(', ');
  const head = `This is the ${year ?? 'undated'} season of ${c.site}, tried in ${all}:`;
  if (c.response === null || c.responseDiffers === null)
    return `${head} the seasons could not be compared; this page rests on this season's plots alone.`;
  return c.responseDiffers
    ? `${head} the response to N differed between the seasons (${formatP(c.response.p)}), so this page speaks for ${year ?? 'this season'} alone.`
    : `${head} the response to N did not differ detectably between the seasons (${formatP(c.response.p)}); this page still rests on this season's plots alone.`;
}
