/**
 * A rate × source (or × timing, × placement) site split into its levels. The trade designs such
 * a trial with one zero-rate check shared by every level: a check plot received no product at
 * all, so whatever its factor cell says (blank, "none", "check" or a level's name), it belongs to
 * every level, and each level's curve starts from the same check. A fertilized plot belongs to
 * the level its factor cell names; one with a blank cell belongs to none and is listed.
 */
import type { SitePlots } from './sitePlots';

/** One level's plots: its fertilized plots and every check plot of the site. */
export interface LevelPlots {
  /** The factor's column header, e.g. "Timing". */
  factor: string;
  /** The level as written in the sheet, e.g. "Split". */
  level: string;
  /** The level's plots as a site of their own (name "Site (Timing: Split)"), kg/ha. */
  plots: SitePlots;
  /** How many of them are shared checks (rate 0). */
  checkPlots: number;
}

/** A site's levels, and the fertilized plots that name no level. */
export interface SiteLevelSplit {
  factor: string;
  levels: LevelPlots[];
  /** Plot ids of fertilized plots whose factor cell is blank (in no level). */
  withoutLevel: string[];
  /** Each analyzable plot's level index (−1: a shared check; −2: no level), in the site's order. */
  levelIndex: Int32Array;
}

/** The display name of one level of a site, unique within a run. */
export function levelSiteName(site: string, factor: string, level: string): string {
  return `${site} (${factor}: ${level})`;
}

/**
 * Splits one site's plots into the levels of a treatment factor.
 * @param site - the site's analyzable plots (sitePlots), kg/ha
 * @param factor - the factor's column header
 * @param levelOf - the factor cell of a plot, by plot id (null or "" when blank)
 * @returns the levels in first-seen order among fertilized plots (none when fewer than two),
 *   each with every check plot, and the fertilized plots without a level
 * @example
 * const split = splitSiteLevels(site, 'Timing', (id) => byId.get(id)?.groups.Timing ?? null);
 * split.levels.map((l) => l.level) // ['At planting', 'Split']
 */
export function splitSiteLevels(
  site: SitePlots,
  factor: string,
  levelOf: (plotId: string) => string | null,
): SiteLevelSplit {
  const n = site.rateKgHa.length;
  const names: string[] = [];
  const levelIndex = new Int32Array(n);
  const withoutLevel: string[] = [];
  for (let i = 0; i < n; i++) {
    if (site.rateKgHa[i] === 0) {
      levelIndex[i] = -1;
      continue;
    }
    const text = (levelOf(site.plotIds[i]) ?? '').trim();
    if (text === '') {
      levelIndex[i] = -2;
      withoutLevel.push(site.plotIds[i]);
      continue;
    }
    let k = names.indexOf(text);
    if (k < 0) k = names.push(text) - 1;
    levelIndex[i] = k;
  }
  if (names.length < 2) return { factor, levels: [], withoutLevel, levelIndex };
  const levels = names.map((level, k): LevelPlots => {
    const members: number[] = [];
    for (let i = 0; i < n; i++) if (levelIndex[i] === k || levelIndex[i] === -1) members.push(i);
    const pick = <T>(a: ArrayLike<T>) => members.map((i) => a[i]);
    return {
      factor,
      level,
      checkPlots: members.filter((i) => levelIndex[i] === -1).length,
      plots: {
        ...site,
        site: levelSiteName(site.site, factor, level),
        rateKgHa: Float64Array.from(pick(site.rateKgHa)),
        yieldKgHa: Float64Array.from(pick(site.yieldKgHa)),
        block: pick(site.block),
        plotIds: pick(site.plotIds),
        groups: { ...site.groups, [factor]: level },
      },
    };
  });
  return { factor, levels, withoutLevel, levelIndex };
}
