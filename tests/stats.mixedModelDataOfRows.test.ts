// mixedModelDataOfRows (flat rows, one class per group, reusable) against mixedModelData, whose
// deviance and estimates are checked against R's nlme in tests/stats.mixedModel.reference.test.ts:
// the same groups through both give the same profiled deviance and estimates to rounding, and
// a second call into the same target with other values gives what a fresh call gives.
// projectStrided against project, the block projection's closure form.
import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../shared/demo/mulberry32';
import { blockContrastProjection } from '../shared/stats/blockContrastProjection';
import {
  mixedModelData,
  mixedModelDataOfRows,
  type FlatMixedModelRows,
  type MixedModelGroup,
} from '../shared/stats/mixedModelData';
import { mixedModelEstimates, profiledDeviance } from '../shared/stats/mixedModelDeviance';

/** Invented groups (seeded): 3 fixed columns, 2 random, 12 rows in 3 blocks, unbalanced last. */
function groupsOf(seed: number): MixedModelGroup[] {
  const rng = mulberry32(seed);
  return Array.from({ length: 7 }, (_, g) => {
    const m = g === 6 ? 11 : 12;
    const fixedRows: number[][] = [];
    const randomRows: number[][] = [];
    const y: number[] = [];
    const blocks: string[] = [];
    for (let r = 0; r < m; r++) {
      const u = (r % 4) / 3;
      fixedRows.push([1, u, u * u + 0.1 * rng.normal()]);
      randomRows.push([1, u]);
      y.push(50 + 20 * u - 8 * u * u + 3 * rng.normal() + (g - 3) * (1 + u));
      blocks.push(`B${Math.floor(r / 4) + 1}`);
    }
    return { name: `G${g + 1}`, fixedRows, randomRows, y, blocks };
  });
}

/** The same groups projected off their blocks, in flat arrays, with projectStrided. */
function flatOf(groups: MixedModelGroup[]): FlatMixedModelRows {
  const start = new Int32Array(groups.length + 1);
  groups.forEach((g, i) => (start[i + 1] = start[i] + g.y.length));
  const total = start[groups.length];
  const x = new Float64Array(total * 3);
  const z = new Float64Array(total * 2);
  const y = new Float64Array(total);
  let n = 0;
  groups.forEach((g, i) => {
    g.y.forEach((v, r) => {
      const row = start[i] + r;
      x.set(g.fixedRows[r], row * 3);
      z.set(g.randomRows[r], row * 2);
      y[row] = v;
    });
    const projection = blockContrastProjection(g.blocks!)!;
    for (let j = 0; j < 3; j++) projection.projectStrided(x, start[i] * 3 + j, 3);
    for (let k = 0; k < 2; k++) projection.projectStrided(z, start[i] * 2 + k, 2);
    projection.projectStrided(y, start[i], 1);
    n += g.y.length - projection.contrasts;
  });
  return { p: 3, q: 2, names: groups.map((g) => g.name), start, x, z, y, n };
}

const relative = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);

describe('mixedModelDataOfRows', () => {
  for (const structure of ['diagonal', 'unstructured'] as const) {
    it(`gives mixedModelData's deviance and estimates on the same rows (Psi ${structure})`, () => {
      const groups = groupsOf(3);
      const reference = mixedModelData(groups);
      const flat = mixedModelDataOfRows(flatOf(groups));
      expect(flat.n).toBe(reference.n);
      const theta = structure === 'diagonal' ? [0.7, 1.3] : [0.7, -0.2, 1.3];
      for (const kind of ['ML', 'REML'] as const) {
        const d = profiledDeviance(flat, theta, structure, kind);
        expect(relative(d, profiledDeviance(reference, theta, structure, kind))).toBeLessThan(
          1e-12,
        );
      }
      const e = mixedModelEstimates(flat, theta, structure, 'ML')!;
      const r = mixedModelEstimates(reference, theta, structure, 'ML')!;
      e.fixed.forEach((v, i) => expect(relative(v, r.fixed[i])).toBeLessThan(1e-10));
      e.conditionalModes.forEach((g, i) =>
        g.effects.forEach((v, k) =>
          expect(Math.abs(v - r.conditionalModes[i].effects[k])).toBeLessThan(1e-9),
        ),
      );
    });
  }

  it('overwrites a target with new rows as a fresh call would', () => {
    const target = mixedModelDataOfRows(flatOf(groupsOf(3)));
    const again = mixedModelDataOfRows(flatOf(groupsOf(4)), target);
    expect(again).toBe(target);
    const fresh = mixedModelData(groupsOf(4));
    const theta = [0.9, 0.4];
    expect(
      relative(
        profiledDeviance(again, theta, 'diagonal', 'ML'),
        profiledDeviance(fresh, theta, 'diagonal', 'ML'),
      ),
    ).toBeLessThan(1e-12);
  });
});

describe('blockContrastProjection', () => {
  it('projectStrided gives project on a column stored with a stride', () => {
    const labels = ['a', 'a', 'b', 'c', 'c', 'c', 'b'];
    const column = [3, 5, 2, 9, 4, 1, 7];
    const viaProject = [...column];
    const p = blockContrastProjection(labels)!;
    p.project(
      (r) => viaProject[r],
      (r, v) => (viaProject[r] = v),
    );
    // The column at offset 1, stride 2, between values that must stay as they are.
    const strided = new Float64Array(1 + 2 * column.length).fill(-1);
    column.forEach((v, r) => (strided[1 + 2 * r] = v));
    p.projectStrided(strided, 1, 2);
    column.forEach((_, r) => {
      expect(Math.abs(strided[1 + 2 * r] - viaProject[r])).toBeLessThan(1e-12);
      expect(strided[2 * r]).toBe(-1);
    });
  });
});
