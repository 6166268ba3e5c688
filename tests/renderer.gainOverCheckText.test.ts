// The one-site step's sentence on the gain over the check, in both unit systems. The outcome is
// written out here (its arithmetic is checked against R in tests/analysis.responseOverCheck);
// unit factors from the 56 lb corn bushel (USDA) and the exact pound and acre (NIST SP 811).
import { describe, expect, it } from 'vitest';
import { gainOverCheckSentence } from '../renderer/src/analysis/gainOverCheckText';
import type { ResponseOverCheckOutcome } from '../shared/analysis/siteResponseOverCheck';

const KG_HA_PER_LB_AC = 0.45359237 / (43560 * 0.3048 * 0.3048 * 1e-4);

const fromZero: ResponseOverCheckOutcome = {
  gains: 20,
  slopeKgPerKg: 835000 / 70000,
  slopeSeKgPerKg: 0.376612,
  slopeCiKgPerKg: [10.96046, 12.89668],
  confidenceLevel: 0.95,
  gainAtZeroKgHa: -66.667,
  gainAtZeroSeKgHa: 115.62,
  t: -0.5766,
  F: 0.33247,
  df1: 1,
  df2: 15,
  p: 0.594,
  gainAtZeroPresent: false,
  curvature: { F: 0.61, df1: 3, df2: 15, p: 0.62 },
  bends: false,
  biasPresent: false,
  reading: 'from-zero',
};

describe('gainOverCheckSentence', () => {
  it('leads with the slope in kg/kg N and its interval, then says the gains start from zero', () => {
    expect(gainOverCheckSentence(fromZero, 'metric', 'corn', 'en-US')).toBe(
      'Gain over each block’s check: 11.9 kg/kg N (95 % interval 11.0 to 12.9). The gains start from zero (t = -0.58, p = 0.59) and follow a straight line.',
    );
  });

  it('gives the slope in bu/lb N (kg/kg ÷ 56) and the gain at rate zero in bu/ac when the gains do not start from zero', () => {
    // 11.928571 / 56 = 0.213010, 10.96046 / 56 = 0.195723, 12.89668 / 56 = 0.230298;
    // 1 000 kg/ha = 1 000 / 1.120851 / 56 bu/ac = 15.93 bu/ac.
    expect((1000 / KG_HA_PER_LB_AC / 56).toFixed(2)).toBe('15.93');
    const lifted: ResponseOverCheckOutcome = {
      ...fromZero,
      gainAtZeroKgHa: 1000,
      t: 4.3,
      p: 0.0004,
      gainAtZeroPresent: true,
      biasPresent: true,
      reading: 'gain-at-zero',
    };
    expect(gainOverCheckSentence(lifted, 'us', 'corn', 'en-US')).toBe(
      'Gain over each block’s check: 0.213 bu/lb N (95 % interval 0.196 to 0.230). The gains do not start from zero: 15.9 bu/ac at rate zero (t = 4.30, p < 0.001), with no clear bend: the check plots yielded low, or most of the response came by the lowest rate.',
    );
  });

  it('names high check plots or a slow start when the gains meet the axis below zero', () => {
    const lowered: ResponseOverCheckOutcome = {
      ...fromZero,
      gainAtZeroKgHa: -400,
      t: -3.1,
      p: 0.007,
      gainAtZeroPresent: true,
      biasPresent: true,
      reading: 'gain-at-zero',
    };
    expect(gainOverCheckSentence(lowered, 'metric', 'corn', 'en-US')).toMatch(
      /The gains do not start from zero: -0\.40 t\/ha at rate zero \(t = -3\.10, p = 0\.007\), with no clear bend: the check plots yielded high, or the response starts slowly\.$/,
    );
  });

  it('names gains that bend as a response that levels off, not a bias', () => {
    const bent: ResponseOverCheckOutcome = {
      ...fromZero,
      gainAtZeroKgHa: 1000,
      t: 4.3,
      p: 0.0004,
      gainAtZeroPresent: true,
      curvature: { F: 9.123, df1: 3, df2: 15, p: 0.0011 },
      bends: true,
      reading: 'bends',
    };
    const text = gainOverCheckSentence(bent, 'metric', 'corn', 'en-US');
    expect(text).toBe(
      'Gain over each block’s check: 11.9 kg/kg N (95 % interval 11.0 to 12.9). The gains bend (F = 9.12, p = 0.0011): a response that levels off, so a curve describes it better than this straight line.',
    );
    expect(text).not.toMatch(/bias/);
  });

  it('writes the numbers in the locale', () => {
    expect(gainOverCheckSentence(fromZero, 'metric', 'corn', 'de-DE')).toContain(
      '11,9 kg/kg N (95 % interval 11,0 to 12,9)',
    );
  });
});
