/**
 * The profiled deviance of a linear mixed model as a function of the relative
 * covariance factor θ alone, and the estimates at a given θ.
 *
 * Formulation: Bates, Mächler, Bolker & Walker, "Fitting Linear Mixed-Effects
 * Models Using lme4", Journal of Statistical Software 67(1), 2015, §3. The
 * random effects are b = Λθ·u with u ~ N(0, σ²I), so Ψ = σ²·ΛθΛθᵀ; here Λθ is
 * block-diagonal with one q × q lower-triangular T(θ) per group. The penalized
 * least-squares system is solved by the blocked Cholesky factor of eq. (18):
 *   Lθ·Lθᵀ = ΛθᵀZᵀZΛθ + I   (one q × q block per group, block-diagonal),
 *   Lθ·RZX = ΛθᵀZᵀX,  RXᵀRX = XᵀX − RZXᵀRZX,
 *   Lθ·cu = ΛθᵀZᵀy,   RXᵀcβ = Xᵀy − RZXᵀcu,  RX·β̂ = cβ,
 * and the penalized residual sum of squares is r² = yᵀy − ‖cu‖² − ‖cβ‖².
 * Then (eqs. 34 and 41)
 *   ML:   d(θ)  = log|Lθ|² + n·(1 + log(2π·r²/n)),
 *   REML: dR(θ) = log|Lθ|² + log|RX|² + (n − p)·(1 + log(2π·r²/(n − p))).
 * The log-likelihood is −d/2. Estimates at θ: σ² = r²/n (ML) or r²/(n − p)
 * (REML); Cov(β̂) = σ²·(RXᵀRX)⁻¹; Ψ = σ²·TTᵀ; conditional modes
 * b_i = T·u_i with Lθ,iᵀ·u_i = cu_i − RZX,i·β̂.
 *
 * θ holds T's entries column by column (lme4's order): for q = 3 unstructured,
 * [T11, T21, T31, T22, T32, T33]; for a diagonal Ψ, [T11, T22, T33]. The
 * deviance does not change when a column of T changes sign (it enters only
 * through TTᵀ and |Lθ|), so an optimizer may leave T's diagonal unconstrained;
 * `covarianceFactor` is what reports read, with the signs made positive.
 *
 * Edge cases:
 * - a θ that makes RXᵀRX not positive definite (X rank deficient) gives +Infinity;
 * - r² ≤ 0 (an exact fit) gives +Infinity, since the likelihood is unbounded there.
 */
import type { MixedModelData } from './mixedModelData';
import {
  choleskyLower,
  inverseFromCholesky,
  solveLowerInPlace,
  solveLowerTransposeInPlace,
} from './smallCholesky';

/** Ψ unstructured (every variance and covariance) or diagonal (variances only). */
export type CovarianceStructure = 'unstructured' | 'diagonal';

/** Restricted (REML) or full maximum likelihood. */
export type LikelihoodKind = 'REML' | 'ML';

/**
 * How many entries θ has.
 * @param q - random effects per group
 * @param structure - the form of Ψ
 * @returns q(q + 1)/2 unstructured, q diagonal
 */
export function thetaLength(q: number, structure: CovarianceStructure): number {
  return structure === 'unstructured' ? (q * (q + 1)) / 2 : q;
}

/**
 * T(θ), the q × q lower-triangular relative covariance factor, with each
 * column's sign chosen so its diagonal is not negative.
 * @param theta - T's entries column by column (see the file header)
 * @param q - random effects per group
 * @param structure - the form of Ψ
 * @returns T, q × q row-major
 */
export function covarianceFactor(
  theta: ArrayLike<number>,
  q: number,
  structure: CovarianceStructure,
): Float64Array {
  const t = new Float64Array(q * q);
  let k = 0;
  for (let j = 0; j < q; j++) {
    if (structure === 'diagonal') {
      t[j * q + j] = theta[k++];
      continue;
    }
    for (let i = j; i < q; i++) t[i * q + j] = theta[k++];
  }
  for (let j = 0; j < q; j++) {
    if (t[j * q + j] < 0) for (let i = j; i < q; i++) t[i * q + j] = -t[i * q + j];
  }
  return t;
}

/** Everything the deviance computes on its way, kept for the estimates. */
interface Solution {
  /** log|Lθ|², summed over groups. */
  logDetL: number;
  /** log|RX|². */
  logDetRX: number;
  /** Penalized residual sum of squares r². */
  prss: number;
  beta: Float64Array;
  /** Lower-triangular RXᵀ, p × p. */
  rxLower: Float64Array;
  /** Per class: Lθ (q × q) and RZX (q × p). */
  classLower: Float64Array[];
  classRzx: Float64Array[];
}

