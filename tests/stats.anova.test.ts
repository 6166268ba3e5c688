// oneWayAnova (unequal replication) and randomizedBlockAnova (complete and with
// a missing plot) against R 4.2.2 (tests/fixtures/stats-r/make-stats-reference.R:
// anova(lm(...)), least-squares means from the fit, LSD from qt()).
import { describe, expect, it } from 'vitest';
import { oneWayAnova } from '../shared/stats/oneWayAnova';
import { randomizedBlockAnova } from '../shared/stats/randomizedBlockAnova';
import { expectDigits, rReference } from './stats.helpers';

describe('oneWayAnova with unequal replication against R 4.2.2', () => {
  const ref = rReference.oneWay;
  const result = oneWayAnova({ treatment: ref.treatment, y: ref.y });
  it('matches the ANOVA table, F and p', () => {
    expect(result.between.df).toBe(ref.dfBetween[0]);
    expect(result.within.df).toBe(ref.dfWithin[0]);
    expectDigits(result.between.ss, ref.ssBetween[0], 12, 'between SS');
    expectDigits(result.within.ss, ref.ssWithin[0], 12, 'within SS');
    expectDigits(result.F, ref.F[0], 12, 'F');
    expectDigits(result.p, ref.p[0], 10, 'p');
    expect(result.balanced).toBe(false);
    expect(result.notes).toEqual([
      'Unequal replication (3 to 5 plots per treatment): each mean has its own standard error and each pair its own LSD.',
    ]);
    expect(result.treatmentMeans).toBe(result.treatments);
  });
  it('matches the treatment means and the pairwise LSD for A (4 plots) against B (3)', () => {
    ref.means.forEach((m: number, i: number) =>
      expectDigits(result.treatments[i].mean, m, 13, `mean ${i}`),
    );
    expectDigits(result.lsd.comparisons[0].lsd, ref.lsdAB[0], 12, 'LSD A–B');
    expect(result.lsd.lsd).toBeNull(); // unequal replication: no single LSD
  });
  it('gives each mean the SE √(MSE/nᵢ)', () => {
    expectDigits(result.treatments[1].se, Math.sqrt(result.within.ms / 3), 14, 'SE of B');
  });
});

describe('randomizedBlockAnova on a complete trial against R 4.2.2', () => {
  const ref = rReference.block;
  const r = ref.complete;
  const result = randomizedBlockAnova({ treatment: ref.treatment, block: ref.block, y: ref.y });
  it('matches the block, treatment and error lines, F and p', () => {
    expect(result.balanced).toBe(true);
    expect(result.notes).toEqual([]);
    expect(result.error.df).toBe(r.dfError[0]);
    expectDigits(result.blocks.ss, r.ssBlocks[0], 12, 'block SS');
    expectDigits(result.treatments.ss, r.ssTreatments[0], 12, 'treatment SS');
    expectDigits(result.error.ss, r.ssError[0], 12, 'error SS');
    expectDigits(result.F, r.F[0], 12, 'F');
    expectDigits(result.blockF, r.blockF[0], 12, 'block F');
    expectDigits(result.p, r.p[0], 9, 'p');
  });
  it('matches the means, their SEs, the single LSD and CV%', () => {
    r.lsMeans.forEach((m: number, i: number) =>
      expectDigits(result.treatmentMeans[i].mean, m, 13, `mean ${i}`),
    );
    r.lsMeanSe.forEach((s: number, i: number) =>
      expectDigits(result.treatmentMeans[i].se, s, 12, `SE ${i}`),
    );
    expectDigits(result.lsd.lsd ?? NaN, r.lsd12[0], 12, 'LSD');
    expectDigits(result.cvPercent ?? NaN, r.cvPercent[0], 12, 'CV%');
  });
});

