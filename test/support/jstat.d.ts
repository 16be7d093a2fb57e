// Minimal types for jstat (it ships JavaScript only).
declare module "jstat" {
  const jStat: {
    normal: { inv(p: number, mean: number, std: number): number; cdf(x: number, mean: number, std: number): number };
    beta: { inv(p: number, a: number, b: number): number };
  };
  export default jStat;
}
