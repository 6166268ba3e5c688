// The site decision (shared/analysis/siteDecision) on hand-made sites whose answer is known by
// construction: a flat site (yields that do not depend on the rate) gets no N with its own
// caution, whatever curve fits best; a step response (the whole gain by the lowest non-zero
// rate) gets the full-response range, the second-lowest rate as its rate, and enters the
// regional rate as a step. The rule is DESIGN.md's "Decisions are statistics too"; the rate
// effect's F test it reads is checked against R's aov in tests/stats.rateBlockModel.test.ts;
// the pound-acre factor is the US survey definition (0.45359237 kg/lb, 4046.8564224 m²/ac).
import { describe, expect, it } from 'vitest';
import { analysisSettings, analyzeTrial, priceTrial } from '../shared/analysis';
import { siteDecision } from '../shared/analysis/siteDecision';
import { illustrativePrices } from '../shared/economics/illustrativePrices';
import { growerPage } from '../shared/report/growerPage';
import { resultsJson } from '../shared/report/resultsJson';
import type { Plot, PlotTable } from '../shared/table/plotTable';
import { reportOf } from './report.pipeline';

const RATES = [0, 40, 80, 120, 160, 200];
const prices = illustrativePrices('corn').canonical;
// Rate-free wobble per block and position (kg/ha), the same list for both sites: chosen by
// hand, not drawn, so the premise of each case below holds by construction.
// Its column sums are 10, 20, −10, 10, −10, −20: the second-lowest rate's mean is not below
// the plateau's, so the step's fits place the whole response by 40 kg/ha.
const WOBBLE = [
  [120, -240, 210, -60, 310, -340],
  [-200, -150, -150, 330, -90, 260],
  [280, 220, -260, 40, -170, -110],
  [-190, 190, 190, -300, -60, 170],
];

function site(name: string, yieldAt: (rate: number) => number): Plot[] {
  const plots: Plot[] = [];
  WOBBLE.forEach((row, b) =>
    RATES.forEach((rate, i) =>
      plots.push({
        id: `${name}|${b + 1}|${i + 1}`,
        site: name,
        year: 2025,
        block: String(b + 1),
        plotLabel: `${b + 1}0${i + 1}`,
        treatment: null,
        rateKgHa: rate,
        yieldKgHa: yieldAt(rate) + 150 * b + row[i],
        moisturePct: null,
        testWeight: null,
        notes: null,
        groups: {},
        excluded: null,
        original: {},
      }),
    ),
  );
  return plots;
}

const table: PlotTable = {
  crop: 'corn',
  standardMoisturePct: 15.5,
  plots: [...site('Flat', () => 12000), ...site('Step', (x) => (x >= 40 ? 12500 : 9500))],
  sources: [],
};
const analysis = analyzeTrial(table, analysisSettings({ prices, seed: 7 }));
const priced = priceTrial(analysis, prices, {});
const flat = analysis.across.sites.find((s) => s.site === 'Flat')!;
const step = analysis.across.sites.find((s) => s.site === 'Step')!;
const pricedFlat = priced.sites.find((s) => s.site === 'Flat')!;
const pricedStep = priced.sites.find((s) => s.site === 'Step')!;

describe('a site that showed no response gets no N', () => {
  it('premise: the rate effect was tested and is not significant', () => {
    expect(flat.rateEffect.test.kind).toBe('f-test');
    expect(flat.responded).toBe(false);
  });

  it('recommends 0 with the no-response caution, whatever curve leads', () => {
    expect(pricedFlat.lead.basis).toBe('no-response');
    expect(pricedFlat.lead.model).not.toBeNull();
    expect(pricedFlat.optimum?.rateKgHa).toBe(0);
    expect(pricedFlat.optimum?.explanation).toMatch(/found no yield response to N at this site/);
    expect(pricedFlat.optimum?.explanation).toMatch(/does not show that the crop here needs no N/);
    expect(pricedFlat.optimum?.cautions.length).toBeGreaterThan(0);
  });

  it('keeps 0 inside the interval', () => {
    const ci = pricedFlat.interval?.ciKgHa;
    expect(ci).toBeTruthy();
    expect(ci![0]).toBe(0);
    expect(ci![1]).toBeGreaterThanOrEqual(0);
  });

  it('an analyst pick overrides the rule (the analyst fixed the model)', () => {
    const other = flat.recommended.model === 'quadratic' ? 'linear' : 'quadratic';
    const pick = siteDecision(flat, { Flat: other });
    expect(pick.picked).toBe(true);
    expect(pick.basis).not.toBe('no-response');
  });

  it('enters the regional rate as a flat gain', () => {
    const used = priced.across.regional.sitesUsed.find((u) => u.site === 'Flat');
    expect(used?.note).toMatch(/flat gain/);
    // The mean gain is half the step's from 40 kg/ha on (1500 kg/ha of grain for 40 kg/ha of
    // N pays at the illustrative corn prices): the regional rate is the step's 40 kg/ha.
    expect(priced.across.regional.regional.bestRateKgHa).toBe(40);
  });
});