/**
 * The blocked Cholesky solution at T. `keepClasses` keeps each class's Lθ and RZX (the
 * conditional modes need them); without it one scratch pair serves every class, so a deviance
 * evaluation over a thousand classes allocates nothing per class.
 */
function solve(data: MixedModelData, t: Float64Array, keepClasses: boolean): Solution | null {
  const { p, q } = data;
  const xtxAdjusted = Float64Array.from(data.xtx);
  const xtyAdjusted = Float64Array.from(data.xty);
  const m = new Float64Array(q * q);
  const b = new Float64Array(q * q);
  const h = new Float64Array(q);
  let logDetL = 0;
  let cuSquared = 0;
  const classLower: Float64Array[] = [];
  const classRzx: Float64Array[] = [];
  const scratchLower = new Float64Array(q * q);
  const scratchRzx = new Float64Array(q * p);
  for (const c of data.classes) {
    // m = Tᵀ·ZᵀZ·T + I
    for (let i = 0; i < q; i++) {
      for (let j = 0; j <= i; j++) {
        let s = i === j ? 1 : 0;
        for (let k = i; k < q; k++) {
          for (let l = j; l < q; l++) s += t[k * q + i] * c.ztz[k * q + l] * t[l * q + j];
        }
        m[i * q + j] = s;
        m[j * q + i] = s;
      }
    }
    const lower = keepClasses ? new Float64Array(q * q) : scratchLower;
    if (!choleskyLower(m, q, lower)) return null;
    for (let i = 0; i < q; i++) logDetL += 2 * c.count * Math.log(lower[i * q + i]);
    // RZX = L⁻¹·Tᵀ·ZᵀX
    const rzx = keepClasses ? new Float64Array(q * p) : scratchRzx;
    for (let i = 0; i < q; i++) {
      for (let j = 0; j < p; j++) {
        let s = 0;
        for (let k = i; k < q; k++) s += t[k * q + i] * c.ztx[k * p + j];
        rzx[i * p + j] = s;
      }
    }
    for (let j = 0; j < p; j++) solveLowerInPlace(lower, q, rzx, j, p);
    // B = L⁻¹·Tᵀ; Σ‖cu_i‖² = tr(B·S·Bᵀ) with S = Σ Zᵢᵀyᵢ(Zᵢᵀyᵢ)ᵀ; h = B·Σ Zᵢᵀyᵢ.
    for (let i = 0; i < q; i++) for (let j = 0; j < q; j++) b[i * q + j] = t[j * q + i];
    for (let j = 0; j < q; j++) solveLowerInPlace(lower, q, b, j, q);
    for (let r = 0; r < q; r++) {
      let hr = 0;
      for (let j = 0; j < q; j++) {
        hr += b[r * q + j] * c.sumZty[j];
        let s = 0;
        for (let k = 0; k < q; k++) s += c.sumZtyZty[j * q + k] * b[r * q + k];
        cuSquared += b[r * q + j] * s;
      }
      h[r] = hr;
    }
    for (let i = 0; i < p; i++) {
      let s = 0;
      for (let r = 0; r < q; r++) s += rzx[r * p + i] * h[r];
      xtyAdjusted[i] -= s;
      for (let j = 0; j <= i; j++) {
        let u = 0;
        for (let r = 0; r < q; r++) u += rzx[r * p + i] * rzx[r * p + j];
        xtxAdjusted[i * p + j] -= c.count * u;
        if (j !== i) xtxAdjusted[j * p + i] = xtxAdjusted[i * p + j];
      }
    }
    if (keepClasses) {
      classLower.push(lower);
      classRzx.push(rzx);
    }
  }
  const rxLower = new Float64Array(p * p);
  if (!choleskyLower(xtxAdjusted, p, rxLower)) return null;
  let logDetRX = 0;
  for (let i = 0; i < p; i++) logDetRX += 2 * Math.log(rxLower[i * p + i]);
  const beta = Float64Array.from(xtyAdjusted);
  solveLowerInPlace(rxLower, p, beta);
  let cbSquared = 0;
  for (let i = 0; i < p; i++) cbSquared += beta[i] * beta[i];
  solveLowerTransposeInPlace(rxLower, p, beta);
  const prss = data.yty - cuSquared - cbSquared;
  return { logDetL, logDetRX, prss, beta, rxLower, classLower, classRzx };
}

