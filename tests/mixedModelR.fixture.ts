// Reading R's nlme::lme fits (tests/fixtures/mixed, tests/fixtures/levelmixed) in the regional
// mixed models' own terms, for the tests that check those models against R 4.2.2 with nlme.
import { expect } from 'vitest';

/** What of an R fit these helpers read: Psi, sigma², and Psi's structure. */
interface RVariances {
  structure: 'unstructured' | 'diagonal';
  psi: number[][];
  sigma2: [number];
}

/**
 * theta (rates divided by `scale`) from R's Psi and sigma²: T = chol(D⁻¹ Psi D⁻¹ / sigma²), with
 * D = diag(1, scale, scale²), as the profiled deviance takes it.
 * @param fit - R's Psi (3 × 3, intercept, x, x²) and sigma²
 * @param scale - the divisor of the rates in the model's columns
 * @returns theta: the diagonal (diagonal Psi) or the lower triangle by columns (unstructured)
 */
export function thetaFromR(fit: RVariances, scale: number): number[] {
  const d = [1, scale, scale * scale];
  const m = fit.psi.map((row, i) => row.map((v, j) => (v * d[i] * d[j]) / fit.sigma2[0]));
  const t = [0, 0, 0].map(() => [0, 0, 0]);
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j <= i; j++) {
      let s = m[i][j];
      for (let k = 0; k < j; k++) s -= t[i][k] * t[j][k];
      // A variance at its boundary 0 can come out a rounding below it: its theta is 0.
      t[i][j] = i === j ? Math.sqrt(Math.max(s, 0)) : s / t[j][j];
    }
  }
  return fit.structure === 'diagonal'
    ? [t[0][0], t[1][1], t[2][2]]
    : [t[0][0], t[1][0], t[2][0], t[1][1], t[2][1], t[2][2]];
}

/**
 * Expects our Psi to be R's within 1e-3 relative, or within 1e-5 absolute on the scale of
 * Psi/sigma² with rates divided by `scale` (a variance at its boundary 0, which R reports as a
 * tiny positive number).
 * @param ours - our Psi, kg/ha units
 * @param fit - R's fit
 * @param scale - the divisor of the rates
 * @param oursSigma2 - our sigma²
 */
export function expectPsi(
  ours: number[][],
  fit: Pick<RVariances, 'psi'>,
  scale: number,
  oursSigma2: number,
): void {
  const d = [1, scale, scale * scale];
  ours.forEach((row, i) =>
    row.forEach((v, j) => {
      const r = fit.psi[i][j];
      const err = Math.abs(v - r);
      const boundary = (err * d[i] * d[j]) / oursSigma2;
      expect(err <= 1e-3 * Math.abs(r) || boundary <= 1e-5, `Psi[${i}][${j}] ${v} vs R ${r}`).toBe(
        true,
      );
    }),
  );
}
