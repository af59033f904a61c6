/**
 * Types for the parts of jstat 1.9 (which ships no declarations) that the engine uses.
 * The package's CommonJS export is the jStat object; import it as `import jStat from 'jstat'`.
 * One declaration for the whole code base (shared/types/ is in every tsconfig's include): extend
 * this file rather than adding a second `declare module 'jstat'` elsewhere (two would clash).
 */
declare module 'jstat' {
  interface JStatContinuous<P extends unknown[]> {
    pdf(x: number, ...parameters: P): number
    cdf(x: number, ...parameters: P): number
    inv(p: number, ...parameters: P): number
  }

  interface JStatStatic {
    /** Gaussian with mean and standard deviation. */
    normal: JStatContinuous<[mean: number, sd: number]>
    /** χ² with `dof` degrees of freedom. */
    chisquare: JStatContinuous<[dof: number]>
    /** Beta distribution with shape parameters α, β. */
    beta: JStatContinuous<[alpha: number, beta: number]>
    /** Euler Beta function B(a, b). */
    betafn(a: number, b: number): number
    /** ln B(a, b). */
    betaln(a: number, b: number): number
    /** Γ(x). */
    gammafn(x: number): number
    /** ln Γ(x). */
    gammaln(x: number): number
    /** Regularised lower incomplete gamma P(a, x). */
    lowRegGamma(a: number, x: number): number
    /** Regularised incomplete beta I_x(a, b). */
    ibeta(x: number, a: number, b: number): number
    erf(x: number): number
    erfc(x: number): number
    erfcinv(p: number): number
    /** Arithmetic mean of a sample. */
    mean(values: number[]): number
    /** Standard deviation; `sample` true for the 1/(n−1) normalisation. */
    stdev(values: number[], sample?: boolean): number
    /** Sample covariance (1/(n−1)) of two equally long samples. */
    covariance(a: number[], b: number[]): number
    /** Pearson correlation coefficient of two equally long samples. */
    corrcoeff(a: number[], b: number[]): number
  }

  const jStat: JStatStatic
  export default jStat
}
