/**
 * Demo and synthetic trials: {@link demoTrial} (the invented scenario),
 * {@link writeDemoWorkbook} (its .xlsx), and {@link syntheticRows},
 * {@link syntheticCsv}, {@link syntheticWorkbook}, {@link syntheticPlotTable}
 * for benchmarks.
 */
export * from './mulberry32';
export * from './demoTrial';
export * from './writeDemoWorkbook';
export * from './syntheticTrial';
export * from './demoTiming';
