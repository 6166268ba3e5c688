/**
 * File bytes → plot table for a batch run: read every file, detect its
 * columns, apply the user's role overrides ("--map yield=Grain") and build the
 * table (the analysis runs the quality checks). Also reports the units the input used
 * (results are shown in them unless the user picks a system) and the mapping
 * in the flat form the provenance sheet lists. Pure: bytes in, values out.
 */
import { assignColumnRole } from './assignColumnRole';
import type { QualityFinding } from '../table/qualityFinding';
import type { CropId, PlotTable } from '../table/plotTable';
import type { DisplayUnits } from '../units/displayUnits';
import { buildPlotTable } from './buildPlotTable';
import {
  MAPPED_ROLES,
  ROLE_LABELS,
  openQuestion,
  questionSentence,
  type ColumnMapping,
  type HeaderUnit,
  type MappedRole,
} from './columnMapping';
import { detectColumns, headerSearchRows, type NamedHeaders } from './detectColumns';
import { normalizeHeader } from './headerWords';
import { ImportError } from './importError';
import { mappingEntries, type MappingEntry } from './mappingEntries';
import { readTrialFile } from './readTrialFile';
import { inputUnitsOf } from './inputUnits';
import type { RawWorkbook } from './rawWorkbook';
import { crops } from '../units/crops';
import type { ProductId } from '../units/products';
import { cropsNamed } from './cropsNamed';

/** Roles a user may assign with an override: every role a column can have. */
export const mappableRoles: readonly MappedRole[] = MAPPED_ROLES;

/** A user's "this header holds this role". */
export interface RoleOverride {
  role: MappedRole;
  header: string;
}

/** A user's "this role's column is in this unit" (the file's header names none, or a wrong one). */
export interface UnitOverride {
  role: MappedRole;
  unit: HeaderUnit;
}

export interface ImportedFiles {
  table: PlotTable;
  findings: QualityFinding[];
  mapping: MappingEntry[];
  /** Units of the first plots sheet's rate and yield columns, when they are rate/yield units. */
  inputUnits: DisplayUnits;
}

const norm = (s: string): string => s.trim().toLowerCase().replace(/\s+/g, ' ');

/**
 * When no sheet reads as plots, the reason with what the user can do: the first row that looks
 * like a header, and --map to name its columns (headers in words Plotrate does not know).
 */
function noPlotSheet(
  raws: readonly RawWorkbook[],
  mappings: readonly ColumnMapping[],
  sheets: readonly string[] | undefined,
): ImportError | null {
  const inUse = (s: ColumnMapping['sheets'][number]) => !sheets || sheets.includes(s.sheet);
  if (mappings.some((m) => m.sheets.some((s) => s.use === 'plots' && inUse(s)))) return null;
  const raw = raws[0];
  const sheet = raw?.sheets.find((s) => !s.hidden && (!sheets || sheets.includes(s.name)));
  if (!raw || !sheet) return null;
  const row = sheet.rows
    .slice(0, headerSearchRows)
    .find((r) => r.filter((c) => c?.kind === 'text' && c.text.trim() !== '').length >= 2);
  const cells = (row ?? []).flatMap((c) =>
    c?.kind === 'text' && c.text.trim() ? [c.text.trim()] : [],
  );
  const heard =
    cells.length > 0
      ? ` Its first header-like row reads ${cells
          .slice(0, 12)
          .map((t) => `"${t}"`)
          .join(', ')}.`
      : '';
  return new ImportError(
    'no-data',
    `${raws.map((r) => `"${r.file.name}"`).join(', ')}: no sheet reads as plots (no row names a yield or plot weight among columns Plotrate knows).${heard} Name the columns with --map, e.g. --map yield="Grain header" rate="Rate header" site=Farm block=Rep.`,
    { file: raw.file.name, ...(sheet.name ? { sheet: sheet.name } : {}) },
  );
}

/** The --map headers, normalized as detection reads them, with their roles. */
function namedHeaders(overrides: readonly RoleOverride[]): NamedHeaders {
  const named = new Map<string, Exclude<MappedRole, 'ignore'>>();
  for (const o of overrides) if (o.role !== 'ignore') named.set(normalizeHeader(o.header), o.role);
  return named;
}

