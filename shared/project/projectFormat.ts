/**
 * The Plotrate project file: plain, documented JSON with the extension
 * `.plotrate`. One file holds everything needed to reopen an analysis exactly:
 * where the plots came from (names and SHA-256 of the source files — the
 * spreadsheets themselves are never copied or written to), the imported plot
 * table with every cell's original text, the column mapping, units,
 * exclusions with reasons, prices, model choices and bootstrap settings.
 *
 * Versioning: `version` is a whole number that rises whenever a field is
 * renamed, moved or given a new meaning. Opening an older file migrates it
 * step by step (see migrateProject.ts); a file from a newer version is refused
 * with a message rather than guessed at, so nothing is silently dropped.
 */
import type { ModelName } from '../models/modelTypes';
import type { PlotTable, SourceFile } from '../table/plotTable';

/** The `format` field every project file carries, so a stray JSON file is recognized as "not a project". */
export const PROJECT_FORMAT_NAME = 'plotrate-project';

/**
 * Largest project file read, bytes (of UTF-8 text; the shell checks the file, parseProject the
 * text, so browser storage is held to it too). A project of 10,000 plots is a few MB.
 */
export const MAX_PROJECT_FILE_BYTES = 512 * 1024 * 1024;

/**
 * Above this a price per kg is no price of grain or fertilizer in any currency in use (even
 * currencies of many units per dollar price grain below 100,000 per kg): the project file or the
 * browser's saved session holding it is damaged.
 */
export const MAX_PRICE_PER_KG = 1e6;

/** The version this build writes. */
export const PROJECT_FORMAT_VERSION = 2;

/** File extension (without the dot) registered with the operating system. */
export const PROJECT_FILE_EXTENSION = 'plotrate';

/** Any JSON value: used for the parts of the file another module owns. */
export type JsonValue =
  null | boolean | number | string | JsonValue[] | { [key: string]: JsonValue };

/**
 * How the sheet's columns were mapped to roles, units and crop. The import
 * module owns its exact shape; the project file keeps it as JSON data and
 * hands it back unchanged.
 */
export type ColumnMappingJson = { [key: string]: JsonValue };

/** Display units chosen by the user; values inside the plot table stay kg/ha. */
export interface ProjectUnits {
  /** Unit rates are shown in, e.g. "kg/ha" or "lb/ac". */
  rate: string;
  /** Unit yields are shown in, e.g. "kg/ha", "t/ha" or "bu/ac". */
  yield: string;
}

/** Prices for the economic optimum. Both prices per kilogram, in one currency. */
export interface ProjectPrices {
  /** ISO 4217 code or the user's own label, e.g. "EUR". */
  currency: string;
  /** Price of the nutrient, currency per kg of nutrient (not of product); null until entered. */
  nutrientPerKg: number | null;
  /** Price of the grain, currency per kg at standard moisture; null until entered. */
  grainPerKg: number | null;
}

/** Which response models to fit and which one the report leads with. */
export interface ProjectModels {
  /** Models to fit (names from shared/models), in the order the screen lists them. */
  fitted: ModelName[];
  /** The model the recommendation uses; null lets the analysis pick by fit. */
  preferred: ModelName | null;
}

/** Settings of the bootstrap interval around the optimum rate. */
export interface ProjectBootstrap {
  /** Number of resamples (whole number, ≥ 0; 0 turns the bootstrap off). */
  resamples: number;
  /** Seed of the random generator, so a reopened project repeats the same interval. */
  seed: number;
  /** Two-sided level of the interval, strictly between 0 and 1 (e.g. 0.9). */
  confidenceLevel: number;
}

/** The current (version 2) project file. */
export interface PlotrateProject {
  format: typeof PROJECT_FORMAT_NAME;
  version: typeof PROJECT_FORMAT_VERSION;
  /** When the project was first created, ISO 8601 UTC. */
  createdAt: string;
  /** When this file was last written, ISO 8601 UTC. */
  savedAt: string;
  /** Version of Plotrate that wrote the file. */
  appVersion: string;
  /** Files the plots were imported from: names as chosen (no folders), sizes and SHA-256. */
  sources: SourceFile[];
  /** The imported plots, with original cell text and exclusions (Plot.excluded); null before import. */
  table: PlotTable | null;
  /** The column mapping as the import module wrote it; null before mapping. */
  mapping: ColumnMappingJson | null;
  units: ProjectUnits;
  prices: ProjectPrices;
  models: ProjectModels;
  bootstrap: ProjectBootstrap;
  /** Free notes the user keeps with the project. */
  notes: string;
  /** Screen choices the renderer wants back (selected site, open tab…); kept as given. */
  view: { [key: string]: JsonValue };
}

/**
 * Version 1, written by the first builds. Differences from version 2:
 * prices were two flat fields `fertilizerPrice` and `grainPrice` (both per kg)
 * plus `currency`; user exclusions lived in a separate `exclusions` list keyed
 * by plot id instead of on each plot; bootstrap settings were `{ n, seed }`.
 */
export interface PlotrateProjectV1 {
  format: typeof PROJECT_FORMAT_NAME;
  version: 1;
  createdAt: string;
  savedAt: string;
  appVersion: string;
  sources: SourceFile[];
  table: PlotTable | null;
  mapping: ColumnMappingJson | null;
  units: ProjectUnits;
  currency: string;
  fertilizerPrice: number | null;
  grainPrice: number | null;
  exclusions: { plotId: string; reason: string }[];
  models: ProjectModels;
  bootstrap: { n: number; seed: number };
  notes: string;
}
