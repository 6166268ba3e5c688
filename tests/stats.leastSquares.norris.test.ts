// Checks the QR least-squares fit against NIST StRD "Norris" (linear least squares,
// lower difficulty), certified values from tests/fixtures/nist/Norris.dat.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fitLeastSquares } from '../shared/stats/leastSquares';

function readNistData(file: string): { x: number[]; y: number[] } {
  const text = readFileSync(new URL(`./fixtures/nist/${file}`, import.meta.url), 'utf8');
  const lines = text.split(/\r?\n/);
  const start = lines.findIndex((l) => /^Data:\s+y\s+x/.test(l));
  const x: number[] = [];
  const y: number[] = [];
  for (const line of lines.slice(start + 1)) {
    const parts = line.trim().split(/\s+/).map(Number);
    if (parts.length === 2 && parts.every(Number.isFinite)) {
      y.push(parts[0]);
      x.push(parts[1]);
    }
  }
  return { x, y };
}

/** Agreement to `digits` significant digits: |a − b| ≤ 10^−digits · |b|. */
function expectDigits(actual: number, certified: number, digits: number): void {
  expect(Math.abs(actual - certified)).toBeLessThanOrEqual(10 ** -digits * Math.abs(certified));
}

describe('fitLeastSquares on NIST StRD Norris', () => {
  const { x, y } = readNistData('Norris.dat');
  const fit = fitLeastSquares({ columns: [x], y, intercept: true, columnNames: ['x'] });

  it('reads all 36 observations', () => expect(fit.n).toBe(36));
  it('matches the certified coefficients and their SDs to 9 significant digits', () => {
    expectDigits(fit.coefficients[0].estimate, -0.262323073774029, 9);
    expectDigits(fit.coefficients[1].estimate, 1.00211681802045, 9);
    expectDigits(fit.coefficients[0].stdError, 0.232818234301152, 9);
    expectDigits(fit.coefficients[1].stdError, 0.429796848199937e-3, 9);
  });
  it('matches the certified residual SD, R² and ANOVA to 9 significant digits', () => {
    expectDigits(fit.sigma, 0.884796396144373, 9);
    expectDigits(fit.r2, 0.999993745883712, 9);
    expectDigits(fit.anova[0].ss, 4255954.13232369, 9);
    expectDigits(fit.anova[1].ss, 26.6173985294224, 9);
    expectDigits(fit.fStatistic, 5436385.54079785, 9);
    expect(fit.r2Kind).toBe('centered');
  });
});
