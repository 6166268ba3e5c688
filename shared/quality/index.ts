/**
 * Quality checks: {@link checkQuality} runs {@link checkValues}, {@link checkDesign} and
 * {@link checkResiduals}; findings are {@link QualityFinding}s with cell references.
 */
export * from '../table/qualityFinding';
export * from './checkQuality';
export * from './checkValues';
export * from './checkDesign';
export * from './checkResiduals';
export * from './treatmentBlockModel';
