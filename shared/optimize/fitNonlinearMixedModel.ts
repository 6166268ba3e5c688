/**
 * Fits a nonlinear mixed model y_ij = f(φ_i, x_ij) + ε_ij, φ_i = β + A·b_i, b_i ~ N(0, Ψ),
 * ε ~ N(0, σ²), by maximum likelihood with the alternating algorithm of Lindstrom & Bates
 * ("Nonlinear mixed effects models for repeated measures data", Biometrics 46:673–687, 1990),
 * the one R's nlme uses (Pinheiro & Bates, Mixed-Effects Models in S and S-PLUS, 2000, §7.2):
 * 1. PNLS: with Ψ/σ² held, minimize Σ_i ‖y_i − f(β + A·b_i)‖² + b_iᵀ(Ψ/σ²)⁻¹b_i over β and every
 *    b_i, by Gauss–Newton with step halving. Each Gauss–Newton step is the penalized least
 *    squares of the linear mixed model below at fixed θ (mixedModelEstimates).
 * 2. LME: linearize at the PNLS estimates, X_i = ∂f/∂β, Z_i = ∂f/∂b (each at the site's own φ_i),
 *    pseudo-response w_i = y_i − f_i + X_i·β + Z_i·b_i, and fit that linear mixed model by ML
 *    (fitLinearMixedModel on the profiled deviance); its θ gives the next Ψ/σ², its β and b the
 *    next start.
 * Repeat until β and θ stop moving. The log-likelihood reported is the LME step's at the
 * converged linearization: the approximation nlme reports, not the exact marginal likelihood.
 * When a step reverses the one before it, the next is taken only in part, and lengthened again
 * after two steps the same way (relaxation): the same fixed point, reached where the plain
 * alternation oscillates. A linear-plateau whose
 * site-years' joins cross tested rates from one step to the next can cycle with no fixed point
 * (the demo's six corn site-years; R's nlme does not converge there either): the fit then
 * stops when the last ten rounds' LME estimates lie in a narrow band (settled), or at the
 * iteration limit, says it did not converge, and returns the last step.
 *
 * Block offsets nested in a group are absorbed as in the linear model: w, X and Z go through
 * mixedModelData's projection, and the PNLS objective reads residuals projected the same way
 * (blockContrastProjection), which profiles the offsets out of both steps.
 *
 * Units: the random effects are fitted in working units b̃_j = K_j·b_j (K = `randomScale`),
 * chosen by the caller so the starting Ψ in working units is about σ²·I: Nelder–Mead over θ
 * then searches numbers of order 1 whatever the parameters' units. The likelihood does not
 * depend on K; the estimates are reported back in the parameters' own units.
 *
 * Edge cases: a linearization whose fixed-effect design is rank deficient (a join past every
 * rate leaves the linear-plateau's join unidentified) ends the fit with `failure`; so does a
 * PNLS objective that is not finite. Reaching the iteration limit returns the last estimates
 * with converged false.
 */
import {
  mixedModelDataOfRows,
  type FlatMixedModelRows,
  type MixedModelData,
} from '../stats/mixedModelData';
import {
  blockContrastProjection,
  type BlockContrastProjection,
} from '../stats/blockContrastProjection';
import {
  covarianceFactor,
  mixedModelEstimates,
  profiledDeviance,
  type CovarianceStructure,
  type MixedModelEstimates,
} from '../stats/mixedModelDeviance';
import { assertFinite, assertSameLength } from '../stats/errors';
import { nelderMead } from './nelderMead';
import { newtonMinimize } from './newtonMinimize';

/** One group's data. */
export interface NonlinearMixedGroup {
  name: string;
  /** Covariate per observation (the model's x, in the units the model function reads). */
  x: readonly number[];
  y: readonly number[];
  /** Optional block label per observation: fixed offsets nested in the group, absorbed. */
  blocks?: readonly string[];
}

/** The model function and which of its parameters vary by group. */
export interface NonlinearMixedSpec {
  /** Number of parameters in φ (= fixed effects). */
  p: number;
  /** Indices into φ of the parameters with a random effect, in the order of b. */
  randomParameters: readonly number[];
  /**
   * f(φ, x), writing ∂f/∂φ into `gradient` (length p).
   * @param phi - parameters
   * @param x - covariate
   * @param gradient - receives the derivatives
   * @returns the model's value
   */
  evaluate(phi: Float64Array, x: number, gradient: Float64Array): number;
}

