// The parts of jStat Lintel uses; the package ships no types of its own.
declare module "jstat" {
  interface JStat {
    normal: {
      inv(p: number, mean: number, sd: number): number;
      cdf(x: number, mean: number, sd: number): number;
    };
    chisquare: {
      inv(p: number, dof: number): number;
      cdf(x: number, dof: number): number;
    };
    poisson: {
      cdf(k: number, lambda: number): number;
    };
    binomial: {
      cdf(k: number, n: number, p: number): number;
      pdf(k: number, n: number, p: number): number;
    };
  }
  const jstat: { jStat: JStat };
  export default jstat;
}