/**
 * The profiled deviance −2·log-likelihood at θ, with β and σ² profiled out.
 * @param data - cross-products from `mixedModelData`
 * @param theta - T's entries column by column
 * @param structure - the form of Ψ
 * @param kind - REML or ML
 * @returns the deviance; +Infinity where the system is not positive definite or r² ≤ 0
 */
export function profiledDeviance(
  data: MixedModelData,
  theta: ArrayLike<number>,
  structure: CovarianceStructure,
  kind: LikelihoodKind,
): number {
  const s = solve(data, covarianceFactor(theta, data.q, structure), false);
  if (s === null || !(s.prss > 0)) return Infinity;
  return devianceFrom(s, data, kind);
}

function devianceFrom(s: Solution, data: MixedModelData, kind: LikelihoodKind): number {
  const dof = kind === 'REML' ? data.n - data.p : data.n;
  const extra = kind === 'REML' ? s.logDetRX : 0;
  return s.logDetL + extra + dof * (1 + Math.log((2 * Math.PI * s.prss) / dof));
}

/** The estimates of a linear mixed model at one θ. */
export interface MixedModelEstimates {
  /** β̂, in the units of y per unit of each fixed-effect column. */
  fixed: number[];
  /** Cov(β̂), p × p (rows of arrays). */
  fixedCovariance: number[][];
  /** Ψ̂ = σ̂²·TTᵀ, q × q, the random effects' covariance. */
  randomCovariance: number[][];
  /** σ̂², the residual variance. */
  residualVariance: number;
  /** The log-likelihood of the kind fitted, −d/2. */
  logLikelihood: number;
  /** Conditional modes b̂_i per group, in input order. */
  conditionalModes: { name: string; effects: number[] }[];
}

/**
 * β̂, its covariance, Ψ̂, σ̂², the log-likelihood and the conditional modes at θ.
 * @param data - cross-products from `mixedModelData`
 * @param theta - T's entries column by column, usually the deviance's minimizer
 * @param structure - the form of Ψ
 * @param kind - REML or ML (sets σ̂²'s divisor and the likelihood)
 * @returns the estimates, or null where the system is not positive definite or r² ≤ 0
 */
export function mixedModelEstimates(
  data: MixedModelData,
  theta: ArrayLike<number>,
  structure: CovarianceStructure,
  kind: LikelihoodKind,
): MixedModelEstimates | null {
  const { p, q } = data;
  const t = covarianceFactor(theta, q, structure);
  const s = solve(data, t, true);
  if (s === null || !(s.prss > 0)) return null;
  const residualVariance = s.prss / (kind === 'REML' ? data.n - p : data.n);
  const inverse = inverseFromCholesky(s.rxLower, p);
  const fixedCovariance = rows(p, p, (i, j) => residualVariance * inverse[i * p + j]);
  const randomCovariance = rows(q, q, (i, j) => {
    let v = 0;
    for (let k = 0; k < q; k++) v += t[i * q + k] * t[j * q + k];
    return residualVariance * v;
  });
  const u = new Float64Array(q);
  const conditionalModes = data.groups.map((g) => {
    const lower = s.classLower[g.classIndex];
    const rzx = s.classRzx[g.classIndex];
    for (let i = 0; i < q; i++) {
      let v = 0;
      for (let k = i; k < q; k++) v += t[k * q + i] * g.zty[k];
      u[i] = v;
    }
    solveLowerInPlace(lower, q, u);
    for (let i = 0; i < q; i++) {
      let v = 0;
      for (let j = 0; j < p; j++) v += rzx[i * p + j] * s.beta[j];
      u[i] -= v;
    }
    solveLowerTransposeInPlace(lower, q, u);
    const effects: number[] = [];
    for (let i = 0; i < q; i++) {
      let v = 0;
      for (let k = 0; k <= i; k++) v += t[i * q + k] * u[k];
      effects.push(v);
    }
    return { name: g.name, effects };
  });
  return {
    fixed: [...s.beta],
    fixedCovariance,
    randomCovariance,
    residualVariance,
    logLikelihood: -devianceFrom(s, data, kind) / 2,
    conditionalModes,
  };
}

function rows(n: number, m: number, value: (i: number, j: number) => number): number[][] {
  return Array.from({ length: n }, (_, i) => Array.from({ length: m }, (_, j) => value(i, j)));
}
