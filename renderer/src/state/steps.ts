// The way through an analysis, as the step rail shows it.

export type StepId = 'files' | 'columns' | 'quality' | 'site' | 'sites' | 'prices' | 'report';

export interface Step {
  id: StepId;
  label: string;
  /** One line under the label: what the step is for. */
  hint: string;
}

export const STEPS: readonly Step[] = [
  { id: 'files', label: 'Trial files', hint: 'Open or drop plot sheets' },
  { id: 'columns', label: 'Columns', hint: 'Roles, units, crop' },
  { id: 'quality', label: 'Quality', hint: 'Findings and exclusions' },
  { id: 'site', label: 'One site', hint: 'Response, models, optimum' },
  { id: 'sites', label: 'All sites', hint: 'Pooling and regional rate' },
  { id: 'prices', label: 'Prices', hint: 'Grain, product, price ratio' },
  { id: 'report', label: 'Report', hint: 'Grower page and workbook' },
];

/** Whether a text names a step (for a view restored from storage). */
export function isStepId(value: unknown): value is StepId {
  return typeof value === 'string' && STEPS.some((s) => s.id === value);
}
