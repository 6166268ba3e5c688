import { MODEL_NAMES } from '../models/modelTypes';
import { rateUnits } from '../units/convertRate';
import { yieldUnits } from '../units/convertYield';
import { FieldReader, describe } from './fieldReader';
import { migrateV1toV2 } from './migrateProject';
import { ProjectFileError } from './projectFileError';
import {
  MAX_PRICE_PER_KG,
  MAX_PROJECT_FILE_BYTES,
  PROJECT_FORMAT_NAME,
  PROJECT_FORMAT_VERSION,
  type ColumnMappingJson,
  type JsonValue,
  type PlotrateProject,
  type PlotrateProjectV1,
  type ProjectModels,
  type ProjectUnits,
} from './projectFormat';
import { readPlotTable, readSources } from './readPlotTable';

/** A project read from a file, in the current version, and the version it was written in. */
export interface ParsedProject {
  project: PlotrateProject;
  /** The file's version when it was older (and so migrated), else null. */
  migratedFrom: number | null;
}

/**
 * Read a project file's text: check it is a Plotrate project, check every
 * field, and migrate an older version to the current one.
 *
 * @param text the file's contents (UTF-8 decoded; a leading byte-order mark is allowed)
 * @param where the file name as the user knows it, used in messages
 * @returns the project in the current version
 * @throws ProjectFileError 'not-json' for text that is not JSON, 'not-a-project'
 *   for JSON without the project format name, 'future-version' for a file from a
 *   newer Plotrate, 'invalid' naming the field otherwise
 * @example parseProject(serializeProject(p), 'a.plotrate').project // deep-equals p
 */
export function parseProject(text: string, where: string): ParsedProject {
  // UTF-16 length ≤ UTF-8 bytes, so a text over the cap in characters is over it in bytes too.
  if (text.length > MAX_PROJECT_FILE_BYTES)
    throw new ProjectFileError(
      'invalid',
      where,
      '',
      `is larger than the ${MAX_PROJECT_FILE_BYTES / 1024 / 1024} MiB a Plotrate project can be; it is damaged or not a project`,
    );
  let data: unknown;
  try {
    data = JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch (e) {
    const hint = text.trim() === '' ? 'the file is empty' : (e as Error).message;
    throw new ProjectFileError(
      'not-json',
      where,
      '',
      `is not a Plotrate project: it is not readable JSON (${hint}); it may be cut short or another kind of file`,
    );
  }
  const top = new FieldReader(where, '', data);
  if (
    typeof data !== 'object' ||
    data === null ||
    Array.isArray(data) ||
    top.field('format').value !== PROJECT_FORMAT_NAME
  ) {
    throw new ProjectFileError(
      'not-a-project',
      where,
      '',
      `is JSON but not a Plotrate project (it has no "format": "${PROJECT_FORMAT_NAME}")`,
    );
  }
  const versionField: FieldReader = top.field('version');
  const raw = versionField.value;
  if (typeof raw !== 'number' || !Number.isInteger(raw) || raw < 1)
    versionField.fail(`should be a whole number ≥ 1, found ${describe(raw)}`);
  const version = raw;
  if (version > PROJECT_FORMAT_VERSION) {
    throw new ProjectFileError(
      'future-version',
      where,
      'version',
      `was written by a newer Plotrate (file version ${version}, this Plotrate reads up to ${PROJECT_FORMAT_VERSION}); update Plotrate to open it — the file has not been changed`,
    );
  }
  if (version === 1) return { project: migrateV1toV2(readV1(top)), migratedFrom: 1 };
  return { project: readV2(top), migratedFrom: null };
}

function readCommon(top: FieldReader) {
  const mapping = top.field('mapping');
  const table = top.field('table');
  return {
    format: PROJECT_FORMAT_NAME,
    createdAt: top.field('createdAt').isoTime(),
    savedAt: top.field('savedAt').isoTime(),
    appVersion: top.field('appVersion').string(),
    sources: readSources(top.field('sources')),
    table: table.value === null ? null : readPlotTable(table),
    mapping:
      mapping.value === null ? null : (mapping.object(), mapping.json() as ColumnMappingJson),
    units: readUnits(top.field('units')),
    models: readModels(top.field('models')),
    notes: top.field('notes').string(),
  } as const;
}

function readV2(top: FieldReader): PlotrateProject {
  const prices = top.field('prices');
  const view = top.field('view');
  view.object();
  return {
    ...readCommon(top),
    version: PROJECT_FORMAT_VERSION,
    prices: {
      currency: prices.field('currency').string(),
      nutrientPerKg: price(prices.field('nutrientPerKg')),
      grainPerKg: price(prices.field('grainPerKg')),
    },
    bootstrap: readBootstrap(top.field('bootstrap')),
    view: view.json() as { [key: string]: JsonValue },
  };
}

function readV1(top: FieldReader): PlotrateProjectV1 {
  const b = top.field('bootstrap');
  const n = b.field('n').number();
  if (!Number.isInteger(n) || n < 0) b.field('n').fail(`should be a whole number ≥ 0, found ${n}`);
  return {
    ...readCommon(top),
    version: 1,
    currency: top.field('currency').string(),
    fertilizerPrice: price(top.field('fertilizerPrice')),
    grainPrice: price(top.field('grainPrice')),
    exclusions: top
      .field('exclusions')
      .items()
      .map((e) => ({ plotId: e.field('plotId').string(), reason: e.field('reason').string() })),
    bootstrap: { n, seed: b.field('seed').number() },
  };
}

/** More resamples than this would take hours per site; a file asking for them is damaged. */
const MAX_RESAMPLES = 100_000;

function price(r: FieldReader): number | null {
  const v = r.nullableNumber();
  if (v !== null && !(v >= 0 && v <= MAX_PRICE_PER_KG))
    r.fail(
      `should be a price from 0 to ${MAX_PRICE_PER_KG.toLocaleString('en-US')} per kg, found ${v}`,
    );
  return v;
}

function readUnits(r: FieldReader): ProjectUnits {
  return { rate: r.field('rate').oneOf(rateUnits), yield: r.field('yield').oneOf(yieldUnits) };
}

function readModels(r: FieldReader): ProjectModels {
  const fitted = r
    .field('fitted')
    .items()
    .map((m) => m.oneOf(MODEL_NAMES));
  const pref = r.field('preferred');
  const preferred = pref.value === null ? null : pref.oneOf(MODEL_NAMES);
  if (preferred !== null && !fitted.includes(preferred))
    r.field('preferred').fail(
      `names "${preferred}", which is not among the fitted models (${fitted.join(', ')})`,
    );
  return { fitted, preferred };
}

function readBootstrap(r: FieldReader): PlotrateProject['bootstrap'] {
  const resamples = r.field('resamples').number();
  if (!Number.isInteger(resamples) || resamples < 0 || resamples > MAX_RESAMPLES)
    r.field('resamples').fail(
      `should be a whole number from 0 to ${MAX_RESAMPLES.toLocaleString('en-US')}, found ${resamples}`,
    );
  const level = r.field('confidenceLevel').number();
  if (!(level > 0 && level < 1))
    r.field('confidenceLevel').fail(
      `should lie strictly between 0 and 1 (e.g. 0.9), found ${level}`,
    );
  const seed = r.field('seed').number();
  if (!Number.isSafeInteger(seed)) r.field('seed').fail(`should be a whole number, found ${seed}`);
  return { resamples, seed, confidenceLevel: level };
}
