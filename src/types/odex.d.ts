// odex ships its TypeScript source but no declarations in its package entry; the part we use.
declare module 'odex' {
  export class Solver {
    constructor(n: number);
    absoluteTolerance: number | number[];
    relativeTolerance: number | number[];
    denseOutput: boolean;
    maxSteps: number;
    solve(
      f: (x: number, y: number[]) => number[],
      x0: number,
      y0: number[],
      xEnd: number,
      solOut?: (nr: number, xOld: number, x: number, y: number[], dense?: (c: number, x: number) => number) => boolean | void,
    ): { y: number[]; outcome: number; nStep: number; xEnd: number; nAccept: number; nReject: number; nEval: number };
  }
}
