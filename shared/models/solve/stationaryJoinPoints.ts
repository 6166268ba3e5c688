/**
 * Where a plateau model's profiled SSE(x0) can have an interior minimum within
 * one interval between rates, found in closed form instead of by a 1-D search.
 *
 * With the join x0 in [r_j, r_{j+1}] the rates up to r_j lie on the rising piece
 * and the rest on the plateau, so the regressor g(x0) of each rate is a
 * polynomial in x0: min(r, x0) is r or x0 (linear-plateau), min(r − x0, 0)² is
 * (r − x0)² or 0 (quadratic-plateau). With centered means c_i = m_i − m̄ and
 * weights n_i, the inner fit gives
 *   SSE(x0) = flatSse − M(x0)² / V(x0),  M = Σ n c g,  V = Σ n g² − (Σ n g)² / w,
 * where β = M / V has the required sign (else SSE = flatSse, its largest value).
 * M and V are polynomials in x0, so SSE is smallest at an end of the interval or
 * where (M² / V)' = M (2 M' V − M V') / V² = 0 with M ≠ 0, that is at a root of
 *   P = 2 M' V − M V'.
 * The leading terms of 2 M' V and M V' are equal, so P has degree 1 for the
 * linear-plateau (M degree 1, V degree 2) and degree 4 for the quadratic-plateau
 * (M degree 2, V degree 4); its roots come from shared/optimize/polynomialRoots.
 *
 * The caller evaluates its exact SSE (explicit residuals) at these points and at
 * the ends, so the polynomials, built from power sums with their rounding, only
 * say where to look. Per interval, x0 = r_j + h s with h = r_{j+1} − r_j and
 * s in [0, 1], and the rates enter as d_i = (r_i − r_j) / h ≤ 0, which keeps the
 * power sums near 1 in size; for the quadratic-plateau every term of Σ n (s − d)^k
 * is then ≥ 0, so those sums have no cancellation.
 *
 * Sites fitted on group sums (design "groups" or "balanced-blocks") use the per-rate
 * sums above. The full design (blocks with unequal mixes of rates) has the same form
 * with the flat fit's columns (intercept and blocks) projected out: their span is the
 * block indicators, so the projection centers g and y within each block, and M and V are
 * plot-level sums of block-centered g's polynomial coefficients (fullDesignJoins).
 */
import { polynomialRoots } from '../../optimize/polynomialRoots';
import type { PreparedSite } from '../prepareSite';

/** Writes the candidate joins (kg/ha) strictly inside interval j to out and returns their count. */
export type StationaryJoinPoints = (interval: number, out: Float64Array) => number;

/**
 * The candidate-join finder of a plateau model on a prepared site.
 * @param site - from prepareSite, any design
 * @param degree - degree of the rising piece: 1 linear-plateau, 2 quadratic-plateau
 * @returns a function of the interval index j that writes at most 4 joins (kg/ha) in (r_j, r_{j+1})
 * @example
 * const out = new Float64Array(4);
 * stationaryJoinPoints(site, 1)(2, out) // 0 or 1 join between the third and fourth rates
 */
export function stationaryJoinPoints(site: PreparedSite, degree: 1 | 2): StationaryJoinPoints {
  if (site.design === 'full') return fullDesignJoins(site, degree);
  const { counts, means } = site;
  const m = counts.length;
  let w = 0;
  let mBar = 0;
  for (let i = 0; i < m; i++) {
    w += counts[i];
    mBar += counts[i] * means[i];
  }
  mBar /= w;
  return degree === 1
    ? linearJoins(site.rates, counts, means, mBar, w)
    : quadraticJoins(site.rates, counts, means, mBar, w);
}

// Scratch for the quartic, shared by all sites (the engine is single-threaded and a
// finder's call finishes before the next begins; typed arrays are costly to make).
const g1 = new Float64Array(3);
const v = new Float64Array(5);
const p = new Float64Array(5);
const roots = new Float64Array(4);

