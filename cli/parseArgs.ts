/**
 * The command line's words → a typed command. Every mistake becomes a
 * UsageError whose one line says which option and what is allowed.
 */
// The roles come from their owner, not from importFiles (which re-exports them): this
// module loads on every start, and importFiles would bring the whole import code.
import {
  EMPTY_PAGE_FIELDS,
  PAGE_FIELD_MAX_CHARS,
  PAGE_FIELD_NAMES,
  type PageFieldName,
  type PageFields,
} from '../shared/report/pageFields';
import { ANALYSIS_DEFAULTS } from '../shared/analysis/analysisSettings';
import {
  MAPPED_ROLES,
  UNITS_BY_ROLE,
  type HeaderUnit,
  type MappedRole,
} from '../shared/import/columnMapping';
import type { RoleOverride, UnitOverride } from '../shared/import/importFiles';
import type { CropId } from '../shared/table/plotTable';
import { areaToM2, type AreaUnit } from '../shared/units/convertYield';
import { cropIds, isCropId } from '../shared/units/crops';
import { productFromText, productIds, type ProductId } from '../shared/units/products';
import { UsageError } from './usageError';

export interface AnalyzeArgs {
  command: 'analyze';
  files: string[];
  out: string | null;
  pdf: string | null;
  json: string | null;
  /** The crop, or null: read from the files (corn when none names one). */
  crop: CropId | null;
  units: 'us' | 'metric' | null;
  grainPrice: number | null;
  nutrientPrice: number | null;
  /** The prices' currency, an ISO 4217 code (USD, EUR, CAD, …), written on every amount. */
  currency: string;
  product: ProductId | null;
  productPrice: number | null;
  boot: number;
  seed: number;
  /** Threads that draw the resamples; null: one per core once a run has many sites. */
  threads: number | null;
  blocks: 'none' | 'fixed';
  map: RoleOverride[];
  /**
   * A treatment level's own N price (--level-price Split=0.62), per lb of N with lb/ac rates or
   * per kg of N, as --nutrient-price; level name → price.
   */
  levelPrices: Record<string, number>;
  /** The unit of a role's column, where the file does not say it (--column-unit plotWeight=kg). */
  columnUnits: UnitOverride[];
  /** Grower, advisor, field and season printed on the grower pages (--page-field grower=…). */
  pageFields: PageFields;
  /**
   * Shortfall tolerance of the risk tables in money per acre (lb/ac output) or per hectare;
   * null: the default, the cost of 10 kg N/ha at the prices.
   */
  shortfallTolerance: number | null;
  /**
   * Most sites a run draws a chart for, per site, in the workbook and the PDF (the regional chart
   * is always drawn); past it the outputs say that the site charts were left out.
   */
  siteChartLimit: number;
  /** Every plot's area, m², for sheets of plot weights with no area column (--plot-area); null: none. */
  plotAreaM2: number | null;
  /** Whether every yield column was weighed at harvest moisture or is at standard moisture; null: as detected. */
  yieldMoisture: 'harvest' | 'standard' | null;
}

/**
 * Default of `--site-charts`: the most sites a run draws a chart for. Drawing is most of the
 * time of a big run with --out or --pdf, and the charts most of its memory (README, Benchmarks).
 */
export const SITE_CHART_LIMIT = 1000;

/**
 * The analyze command's settings before any option is read: no outputs, corn,
 * the input's own units, no prices, the analysis defaults the workspace also uses
 * (ANALYSIS_DEFAULTS: 200 bootstrap resamples with seed 1, block offsets wherever a site's
 * plots all carry a block label), no role overrides.
 * @param files - the input files
 * @returns a fresh AnalyzeArgs (the map list is the caller's own)
 * @example
 * analyzeDefaults(['a.csv']).boot // 200
 */
