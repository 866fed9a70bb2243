// sweep stage: cell areas as formulas of the sweep's parameters, parsed and compiled with mathjs (no eval).
//
// A formula is checked node by node before it is compiled: numbers, the parameters, the constants
// pi, e, tau and phi, the operators + - * / ^ (implicit multiplication included), parentheses and a
// fixed list of real functions. Anything else (assignments, function definitions, matrices, strings,
// conditionals, property access, unknown names) is refused, so evaluating a formula can only compute
// a number from the parameters.

import { createRequire } from 'node:module';
import type { EvalFunction, MathNode } from 'mathjs';

type MathJs = typeof import('mathjs');
let mathjs: MathJs | null = null;

/** mathjs, loaded on the first formula (it takes most of a second to load; only formulas need it). */
function math(): MathJs {
  mathjs ??= createRequire(import.meta.url)('mathjs') as MathJs;
  return mathjs;
}
import { FormulaError } from '../errors.ts';

/** The real functions a formula may call. */
export const FORMULA_FUNCTIONS: readonly string[] = [
  'abs', 'sqrt', 'cbrt', 'square', 'cube', 'exp', 'expm1', 'log', 'log1p', 'log2', 'log10', 'pow',
  'sin', 'cos', 'tan', 'asin', 'acos', 'atan', 'atan2', 'sinh', 'cosh', 'tanh', 'min', 'max', 'hypot',
];

/** The named constants a formula may use. */
export const FORMULA_CONSTANTS: readonly string[] = ['pi', 'e', 'tau', 'phi'];

const OPERATORS = new Set(['add', 'subtract', 'multiply', 'divide', 'pow', 'unaryMinus', 'unaryPlus']);

/** One cell-area formula, compiled. */
export interface AreaFormula {
  /** The text as the user typed it (trimmed). */
  readonly source: string;
  /** The parsed formula printed back by mathjs: equal keys mean the same formula. */
  readonly key: string;
  /** Parameters the formula actually uses, in the order of the sweep's parameters. */
  readonly uses: readonly string[];
  /** Value at the given parameter values (any real number, or NaN when mathjs gives no real number). */
  value(scope: Readonly<Record<string, number>>): number;
  /** Derivative with respect to `parameter` at the given values (symbolic when mathjs can, else a central difference). */
  slope(scope: Readonly<Record<string, number>>, parameter: string): number;
}

/**
 * Split a list of formulas at its top-level commas ("max(1, t), 2" is two formulas).
 * @throws FormulaError when a parenthesis is unbalanced or a formula is empty.
 */
export function splitFormulas(text: string): string[] {
  const items: string[] = [];
  let depth = 0;
  let start = 0;
  for (let i = 0; i <= text.length; i++) {
    const ch = text[i];
    if (ch === '(' || ch === '[') depth++;
    else if (ch === ')' || ch === ']') depth--;
    if (depth < 0) throw new FormulaError(`Areas "${text}" close a parenthesis at character ${i + 1} that was never opened when expected balanced parentheses.`);
    if (i === text.length || (ch === ',' && depth === 0)) {
      const item = text.slice(start, i).trim();
      if (item === '') throw new FormulaError(`Area ${items.length + 1} of "${text}" is empty when expected a formula.`);
      items.push(item);
      start = i + 1;
    }
  }
  if (depth !== 0) throw new FormulaError(`Areas "${text}" leave ${depth} parenthesis open when expected balanced parentheses.`);
  return items;
}

