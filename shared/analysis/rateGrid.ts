/**
 * The fine grid of rates on which regional returns are compared: from `from` to
 * `to` in equal steps (1 kg/ha, or 1 lb/ac = 1.120851 kg/ha), with `to` itself
 * included when it falls on the grid within rounding.
 */
import { SitesInputError } from './sitesInputError';

/** The largest grid the analysis will build, to catch a step given in the wrong unit. */
export const MAX_GRID_POINTS = 100_000;

/**
 * Rates from `fromKgHa` to `toKgHa` every `stepKgHa`.
 * @param fromKgHa - first rate, kg/ha (≥ 0)
 * @param toKgHa - last rate, kg/ha (≥ fromKgHa)
 * @param stepKgHa - spacing, kg/ha (> 0)
 * @returns the rates, kg/ha, ascending
 * @throws {SitesInputError} "bad-grid" for a non-finite or negative bound, to < from, step ≤ 0, or
 *   more than MAX_GRID_POINTS points
 * @example
 * rateGrid(0, 3, 1) // Float64Array [0, 1, 2, 3]
 */
export function rateGrid(fromKgHa: number, toKgHa: number, stepKgHa: number): Float64Array {
  if (![fromKgHa, toKgHa, stepKgHa].every(Number.isFinite) || fromKgHa < 0 || toKgHa < fromKgHa) {
    throw new SitesInputError(
      'bad-grid',
      `rateGrid: from ${fromKgHa} to ${toKgHa} kg/ha is not a range of rates (need 0 ≤ from ≤ to, both finite).`,
    );
  }
  if (!(stepKgHa > 0)) {
    throw new SitesInputError(
      'bad-grid',
      `rateGrid: step is ${stepKgHa} kg/ha; it must be above 0.`,
    );
  }
  const count = Math.floor((toKgHa - fromKgHa) / stepKgHa + 1e-9) + 1;
  if (count > MAX_GRID_POINTS) {
    throw new SitesInputError(
      'bad-grid',
      `rateGrid: a step of ${stepKgHa} kg/ha gives ${count} points; at most ${MAX_GRID_POINTS} are allowed.`,
    );
  }
  // A plain loop: Float64Array.from with a function is many times slower (every site's
  // profitable range builds a grid of about 400 rates at each pricing).
  const grid = new Float64Array(count);
  for (let i = 0; i < count; i++) grid[i] = fromKgHa + i * stepKgHa;
  return grid;
}
