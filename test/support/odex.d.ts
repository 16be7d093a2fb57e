// Minimal types for the odex package (it ships JavaScript without a `types` field).
declare module "odex" {
  export class Solver {
    constructor(n: number);
    maxSteps: number;
    initialStepSize: number;
    maxStepSize: number;
    relativeTolerance: number | number[];
    absoluteTolerance: number | number[];
    denseOutput: boolean;
    solve(
      f: (x: number, y: number[]) => number[],
      x0: number,
      y0: number[],
      x1: number,
      solOut?: (n: number, xOld: number, x: number, y: number[], dense?: (c: number, x: number) => number) => boolean | void,
    ): { y: number[]; outcome: number; nStep: number; xEnd: number; nEval: number; nAccept: number; nReject: number };
  }
}
