import { MODEL_NAMES, type ModelName } from '../models/modelTypes';
import { PROJECT_FORMAT_NAME, PROJECT_FORMAT_VERSION, type PlotrateProject } from './projectFormat';

/** The response models a new project fits: all of them. */
export const DEFAULT_FITTED_MODELS: readonly ModelName[] = MODEL_NAMES;

/**
 * An empty project in the current format: nothing imported, no prices yet,
 * all usual models and a 1000-resample 90 % bootstrap.
 *
 * @param now creation time (the caller's clock, so tests can fix it)
 * @param appVersion version of Plotrate creating it, e.g. "0.1.0"
 * @returns a project ready to be filled and saved
 * @example createProject(new Date('2026-03-01T08:00:00Z'), '0.1.0').createdAt // '2026-03-01T08:00:00.000Z'
 */
export function createProject(now: Date, appVersion: string): PlotrateProject {
  const at = now.toISOString();
  return {
    format: PROJECT_FORMAT_NAME,
    version: PROJECT_FORMAT_VERSION,
    createdAt: at,
    savedAt: at,
    appVersion,
    sources: [],
    table: null,
    mapping: null,
    units: { rate: 'kg/ha', yield: 'kg/ha' },
    prices: { currency: 'EUR', nutrientPerKg: null, grainPerKg: null },
    models: { fitted: [...DEFAULT_FITTED_MODELS], preferred: null },
    bootstrap: { resamples: 1000, seed: 1, confidenceLevel: 0.9 },
    notes: '',
    view: {},
  };
}