export function analyzeDefaults(files: string[] = []): AnalyzeArgs {
  return {
    command: 'analyze',
    files,
    out: null,
    pdf: null,
    json: null,
    crop: null,
    units: null,
    grainPrice: null,
    currency: 'USD',
    nutrientPrice: null,
    product: null,
    productPrice: null,
    boot: ANALYSIS_DEFAULTS.resamples,
    seed: ANALYSIS_DEFAULTS.seed,
    threads: null,
    blocks: 'fixed',
    map: [],
    levelPrices: {},
    columnUnits: [],
    pageFields: { ...EMPTY_PAGE_FIELDS },
    shortfallTolerance: null,
    siteChartLimit: SITE_CHART_LIMIT,
    plotAreaM2: null,
    yieldMoisture: null,
  };
}

export type Command =
  AnalyzeArgs | { command: 'demo'; dir: string } | { command: 'help' } | { command: 'version' };

function number(
  option: string,
  text: string | undefined,
  rule: (v: number) => boolean,
  what: string,
): number {
  if (text === undefined || text.startsWith('--'))
    throw new UsageError(`${option} needs a value: ${what}.`);
  const v = Number(text);
  if (!Number.isFinite(v) || !rule(v)) throw new UsageError(`${option} ${text}: ${what}.`);
  return v;
}

/**
 * The whole number an option is given, from `lo` to `hi`.
 * @throws {UsageError} as number(), saying "a whole number from lo to hi"
 */
function wholeNumber(option: string, text: string | undefined, lo: number, hi: number): number {
  const rule = (v: number) => Number.isInteger(v) && v >= lo && v <= hi;
  return number(option, text, rule, `a whole number from ${lo} to ${hi}`);
}

/**
 * `--plot-area`'s value in m²: a positive number, in m² or followed by a unit (m2, ft2, ha, ac).
 * @throws {UsageError} for a missing value, a number that is not positive or an unknown unit
 */
function plotAreaM2(text: string | undefined): number {
  const what = 'a plot area, e.g. 55.7 (m²) or 600ft2; units m2, ft2, ha, ac';
  if (text === undefined || text.startsWith('--'))
    throw new UsageError(`--plot-area needs a value: ${what}.`);
  const m = /^\s*([0-9]*\.?[0-9]+(?:e[+-]?\d+)?)\s*(m2|m²|ft2|ft²|ha|ac)?\s*$/i.exec(text);
  const area = m ? Number(m[1]) : NaN;
  if (!m || !(area > 0)) throw new UsageError(`--plot-area ${text}: ${what}.`);
  const unit = (m[2] ?? 'm2').toLowerCase().replace('²', '2') as AreaUnit;
  return areaToM2(area, unit);
}

/**
 * Parses the arguments after `plotrate`.
 * @param argv - the words, e.g. process.argv.slice(2)
 * @returns the command
 * @throws {UsageError} for an unknown command or option, a missing or bad value, or conflicting options
 * @example
 * parseArgs(['analyze', 'a.csv', '--units', 'us']).command // 'analyze'
 */