/** Options of the fit. */
export interface NonlinearMixedOptions {
  structure: CovarianceStructure;
  /** Starting fixed effects β, length p. */
  start: readonly number[];
  /** K: working random effect j is K_j·b_j; pick K so the starting Ψ is about σ²·I. */
  randomScale: readonly number[];
  /** Outer (PNLS + LME) iterations, default 60. */
  maxIterations?: number;
}

/**
 * The fit, in the parameters' own units: the last LME step's estimates (Cov(β̂) as nlme's vcov,
 * the log-likelihood the ML one of the converged linearization, nlme's logLik), and how the
 * alternation ended.
 */
export interface NonlinearMixedFit extends MixedModelEstimates {
  /** θ in working units at the end. */
  theta: number[];
  iterations: number;
  /** The alternation reached a fixed point (β to 1e-7 relative, θ to 1e-6, b to 1e-5 σ). */
  converged: boolean;
  /** Converged, or cycling with the LME estimates of the last ten rounds in a band (SETTLED_FIXED). */
  settled: boolean;
  /** Observations after absorbed block contrasts. */
  observations: number;
}

/** Why a fit stopped without estimates. */
export interface NonlinearMixedFailure {
  failure: string;
}

/**
 * β relative, θ absolute and b (per σ) changes below which the alternation has converged.
 * R's nlme tests β and θ only (1e-6 relative). The random effects' bound is 1e-5 of σ: with
 * 1,000 site-years, a site-year whose join sits just past a tested rate (where the
 * quadratic-plateau's curvature in x0 jumps) creeps by a few 1e-6 σ a round for a dozen rounds
 * after β and θ have stopped (measured: β to 1e-9, θ to 1e-8 from round 16, b at 3–9e-6 σ until
 * round 29); 1e-5 σ is ~3e-4 kg N/ha on a join, far below any digit reported.
 */
const FIXED_TOLERANCE = 1e-7;
const THETA_TOLERANCE = 1e-6;
const RANDOM_TOLERANCE = 1e-5;
/**
 * Looser bounds for "settled": a linear-plateau whose site-years' joins sit on tested rates
 * flips between linearizations for ever (no fixed point exists). Settled means the LME steps'
 * estimates over the last SETTLED_ROUNDS rounds stay in a band: each fixed effect within 1e-3
 * of its size, θ within 1e-3 (Ψ to about 0.2 % relative). The band is of the LME estimates
 * themselves, not of the PNLS step's detour between them: with 1,000 site-years, a few dozen
 * joins cross rates each round, and the PNLS step moves β by ~4e-3 before the LME step brings it
 * back to the same band (measured; the band was ~3e-4 for the join). Reported as settled, never
 * as converged.
 */
const SETTLED_FIXED = 1e-3;
const SETTLED_ROUNDS = 10;
const SETTLED_AFTER = 30;
/**
 * Before SETTLED_AFTER rounds, a fit in the band is settled only when its fixed-point residual
 * (the round's largest relative move of a fixed effect) has stopped shrinking: the smallest of the
 * last STALL_ROUNDS rounds is at least STALL_RATIO of the largest of the STALL_ROUNDS before. A
 * fit converging towards a fixed point shrinks it geometrically (the quadratic-plateau at 1,000
 * site-years: by about 2.5 a round) and runs on; a cycle keeps it level (the linear-plateau at
 * 1,000 site-years: 3.3–3.9e-3 every round from the 10th), and ran to round 30 for nothing: 0.66
 * of that fit's 0.99 s (measured).
 */
const STALL_ROUNDS = 5;
const STALL_RATIO = 0.8;
/**
 * Gauss–Newton steps per PNLS: a few, as nlme's pnlsMaxIter (7), since each round starts from
 * the last and the fixed-point test (the LME step leaves β and θ in place) also checks that PNLS
 * has converged: at fixed θ the LME step's β and b are the Gauss–Newton target.
 */
const PNLS_STEPS = 2;

/**
 * Fits the model by ML with the Lindstrom–Bates alternation.
 * @param groups - the groups' data
 * @param spec - the model function
 * @param options - Ψ's structure, starting β, working scale of the random effects
 * @returns the fit, or why there is none
 * @throws {StatsInputError} "length-mismatch" when a group's x, y (or blocks) differ in length;
 *   "non-finite" for an x or y that is not a finite number
 * @example
 * fitNonlinearMixedModel(groups, spec, { structure: 'diagonal', start: [9000, -3, 0.6], randomScale: [1, 5000] })
 */
