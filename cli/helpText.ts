/**
 * The text of `plotrate --help`, with the same cautions the reports carry.
 */
import { recommendationCautions } from '../shared/economics/recommendationCautions';
import { THREADS_FROM_SITES } from './drawThreads';
import { SITE_CHART_LIMIT } from './parseArgs';

/**
 * The help screen.
 * @param version - the app version
 * @returns the text, wrapped for an 80-column terminal
 */
export function helpText(version: string): string {
  return `plotrate ${version}: yield response to fertilizer rate for small-plot trials

Usage
  plotrate analyze FILE... [options]   analyze trial sheets (.xlsx, .csv, .tsv)
  plotrate demo [--dir DIR]            write the demo trial workbook and its report
  plotrate --help                      this text
  plotrate --version                   the version

Options for analyze
  --out FILE.xlsx        write the report workbook
  --pdf FILE.pdf         write the grower recommendations (one page per site
                         and one for the region; Letter with US units, A4 else)
  --json FILE.json       write the results (schema in README, "Results format")
  --crop NAME            corn, wheat, soybean, barley, sorghum, oats, canola;
                         default: the crop the files name (sheet or file name,
                         a title row, a crop column), else corn
  --units us|metric      show rates and yields in lb/ac and bu/ac, or kg/ha and
                         t/ha; default: the units of the input
  --page-field NAME=TEXT the grower pages' grower, field, season or advisor,
                         e.g. --page-field "field=North 40" (repeat for each)
  --currency CODE        the prices' currency, written on every amount: USD,
                         EUR, CAD, … (default USD)
  --grain-price N        grain price per bushel (bu/ac yields), per tonne
                         (t/ha), per kg (kg/ha) or per lb (lb/ac)
  --nutrient-price N     N price per lb of N (lb/ac rates) or per kg of N
  --product NAME --product-price N
                         price a product instead: urea, uan28, uan32,
                         anhydrous, ammoniumSulfate, ammoniumNitrate; the price
                         is per lb (lb/ac) or per kg of product, e.g. urea at
                         600 per short ton is 0.30 per lb
  --boot N               bootstrap resamples for the optimum interval
                         (default 200; 0 for none)
  --seed N               bootstrap seed (default 1): the same seed gives the
                         same interval
  --threads N            threads that draw the resamples (default: one per
                         core from ${THREADS_FROM_SITES} sites); any number gives the same results
  --blocks none|fixed    block offsets in the curves (default fixed: wherever
                         every plot of a site has a block label)
  --shortfall-tolerance N
                         money per acre (lb/ac rates) or per hectare by which a
                         rate may return less than the best before the risk
                         tables count it as falling short (default: the cost
                         of 10 kg N/ha at the prices)
  --plot-area N          every plot's area, for sheets of plot weights with no
                         area column: m² (55.7) or with a unit (600ft2, m2, ha,
                         ac)
  --yield-moisture harvest|standard
                         whether the yield columns were weighed at harvest
                         moisture (adjusted to the crop's standard with the
                         moisture column) or are already at standard
                         moisture; default: the header's words ("dry",
                         "adjusted", "@ 15%"), else harvest where a sheet has
                         a moisture column
  --site-charts N        draw each site's chart (workbook and PDF) when the run
                         has at most N sites (default ${SITE_CHART_LIMIT}; 0 for none); past
                         that the outputs say the site charts were left out
  --map role=Header ...  say which column holds what, e.g. --map yield=Grain
                         rate="N applied"; roles: site, year, block, plot,
                         treatment, rate, yield, moisture, exclude, notes,
                         plotWeight, plotArea, group, factor, ignore
                         factor: a treatment factor (source, timing,
                         placement…): each of its values gets its own curve
                         and recommendation, the zero-rate check plots shared
                         by all, e.g. --map factor=Source (a Timing column of
                         a plots sheet is taken as the factor by itself)
  --level-price Level=N ...
                         a factor level's own N price, as --nutrient-price,
                         e.g. --level-price "Stabilised urea=0.75"; other
                         levels take the run's N price
  --column-unit role=unit ...
                         the unit of a column whose header names none, e.g.
                         --column-unit plotWeight=kg yield=t/ha; rate: kg/ha,
                         lb/ac, g/m2; yield: kg/ha, t/ha, q/ha (quintals),
                         lb/ac, bu/ac, g/m2; plotWeight: kg, g, lb;
                         plotArea: m2, ft2, ha, ac

Without prices the run uses illustrative prices and every report says so.
A summary is printed either way; files are written only when asked for, and
never over an input file.

Exit codes
  0  done    1  the analysis failed    2  bad input or usage (the message
  names the file, sheet and cell to fix)

Cautions
${recommendationCautions.map((c) => wrap(`- ${c}`, 78, '  ')).join('\n')}
`;
}

function wrap(text: string, width: number, indent: string): string {
  const words = text.split(' ');
  const lines: string[] = [];
  let line = '';
  for (const w of words) {
    if (line && (line + ' ' + w).length > width) {
      lines.push(line);
      line = indent + w;
    } else {
      line = line ? `${line} ${w}` : w;
    }
  }
  if (line) lines.push(line);
  return lines.join('\n');
}