/** Check one parsed node tree against the allowed grammar; returns the parameters it uses. */
function checkNode(root: MathNode, label: string, parameters: readonly string[]): string[] {
  const used = new Set<string>();
  const refuse = (what: string): never => {
    throw new FormulaError(
      `${label} uses ${what} when expected numbers, the parameters (${parameters.join(', ') || 'none'}), ` +
        `the constants ${FORMULA_CONSTANTS.join(', ')}, + - * / ^ and the functions ${FORMULA_FUNCTIONS.join(', ')}.`,
    );
  };
  root.traverse((node: MathNode, path: string, parent: MathNode | null) => {
    // the name of a called function is checked with its call
    if (path === 'fn' && parent !== null && parent.type === 'FunctionNode') return;
    switch (node.type) {
      case 'ConstantNode': {
        const value = (node as unknown as { value: unknown }).value;
        if (typeof value !== 'number') refuse(`the constant ${node.toString()}`);
        return;
      }
      case 'ParenthesisNode':
        return;
      case 'OperatorNode': {
        const fn = (node as unknown as { fn: string; op: string }).fn;
        if (!OPERATORS.has(fn)) refuse(`the operator "${(node as unknown as { op: string }).op}"`);
        return;
      }
      case 'SymbolNode': {
        const name = (node as unknown as { name: string }).name;
        if (parameters.includes(name)) used.add(name);
        else if (!FORMULA_CONSTANTS.includes(name)) {
          throw new FormulaError(
            `${label} names the unknown symbol "${name}" when expected the parameters (${parameters.join(', ') || 'none'}) or the constants ${FORMULA_CONSTANTS.join(', ')}.`,
          );
        }
        return;
      }
      case 'FunctionNode': {
        const fn = (node as unknown as { fn: MathNode }).fn;
        const name = fn.type === 'SymbolNode' ? (fn as unknown as { name: string }).name : fn.toString();
        if (!FORMULA_FUNCTIONS.includes(name)) refuse(`the function "${name}"`);
        return;
      }
      default: {
        const kind = node.type.replace(/Node$/, '').toLowerCase();
        refuse(`${/^[aeiou]/.test(kind) ? 'an' : 'a'} ${kind} ("${node.toString()}")`);
      }
    }
  });
  return parameters.filter((p) => used.has(p));
}

/**
 * Parse and compile one formula in the given parameters.
 * @throws FormulaError when it does not parse, names an unknown symbol or uses anything outside the
 *   grammar above.
 */
export function parseFormula(source: string, parameters: readonly string[], label = `Formula "${source}"`): AreaFormula {
  let root: MathNode;
  try {
    root = math().parse(source);
  } catch (error) {
    const reason = (error as Error).message.replace(/\s+/g, ' ').replace(/\.$/, '');
    throw new FormulaError(`${label} does not parse (${reason}) when expected an expression such as 1 + t^2.`);
  }
  const uses = checkNode(root, label, parameters);
  const compiled = root.compile();
  const slopes = new Map<string, EvalFunction | null>();
  for (const p of parameters) {
    let d: EvalFunction | null = null;
    if (!uses.includes(p)) d = math().parse('0').compile();
    else {
      try {
        d = math().derivative(root, p).compile();
      } catch {
        d = null; // e.g. min/max: no symbolic derivative; a central difference below
      }
    }
    slopes.set(p, d);
  }
  const value = (scope: Readonly<Record<string, number>>): number => {
    const v: unknown = compiled.evaluate({ ...scope });
    return typeof v === 'number' ? v : NaN;
  };
  return {
    source,
    key: root.toString({ parenthesis: 'auto' }),
    uses,
    value,
    slope(scope, parameter) {
      const d = slopes.get(parameter);
      if (d === undefined) return 0;
      if (d !== null) {
        const v: unknown = d.evaluate({ ...scope });
        if (typeof v === 'number' && Number.isFinite(v)) return v;
      }
      // central difference, step ~ cube root of the rounding unit (error ~ 1e-10 relative)
      const x = scope[parameter];
      const h = 6e-6 * Math.max(1, Math.abs(x));
      const up = value({ ...scope, [parameter]: x + h });
      const down = value({ ...scope, [parameter]: x - h });
      if (Number.isFinite(up) && Number.isFinite(down)) return (up - down) / (2 * h);
      const mid = value(scope);
      if (Number.isFinite(up)) return (up - mid) / h;
      if (Number.isFinite(down)) return (mid - down) / h;
      return 0;
    },
  };
}

/**
 * Parse a comma-separated list of area formulas ("1, 1, 1, t"), one per cell.
 * @throws FormulaError naming the first formula that fails.
 */
export function parseAreaFormulas(text: string, parameters: readonly string[]): AreaFormula[] {
  const items = splitFormulas(text);
  return items.map((item, i) => parseFormula(item, parameters, `Area ${i + 1} "${item}"`));
}
