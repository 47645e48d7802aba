// Types for the parts of logic-solver 2.0.1 (MiniSat in JavaScript) the equivalence checker uses.
declare module 'logic-solver' {
  type Operand = string | Formula;
  interface Formula {
    readonly __formula: true;
  }
  interface Solution {
    getMap(): Record<string, boolean>;
    getTrueVars(): string[];
  }
  class Solver {
    require(...args: Operand[]): void;
    forbid(...args: Operand[]): void;
    solve(): Solution | null;
    solveAssuming(assumption: Operand): Solution | null;
  }
  const Logic: {
    Solver: typeof Solver;
    not(x: Operand): Formula;
    or(...xs: Operand[]): Formula;
    and(...xs: Operand[]): Formula;
    xor(...xs: Operand[]): Formula;
    implies(a: Operand, b: Operand): Formula;
    equiv(a: Operand, b: Operand): Formula;
    TRUE: string;
    FALSE: string;
  };
  export default Logic;
}
