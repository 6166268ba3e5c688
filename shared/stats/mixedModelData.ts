/**
 * The sufficient statistics of a linear mixed model y = Xβ + Zb + ε with one
 * grouping factor, b_i ~ N(0, Ψ) per group and ε ~ N(0, σ²I): every quantity
 * the profiled deviance needs is a cross-product (XᵀX, XᵀZ_i, Z_iᵀZ_i, Z_iᵀy_i,
 * Xᵀy, yᵀy), so the rows are read once here and never again.
 *
 * Groups whose Z_iᵀZ_i and Z_iᵀX_i agree (sites with the same rates and plots,
 * the usual case in a trial series) share one Cholesky factor per evaluation of
 * the deviance; they are gathered into classes that keep Σ Z_iᵀy_i and
 * Σ (Z_iᵀy_i)(Z_iᵀy_i)ᵀ, so one evaluation costs O(classes), not O(groups).
 * Class membership is decided on the cross-products written to 12 significant
 * digits; the class then uses its first member's cross-products, which differ
 * from the others' by rounding only.
 *
 * Offsets within a group (blocks nested in a site, as fixed effects) are
 * absorbed: every column and y are projected off C, the group's b − 1
 * sum-to-zero block contrasts (shared/stats/blockContrastProjection),
 * a ↦ a − C(CᵀC)⁻¹Cᵀa; in a balanced group that is a − ā_block + ā_group.
 * This is the same as fitting those contrasts of every group as fixed effects
 * (Frisch–Waugh–Lovell for β; for the REML criterion, both are likelihoods of
 * the same error contrasts, so they differ by ½·log|CᵀC| summed over groups, a
 * constant of the layout). The contrasts sum to zero over blocks, so the
 * group's unweighted mean of block means stays in the data and the intercept
 * stays estimable. Each absorbed contrast removes one observation from n.
 */
import { StatsInputError, assertFinite } from './errors';
import { blockContrastProjection } from './blockContrastProjection';

/** One group (site-year) of a mixed model's data. */
export interface MixedModelGroup {
  /** How reports name the group. */
  name: string;
  /** Rows of the fixed-effects design X, each of the same length p. */
  fixedRows: readonly (readonly number[])[];
  /** Rows of the random-effects design Z, each of the same length q. */
  randomRows: readonly (readonly number[])[];
  /** The response, one value per row. */
  y: readonly number[];
  /** Optional block label per row: fixed block offsets within this group, absorbed. */
  blocks?: readonly string[];
}

/** Cross-products shared by the groups of one class. */
export interface MixedModelClass {
  /** How many groups share these cross-products. */
  count: number;
  /** ZᵢᵀZᵢ, q × q row-major. */
  ztz: Float64Array;
  /** ZᵢᵀXᵢ, q × p row-major. */
  ztx: Float64Array;
  /** Σ over the class of Zᵢᵀyᵢ, length q. */
  sumZty: Float64Array;
  /** Σ over the class of (Zᵢᵀyᵢ)(Zᵢᵀyᵢ)ᵀ, q × q row-major. */
  sumZtyZty: Float64Array;
}

/** The data of a mixed model reduced to what the deviance reads. */
export interface MixedModelData {
  /** Fixed effects. */
  p: number;
  /** Random effects per group. */
  q: number;
  /** Observations, less one per absorbed block contrast. */
  n: number;
  /** XᵀX, p × p row-major. */
  xtx: Float64Array;
  /** Xᵀy, length p. */
  xty: Float64Array;
  /** yᵀy. */
  yty: number;
  classes: MixedModelClass[];
  /** For each group: its name, its class and its own Zᵢᵀyᵢ (for the conditional modes). */
  groups: { name: string; classIndex: number; zty: Float64Array }[];
}

/**
 * Reduces the rows of every group to cross-products.
 * @param groups - the groups, at least one, each with as many rows of X and Z as values of y
 * @returns the cross-products, with groups of equal ZᵀZ and ZᵀX gathered into classes
 * @throws {StatsInputError} "too-few-points" with no group; "length-mismatch" when rows or
 *   row lengths disagree; "non-finite" for a value that is not a finite number
 * @example
 * const data = mixedModelData([{ name: 'A', fixedRows: [[1], [1]], randomRows: [[1], [1]], y: [3, 5] }]);
 * data.xty // Float64Array [8]
 */
