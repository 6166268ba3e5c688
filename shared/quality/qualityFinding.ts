/**
 * The finding type lives with the plot table (`shared/table/qualityFinding.ts`), below both the
 * import and the quality checks that write findings, so neither of those imports the other.
 * This re-export keeps the older path working for the report, the renderer and the command line.
 */
export { describeRef } from '../table/qualityFinding';
export type { FindingCode, FindingSeverity, QualityFinding } from '../table/qualityFinding';