describe('a full response by the lowest non-zero rate is a range', () => {
  it('premise: the site responded', () => {
    expect(step.responded).toBe(true);
  });

  it('leads with the full response and prices the range 0 to 40 kg/ha', () => {
    expect(pricedStep.lead.basis).toBe('full-response');
    expect(step.fits!.fits[pricedStep.lead.model!].status).toBe('full-response-at-lowest-rate');
    expect(pricedStep.optimum?.status).toBe('join-in-first-interval');
    expect(pricedStep.optimum?.rangeKgHa).toEqual([0, 40]);
    // 3000 kg/ha of grain for 40 kg/ha of N pays at any illustrative corn price.
    expect(pricedStep.optimum?.gainOverCheckPerHa).toBeGreaterThan(0);
  });

  it('decides most resamples by the same rule as a full response', () => {
    // A resample whose mean at 40 kg/ha falls below the rest gets a curve with its join just
    // past 40 ("ok"), so not every resample is a full response; most are.
    expect(pricedStep.interval?.shares.fullResponse).toBeGreaterThan(0.5);
    expect(pricedStep.interval?.ciKgHa?.[0]).toBeLessThanOrEqual(40);
  });

  it('enters the regional rate as a step at 40 kg/ha', () => {
    const used = priced.across.regional.sitesUsed.find((u) => u.site === 'Step');
    expect(used?.note).toMatch(/step at 40 kg\/ha/);
  });
});

describe('the report, the grower page and the results file say the same', () => {
  const report = reportOf(
    table,
    {
      units: { rate: 'lb/ac', yield: 'bu/ac' },
      unitSystem: 'us',
      currency: 'USD',
      crop: table.crop,
      prices: { grainPrice: 4.5, nutrientPrice: 0.6, product: null, defaulted: false },
      boot: 200,
      seed: 7,
      blocks: 'fixed',
      intervalLevel: 0.9,
    },
    { tool: { name: 'Plotrate', version: 'test' }, createdAt: '2026-01-01T00:00:00Z', mapping: [] },
  );
  const json = resultsJson(report);
  const bySite = (name: string) => json.sites.find((s) => s.site === name)!;

  it('the flat site: rate 0, basis no-response, interval from 0, and the caution on the page', () => {
    const r = bySite('Flat').recommendation;
    expect(r.basis).toBe('no-response');
    expect(r.rate).toBe(0);
    expect(r.interval?.[0]).toBe(0);
    expect(r.level).toBe(0.9);
    const page = growerPage(report, 'Flat');
    expect(page.recommendation).toMatch(/^Apply no N/);
    expect(page.warnings[0]).toMatch(/found no yield response to N/);
    expect(page.cautions.length).toBeGreaterThan(0);
  });

  it('the step: rate 40 kg/ha in lb/ac (1 lb/ac = 1.12085 kg/ha), basis full-response', () => {
    const r = bySite('Step').recommendation;
    expect(r.basis).toBe('full-response');
    expect(r.rate).toBeCloseTo(40 / 1.12085, 3);
    // The page rounds the top down to a spreader setting (5 lb/ac steps, common practice): 35.7 → 35.
    const page = growerPage(report, 'Step');
    expect(page.recommendation).toMatch(/^Apply no more than 35 lb N\/ac/);
    expect(page.warnings[0]).toMatch(/whole yield response came by the lowest rate/);
  });
});

describe('a site still rising at the highest rate tested', () => {
  // 25 kg of grain per kg of N all the way to 200 kg/ha: more than three times the illustrative
  // price ratio, so every curve puts the best rate at (or past) the highest rate tested.
  const ramp: PlotTable = { ...table, plots: site('Ramp', (x) => 9000 + 25 * x) };
  const settings = {
    units: { rate: 'kg/ha', yield: 't/ha' },
    unitSystem: 'metric',
    currency: 'USD',
    crop: ramp.crop,
    prices: { grainPrice: 180, nutrientPrice: 1.26, product: null, defaulted: false },
    boot: 100,
    seed: 3,
    blocks: 'fixed',
    intervalLevel: 0.9,
  } as const;
  const report = reportOf(ramp, settings, {
    tool: { name: 'Plotrate', version: 'test' },
    createdAt: '2026-01-01T00:00:00Z',
    mapping: [],
  });

  it('recommends the highest rate as what it is, and says the best rate is not located', () => {
    const s = report.sites[0];
    expect(s.recommendation.rateKgHa).toBe(200);
    expect(s.warnings.join(' ')).toMatch(/did not test high enough/);
    const page = growerPage(report, 'Ramp');
    expect(page.recommendation).toMatch(/^Apply about 200 kg N\/ha, the highest rate tested/);
    // Resamples counted at the top rate would read "fairly sure"; the page says otherwise.
    expect(page.certainty.level).toBe('not very sure');
    expect(page.certainty.text).toMatch(/^Not located: .*cannot say whether more would pay/);
  });

  it('says the same on the region page when every site still rises (they agree only at the top)', () => {
    const twoRamps: PlotTable = {
      ...table,
      plots: [...site('Ramp', (x) => 9000 + 25 * x), ...site('Ramp II', (x) => 9400 + 28 * x)],
    };
    const regional = reportOf(
      twoRamps,
      { ...settings, boot: 0 },
      {
        tool: { name: 'Plotrate', version: 'test' },
        createdAt: '2026-01-01T00:00:00Z',
        mapping: [],
      },
    );
    expect(regional.acrossSites!.bestRateKgHa).toBe(200);
    const page = growerPage(regional, 'region');
    expect(page.recommendation).toMatch(/the highest rate tested$/);
    expect(page.certainty.text).toMatch(/^Not located/);
  });
});