export function fitNonlinearMixedModel(
  groups: readonly NonlinearMixedGroup[],
  spec: NonlinearMixedSpec,
  options: NonlinearMixedOptions,
): NonlinearMixedFit | NonlinearMixedFailure {
  const q = spec.randomParameters.length;
  const { structure } = options;
  const state = new Linearization(groups, spec, options.randomScale);
  let beta = [...options.start];
  let b = groups.map(() => new Array<number>(q).fill(0));
  let theta = identityTheta(q, structure);
  let lme: LmeStep | null = null;
  let converged = false;
  let iterations = 0;
  let relaxation = 1;
  let previousStep: number[] | null = null;
  const recent: { fixed: number[]; theta: number[] }[] = [];
  const residuals: number[] = [];
  let nmStep = 0.1;
  let settled = false;
  const limit = options.maxIterations ?? 60;
  while (iterations < limit) {
    iterations++;
    const pnls = state.penalizedNls(beta, b, theta, structure);
    if ('failure' in pnls) return pnls;
    const data = state.data(pnls.beta, pnls.b);
    lme = lmeStep(data, structure, theta, nmStep);
    if (lme === null) {
      return {
        failure: 'the linearized model has no unique fixed effects (a parameter is not identified)',
      };
    }
    // The fixed-point residual: how far the round moved from its start, and the LME step from
    // its own linearization point (a round can return to its start through a PNLS move and
    // back: a linear-plateau join crossing a rate and returning).
    const fixedChange = Math.max(
      ...lme.fixed.map(
        (v, j) =>
          Math.max(Math.abs(v - beta[j]), Math.abs(v - pnls.beta[j])) / Math.max(Math.abs(v), 1e-8),
      ),
    );
    const lmeTheta = positiveTheta(lme.theta, q, structure);
    const thetaStep = lmeTheta.map((v, j) => v - theta[j]);
    const thetaChange = Math.max(...thetaStep.map(Math.abs));
    // The random effects too: in working units they are of the size of σ.
    const sigma = Math.sqrt(lme.residualVariance);
    let randomChange = 0;
    lme.conditionalModes.forEach((g, i) =>
      g.effects.forEach((v, r) => {
        const move = Math.max(Math.abs(v - b[i][r]), Math.abs(v - pnls.b[i][r]));
        randomChange = Math.max(randomChange, move / sigma);
      }),
    );
    if (
      fixedChange < FIXED_TOLERANCE &&
      thetaChange < THETA_TOLERANCE &&
      randomChange < RANDOM_TOLERANCE
    ) {
      converged = lme.converged;
      settled = true;
      break;
    }
    // A cycle that stays in a small band (joins flipping across rates and back): stop there.
    // Judged after SETTLED_AFTER rounds, or sooner once the residual has stopped shrinking, so a
    // fit still converging is not cut short.
    recent.push({ fixed: lme.fixed, theta: lmeTheta });
    if (recent.length > SETTLED_ROUNDS) recent.shift();
    residuals.push(fixedChange);
    if (
      (iterations >= SETTLED_AFTER || stalled(residuals)) &&
      recent.length === SETTLED_ROUNDS &&
      inBand(recent)
    ) {
      settled = true;
      break;
    }
    // The alternation can overshoot and oscillate (the quadratic-plateau on the demo's six
    // site-years: each step reverses the last, shrinking by a quarter). When a step reverses
    // the previous one, take a fraction of it: relaxation changes the path, not the fixed point.
    // Steps near the search's own tolerance reverse by rounding; they are not overshoot.
    const reversed =
      previousStep !== null &&
      thetaChange > 100 * THETA_TOLERANCE &&
      thetaStep.reduce((sum, v, j) => sum + v * previousStep![j], 0) < 0;
    if (reversed) {
      relaxation = Math.max(relaxation / 2, 1 / 16);
    } else if (previousStep !== null && thetaChange > 100 * THETA_TOLERANCE) {
      // Two steps the same way: the overshoot is over; lengthen again.
      relaxation = Math.min(relaxation * 2, 1);
    }
    previousStep = thetaStep;
    // Near the fixed point θ moves little between rounds: a simplex of that size needs far
    // fewer evaluations than one of 0.1 (measured: ~400 down to ~100 per round).
    nmStep = Math.min(0.1, Math.max(1e-4, 10 * thetaChange));
    const w = relaxation;
    const lmeB = lme.conditionalModes.map((g) => g.effects);
    beta = beta.map((v, j) => v + w * (lme!.fixed[j] - v));
    b = b.map((row, i) => row.map((v, r) => v + w * (lmeB[i][r] - v)));
    theta = theta.map((v, j) => v + w * thetaStep[j]);
  }
  if (lme === null) return { failure: 'no iteration ran' };
  const k = options.randomScale;
  return {
    fixed: lme.fixed,
    fixedCovariance: lme.fixedCovariance,
    randomCovariance: lme.randomCovariance.map((row, i) => row.map((v, j) => v / (k[i] * k[j]))),
    residualVariance: lme.residualVariance,
    logLikelihood: lme.logLikelihood,
    conditionalModes: lme.conditionalModes.map((g) => ({
      name: g.name,
      effects: g.effects.map((v, j) => v / k[j]),
    })),
    theta: lme.theta,
    iterations,
    converged,
    settled,
    observations: lme.observations,
  };
}

