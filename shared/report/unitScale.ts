/**
 * Canonical numbers (kg/ha) into the report's display units, including the
 * curve parameters, whose unit follows from their place in the formula: a
 * yield (a, P, and the exponential's b), a yield per rate (slope b), per rate
 * squared (c), a rate (x0) or a reciprocal rate (k). Every conversion here is
 * a scale factor, so standard errors and interval ends convert the same way.
 * Each parameter's dimension is in its model's curve entry (shared/models/curves).
 */
import { paramDimension } from '../models/curves';
import type { ParamDimension } from '../models/modelCurve';
import type { ModelName } from '../models/modelTypes';
import type { CropId } from '../table/plotTable';
import { rateFromKgHa } from '../units/convertRate';
import { yieldFromKgHa } from '../units/convertYield';
import { M2_PER_ACRE, M2_PER_HA } from '../units/unitConstants';
import type { DisplayUnits as ReportUnits } from '../units/displayUnits';

/** Converters from canonical kg/ha to the report's units. */
export interface UnitScale {
  units: ReportUnits;
  /** kg/ha of nutrient → display rate unit. */
  rate: (kgHa: number) => number;
  /** kg/ha of grain → display yield unit. */
  yield: (kgHa: number) => number;
  /** A curve parameter, canonical → display. */
  param: (model: ModelName, name: string, value: number) => number;
  /** Unit text of a curve parameter, e.g. "bu/ac per lb/ac". */
  paramUnit: (model: ModelName, name: string) => string;
  /** Currency per ha → currency per display area (ac or ha). */
  perArea: (perHa: number) => number;
  /** "ac" or "ha". */
  areaName: string;
}

/**
 * Builds the converters for one set of display units.
 * @param units - display rate and yield units
 * @param crop - the crop (bushel weight for bu/ac)
 * @returns converters
 * @example
 * unitScale({ rate: 'lb/ac', yield: 'bu/ac' }, 'corn').rate(112.085) // ≈ 100
 */
export function unitScale(units: ReportUnits, crop: CropId): UnitScale {
  const fy = yieldFromKgHa(1, units.yield, crop);
  const fr = rateFromKgHa(1, units.rate);
  const factor: Record<ParamDimension, number> = {
    yield: fy,
    yieldPerRate: fy / fr,
    yieldPerRate2: fy / (fr * fr),
    rate: fr,
    perRate: 1 / fr,
  };
  const unitText: Record<ParamDimension, string> = {
    yield: units.yield,
    yieldPerRate: `${units.yield} per ${units.rate}`,
    yieldPerRate2: `${units.yield} per (${units.rate})²`,
    rate: units.rate,
    perRate: `1/(${units.rate})`,
  };
  // lb/ac rates imply acres; every other rate unit here is per hectare or m².
  const perAcre = units.rate === 'lb/ac';
  const HA_PER_AC = M2_PER_ACRE / M2_PER_HA;
  return {
    units,
    rate: (v) => v * fr,
    yield: (v) => v * fy,
    param: (model, name, value) => value * factor[paramDimension(model, name)],
    paramUnit: (model, name) => unitText[paramDimension(model, name)],
    perArea: (v) => (perAcre ? v * HA_PER_AC : v),
    areaName: perAcre ? 'ac' : 'ha',
  };
}

/**
 * The site model whose parameter of this name carries the unit of a regional mixed model form's
 * parameter: the quadratic's own; in both plateau forms the plateau P is a yield (as the
 * quadratic-plateau's), and the linear-plateau's slope b and join x0 are its site model's.
 * @param form - the mixed model form
 * @param name - the parameter's name in that form (a, b, c, P, x0)
 * @returns the model to hand UnitScale.param and paramUnit with the same name
 * @example mixedFormParamModel('linearPlateau', 'P') // 'quadraticPlateau'
 */
export function mixedFormParamModel(
  form: 'quadratic' | 'quadraticPlateau' | 'linearPlateau',
  name: string,
): ModelName {
  if (form === 'linearPlateau' && name !== 'P') return 'linearPlateau';
  return form === 'quadratic' ? 'quadratic' : 'quadraticPlateau';
}
