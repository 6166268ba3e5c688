/**
 * Checks of the trial's layout within each site-year (shared/table/siteYear): the same plot
 * number twice, block × rate cells with no plot, and rates with unequal numbers of usable
 * plots (which makes block-adjusted means differ from raw means); and, once per site, a site
 * whose plots come from several years.
 */
import { originalRef } from '../table/originalCell';
import { hasBlocks } from '../stats/hasBlocks';
import type { Plot, PlotTable } from '../table/plotTable';
import { describeRef, type QualityFinding } from '../table/qualityFinding';
import { siteYearsOf, type SiteYear } from '../table/siteYear';

/**
 * A plot's rate for a message: its treatment, the rate as typed in the sheet when it reads
 * otherwise than in kg N/ha (a sheet in lb/ac, or of product: the user finds the plots by the
 * number they wrote), and the rate in kg N/ha.
 * @example
 * rateLabel(plot) // 'rate “80” (89.7 kg N/ha)', or 'treatment 4 (150 kg N/ha)'
 */
function rateLabel(p: Plot): string {
  if (p.rateKgHa === null) return p.treatment !== null ? `treatment ${p.treatment}` : '';
  const kgValue = Math.round(p.rateKgHa * 10) / 10;
  const kg = `${kgValue} kg N/ha`;
  const typed = p.original.rate?.text.trim() ?? '';
  const asTyped = typed !== '' && Number(typed) !== kgValue ? `rate “${typed}”` : null;
  if (p.treatment !== null)
    return `treatment ${p.treatment} (${asTyped ? `${asTyped}, ` : ''}${kg})`;
  return asTyped ? `${asTyped} (${kg})` : kg;
}

/**
 * Checks duplicates, missing plots and replication per site.
 * @param table - the plot table
 * @returns findings naming the site, the plots and their cells
 * @example
 * checkDesign(table).find((f) => f.code === 'missing-plot')?.message
 * // 'Tarrowfield: block 3 has no plot of treatment 5 (201.7 kg N/ha); …'
 */
export function checkDesign(table: PlotTable): QualityFinding[] {
  const { siteYears, nameOf } = siteYearsOf(table);
  const out: QualityFinding[] = severalYears(siteYears);
  const bySite = new Map<string, Plot[]>();
  for (const p of table.plots) {
    const k = nameOf(p);
    if (!bySite.has(k)) bySite.set(k, []);
    bySite.get(k)!.push(p);
  }
  for (const [site, plots] of bySite) {
    // Duplicate plot labels within the site-year (the same number in another year is another plot).
    const byLabel = new Map<string, Plot[]>();
    for (const p of plots) {
      if (p.plotLabel === null) continue;
      if (!byLabel.has(p.plotLabel)) byLabel.set(p.plotLabel, []);
      byLabel.get(p.plotLabel)!.push(p);
    }
    for (const [, same] of byLabel) {
      if (same.length < 2) continue;
      const refs = same.map((p) => originalRef(p.original.plot!));
      out.push({
        code: 'duplicate-plot',
        severity: 'warning',
        message: `${site}: plot ${same[0].plotLabel} appears ${same.length} times (${refs.map(describeRef).join(', ')}); correct the plot numbers or exclude the wrong row.`,
        refs,
        site,
        plotIds: same.map((p) => p.id),
      });
    }
    // Missing block × rate cells.
    const withRate = plots.filter((p) => p.rateKgHa !== null);
    const rateKey = (p: Plot) => p.rateKgHa!.toFixed(6);
    const rates = new Map<string, Plot>();
    for (const p of withRate) if (!rates.has(rateKey(p))) rates.set(rateKey(p), p);
    // Only a site the rate + block model gives block terms (hasBlocks) has block × rate cells.
    const labels = withRate.map((p) => p.block);
    const blocks = hasBlocks(labels) ? [...new Set(labels as string[])] : [];
    if (blocks.length > 1) {
      const present = new Set(withRate.map((p) => `${p.block}|${rateKey(p)}`));
      for (const b of blocks) {
        for (const [rk, example] of rates) {
          if (present.has(`${b}|${rk}`)) continue;
          out.push({
            code: 'missing-plot',
            severity: 'warning',
            message: `${site}: block ${b} has no plot of ${rateLabel(example)}; the site is unbalanced, so block-adjusted means are used.`,
            refs: [],
            site,
          });
        }
      }
    }
    // Replication: usable plots per rate.
    const counts = new Map<string, { n: number; example: Plot }>();
    for (const p of withRate) {
      if (p.excluded !== null || p.yieldKgHa === null) continue;
      const c = counts.get(rateKey(p));
      if (c) c.n++;
      else counts.set(rateKey(p), { n: 1, example: p });
    }
    const ns = [...counts.values()].map((c) => c.n);
    if (ns.length > 1 && Math.min(...ns) !== Math.max(...ns)) {
      const most = Math.max(...ns);
      const short = [...counts.values()].filter((c) => c.n < most);
      out.push({
        code: 'unequal-replication',
        severity: 'warning',
        // A rate with one plot is that plot in every resample (resampling within rates), so the
        // optimum's interval carries none of its noise: said where it happens.
        message: `${site}: unequal replication — ${short.map((c) => `${rateLabel(c.example)} has ${c.n}`).join(', ')} usable plot${short.length === 1 && short[0].n === 1 ? '' : 's'} where the other rates have ${most}.${short.some((c) => c.n === 1) ? ' A rate with one plot is the same in every resample, so the optimum’s interval leaves its noise out and is narrower than the data warrant.' : ''}`,
        refs: [],
        site,
      });
    }
  }
  return out;
}

/**
 * One finding per site seen in several years: each year is its own site-year, named with the
 * year, and the years are compared in the across-site results.
 */
function severalYears(siteYears: readonly SiteYear[]): QualityFinding[] {
  const bySite = new Map<string, SiteYear[]>();
  for (const s of siteYears) {
    const list = bySite.get(s.site);
    if (list) list.push(s);
    else bySite.set(s.site, [s]);
  }
  return [...bySite.entries()]
    .filter(([, list]) => list.length > 1)
    .map(([site, list]) => ({
      code: 'site-in-several-years' as const,
      severity: 'info' as const,
      message: `${site} has plots from ${list.length} years (${list.map((s) => s.year ?? 'no year').join(', ')}); each year is analyzed as its own site-year (${list.map((s) => s.name).join(', ')}) with its own blocks and plots, and the years are compared across sites.`,
      refs: [],
    }));
}