export function parseArgs(argv: readonly string[]): Command {
  if (argv.length === 0 || argv.includes('--help') || argv.includes('-h') || argv[0] === 'help')
    return { command: 'help' };
  if (argv[0] === '--version' || argv[0] === '-v') return { command: 'version' };
  const [cmd, ...rest] = argv;
  if (cmd === 'demo') {
    let dir = 'plotrate-demo';
    for (let i = 0; i < rest.length; i++) {
      if (rest[i] === '--dir') {
        const v = rest[++i];
        if (!v || v.startsWith('--')) throw new UsageError('--dir needs a folder name.');
        dir = v;
      } else throw new UsageError(`Unknown option for demo: ${rest[i]} (only --dir DIR).`);
    }
    return { command: 'demo', dir };
  }
  if (cmd !== 'analyze') {
    throw new UsageError(
      `Unknown command "${cmd}"; use "plotrate analyze FILE..." or "plotrate demo" (see plotrate --help).`,
    );
  }
  const a = analyzeDefaults();
  const path = (option: string, v: string | undefined): string => {
    if (!v || v.startsWith('--')) throw new UsageError(`${option} needs a file name.`);
    return v;
  };
  const positive = (v: number): boolean => v > 0;
  for (let i = 0; i < rest.length; i++) {
    const w = rest[i];
    switch (w) {
      case '--':
        // Everything after "--" is a file, even a name that starts with a dash.
        a.files.push(...rest.slice(i + 1));
        i = rest.length;
        break;
      case '--out':
        a.out = path(w, rest[++i]);
        break;
      case '--pdf':
        a.pdf = path(w, rest[++i]);
        break;
      case '--json':
        a.json = path(w, rest[++i]);
        break;
      case '--crop': {
        const v = (rest[++i] ?? '').toLowerCase();
        if (!isCropId(v))
          throw new UsageError(`--crop ${v || '(missing)'}: use one of ${cropIds.join(', ')}.`);
        a.crop = v;
        break;
      }
      case '--units': {
        const v = rest[++i];
        if (v !== 'us' && v !== 'metric')
          throw new UsageError(`--units ${v ?? '(missing)'}: use us or metric.`);
        a.units = v;
        break;
      }
      case '--currency': {
        const v = (rest[++i] ?? '').trim().toUpperCase();
        // Three letters, as ISO 4217 writes them; the reports print its symbol where one exists.
        if (!/^[A-Z]{3}$/.test(v))
          throw new UsageError(
            `--currency ${v || '(missing)'}: give a three-letter currency code such as USD, EUR or CAD.`,
          );
        a.currency = v;
        break;
      }
      case '--grain-price':
        a.grainPrice = number(w, rest[++i], positive, 'a price above 0');
        break;
      case '--nutrient-price':
        a.nutrientPrice = number(w, rest[++i], positive, 'a price above 0');
        break;
      case '--product-price':
        a.productPrice = number(w, rest[++i], positive, 'a price above 0');
        break;
      case '--product': {
        const v = rest[++i] ?? '';
        const id = (productIds as readonly string[]).includes(v)
          ? (v as ProductId)
          : (productFromText(v)?.id ?? null);
        if (!id || id === 'nitrogen') {
          throw new UsageError(
            `--product ${v || '(missing)'}: use one of ${productIds.filter((p) => p !== 'nitrogen').join(', ')}.`,
          );
        }
        a.product = id;
        break;
      }
      case '--boot':
        a.boot = wholeNumber(w, rest[++i], 0, 100000);
        break;
      case '--seed':
        a.seed = wholeNumber(w, rest[++i], 0, 4294967295);
        break;
      case '--threads':
        a.threads = wholeNumber(w, rest[++i], 1, 256);
        break;
      case '--shortfall-tolerance':
        a.shortfallTolerance = number(w, rest[++i], (v) => v >= 0, 'an amount of 0 or more');
        break;
      case '--plot-area':
        a.plotAreaM2 = plotAreaM2(rest[++i]);
        break;
      case '--site-charts':
        a.siteChartLimit = number(
          w,
          rest[++i],
          (v) => Number.isInteger(v) && v >= 0,
          'the most sites to draw a chart for, a whole number (0 for none)',
        );
        break;
      case '--yield-moisture': {
        const v = rest[++i];
        if (v !== 'harvest' && v !== 'standard')
          throw new UsageError(`--yield-moisture ${v ?? '(missing)'}: use harvest or standard.`);
        a.yieldMoisture = v;
        break;
      }
      case '--blocks': {
        const v = rest[++i];
        if (v !== 'none' && v !== 'fixed')
          throw new UsageError(`--blocks ${v ?? '(missing)'}: use none or fixed.`);
        a.blocks = v;
        break;
      }
      case '--map': {
        let any = false;
        while (i + 1 < rest.length && !rest[i + 1].startsWith('--')) {
          const pair = rest[++i];
          const eq = pair.indexOf('=');
          const role = pair.slice(0, eq);
          const header = pair.slice(eq + 1).trim();
          if (eq < 1 || !header)
            throw new UsageError(`--map ${pair}: write role=Header, e.g. --map yield=Grain.`);
          if (!(MAPPED_ROLES as readonly string[]).includes(role)) {
            throw new UsageError(
              `--map ${pair}: "${role}" is not a role; use one of ${MAPPED_ROLES.join(', ')}.`,
            );
          }
          a.map.push({ role: role as MappedRole, header });
          any = true;
        }
        if (!any) throw new UsageError('--map needs at least one role=Header.');
        break;
      }
      case '--page-field': {
        const pair = rest[++i] ?? '';
        const eq = pair.indexOf('=');
        const name = pair.slice(0, eq).trim() as PageFieldName;
        const text = pair.slice(eq + 1).trim();
        if (eq < 1 || !PAGE_FIELD_NAMES.includes(name))
          throw new UsageError(
            `--page-field ${pair || '(missing)'}: write name=text with a name of ${PAGE_FIELD_NAMES.join(', ')}, e.g. --page-field "field=North 40".`,
          );
        if (text.length > PAGE_FIELD_MAX_CHARS)
          throw new UsageError(
            `--page-field ${name}: at most ${PAGE_FIELD_MAX_CHARS} characters; got ${text.length}.`,
          );
        a.pageFields[name] = text;
        break;
      }
      case '--level-price': {
        let any = false;
        while (i + 1 < rest.length && !rest[i + 1].startsWith('--')) {
          const pair = rest[++i];
          const eq = pair.lastIndexOf('=');
          const level = pair.slice(0, eq).trim();
          const price = Number(pair.slice(eq + 1));
          if (eq < 1 || !level || !(Number.isFinite(price) && price > 0))
            throw new UsageError(
              `--level-price ${pair}: write Level=price with a price above 0, e.g. --level-price Split=0.62.`,
            );
          a.levelPrices[level] = price;
          any = true;
        }
        if (!any) throw new UsageError('--level-price needs at least one Level=price.');
        break;
      }
      case '--column-unit': {
        let any = false;
        while (i + 1 < rest.length && !rest[i + 1].startsWith('--')) {
          const pair = rest[++i];
          const eq = pair.indexOf('=');
          const role = pair.slice(0, eq) as MappedRole;
          const unit = pair.slice(eq + 1).trim();
          const units = UNITS_BY_ROLE[role];
          if (eq < 1 || !unit)
            throw new UsageError(
              `--column-unit ${pair}: write role=unit, e.g. --column-unit plotWeight=kg.`,
            );
          if (!units)
            throw new UsageError(
              `--column-unit ${pair}: "${role}" is not a role with a unit; use one of ${Object.keys(UNITS_BY_ROLE).join(', ')}.`,
            );
          if (!(units as readonly string[]).includes(unit))
            throw new UsageError(
              `--column-unit ${pair}: a ${role} column takes ${units.join(', ')}.`,
            );
          a.columnUnits.push({ role, unit: unit as HeaderUnit });
          any = true;
        }
        if (!any) throw new UsageError('--column-unit needs at least one role=unit.');
        break;
      }
      default:
        if (w.startsWith('-'))
          throw new UsageError(
            `Unknown option ${w} (see plotrate --help; write -- before a file whose name starts with a dash).`,
          );
        a.files.push(w);
    }
  }
  if (a.files.length === 0)
    throw new UsageError('analyze needs at least one trial file (.xlsx, .csv or .tsv).');
  if (a.nutrientPrice !== null && (a.product !== null || a.productPrice !== null)) {
    throw new UsageError(
      'Give either --nutrient-price or --product with --product-price, not both.',
    );
  }
  if ((a.product === null) !== (a.productPrice === null)) {
    throw new UsageError(
      '--product and --product-price go together: name the product and its price.',
    );
  }
  return a;
}
