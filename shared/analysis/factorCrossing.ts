/**
 * Two treatment factors at one site (e.g. source and timing): how their levels meet on the
 * fertilized plots, and, when they are crossed, each factor's test with the other's curves held.
 *
 * Relations (fertilized plots with a level of both; A the factor read, B the other):
 * - same-treatments: each level of A goes with one level of B and back (two names for the same
 *   treatments): the two tests are one test read twice;
 * - nested: each level of B goes with one level of A but not back (B within A, e.g. products
 *   within sources), or the reverse: each test compares its own groups, as designed;
 * - crossed: every combination present: each factor's own test pools the other's levels into its
 *   curves, so it is also tested adjusted for the other (below); their interaction is not tested;
 * - partly-crossed: some combinations missing: not a design the analysis handles; no adjusted
 *   test, and the message says to split the file.
 *
 * The adjusted test (a Type II comparison, each factor after the other): one quadratic per level
 * of B in both models, and one per level of A on top in the fuller one (A's first level dropped,
 * its terms being the sum of B's), the check shared, weighted by 1/ŷ² of the unweighted reduced
 * model, as levelResponseTest weighs its own:
 *   reduced: y = block + Σ_B (b_B·x + c_B·x²)·[plot in B]
 *   fuller:  y = block + Σ_B (b_B·x + c_B·x²)·[plot in B] + Σ_{A ≠ first} (b_A·x + c_A·x²)·[plot in A]
 * R's anova(lm(y ~ block + x:B + I(x^2):B, weights = w), lm(y ~ block + x:B + I(x^2):B + x:A +
 * I(x^2):A, weights = w)) is the reference (tests/analysis.factorCrossing.test.ts).
 */
import { StatsInputError } from '../stats/errors';
import { defaultBlockTerms } from '../stats/hasBlocks';
import { fitLeastSquares } from '../stats/leastSquares';
import type { BlockChoice } from './analysisSettings';
import { describeFTest } from './describeFTest';
import { designSse } from './designSse';
import { extraSumOfSquaresTest, type NoTest } from './extraSumOfSquaresTest';
import { levelColumns, type FactorCrossing, type LevelCurveTest } from './levelResponseTest';
import type { SiteLevelSplit } from './siteLevels';
import type { SitePlots } from './sitePlots';

export type { FactorCrossing, FactorRelation } from './levelResponseTest';

/**
 * How factor A's levels meet factor B's at a site, with the adjusted test when crossed.
 * @param site - the site's analyzable plots (kg/ha)
 * @param a - the split by the factor read (splitSiteLevels)
 * @param b - the split by the other factor, same site
 * @param blocks - "auto" (block offsets when every plot has a block label) or "none"
 * @param alpha - significance level of the sentence
 * @returns the relation, its message and (crossed) the adjusted quadratic test
 * @example
 * factorCrossing(site, bySource, byTiming, 'auto', 0.05).relation // 'crossed'
 */
export function factorCrossing(
  site: SitePlots,
  a: SiteLevelSplit,
  b: SiteLevelSplit,
  blocks: BlockChoice,
  alpha: number,
): FactorCrossing {
  const pairs = new Set<string>();
  const aOfB = new Map<number, Set<number>>();
  const bOfA = new Map<number, Set<number>>();
  a.levelIndex.forEach((ka, i) => {
    const kb = b.levelIndex[i];
    if (ka < 0 || kb < 0) return;
    pairs.add(`${ka}|${kb}`);
    (aOfB.get(kb) ?? aOfB.set(kb, new Set()).get(kb)!).add(ka);
    (bOfA.get(ka) ?? bOfA.set(ka, new Set()).get(ka)!).add(kb);
  });
  const la = a.levels.length;
  const lb = b.levels.length;
  const one = (m: Map<number, Set<number>>) => [...m.values()].every((s) => s.size === 1);
  const A = a.factor;
  const B = b.factor;
  const cells = pairs.size;
  const at = `at ${site.site}`;
  if (one(aOfB) && one(bOfA)) {
    return {
      other: B,
      relation: 'same-treatments',
      cells,
      message: `${A} and ${B} name the same treatments ${at} (each ${A} level goes with one ${B} level), so their tests are one test read twice.`,
      adjusted: null,
    };
  }
  if (one(aOfB) || one(bOfA)) {
    const [outer, inner] = one(aOfB) ? [A, B] : [B, A];
    return {
      other: B,
      relation: 'nested',
      cells,
      message: `${inner} levels sit within ${outer} levels ${at} (each ${inner} level with one ${outer} level): the ${outer} test compares groups of ${inner} levels, the ${inner} test the levels one by one.`,
      adjusted: null,
    };
  }
  if (cells === la * lb) {
    return {
      other: B,
      relation: 'crossed',
      cells,
      message: `${A} and ${B} are crossed ${at} (every ${A} level with every ${B} level): the ${A} test pools the ${B} levels into each curve, so it is also made with one curve per ${B} level in both models (adjusted for ${B}); whether the two interact is not tested.`,
      adjusted: adjustedTest(site, a, b, blocks, alpha),
    };
  }
  return {
    other: B,
    relation: 'partly-crossed',
    cells,
    message: `${A} and ${B} are partly crossed ${at} (${cells} of ${la * lb} combinations present): Plotrate does not analyze this design; the ${A} test pools the ${B} levels into each curve. Split the file so each part has one ${B} level (or one ${A} level) and analyze the parts.`,
    adjusted: null,
  };
}

