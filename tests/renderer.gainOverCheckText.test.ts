// The one-site step's sentence on the gain over the check, in both unit systems. The outcome is
// the invented site of tests/sites.responseOverCheck.test.ts (values worked there by hand), with
// a bias added for the second sentence; unit factors from the 56 lb corn bushel (USDA) and the
// exact pound and acre (NIST SP 811).
import { describe, expect, it } from 'vitest';
import { gainOverCheckSentence } from '../renderer/src/analysis/gainOverCheckText';
import type { ResponseOverCheckOutcome } from '../shared/analysis/siteResponseOverCheck';

const KG_HA_PER_LB_AC = 0.45359237 / (43560 * 0.3048 * 0.3048 * 1e-4);

const noBias: ResponseOverCheckOutcome = {
  gains: 6,
  slopeKgPerKg: 835000 / 70000,
  slopeSeKgPerKg: 0.376612,
  slopeCiKgPerKg: [10.96046, 12.89668],
  confidenceLevel: 0.95,
  gainAtZeroKgHa: -66.667,
  gainAtZeroSeKgHa: 115.62,
  t: -0.5766,
  F: 0.33247,
  df1: 1,
  df2: 4,
  p: 0.594,
  biasPresent: false,
};

describe('gainOverCheckSentence', () => {
  it('gives the slope in kg/kg N with its interval and says no gain at rate zero is evident', () => {
    expect(gainOverCheckSentence(noBias, 'metric', 'corn', 'en-US')).toBe(
      'Gain over each block’s check: 11.9 kg/kg N (95 % interval 11.0 to 12.9), and no gain at rate zero is evident (t = -0.58, p = 0.59): the gains start from zero.',
    );
  });

  it('gives the slope in bu/lb N (kg/kg ÷ 56) and the gain at rate zero in bu/ac when it is present', () => {
    // 11.928571 / 56 = 0.213010, 10.96046 / 56 = 0.195723, 12.89668 / 56 = 0.230298;
    // 1 000 kg/ha = 1 000 / 1.120851 / 56 bu/ac = 15.93 bu/ac.
    expect((1000 / KG_HA_PER_LB_AC / 56).toFixed(2)).toBe('15.93');
    const biased = { ...noBias, gainAtZeroKgHa: 1000, t: 4.3, p: 0.0004, biasPresent: true };
    expect(gainOverCheckSentence(biased, 'us', 'corn', 'en-US')).toBe(
      'Gain over each block’s check: 0.213 bu/lb N (95 % interval 0.196 to 0.230), and a gain of 15.9 bu/ac at rate zero is present (t = 4.30, p < 0.001): a bias at the check plots, or a response that levels off.',
    );
  });

  it('writes the numbers in the locale', () => {
    expect(gainOverCheckSentence(noBias, 'metric', 'corn', 'de-DE')).toContain(
      '11,9 kg/kg N (95 % interval 11,0 to 12,9)',
    );
  });
});
