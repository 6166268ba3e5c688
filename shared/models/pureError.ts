/**
 * Pure error of a site: the residual SS of the saturated model with one mean per
 * rate (plus block offsets when they are modelled), the yardstick of the
 * lack-of-fit test (Draper & Smith, Applied Regression Analysis, 3rd ed., §2.1).
 * Cached per prepared site for the full block design (a QR decomposition), since all the models share it.
 */
import { applyQTranspose, qrDecompose } from '../stats/qr';
import type { PreparedSite } from './prepareSite';
import { blockColumns } from './solve/profileSolver';

const cache = new WeakMap<PreparedSite, { ss: number; df: number }>();

/**
 * Pure-error sum of squares and its degrees of freedom.
 * @param site - from prepareSite
 * @returns ss (kg/ha)² and df (0 when no rate is replicated)
 * @example
 * pureError(prepareSite({ rateKgHa: [0, 0, 50, 50], yieldKgHa: [5, 6, 8, 9] }, 'none')) // { ss: 1, df: 2 }
 */
export function pureError(site: PreparedSite): { ss: number; df: number } {
  const m = site.rates.length;
  if (site.design !== 'full') {
    // Read off the group sums, before the cache: a WeakMap entry per short-lived
    // site costs the garbage collector more than this does.
    const df = site.n - m - site.blockDf;
    return df > 0 ? { ss: site.ssWithin, df } : { ss: 0, df: 0 };
  }
  const hit = cache.get(site);
  if (hit) return hit;
  const blocks = blockColumns(site);
  const p = m + blocks.length;
  const { n } = site;
  const matrix = new Float64Array(n * p);
  for (let i = 0; i < n; i++) matrix[site.groupOf[i] * n + i] = 1;
  blocks.forEach((c, k) => matrix.set(c, (m + k) * n));
  const qr = qrDecompose(matrix, n, p);
  const qty = Float64Array.from(site.y);
  applyQTranspose(qr, qty);
  let ss = 0;
  for (let i = p; i < n; i++) ss += qty[i] * qty[i];
  let out = { ss, df: n - qr.rank };
  if (out.df <= 0) out = { ss: 0, df: 0 };
  cache.set(site, out);
  return out;
}
