import type { PlotrateProject, PlotrateProjectV1 } from './projectFormat';
import { PROJECT_FORMAT_VERSION } from './projectFormat';

/**
 * Bring a version 1 project to version 2:
 * - prices: `fertilizerPrice`, `grainPrice`, `currency` → `prices.nutrientPerKg`,
 *   `prices.grainPerKg`, `prices.currency` (both were already per kg);
 * - exclusions: each `{ plotId, reason }` of the separate list becomes that
 *   plot's `excluded = { reason, by: 'user' }`, unless the plot already carries
 *   an exclusion (the sheet's own, which wins because it is the source's word);
 *   an entry naming no plot is kept in the notes so no reason is lost;
 * - bootstrap `{ n, seed }` → `{ resamples: n, seed, confidenceLevel: 0.9 }`
 *   (version 1 always used 90 %);
 * - `view` did not exist: empty.
 *
 * @param v1 a checked version 1 project (not changed)
 * @returns the same project in version 2
 * @example migrateV1toV2(old).prices.nutrientPerKg === old.fertilizerPrice // true
 */
export function migrateV1toV2(v1: PlotrateProjectV1): PlotrateProject {
  const lost: string[] = [];
  let table = v1.table;
  if (table !== null) {
    const byId = new Map(v1.exclusions.map((e) => [e.plotId, e.reason]));
    const found = new Set<string>();
    table = {
      ...table,
      plots: table.plots.map((plot) => {
        const reason = byId.get(plot.id);
        if (reason === undefined) return plot;
        found.add(plot.id);
        return plot.excluded !== null ? plot : { ...plot, excluded: { reason, by: 'user' } };
      }),
    };
    for (const e of v1.exclusions) if (!found.has(e.plotId)) lost.push(`${e.plotId}: ${e.reason}`);
  } else {
    for (const e of v1.exclusions) lost.push(`${e.plotId}: ${e.reason}`);
  }
  const notes =
    lost.length === 0
      ? v1.notes
      : [v1.notes, 'Exclusions from the earlier file naming no imported plot:', ...lost]
          .filter((line) => line !== '')
          .join('\n');
  return {
    format: v1.format,
    version: PROJECT_FORMAT_VERSION,
    createdAt: v1.createdAt,
    savedAt: v1.savedAt,
    appVersion: v1.appVersion,
    sources: v1.sources,
    table,
    mapping: v1.mapping,
    units: v1.units,
    prices: { currency: v1.currency, nutrientPerKg: v1.fertilizerPrice, grainPerKg: v1.grainPrice },
    models: v1.models,
    bootstrap: { resamples: v1.bootstrap.n, seed: v1.bootstrap.seed, confidenceLevel: 0.9 },
    notes,
    view: {},
  };
}
