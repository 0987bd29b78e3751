/**
 * Free Cp expressions in T (J/(mol·K)), parsed by mathjs and compiled once. T is the only
 * free symbol; only whitelisted functions are allowed; anything that could change the
 * parser (import, createUnit, evaluate, parse), assignment and function definition is refused.
 */
import { all, create, type MathNode } from "mathjs";
import { refuse } from "./errors";

const math = create(all, {});

export const ALLOWED_FUNCTIONS: ReadonlySet<string> = new Set([
  "exp",
  "log",
  "log10",
  "log2",
  "sqrt",
  "cbrt",
  "abs",
  "pow",
  "sin",
  "cos",
  "tan",
  "sinh",
  "cosh",
  "tanh",
  "min",
  "max",
]);
const ALLOWED_CONSTANTS = new Set(["pi", "e"]);
const ALLOWED_OPERATORS = new Set([
  "add",
  "subtract",
  "multiply",
  "divide",
  "pow",
  "unaryMinus",
  "unaryPlus",
  "smaller",
  "smallerEq",
  "larger",
  "largerEq",
  "equal",
  "unequal",
  "and",
  "or",
  "not",
]);
const FORBIDDEN = new Set(["import", "createUnit", "evaluate", "parse", "compile", "simplify", "derivative", "reviver", "chain", "config", "help"]);

/** The expression budget, checked before anything is evaluated. */
export const EXPRESSION_MAX_CHARS = 2000;
export const EXPRESSION_MAX_NODES = 400;
export const EXPRESSION_MAX_DEPTH = 48;

function overBudget(label: string, what: string, got: number, limit: number, unit: string): never {
  return refuse("expression-budget", `${label}: the Cp expression ${what} ${got} ${unit}; at most ${limit} are allowed`, { got, limit });
}

/**
 * Nesting the parser itself would recurse through, counted on the text (mathjs parses
 * prefix operators, powers and parentheses recursively): open parentheses, and runs of
 * prefix signs and `^` between operands.
 */
function textNesting(text: string): number {
  let depth = 0;
  let worst = 0;
  let run = 0;
  let afterOperand = false;
  for (const ch of text) {
    if (ch === " " || ch === "\t") continue;
    if (ch === "(" || ch === "[") {
      depth++;
      run = 0;
      afterOperand = false;
    } else if (ch === ")" || ch === "]") {
      depth = Math.max(0, depth - 1);
      afterOperand = true;
    } else if (ch === "^") {
      run++;
      afterOperand = false;
    } else if ((ch === "-" || ch === "+" || ch === "!") && !afterOperand) {
      run++;
    } else if (/[-+*\/,<>=?:&|]/.test(ch)) {
      afterOperand = false;
      run = 0;
    } else {
      afterOperand = true;
    }
    worst = Math.max(worst, depth + run);
  }
  return worst;
}

/** Node count and depth without recursion (a flat chain of 10 000 terms is a tree 10 000 deep). */
function measure(root: MathNode, label: string): number {
  let nodes = 0;
  let deepest = 0;
  const stack: [MathNode, number][] = [[root, 1]];
  while (stack.length) {
    const [n, d] = stack.pop()!;
    nodes++;
    if (d > deepest) deepest = d;
    for (const c of childrenOf(n)) stack.push([c, d + 1]);
  }
  if (nodes > EXPRESSION_MAX_NODES) overBudget(label, "has", nodes, EXPRESSION_MAX_NODES, "nodes (numbers, symbols, operators and calls)");
  if (deepest > EXPRESSION_MAX_DEPTH) overBudget(label, "nests", deepest, EXPRESSION_MAX_DEPTH, "levels deep");
  return nodes;
}

function childrenOf(n: MathNode): MathNode[] {
  const out: MathNode[] = [];
  n.forEach((child: MathNode) => out.push(child));
  return out;
}

/** A compiled Cp expression: Cp(T) in J/(mol·K), and its node count. */
export interface CompiledExpression {
  (tK: number): number;
  nodes: number;
}

/**
 * Compile a Cp expression once; throws EngineRefusal `invalid-expression` (or
 * `expression-budget` for one too long, too large or too deep) with an exact message.
 */
export function compileCpExpression(text: string, label: string): CompiledExpression {
  const fail = (why: string): never => refuse("invalid-expression", `${label}: ${why}`);
  if (text.length > EXPRESSION_MAX_CHARS) overBudget(label, "is", text.length, EXPRESSION_MAX_CHARS, "characters long");
  const nesting = textNesting(text);
  if (nesting > EXPRESSION_MAX_DEPTH) overBudget(label, "nests", nesting, EXPRESSION_MAX_DEPTH, "levels deep");
  let node: MathNode;
  try {
    node = math.parse(text);
  } catch (e) {
    if (e instanceof RangeError) overBudget(label, "nests", nesting, EXPRESSION_MAX_DEPTH, "levels deep");
    fail(`cannot read the expression (${(e as Error).message})`);
  }
  const nodes = measure(node!, label);
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
  const f = ((tK: number): number => {
    scope.set("T", tK);
    const v = code.evaluate(scope);
    return typeof v === "number" ? v : Number.NaN;
  }) as CompiledExpression;
  f.nodes = nodes;
  return f;
}