/** A's quadratic test with one curve per level of B in both models (file header). */
function adjustedTest(
  site: SitePlots,
  a: SiteLevelSplit,
  b: SiteLevelSplit,
  blocks: BlockChoice,
  alpha: number,
): LevelCurveTest {
  const keep: number[] = [];
  a.levelIndex.forEach((ka, i) => {
    const kb = b.levelIndex[i];
    // A check (−1 in both) or a plot with a level of both.
    if ((ka === -1 && kb === -1) || (ka >= 0 && kb >= 0)) keep.push(i);
  });
  const n = keep.length;
  const x = Float64Array.from(keep, (i) => site.rateKgHa[i]);
  const y = Float64Array.from(keep, (i) => site.yieldKgHa[i]);
  const la = Int32Array.from(keep, (i) => a.levelIndex[i]);
  const lb = Int32Array.from(keep, (i) => b.levelIndex[i]);
  const labels = keep.map((i) => site.block[i]);
  const base = levelColumns(labels, blocks === 'auto' && defaultBlockTerms(labels) === 'fixed');
  const term = (p: number, of: Int32Array, k: number) =>
    Float64Array.from(x, (v, i) => (of[i] === k ? v ** p : 0));
  const words = {
    comparison: `One quadratic per ${a.factor.toLowerCase()} level on top of one per ${b.factor.toLowerCase()} level, against one per ${b.factor.toLowerCase()} level only (the zero-rate check shared)`,
    significant: `the response to N differs between the ${a.factor.toLowerCase()} levels, ${b.factor.toLowerCase()} allowed for`,
    notSignificant: `the ${a.factor.toLowerCase()} levels do not differ detectably in their response to N once ${b.factor.toLowerCase()} is allowed for`,
  };
  const none = (reason: string): LevelCurveTest => {
    const result: NoTest = { kind: 'no-test', reason };
    return {
      model: 'quadratic',
      n,
      common: null,
      perLevel: null,
      result,
      sentence: describeFTest(result, words, alpha),
    };
  };
  const reduced = [...base];
  for (let k = 0; k < b.levels.length; k++) reduced.push(term(1, lb, k), term(2, lb, k));
  const fuller = [...reduced];
  for (let k = 1; k < a.levels.length; k++) fuller.push(term(1, la, k), term(2, la, k));
  let fitted: Float64Array;
  try {
    fitted = fitLeastSquares({ y, columns: reduced, intercept: false }).fitted;
  } catch (e) {
    if (!(e instanceof StatsInputError)) throw e;
    return none(`the curves per ${b.factor.toLowerCase()} level could not be fitted: ${e.message}`);
  }
  if (!fitted.every((v) => v > 0)) return none('a fitted yield is at or below 0');
  const scaled = (col: ArrayLike<number>) => Float64Array.from(col, (v, i) => v / fitted[i]);
  const r = designSse(reduced.map(scaled), scaled(y));
  const f = designSse(fuller.map(scaled), scaled(y));
  if (r.rank < r.columns || f.rank < f.columns) {
    return none('the design is not of full rank (too few rates per combination of levels)');
  }
  const common = { sse: r.sse, df: n - r.columns };
  const perLevel = { sse: f.sse, df: n - f.columns };
  const result = extraSumOfSquaresTest(common, perLevel);
  return {
    model: 'quadratic',
    n,
    common,
    perLevel,
    result,
    sentence: describeFTest(result, words, alpha),
  };
}