export function mixedModelData(groups: readonly MixedModelGroup[]): MixedModelData {
  if (groups.length === 0) {
    throw new StatsInputError('too-few-points', 'groups: a mixed model needs at least one group.');
  }
  const p = groups[0].fixedRows[0]?.length ?? 0;
  const q = groups[0].randomRows[0]?.length ?? 0;
  if (p === 0 || q === 0) {
    throw new StatsInputError('bad-argument', 'groups: the first group has no rows or empty rows.');
  }
  const xtx = new Float64Array(p * p);
  const xty = new Float64Array(p);
  let yty = 0;
  let n = 0;
  const classes: MixedModelClass[] = [];
  const classByKey = new Map<string, number>();
  const groupStats: MixedModelData['groups'] = [];
  for (const group of groups) {
    const rows = absorbedRows(group, p, q);
    n += rows.effectiveRows;
    const ztz = new Float64Array(q * q);
    const ztx = new Float64Array(q * p);
    const zty = new Float64Array(q);
    for (let r = 0; r < rows.y.length; r++) {
      const x = rows.x[r];
      const z = rows.z[r];
      const yr = rows.y[r];
      yty += yr * yr;
      for (let i = 0; i < p; i++) {
        xty[i] += x[i] * yr;
        for (let j = 0; j < p; j++) xtx[i * p + j] += x[i] * x[j];
      }
      for (let i = 0; i < q; i++) {
        zty[i] += z[i] * yr;
        for (let j = 0; j < q; j++) ztz[i * q + j] += z[i] * z[j];
        for (let j = 0; j < p; j++) ztx[i * p + j] += z[i] * x[j];
      }
    }
    const key = [...ztz, ...ztx].map((v) => v.toPrecision(12)).join(',');
    let classIndex = classByKey.get(key);
    if (classIndex === undefined) {
      classIndex = classes.length;
      classByKey.set(key, classIndex);
      classes.push({
        count: 0,
        ztz,
        ztx,
        sumZty: new Float64Array(q),
        sumZtyZty: new Float64Array(q * q),
      });
    }
    const target = classes[classIndex];
    target.count++;
    for (let i = 0; i < q; i++) {
      target.sumZty[i] += zty[i];
      for (let j = 0; j < q; j++) target.sumZtyZty[i * q + j] += zty[i] * zty[j];
    }
    groupStats.push({ name: group.name, classIndex, zty });
  }
  return { p, q, n, xtx, xty, yty, classes, groups: groupStats };
}

/**
 * Every group's rows in flat arrays, block offsets already projected out: group g owns rows
 * start[g] to start[g + 1] − 1, row r of X at x[r·p … r·p + p − 1], of Z at z[r·q …].
 */
export interface FlatMixedModelRows {
  p: number;
  q: number;
  names: readonly string[];
  /** First row of each group, and the total row count last (length groups + 1). */
  start: Int32Array;
  x: Float64Array;
  z: Float64Array;
  y: Float64Array;
  /** Observations less the absorbed block contrasts. */
  n: number;
}

/**
 * The cross-products of rows already absorbed, one class per group: for a model whose every
 * group has its own Z (the plateau forms' linearization at each site-year's own join), rebuilt
 * at every Gauss–Newton step, where gathering classes would find none and its keys would cost
 * more than the deviance saves. Writing into `target` (from an earlier call on rows of the same
 * shape) allocates nothing. The rows are not checked: the caller computed them.
 * @param rows - the groups' flat rows
 * @param target - optional data of the same groups and sizes to overwrite
 * @returns the cross-products, `target` when given
 * @example
 * const rows = { p: 1, q: 1, names: ['A'], start: Int32Array.of(0, 2), x: Float64Array.of(1, 1), z: Float64Array.of(1, 1), y: Float64Array.of(3, 5), n: 2 };
 * mixedModelDataOfRows(rows).xty // Float64Array [8]
 */
