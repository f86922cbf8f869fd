// Minimal typings for the parts of jstat the engine uses (jstat ships no types).
declare module "jstat" {
  interface Dist1 { cdf(x: number, a: number): number; inv(p: number, a: number): number; pdf(x: number, a: number): number }
  interface Dist2 { cdf(x: number, a: number, b: number): number; inv(p: number, a: number, b: number): number; pdf(x: number, a: number, b: number): number }
  export const jStat: {
    studentt: Dist1;
    chisquare: Dist1;
    centralF: Dist2;
    normal: Dist2;
    beta: Dist2;
    gammaln(x: number): number;
    [key: string]: any;
  };
}
