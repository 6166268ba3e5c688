// The two ml-regression classes the model tests use as an independent reference
// (ml-regression 6.3.0 ships without type declarations of its own).
declare module 'ml-regression' {
  export class SimpleLinearRegression {
    constructor(x: number[], y: number[]);
    slope: number;
    intercept: number;
  }
  export class PolynomialRegression {
    constructor(x: number[], y: number[], degree: number);
    /** Lowest power first: [c0, c1, c2] for c0 + c1·x + c2·x². */
    coefficients: number[];
  }
}