export function mixedModelDataOfRows(
  rows: FlatMixedModelRows,
  target?: MixedModelData,
): MixedModelData {
  const { p, q, x, z, y, start } = rows;
  const groupCount = rows.names.length;
  const data: MixedModelData = target ?? {
    p,
    q,
    n: rows.n,
    xtx: new Float64Array(p * p),
    xty: new Float64Array(p),
    yty: 0,
    classes: rows.names.map(() => ({
      count: 1,
      ztz: new Float64Array(q * q),
      ztx: new Float64Array(q * p),
      sumZty: new Float64Array(q),
      sumZtyZty: new Float64Array(q * q),
    })),
    groups: rows.names.map((name, g) => ({ name, classIndex: g, zty: new Float64Array(q) })),
  };
  const { xtx, xty } = data;
  xtx.fill(0);
  xty.fill(0);
  let yty = 0;
  for (let g = 0; g < groupCount; g++) {
    const c = data.classes[g];
    const { ztz, ztx } = c;
    const zty = data.groups[g].zty;
    ztz.fill(0);
    ztx.fill(0);
    zty.fill(0);
    for (let r = start[g]; r < start[g + 1]; r++) {
      const xr = r * p;
      const zr = r * q;
      const yr = y[r];
      yty += yr * yr;
      for (let i = 0; i < p; i++) {
        const xi = x[xr + i];
        xty[i] += xi * yr;
        for (let j = 0; j <= i; j++) xtx[i * p + j] += xi * x[xr + j];
      }
      for (let i = 0; i < q; i++) {
        const zi = z[zr + i];
        zty[i] += zi * yr;
        for (let j = 0; j <= i; j++) ztz[i * q + j] += zi * z[zr + j];
        for (let j = 0; j < p; j++) ztx[i * p + j] += zi * x[xr + j];
      }
    }
    for (let i = 0; i < q; i++) {
      for (let j = 0; j < i; j++) ztz[j * q + i] = ztz[i * q + j];
      c.sumZty[i] = zty[i];
      for (let j = 0; j < q; j++) c.sumZtyZty[i * q + j] = zty[i] * zty[j];
    }
  }
  for (let i = 0; i < p; i++) for (let j = 0; j < i; j++) xtx[j * p + i] = xtx[i * p + j];
  data.yty = yty;
  return data;
}

/** A group's rows after the block offsets are projected out, and how many observations remain. */
function absorbedRows(
  group: MixedModelGroup,
  p: number,
  q: number,
): { x: number[][]; z: number[][]; y: number[]; effectiveRows: number } {
  const m = group.y.length;
  if (group.fixedRows.length !== m || group.randomRows.length !== m) {
    throw new StatsInputError(
      'length-mismatch',
      `group ${group.name}: ${group.fixedRows.length} fixed rows, ${group.randomRows.length} random rows and ${m} values of y; they must pair up one to one.`,
    );
  }
  if (group.blocks !== undefined && group.blocks.length !== m) {
    throw new StatsInputError(
      'length-mismatch',
      `group ${group.name}: ${group.blocks.length} block labels for ${m} values of y.`,
    );
  }
  assertFinite(group.y, `group ${group.name}: y`);
  const x = group.fixedRows.map((row) => checkedRow(row, p, group.name, 'fixed'));
  const z = group.randomRows.map((row) => checkedRow(row, q, group.name, 'random'));
  const y = [...group.y];
  const projection = blockContrastProjection(group.blocks ?? []);
  if (projection === null) return { x, z, y, effectiveRows: m };
  const project = projection.project;
  for (let j = 0; j < p; j++)
    project(
      (r) => x[r][j],
      (r, v) => (x[r][j] = v),
    );
  for (let j = 0; j < q; j++)
    project(
      (r) => z[r][j],
      (r, v) => (z[r][j] = v),
    );
  project(
    (r) => y[r],
    (r, v) => (y[r] = v),
  );
  return { x, z, y, effectiveRows: m - projection.contrasts };
}

function checkedRow(
  row: readonly number[],
  length: number,
  group: string,
  which: 'fixed' | 'random',
): number[] {
  if (row.length !== length) {
    throw new StatsInputError(
      'length-mismatch',
      `group ${group}: a ${which}-effects row has ${row.length} values; every row needs ${length}.`,
    );
  }
  assertFinite(row, `group ${group}: ${which}-effects row`);
  return [...row];
}
