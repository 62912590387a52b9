// The part of npm `logic-solver` (MiniSat compiled to JavaScript) that the SAT oracle uses;
// the package ships no type declarations.
declare module 'logic-solver' {
  namespace Logic {
    type Operand = string | Formula | readonly Operand[];
    interface Formula {
      readonly __formula: true;
    }
    interface Solution {
      getTrueVars(): string[];
      getWeightedSum(formulas: readonly Operand[], weights: readonly number[]): number;
    }
    class Solver {
      require(...operands: Operand[]): void;
      forbid(...operands: Operand[]): void;
      solve(): Solution | null;
      minimizeWeightedSum(solution: Solution, formulas: readonly Operand[], weights: readonly number[]): Solution;
    }
    const TRUE: string;
    const FALSE: string;
    function not(operand: Operand): Operand;
    function and(...operands: Operand[]): Operand;
    function or(...operands: Operand[]): Operand;
    function xor(...operands: Operand[]): Operand;
    function disablingAssertions<T>(run: () => T): T;
  }
  export default Logic;
}