interface LmeStep extends MixedModelEstimates {
  theta: number[];
  converged: boolean;
  observations: number;
}

/**
 * The LME step: θ maximizing the ML profiled likelihood of the linearized model, from the last
 * θ, by Newton's method (Nelder–Mead where Newton cannot proceed). Like fitLinearMixedModel but
 * with tighter tolerances: the fixed point's log-likelihood
 * moves with θ to first order through the linearization, so θ is wanted to 1e-9, not 1e-5.
 */
function lmeStep(
  data: MixedModelData,
  structure: CovarianceStructure,
  start: readonly number[],
  step: number,
): LmeStep | null {
  const deviance = (theta: number[]) => profiledDeviance(data, theta, structure, 'ML');
  // Newton from the last θ first; Nelder–Mead where it cannot proceed (a variance at 0).
  const newton = Number.isFinite(deviance([...start]))
    ? newtonMinimize(deviance, start, 1e-9)
    : null;
  let theta: number[];
  let converged = true;
  if (newton !== null) {
    theta = newton.x;
  } else {
    // The deviance's rounding grows with it, hence a tolerance relative to its size.
    const scale = Math.max(1, Math.abs(deviance([...start])));
    // Far from the minimum (the first round starts at θ = I) the Hessian need not be positive
    // definite: a coarse simplex search brings θ near the minimum, and Newton finishes there
    // in a few steps where the simplex needs hundreds of evaluations more (at 1,000 site-years
    // the first round's search was 0.12 s of each plateau form's fit). Where Newton still
    // cannot proceed (a variance at 0), the simplex finishes.
    const coarse = nelderMead(deviance, start, {
      functionTolerance: 1e-8 * scale,
      pointTolerance: 1e-3,
      step,
    });
    const polished = newtonMinimize(deviance, coarse.x, 1e-9);
    if (polished !== null) {
      theta = polished.x;
    } else {
      const search = nelderMead(deviance, coarse.x, {
        functionTolerance: 1e-14 * scale,
        pointTolerance: 1e-8,
        step: Math.min(step, 1e-2),
      });
      theta = search.x;
      converged = search.converged;
    }
  }
  const estimates = mixedModelEstimates(data, theta, structure, 'ML');
  if (estimates === null) return null;
  return { ...estimates, theta, converged, observations: data.n };
}

/**
 * The linear mixed model of the LME step at (β, b): X = ∂f/∂β, Z = ∂f/∂b at each group's φ_i,
 * w = y − f + X·β + Z·b, block offsets absorbed. What the fit's log-likelihood is computed on.
 * @param groups - the groups' data
 * @param spec - the model function
 * @param randomScale - K, the working units of b (1 for the parameters' own units)
 * @param beta - fixed effects
 * @param b - each group's random effects, in working units
 * @returns the cross-products (mixedModelData)
 * @example
 * mixedModelEstimates(linearizedMixedModel(groups, spec, [1, 1], beta, b), theta, 'diagonal', 'ML')?.logLikelihood
 */
export function linearizedMixedModel(
  groups: readonly NonlinearMixedGroup[],
  spec: NonlinearMixedSpec,
  randomScale: readonly number[],
  beta: readonly number[],
  b: readonly number[][],
): MixedModelData {
  return new Linearization(groups, spec, randomScale).data(beta, b);
}

/**
 * The groups' rows, the model, and the linearization and PNLS objective built on them. Every
 * row lives in flat typed arrays allocated once: the linearization is rebuilt at every
 * Gauss–Newton step and every round, and per-row arrays made it mostly garbage collection.
 */
