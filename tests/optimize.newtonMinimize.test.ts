// newtonMinimize against closed-form minima (a positive definite quadratic's minimum solves a
// linear system by hand), including where f carries a large constant, so its rounding makes the
// central-difference gradient noisy, as the profiled deviance of 1,000 site-years does.
import { describe, expect, it } from 'vitest';
import { newtonMinimize } from '../shared/optimize/newtonMinimize';

// (x − 1)² + 3(y + 2)² + x·y: gradient 2(x − 1) + y = 0, 6(y + 2) + x = 0, so x = 24/11,
// y = −26/11 (solved by hand).
const quadratic = ([x, y]: number[]) => (x - 1) ** 2 + 3 * (y + 2) ** 2 + x * y;
const minimum = [24 / 11, -26 / 11];

describe('newtonMinimize', () => {
  it('finds the minimum of a quadratic to its tolerance', () => {
    const r = newtonMinimize(quadratic, [0, 0], 1e-10)!;
    r.x.forEach((v, i) => expect(Math.abs(v - minimum[i])).toBeLessThan(1e-8));
  });

  it('stops on a function whose rounding hides steps below the tolerance, at its minimum', () => {
    // f of size 1e6 resolves changes of ~1e-10: the gradient's central differences (h = 1e-4)
    // carry noise near 1e-6, so Newton's steps never fall below 1e-9 and only the predicted
    // decrease (½·gᵀH⁻¹g under 1e-15·|f|) can end the search.
    const shifted = (p: number[]) => 1e6 + quadratic(p);
    const r = newtonMinimize(shifted, [0, 0], 1e-9);
    expect(r).not.toBeNull();
    // The noise bound: a gradient error of ~1e-6 on a curvature of ~2 moves the minimum ~1e-6.
    r!.x.forEach((v, i) => expect(Math.abs(v - minimum[i])).toBeLessThan(1e-5));
    // Newton on a quadratic: a step to the minimum, then steps of noise until one predicts a
    // decrease f cannot resolve; 9 evaluations an iteration in two dimensions (measured: 28, 3
    // iterations). Before that rule it took 37: its last step, noise, was halved 20 times.
    expect(r!.evaluations).toBeLessThanOrEqual(30);
  });

  it('returns null where the Hessian is not positive definite (a saddle)', () => {
    expect(newtonMinimize(([x, y]) => x * x - y * y, [0.5, 0.5], 1e-9)).toBeNull();
  });
});
