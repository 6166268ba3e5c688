// The few jstat functions the statistics tests use as an independent reference
// (jstat ships without type declarations).
declare module 'jstat' {
  interface ContinuousDistribution {
    cdf(x: number, ...params: number[]): number;
    inv(p: number, ...params: number[]): number;
  }
  const jStat: {
    studentt: ContinuousDistribution;
    centralF: ContinuousDistribution;
    chisquare: ContinuousDistribution;
    normal: ContinuousDistribution;
    mean(values: number[]): number;
    variance(values: number[], sample?: boolean): number;
    stdev(values: number[], sample?: boolean): number;
    median(values: number[]): number;
    corrcoeff(x: number[], y: number[]): number;
    spearmancoeff(x: number[], y: number[]): number;
  };
  export default jStat;
}
