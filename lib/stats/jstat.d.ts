/**
 * Minimal typings for the parts of jStat 1.9.6 that lib/stats uses (no @types package exists).
 * Signatures follow the jStat documentation: https://jstat.github.io/distributions.html
 */
declare module 'jstat' {
  interface JStatDistribution2 {
    cdf(x: number, dof: number): number;
    inv(p: number, dof: number): number;
    pdf(x: number, dof: number): number;
  }
  interface JStatCentralF {
    cdf(x: number, df1: number, df2: number): number;
    inv(p: number, df1: number, df2: number): number;
  }
  interface JStatNormal {
    cdf(x: number, mean: number, sd: number): number;
    inv(p: number, mean: number, sd: number): number;
  }
  interface JStatStatic {
    studentt: JStatDistribution2;
    centralF: JStatCentralF;
    normal: JStatNormal;
    /** Regularised incomplete beta function I_x(a, b). */
    ibeta(x: number, a: number, b: number): number;
  }
  export const jStat: JStatStatic;
}