class Linearization {
  private readonly gradient: Float64Array;
  private readonly phi: Float64Array;
  private readonly projections: (BlockContrastProjection | null)[];
  /** Rates and yields of every group, end to end. */
  private readonly xs: Float64Array;
  private readonly ys: Float64Array;
  private readonly rows: FlatMixedModelRows;
  private readonly residual: Float64Array;
  private built: MixedModelData | undefined;

  constructor(
    private readonly groups: readonly NonlinearMixedGroup[],
    private readonly spec: NonlinearMixedSpec,
    private readonly randomScale: readonly number[],
  ) {
    const { p } = spec;
    const q = spec.randomParameters.length;
    this.gradient = new Float64Array(p);
    this.phi = new Float64Array(p);
    // The checks mixedModelData made on every linearization, once: the rows are trusted after.
    for (const g of groups) {
      assertSameLength(g.x, g.y, [`group ${g.name}: x`, 'y']);
      if (g.blocks !== undefined) assertSameLength(g.blocks, g.y, [`group ${g.name}: blocks`, 'y']);
      assertFinite(g.x, `group ${g.name}: x`);
      assertFinite(g.y, `group ${g.name}: y`);
    }
    this.projections = groups.map((g) => blockContrastProjection(g.blocks ?? []));
    const start = new Int32Array(groups.length + 1);
    groups.forEach((g, i) => (start[i + 1] = start[i] + g.x.length));
    const total = start[groups.length];
    this.xs = new Float64Array(total);
    this.ys = new Float64Array(total);
    let longest = 0;
    groups.forEach((g, i) => {
      this.xs.set(g.x, start[i]);
      this.ys.set(g.y, start[i]);
      longest = Math.max(longest, g.x.length);
    });
    const absorbed = this.projections.reduce((sum, pr) => sum + (pr?.contrasts ?? 0), 0);
    this.rows = {
      p,
      q,
      names: groups.map((g) => g.name),
      start,
      x: new Float64Array(total * p),
      z: new Float64Array(total * q),
      y: new Float64Array(total),
      n: total - absorbed,
    };
    this.residual = new Float64Array(longest);
  }

  /** φ_i = β + A·b_i, with b_i in working units. */
  private setPhi(beta: readonly number[], b: readonly number[]): void {
    for (let j = 0; j < this.spec.p; j++) this.phi[j] = beta[j];
    const { randomParameters } = this.spec;
    for (let r = 0; r < randomParameters.length; r++) {
      this.phi[randomParameters[r]] += b[r] / this.randomScale[r];
    }
  }

  /**
   * The linear mixed model of the LME step at (β, b). The returned data is overwritten by the
   * next call: read it before linearizing again.
   */
  data(beta: readonly number[], b: readonly number[][]): MixedModelData {
    const { p, randomParameters } = this.spec;
    const q = randomParameters.length;
    const { x, z, y, start } = this.rows;
    const gradient = this.gradient;
    for (let i = 0; i < this.groups.length; i++) {
      this.setPhi(beta, b[i]);
      const bi = b[i];
      for (let r = start[i]; r < start[i + 1]; r++) {
        const f = this.spec.evaluate(this.phi, this.xs[r], gradient);
        let v = this.ys[r] - f;
        for (let j = 0; j < p; j++) {
          x[r * p + j] = gradient[j];
          v += gradient[j] * beta[j];
        }
        for (let k = 0; k < q; k++) {
          const zk = gradient[randomParameters[k]] / this.randomScale[k];
          z[r * q + k] = zk;
          v += zk * bi[k];
        }
        y[r] = v;
      }
      const projection = this.projections[i];
      if (projection !== null) {
        for (let j = 0; j < p; j++) projection.projectStrided(x, start[i] * p + j, p);
        for (let k = 0; k < q; k++) projection.projectStrided(z, start[i] * q + k, q);
        projection.projectStrided(y, start[i], 1);
      }
    }
    this.built = mixedModelDataOfRows(this.rows, this.built);
    return this.built;
  }

