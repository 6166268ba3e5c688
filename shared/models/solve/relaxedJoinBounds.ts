/**
 * Lower bounds of a plateau model's SSE over each interval between rates, for
 * the branch and bound in searchJoinPoint. With the join x0 in (r_j, r_{j+1}),
 * the rates up to r_j lie on the rising piece and the others on the plateau.
 * Letting the two pieces be fitted separately (a polynomial of the rising
 * piece's degree through the left per-rate means, a constant through the
 * right ones) can only lower the SSE, so
 *   SSE(x0) ≥ SS_within + SSE_left(polynomial) + SSE_right(constant)
 * for every x0 in the interval. Weighted by the plots per rate; only for sites
 * fitted on group sums (the full block design gets no bounds).
 */
import { exactScratch } from './exactScratch';
import type { PreparedSite } from '../prepareSite';

/**
 * One bound per interval.
 * @param site - from prepareSite, design "groups" or "balanced-blocks"
 * @param degree - degree of the rising piece: 1 linear-plateau, 2 quadratic-plateau
 * @returns bounds[j] for the interval [r_j, r_{j+1}], (kg/ha)²
 * @example
 * relaxedJoinBounds(site, 1)[0] // SSE of check against the rest
 */
export function relaxedJoinBounds(site: PreparedSite, degree: 1 | 2): Float64Array {
  const { rates, counts, means, ssWithin } = site;
  const m = rates.length;
  const bounds = new Float64Array(m - 1);
  // Right pieces: weighted SS about the mean of groups j+1 … m−1, by a backward pass
  // with Welford's update (no cancellation).
  const right = exactScratch(m);
  let w = 0;
  let mean = 0;
  let ss = 0;
  for (let j = m - 1; j >= 1; j--) {
    const nj = counts[j];
    const d = means[j] - mean;
    w += nj;
    mean += (nj * d) / w;
    ss += nj * d * (means[j] - mean);
    right[j] = ss;
  }
  const cols = degree + 1;
  const scale = rates[m - 1] > 0 ? rates[m - 1] : 1;
  // Buffers for the augmented matrix [A | b], reused for every interval.
  const a = exactScratch(m * (cols + 1));
  for (let j = 0; j < m - 1; j++) {
    const rows = j + 1;
    let left = 0;
    if (rows > cols) {
      // Weighted polynomial fit of the left means, rates scaled to [0, 1] for
      // conditioning; the residual by modified Gram-Schmidt on [A | b], which is
      // backward stable for the residual (Björck, Numerical Methods for Least
      // Squares Problems, 1996, §2.4.4).
      for (let i = 0; i < rows; i++) {
        const w = Math.sqrt(counts[i]);
        const x = rates[i] / scale;
        a[i] = w;
        a[rows + i] = w * x;
        if (cols === 3) a[2 * rows + i] = w * x * x;
        a[cols * rows + i] = w * means[i];
      }
      for (let k = 0; k < cols; k++) {
        const ck = k * rows;
        let norm = 0;
        for (let i = 0; i < rows; i++) norm += a[ck + i] * a[ck + i];
        if (!(norm > 0)) continue;
        for (let l = k + 1; l <= cols; l++) {
          const cl = l * rows;
          let dot = 0;
          for (let i = 0; i < rows; i++) dot += a[ck + i] * a[cl + i];
          const f = dot / norm;
          for (let i = 0; i < rows; i++) a[cl + i] -= f * a[ck + i];
        }
      }
      const cb = cols * rows;
      for (let i = 0; i < rows; i++) left += a[cb + i] * a[cb + i];
    }
    bounds[j] = ssWithin + left + right[j + 1];
  }
  return bounds;
}
