/**
 * The name of each response model as the across-site sentences write it
 * ("the linear-plateau reached no plateau, so its limit, the straight line, is used").
 */
import type { ModelName } from '../models/modelTypes';

/** Each model's name in running text, lower case, as used after "the". */
export const MODEL_LABEL: Record<ModelName, string> = {
  linear: 'straight line',
  proportional: 'line through the origin',
  quadratic: 'quadratic',
  linearPlateau: 'linear-plateau',
  quadraticPlateau: 'quadratic-plateau',
  exponential: 'exponential rise',
};