/** Linear-plateau: P is linear, its one root in closed form. */
function linearJoins(
  rates: Float64Array,
  counts: Float64Array,
  means: Float64Array,
  mBar: number,
  w: number,
): StationaryJoinPoints {
  const m = rates.length;
  // Returned unnamed: see profileSolver on tools that keep function names.
  return (j, out) => {
    const h = rates[j + 1] - rates[j];
    // g − r_j, over h: d_i on the left, s on the right (a shift and a scale of g
    // change neither β's sign nor the SSE).
    let d1 = 0; // Σ_L n d
    let d2 = 0; // Σ_L n d²
    let mu0 = 0; // Σ_L n c d
    for (let i = 0; i <= j; i++) {
      const d = (rates[i] - rates[j]) / h;
      d1 += counts[i] * d;
      d2 += counts[i] * d * d;
      mu0 += counts[i] * (means[i] - mBar) * d;
    }
    let right = 0; // Σ_R n
    let mu1 = 0; // Σ_R n c
    for (let i = j + 1; i < m; i++) {
      right += counts[i];
      mu1 += counts[i] * (means[i] - mBar);
    }
    // V(s) = v0 + v1 s + v2 s².
    const v0 = d2 - (d1 * d1) / w;
    const v1 = (-2 * d1 * right) / w;
    const v2 = right - (right * right) / w;
    const p0 = 2 * mu1 * v0 - mu0 * v1;
    const p1 = mu1 * v1 - 2 * mu0 * v2;
    const s = -p0 / p1;
    if (!(s > 0 && s < 1)) return 0;
    out[0] = rates[j] + h * s;
    return 1;
  };
}

/** Quadratic-plateau: P is a quartic; its roots in (0, 1) by polynomialRoots. */
function quadraticJoins(
  rates: Float64Array,
  counts: Float64Array,
  means: Float64Array,
  mBar: number,
  w: number,
): StationaryJoinPoints {
  return (j, out) => {
    const h = rates[j + 1] - rates[j];
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    let s4 = 0;
    let t0 = 0;
    let t1 = 0;
    let t2 = 0;
    for (let i = 0; i <= j; i++) {
      const d = (rates[i] - rates[j]) / h;
      const n = counts[i];
      const nc = n * (means[i] - mBar);
      const dd = d * d;
      s0 += n;
      s1 += n * d;
      s2 += n * dd;
      s3 += n * dd * d;
      s4 += n * dd * dd;
      t0 += nc;
      t1 += nc * d;
      t2 += nc * dd;
    }
    // G1 = Σ n (s − d)², G2 = Σ n (s − d)⁴, M = Σ n c (s − d)², coefficients from s⁰ up.
    g1[0] = s2;
    g1[1] = -2 * s1;
    g1[2] = s0;
    const mc0 = t2;
    const mc1 = -2 * t1;
    const mc2 = t0;
    // V = G2 − G1² / w.
    v[0] = s4 - (g1[0] * g1[0]) / w;
    v[1] = -4 * s3 - (2 * g1[0] * g1[1]) / w;
    v[2] = 6 * s2 - (2 * g1[0] * g1[2] + g1[1] * g1[1]) / w;
    v[3] = -4 * s1 - (2 * g1[1] * g1[2]) / w;
    v[4] = s0 - (g1[2] * g1[2]) / w;
    // P = 2 M' V − M V', with M' = mc1 + 2 mc2 s and V' = v1 + 2 v2 s + 3 v3 s² + 4 v4 s³;
    // the s⁵ terms cancel exactly and are left out.
    const dm0 = 2 * mc1;
    const dm1 = 4 * mc2;
    p[0] = dm0 * v[0] - mc0 * v[1];
    p[1] = dm0 * v[1] + dm1 * v[0] - 2 * mc0 * v[2] - mc1 * v[1];
    p[2] = dm0 * v[2] + dm1 * v[1] - 3 * mc0 * v[3] - 2 * mc1 * v[2] - mc2 * v[1];
    p[3] = dm0 * v[3] + dm1 * v[2] - 4 * mc0 * v[4] - 3 * mc1 * v[3] - 2 * mc2 * v[2];
    p[4] = dm0 * v[4] + dm1 * v[3] - 4 * mc1 * v[4] - 3 * mc2 * v[3];
    const count = polynomialRoots(p, 4, 0, 1, roots);
    for (let k = 0; k < count; k++) out[k] = rates[j] + h * roots[k];
    return count;
  };
}

