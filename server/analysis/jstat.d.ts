// Minimal typings for the parts of jstat (https://jstat.github.io) that the analysis engine uses.
// jstat ships no TypeScript types; declare only what we call so a wrong call fails type-checking.
declare module 'jstat' {
  interface JStatNormal {
    /** P(X ≤ x) for X ~ Normal(mean, std). */
    cdf(x: number, mean: number, std: number): number;
    /** Quantile: the x with P(X ≤ x) = p. */
    inv(p: number, mean: number, std: number): number;
  }
  interface JStatStudentT {
    /** P(T ≤ x) for Student's t with dof degrees of freedom. */
    cdf(x: number, dof: number): number;
    /** Quantile: the x with P(T ≤ x) = p. */
    inv(p: number, dof: number): number;
  }
  interface JStatHypergeometric {
    /** P(X = k) when n items are drawn without replacement from N items of which m are successes. */
    pdf(k: number, N: number, m: number, n: number): number;
  }
  export const jStat: {
    normal: JStatNormal;
    studentt: JStatStudentT;
    hypgeom: JStatHypergeometric;
    /** Regularized incomplete beta function I_x(a, b). */
    ibeta(x: number, a: number, b: number): number;
    /** ln Γ(x). */
    gammaln(x: number): number;
  };
}
