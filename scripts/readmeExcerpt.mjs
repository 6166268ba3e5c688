// Prints the excerpt of a results file that README.md shows under "Results format": the
// settings, one site with two of its models and a few rows of its price-ratio and risk tables,
// and the across-site part with two site optima. Run after `plotrate demo`:
//   node scripts/readmeExcerpt.mjs plotrate-demo/demo-corn-results.json
// and paste its output into README.md's json block (it is formatted as prettier formats JSON).
import { readFileSync } from 'node:fs';
import prettier from 'prettier';

const file = process.argv[2];
if (!file) {
  process.stderr.write('usage: node scripts/readmeExcerpt.mjs RESULTS.json\n');
  process.exit(2);
}
const json = JSON.parse(readFileSync(file, 'utf8'));
const site = json.sites[0];
const keptModels = [site.bestModel, 'quadraticPlateau', 'linearPlateau'];
const models = site.models
  .filter((m) => keptModels.includes(m.model))
  .filter((m, i, all) => all.findIndex((x) => x.model === m.model) === i)
  .slice(0, 2);
// A few rows around the recommended one.
const around = (rows) => {
  const at = Math.max(
    0,
    rows.findIndex((r) => r.recommended),
  );
  return rows.slice(Math.max(0, at - 1), at + 2);
};
const ratios = (rows) => rows.filter((r) => r.ratioMultiplier === 1 || r.ratioMultiplier === 1.5);
const excerpt = {
  tool: json.tool,
  settings: json.settings,
  sites: [
    {
      ...site,
      models,
      priceRatioSensitivity: ratios(site.priceRatioSensitivity),
      shortfallRisk: site.shortfallRisk && {
        ...site.shortfallRisk,
        rows: around(site.shortfallRisk.rows),
      },
      warnings: site.warnings.slice(0, 1),
    },
  ],
  acrossSites: json.acrossSites && {
    ...json.acrossSites,
    siteOptima: json.acrossSites.siteOptima.slice(0, 2),
    priceRatioSensitivity: ratios(json.acrossSites.priceRatioSensitivity),
    shortfallRisk: json.acrossSites.shortfallRisk && {
      ...json.acrossSites.shortfallRisk,
      rows: around(json.acrossSites.shortfallRisk.rows),
    },
  },
};
process.stdout.write(await prettier.format(JSON.stringify(excerpt), { parser: 'json' }));