/**
 * Any design, from plot-level sums. Within interval j, with x0 = r_j + h s, each plot's
 * regressor is a polynomial in s, g_i(s) = Σ_k a_ik s^k (d_i = (r_i − r_j) / h):
 * linear-plateau a_i = (d_i, 0) left of the join and (0, 1) right of it; quadratic-plateau
 * (d_i², −2 d_i, 1) left and 0 right. Centering the a_k and y within blocks (ã_k, ỹ) gives
 * M(s) = Σ_k s^k Σ_i ã_ik ỹ_i and V(s) = Σ_{k,l} s^(k+l) Σ_i ã_ik ã_il, and P as above.
 */
function fullDesignJoins(site: PreparedSite, degree: 1 | 2): StationaryJoinPoints {
  const { n, y, rates, groupOf, blockOf } = site;
  const nb = Math.max(site.blockLabels.length, 1);
  const size = new Float64Array(nb);
  const ySum = new Float64Array(nb);
  for (let i = 0; i < n; i++) {
    size[blockOf[i]]++;
    ySum[blockOf[i]] += y[i];
  }
  const yc = new Float64Array(n);
  for (let i = 0; i < n; i++) yc[i] = y[i] - ySum[blockOf[i]] / size[blockOf[i]];
  const terms = degree + 1;
  const a = new Float64Array(terms * n);
  const aSum = new Float64Array(terms * nb);
  const mc = new Float64Array(terms);
  const vc = new Float64Array(2 * degree + 1);
  const pc = new Float64Array(3 * degree);
  return (j, out) => {
    const h = rates[j + 1] - rates[j];
    aSum.fill(0);
    for (let i = 0; i < n; i++) {
      const left = groupOf[i] <= j;
      const d = (rates[groupOf[i]] - rates[j]) / h;
      if (degree === 1) {
        a[i] = left ? d : 0;
        a[n + i] = left ? 0 : 1;
      } else {
        a[i] = left ? d * d : 0;
        a[n + i] = left ? -2 * d : 0;
        a[2 * n + i] = left ? 1 : 0;
      }
      for (let k = 0; k < terms; k++) aSum[k * nb + blockOf[i]] += a[k * n + i];
    }
    for (let k = 0; k < terms; k++) {
      for (let i = 0; i < n; i++) a[k * n + i] -= aSum[k * nb + blockOf[i]] / size[blockOf[i]];
    }
    mc.fill(0);
    vc.fill(0);
    for (let k = 0; k < terms; k++) {
      for (let i = 0; i < n; i++) mc[k] += a[k * n + i] * yc[i];
      for (let l = k; l < terms; l++) {
        let s = 0;
        for (let i = 0; i < n; i++) s += a[k * n + i] * a[l * n + i];
        vc[k + l] += k === l ? s : 2 * s;
      }
    }
    // P = 2 M' V − M V', degree 3·degree − 1; its top coefficient cancels and is left out.
    pc.fill(0);
    for (let k = 1; k < terms; k++) {
      for (let q = 0; q < vc.length; q++) pc[k - 1 + q] += 2 * k * mc[k] * vc[q];
    }
    for (let k = 0; k < terms; k++) {
      for (let q = 1; q < vc.length; q++) pc[k + q - 1] -= q * mc[k] * vc[q];
    }
    const count = polynomialRoots(pc, 3 * degree - 2, 0, 1, roots);
    for (let k = 0; k < count; k++) out[k] = rates[j] + h * roots[k];
    return count;
  };
}
