/**
 * Free Cp expressions in T (J/(mol·K)), parsed by mathjs and compiled once. T is the only
 * free symbol; only whitelisted functions are allowed; anything that could change the
 * parser (import, createUnit, evaluate, parse), assignment and function definition is refused.
 */
import { all, create, type MathNode } from "mathjs";
import { refuse } from "./errors";

const math = create(all, {});

export const ALLOWED_FUNCTIONS = new Set([
  "exp", "log", "log10", "log2", "sqrt", "cbrt", "abs", "pow",
  "sin", "cos", "tan", "sinh", "cosh", "tanh", "min", "max",
]);
const ALLOWED_CONSTANTS = new Set(["pi", "e"]);
const ALLOWED_OPERATORS = new Set(["add", "subtract", "multiply", "divide", "pow", "unaryMinus", "unaryPlus",
  "smaller", "smallerEq", "larger", "largerEq", "equal", "unequal", "and", "or", "not"]);
const FORBIDDEN = new Set(["import", "createUnit", "evaluate", "parse", "compile", "simplify", "derivative", "reviver", "chain", "config", "help"]);

/** Compile a Cp expression once; throws EngineRefusal `invalid-expression` with an exact message. */
export function compileCpExpression(text: string, label: string): (tK: number) => number {
  const fail = (why: string): never => refuse("invalid-expression", `${label}: ${why}`);
  let node: MathNode;
  try {
    node = math.parse(text);
  } catch (e) {
    fail(`cannot read the expression (${(e as Error).message})`);
  }
  node!.traverse((n: MathNode, _path: string, parent: MathNode | null) => {
    switch (n.type) {
      case "ConstantNode":
        if (typeof (n as unknown as { value: unknown }).value !== "number") fail("only numbers are allowed as constants");
        return;
      case "ParenthesisNode":
      case "ConditionalNode":
        return;
      case "OperatorNode": {
        const fn = (n as unknown as { fn: string }).fn;
        if (!ALLOWED_OPERATORS.has(fn)) fail(`the operator "${(n as unknown as { op: string }).op}" is not allowed`);
        return;
      }
      case "FunctionNode": {
        const name = (n as unknown as { fn: { name?: string } }).fn?.name ?? "";
        if (FORBIDDEN.has(name)) fail(`"${name}" is not allowed in a Cp expression`);
        if (!ALLOWED_FUNCTIONS.has(name)) fail(`the function "${name}" is not allowed (allowed: ${[...ALLOWED_FUNCTIONS].join(", ")})`);
        return;
      }
      case "SymbolNode": {
        const name = (n as unknown as { name: string }).name;
        // A function's own name is a SymbolNode under its FunctionNode; checked above.
        if (parent && parent.type === "FunctionNode" && (parent as unknown as { fn: MathNode }).fn === n) return;
        if (FORBIDDEN.has(name)) fail(`"${name}" is not allowed in a Cp expression`);
        if (name !== "T" && !ALLOWED_CONSTANTS.has(name)) fail(`unknown symbol "${name}"; T (in K) is the only variable`);
        return;
      }
      case "AssignmentNode":
        fail("assignment is not allowed in a Cp expression");
        return;
      case "FunctionAssignmentNode":
        fail("function definition is not allowed in a Cp expression");
        return;
      case "BlockNode":
        fail("only one expression is allowed (no ';' or line breaks)");
        return;
      default:
        fail(`${n.type.replace(/Node$/, "").toLowerCase()} syntax is not allowed in a Cp expression`);
    }
  });
  const code = node!.compile();
  const scope = new Map<string, number>();
  return (tK: number): number => {
    scope.set("T", tK);
    const v = code.evaluate(scope);
    return typeof v === "number" ? v : Number.NaN;
  };
}
