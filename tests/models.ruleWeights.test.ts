// The rule's Akaike weights (shared/models/chooseModel ruleWeights): wᵢ = exp(−Δᵢ/2) / Σ exp(−Δⱼ/2)
// over the rule's candidates (Burnham & Anderson, Model Selection and Multimodel Inference, 2nd
// ed., 2002, §2.9). Hand computation: Δ = 0 and 2 give 1/(1 + e⁻¹) = 0.731059 and 0.268941.
import { describe, expect, it } from 'vitest';
import { ruleWeights, type ModelCandidate } from '../shared/models/chooseModel';

function weights(list: ModelCandidate[]): number[] {
  const out = new Float64Array(list.length);
  ruleWeights(list, out);
  return [...out];
}

describe('ruleWeights', () => {
  it('gives the Akaike weights of the usable curves (ok or full response)', () => {
    const w = weights([
      { model: 'quadratic', status: 'ok', aicc: 100 },
      { model: 'step', status: 'full-response-at-lowest-rate', aicc: 102 },
      { model: 'linearPlateau', status: 'no-plateau', aicc: 90 },
      { model: 'linear', status: 'ok', aicc: 95 },
    ]);
    expect(w[0]).toBeCloseTo(0.731059, 6);
    expect(w[1]).toBeCloseTo(0.268941, 6);
    // No plateau gives no usable answer; a straight line only counts when no curve does.
    expect(w[2]).toBe(0);
    expect(w[3]).toBe(0);
  });

  it('puts all the weight on the straight line the rule takes when no curve is usable, and none without a candidate', () => {
    expect(
      weights([
        { model: 'quadratic', status: 'convex', aicc: 100 },
        { model: 'linear', status: 'ok', aicc: 101 },
        { model: 'proportional', status: 'ok', aicc: 104 },
      ]),
    ).toEqual([0, 1, 0]);
    expect(weights([{ model: 'quadratic', status: 'convex', aicc: 100 }])).toEqual([0]);
  });
});
