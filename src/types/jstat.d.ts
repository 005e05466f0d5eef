// jstat ships no type declarations; these are the few functions Strewn uses.
declare module 'jstat' {
  export const jStat: {
    normal: { inv(p: number, mean: number, sd: number): number; cdf(x: number, mean: number, sd: number): number };
    beta: { inv(p: number, a: number, b: number): number; cdf(x: number, a: number, b: number): number };
    chisquare: { inv(p: number, dof: number): number };
    ibetainv(p: number, a: number, b: number): number;
  };
  const _default: { jStat: typeof jStat };
  export default _default;
}