  /** Σ‖projected y_i − f_i‖² + ‖u_i‖², u_i = T⁻¹·b_i. */
  private objective(beta: readonly number[], b: readonly number[][], t: Float64Array): number {
    const q = this.spec.randomParameters.length;
    const { start } = this.rows;
    const residual = this.residual;
    let total = 0;
    const u = new Float64Array(q);
    for (let i = 0; i < this.groups.length; i++) {
      this.setPhi(beta, b[i]);
      const m = start[i + 1] - start[i];
      for (let r = 0; r < m; r++) {
        const row = start[i] + r;
        residual[r] = this.ys[row] - this.spec.evaluate(this.phi, this.xs[row], this.gradient);
      }
      this.projections[i]?.projectStrided(residual, 0, 1);
      for (let r = 0; r < m; r++) total += residual[r] * residual[r];
      // Forward substitution T·u = b; a zero diagonal (a variance at 0) carries no penalty,
      // since b is 0 along it at the PNLS solution.
      for (let r = 0; r < q; r++) {
        let s = b[i][r];
        for (let c = 0; c < r; c++) s -= t[r * q + c] * u[c];
        const d = t[r * q + r];
        u[r] = Math.abs(d) > 1e-12 ? s / d : 0;
        total += u[r] * u[r];
      }
    }
    return total;
  }

  /** Gauss–Newton with step halving on the PNLS objective at fixed θ. */
  penalizedNls(
    beta0: readonly number[],
    b0: readonly number[][],
    theta: readonly number[],
    structure: CovarianceStructure,
  ): { beta: number[]; b: number[][] } | NonlinearMixedFailure {
    const q = this.spec.randomParameters.length;
    const t = covarianceFactor(theta, q, structure);
    let beta = [...beta0];
    let b = b0.map((v) => [...v]);
    let current = this.objective(beta, b, t);
    if (!Number.isFinite(current)) return { failure: 'the model is not finite at the start' };
    for (let step = 0; step < PNLS_STEPS; step++) {
      const e = mixedModelEstimates(this.data(beta, b), theta, structure, 'ML');
      if (e === null) {
        return {
          failure:
            'the linearized model has no unique fixed effects (a parameter is not identified)',
        };
      }
      const target = e.fixed;
      const targetB = e.conditionalModes.map((g) => g.effects);
      let factor = 1;
      let next = Infinity;
      let trialBeta = beta;
      let trialB = b;
      for (let halving = 0; halving < 10; halving++) {
        trialBeta = beta.map((v, j) => v + factor * (target[j] - v));
        trialB = b.map((row, i) => row.map((v, k) => v + factor * (targetB[i][k] - v)));
        next = this.objective(trialBeta, trialB, t);
        if (next <= current) break;
        factor /= 2;
      }
      if (!(next <= current)) break;
      const decrease = current - next;
      beta = trialBeta;
      b = trialB;
      current = next;
      if (decrease <= 1e-12 * current) break;
    }
    return { beta, b };
  }
}

/** Each fixed effect within SETTLED_FIXED of its size, and θ within SETTLED_FIXED, over the rounds. */
function inBand(rounds: readonly { fixed: number[]; theta: number[] }[]): boolean {
  const spread = (values: number[]) => Math.max(...values) - Math.min(...values);
  const fixedOk = rounds[0].fixed.every((v, j) => {
    const column = rounds.map((r) => r.fixed[j]);
    return spread(column) <= SETTLED_FIXED * Math.max(Math.abs(v), 1e-8);
  });
  return (
    fixedOk &&
    rounds[0].theta.every((_, j) => spread(rounds.map((r) => r.theta[j])) <= SETTLED_FIXED)
  );
}

/** The fixed-point residual has stopped shrinking over the last rounds (STALL_ROUNDS, STALL_RATIO). */
function stalled(residuals: readonly number[]): boolean {
  const n = residuals.length;
  if (n < 2 * STALL_ROUNDS) return false;
  const last = Math.min(...residuals.slice(n - STALL_ROUNDS));
  const before = Math.max(...residuals.slice(n - 2 * STALL_ROUNDS, n - STALL_ROUNDS));
  return last >= STALL_RATIO * before;
}

/** θ with each column of T signed so its diagonal is not negative (the deviance is unchanged). */
function positiveTheta(
  theta: readonly number[],
  q: number,
  structure: CovarianceStructure,
): number[] {
  const t = covarianceFactor(theta, q, structure);
  const out: number[] = [];
  for (let j = 0; j < q; j++) {
    if (structure === 'diagonal') out.push(t[j * q + j]);
    else for (let i = j; i < q; i++) out.push(t[i * q + j]);
  }
  return out;
}

function identityTheta(q: number, structure: CovarianceStructure): number[] {
  if (structure === 'diagonal') return new Array<number>(q).fill(1);
  const theta: number[] = [];
  for (let j = 0; j < q; j++) for (let i = j; i < q; i++) theta.push(i === j ? 1 : 0);
  return theta;
}