describe('randomizedBlockAnova with one plot missing against R 4.2.2 (blocks fitted first)', () => {
  const ref = rReference.block;
  const r = ref.missingOne;
  const drop = ref.missingIndex[0] - 1; // R's 1-based row 13: N120 in block III
  const keep = (_: unknown, i: number) => i !== drop;
  const input = {
    treatment: ref.treatment.filter(keep),
    block: ref.block.filter(keep),
    y: ref.y.filter(keep),
  };
  const result = randomizedBlockAnova(input);
  it('says the design is unbalanced and which plot is missing', () => {
    expect(result.balanced).toBe(false);
    expect(result.missingPlots.map((m) => [m.treatment, m.block])).toEqual([['N120', 'III']]);
    expect(result.notes[0]).toBe(
      'Unbalanced: 1 plot missing (treatment "N120" in block "III"). Fitted by least squares with blocks first: the treatment sum of squares is adjusted for blocks, treatment means are least-squares means, and each pair has its own LSD.',
    );
  });
  it('matches the sequential ANOVA (blocks, then treatments adjusted for blocks)', () => {
    expect(result.error.df).toBe(r.dfError[0]);
    expectDigits(result.blocks.ss, r.ssBlocks[0], 11, 'block SS');
    expectDigits(result.treatments.ss, r.ssTreatments[0], 11, 'treatment SS');
    expectDigits(result.error.ss, r.ssError[0], 11, 'error SS');
    expectDigits(result.F, r.F[0], 11, 'F');
    expectDigits(result.p, r.p[0], 9, 'p');
  });
  it('matches the least-squares means, their SEs and the pairwise LSDs', () => {
    r.lsMeans.forEach((m: number, i: number) =>
      expectDigits(result.treatmentMeans[i].mean, m, 12, `LS mean ${i}`),
    );
    r.lsMeanSe.forEach((s: number, i: number) =>
      expectDigits(result.treatmentMeans[i].se, s, 11, `SE ${i}`),
    );
    const pair = (a: string, b: string) =>
      result.lsd.comparisons.find((c) => c.first === a && c.second === b);
    expectDigits(pair('N0', 'N60')?.seDifference ?? NaN, r.seDiff12[0], 11, 'SE N0−N60');
    expectDigits(pair('N60', 'N240')?.seDifference ?? NaN, r.seDiff25[0], 11, 'SE N60−N240');
    expectDigits(pair('N0', 'N60')?.lsd ?? NaN, r.lsd12[0], 11, 'LSD N0−N60');
    expect(result.lsd.lsd).toBeNull();
  });
  it("predicts the missing plot as R does, which is Yates's formula (tT + bB − G)/((t − 1)(b − 1))", () => {
    expectDigits(result.missingPlots[0].estimate, r.missingPrediction[0], 12, 'missing plot vs R');
    // Yates (1933), the missing-plot formula as given in Steel, Torrie & Dickey §9.7
    // (from memory): T, B, G are the observed totals of its treatment, its block and all.
    const sum = (pick: (i: number) => boolean) =>
      input.y.reduce((s: number, v: number, i: number) => (pick(i) ? s + v : s), 0);
    const T = sum((i) => input.treatment[i] === 'N120');
    const B = sum((i) => input.block[i] === 'III');
    const G = sum(() => true);
    expectDigits(result.missingPlots[0].estimate, (5 * T + 4 * B - G) / (4 * 3), 12, 'Yates');
  });
  it('keeps the raw mean of the observed plots beside the least-squares mean', () => {
    const n120 = result.treatmentMeans[2];
    expect(n120.n).toBe(3);
    expectDigits(n120.rawMean, (6480 + 6620 + 6790) / 3, 14, 'raw mean N120');
  });
});

describe('randomizedBlockAnova with no error variation', () => {
  it('calls a varying treatment infinitely significant and a flat one F = 0, p = 1', () => {
    // Exactly additive yields: block + treatment, no error (hand-made, worked in the head).
    const varying = randomizedBlockAnova({
      treatment: [0, 60, 0, 60, 0, 60],
      block: [1, 1, 2, 2, 3, 3],
      y: [5, 7, 6, 8, 4, 6],
    });
    expect(varying.error.ss).toBeLessThan(1e-20);
    expect(varying.F).toBe(Infinity);
    expect(varying.p).toBe(0);
    const flat = randomizedBlockAnova({
      treatment: [0, 60, 0, 60, 0, 60],
      block: [1, 1, 2, 2, 3, 3],
      y: [5, 5, 6, 6, 4, 4],
    });
    expect(flat.F).toBe(0);
    expect(flat.p).toBe(1);
    expect(flat.blockF).toBe(Infinity);
  });
});
