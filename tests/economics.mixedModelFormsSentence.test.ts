// Which regional mixed model form the AIC favours, and where a favoured plateau form puts the
// rate (shared/economics/mixedModelFormsSentence). The rule is the AIC's: lower is better
// supported, a difference under 2 is little evidence either way (Burnham & Anderson, Model
// Selection and Multimodel Inference, 2nd ed., 2002, §2.6). The optima are invented.
import { describe, expect, it } from 'vitest';
import {
  favouredFormRateSentence,
  mixedModelFormsSentence,
  type MixedModelFormAic,
} from '../shared/economics/mixedModelFormsSentence';
import type { MixedModelOptimum } from '../shared/economics/mixedModelOptimum';

const optimum = (rateKgHa: number, low: number, high: number): MixedModelOptimum => ({
  status: 'interior',
  rateKgHa,
  interval: { lowKgHa: low, highKgHa: high, lowOpen: false, highOpen: false },
  stdErrorKgHa: 10,
  level: 0.9,
  method: 'delta (Student t, site-years − 3 df)',
});
const format = {
  rate: (kgHa: number) => `${kgHa} kg/ha`,
  interval: (i: { lowKgHa: number; highKgHa: number }) => `${i.lowKgHa} to ${i.highKgHa} kg/ha`,
};
const form = (
  model: MixedModelFormAic['model'],
  aic: number | null,
  o: MixedModelOptimum | null,
  settled = true,
): MixedModelFormAic => ({ model, aic, converged: settled, settled, optimum: o });

describe('the favoured mixed model form', () => {
  it('names the lowest AIC and, for a plateau form, its own rate and interval', () => {
    const forms = [
      form('quadratic', 2363.9, optimum(186, 159, 213)),
      form('quadraticPlateau', 2355.6, optimum(168, 141, 195)),
      form('linearPlateau', 2361.0, optimum(150, 130, 170)),
    ];
    expect(mixedModelFormsSentence(forms)).toMatch(/AIC favours the quadratic-plateau/);
    expect(favouredFormRateSentence(forms, format)).toBe(
      'On the quadratic-plateau the most profitable regional rate is 168 kg/ha (90 % interval 141 to 195 kg/ha).',
    );
  });

  it('says nothing more when the quadratic leads, one form is ranked, or the leader is unsettled', () => {
    const q = form('quadratic', 2350, optimum(186, 159, 213));
    expect(
      favouredFormRateSentence([q, form('quadraticPlateau', 2355, optimum(168, 141, 195))], format),
    ).toBe('');
    expect(favouredFormRateSentence([q, form('linearPlateau', null, null, false)], format)).toBe(
      '',
    );
    // An unsettled fit is not ranked, so the quadratic leads the two that are.
    expect(
      favouredFormRateSentence(
        [
          q,
          form('linearPlateau', 2300, optimum(150, 130, 170), false),
          form('quadraticPlateau', 2360, optimum(168, 141, 195)),
        ],
        format,
      ),
    ).toBe('');
  });
});