/** Applies overrides to one file's mapping; returns the headers that matched. */
function applyOverrides(mapping: ColumnMapping, overrides: readonly RoleOverride[]): Set<string> {
  const matched = new Set<string>();
  for (const sheet of mapping.sheets) {
    if (sheet.use !== 'plots') continue;
    for (const o of overrides) {
      const col = sheet.columns.find((c) => norm(c.header) === norm(o.header));
      if (!col) continue;
      matched.add(norm(o.header));
      // One column per role (roleTakesOneColumn): the one named wins.
      sheet.columns = assignColumnRole(sheet.columns, col.col, o.role, {
        chosen: () => `set by the user (--map ${o.role}=${o.header})`,
        setAside: `set aside: --map ${o.role}=${o.header} names another column`,
      });
      if (o.role === 'site') sheet.site = { from: 'column' };
    }
  }
  return matched;
}

/** Gives each role's column in every plots sheet the user's unit; returns the roles that matched. */
function applyUnits(mapping: ColumnMapping, units: readonly UnitOverride[]): Set<MappedRole> {
  const matched = new Set<MappedRole>();
  for (const sheet of mapping.sheets) {
    if (sheet.use !== 'plots') continue;
    for (const u of units) {
      const col = sheet.columns.find((c) => c.role === u.role);
      if (!col) continue;
      matched.add(u.role);
      sheet.columns = sheet.columns.map((c) =>
        c === col ? { ...c, unit: u.unit, evidence: `${c.evidence}; unit set by the user` } : c,
      );
    }
  }
  return matched;
}

/** The command-line words that settle an open question: one --map (and unit) per reading. */
function questionAnswers(
  mapping: ColumnMapping,
  file: string,
  sheets: readonly string[] | undefined,
): ImportError | null {
  for (const sheet of mapping.sheets) {
    if (sheets && !sheets.includes(sheet.sheet)) continue;
    const asked = openQuestion(sheet);
    if (!asked?.question) continue;
    const header = asked.header.includes(' ') ? `"${asked.header}"` : asked.header;
    const ways = asked.question.readings.map(
      (r) => `--map ${r.role}=${header} --column-unit ${r.role}=${r.unit}`,
    );
    return new ImportError(
      'column-needs-answer',
      `${questionSentence(file, sheet, asked)}: ${ways.join(', or ')}.`,
      { file, sheet: sheet.sheet, cell: `${asked.letter}${sheet.headerRow}` },
    );
  }
  return null;
}

/**
 * The crop the files name when the user gave none: the crop most of their plots sheets name
 * (sheet name, title rows, a crop column or the file name; detectColumns), else corn, said in an
 * info finding. One run analyses one crop: sheets naming another are left out (buildPlotTable).
 */
function cropOfFiles(
  raws: readonly RawWorkbook[],
  mappings: readonly ColumnMapping[],
  sheets: readonly string[] | undefined,
): CropChoice {
  const named = cropsNamed(
    mappings.map((mapping, i) => ({ name: raws[i].file.name, mapping })),
    sheets,
  );
  if (named.length === 0)
    return {
      crop: 'corn',
      finding: {
        code: 'crop-from-files',
        severity: 'info',
        message:
          'No file names its crop, so the crop is taken as corn (maize), whose bushel weight and standard moisture apply; give --crop if it is another.',
        refs: [],
      },
    };
  // The crop most sheets name (the first named on a tie); sheets of another crop are left out
  // by buildPlotTable, each with its own finding.
  const [first, ...others] = named;
  const crop = first.crop;
  const rest = others.map((c) => c.crop);
  return {
    crop,
    finding: {
      code: 'crop-from-files',
      severity: 'info',
      message: `The crop is ${crops(crop).label.toLowerCase()}, as ${first.where} names it${rest.length ? `; sheets naming ${rest.join(', ')} are left out (give --crop ${rest[0]} to analyse them)` : ''}; give --crop to choose another.`,
      refs: [],
    },
  };
}

interface CropChoice {
  crop: CropId;
  finding: QualityFinding | null;
}

/** A batch run's rates are of N where a header does not say (a product is named with --map). */
const BATCH_RATE_BASIS = 'nutrient';

/**
 * Reads trial files into one plot table.
 * @param files - names (no directories needed) and bytes of each file
 * @param options - the crop, role overrides, sheets to import (default every plots sheet) and
 *   the plot area where sheets of plot weights give none
 * @returns the table, import findings, the mapping as used and the input's units
 * @throws {ImportError} for an unreadable file, an override naming a header no file has, or a
 *   mapping that cannot build plots; the message names the file, sheet and cell
 * @example
 * const { table } = await importFiles([{ name: 'trial.csv', bytes }], { crop: 'corn', overrides: [] });
 */
export async function importFiles(
  files: readonly { name: string; bytes: Uint8Array }[],
  options: {
    /** The crop, or null to read it from the files (one crop named: that one; none: corn). */
    crop: CropId | null;
    overrides: readonly RoleOverride[];
    units?: readonly UnitOverride[];
    sheets?: string[];
    /** Every plot's area, m², for sheets of plot weights without an area column (--plot-area). */
    plotAreaM2?: number;
    /** The product of rates of product that no header, column or key names (--product). */
    product?: ProductId;
    /**
     * Whether every yield column was weighed at harvest moisture or is at standard moisture
     * (--yield-moisture); default as detected (detectColumns).
     */
    yieldMoisture?: 'harvest' | 'standard';
  },
): Promise<ImportedFiles> {
  const raws = [];
  const mappings: ColumnMapping[] = [];
  const matched = new Set<string>();
  const unitMatched = new Set<MappedRole>();
  for (const f of files) {
    const raw = await readTrialFile({ name: f.name, bytes: f.bytes });
    // The headers named with --map count as known, so a sheet in words Plotrate does not know
    // is still found (its header row, then the roles the user gave).
    const mapping = detectColumns(raw, namedHeaders(options.overrides));
    for (const h of applyOverrides(mapping, options.overrides)) matched.add(h);
    for (const r of applyUnits(mapping, options.units ?? [])) unitMatched.add(r);
    if (options.yieldMoisture)
      for (const sheet of mapping.sheets)
        for (const c of sheet.columns)
          if (c.role === 'yield') c.moistureBasis = options.yieldMoisture;
    raws.push(raw);
    mappings.push(mapping);
  }
  for (const u of options.units ?? []) {
    if (!unitMatched.has(u.role))
      throw new ImportError(
        'bad-mapping',
        `--column-unit ${u.role}=${u.unit}: no plot sheet in ${files.map((f) => `"${f.name}"`).join(', ')} has a ${ROLE_LABELS[u.role].toLowerCase()} column; give one with --map ${u.role}=Header.`,
        { file: files[0]?.name ?? '' },
      );
  }
  raws.forEach((raw, i) => {
    const asked = questionAnswers(mappings[i], raw.file.name, options.sheets);
    if (asked) throw asked;
  });
  for (const o of options.overrides) {
    if (matched.has(norm(o.header))) continue;
    const headers = [
      ...new Set(
        mappings.flatMap((m) =>
          m.sheets.filter((s) => s.use === 'plots').flatMap((s) => s.columns.map((c) => c.header)),
        ),
      ),
    ];
    throw new ImportError(
      'bad-mapping',
      `--map ${o.role}=${o.header}: no plot sheet in ${files.map((f) => `"${f.name}"`).join(', ')} has a column headed "${o.header}". The headers are: ${headers.map((h) => `"${h}"`).join(', ')}.`,
      { file: files[0]?.name ?? '' },
    );
  }
  const noPlots = noPlotSheet(raws, mappings, options.sheets);
  if (noPlots) throw noPlots;
  const chosen: CropChoice = options.crop
    ? { crop: options.crop, finding: null }
    : cropOfFiles(raws, mappings, options.sheets);
  const { table, findings } = buildPlotTable(raws, mappings, {
    crop: chosen.crop,
    rateBasis: BATCH_RATE_BASIS,
    ...(options.sheets ? { sheets: options.sheets } : {}),
    ...(options.plotAreaM2 !== undefined ? { plotAreaM2: options.plotAreaM2 } : {}),
    ...(options.product ? { product: options.product } : {}),
  });
  if (chosen.finding) findings.unshift(chosen.finding);
  const entries = mappingEntries(
    raws.map((raw, i) => ({ file: raw.file.name, mapping: mappings[i] })),
    options.sheets,
    {
      rateBasis: BATCH_RATE_BASIS,
      ...(options.product ? { product: options.product } : {}),
      standardMoisturePct: table.standardMoisturePct,
    },
  );
  const inputUnits = inputUnitsOf(mappings, options.sheets);
  return { table, findings, mapping: entries, inputUnits };
}
