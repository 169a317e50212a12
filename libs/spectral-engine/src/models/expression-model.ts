import { complex as mathComplex, parse, type EvalFunction, type MathNode } from 'mathjs';
import { ModelDefinitionError } from './model-definition-error';
import type { ImpedanceModel, ModelParameter } from './model-types';

/** Functions a lab-defined model may call: complex-safe and free of side effects. */
const ALLOWED_FUNCTIONS = new Set([
  'sqrt', 'exp', 'log', 'log10', 'sin', 'cos', 'tan', 'cot', 'sinh', 'cosh', 'tanh', 'coth', 'atan', 'pow', 'abs',
]);
const CONSTANTS = new Set(['pi', 'e']);
const FREQUENCY_SYMBOLS = new Set(['ω', 'omega']);
const ALLOWED_OPERATORS = new Set(['+', '-', '*', '/', '^', 'unaryMinus', 'unaryPlus']);
const PARAMETER_NAME = /^[A-Za-z][A-Za-z0-9_]*$/;

/** Options for a lab-defined model. Parameters not listed take bounds [0, ∞) and unit "". */
export interface ExpressionModelOptions {
  readonly name?: string;
  readonly label?: string;
  /** Parameter metadata by name; names must match free symbols of the expression. */
  readonly parameters?: readonly (Partial<ModelParameter> & { readonly name: string })[];
  /** Starting values used when fitting; default 1 for each parameter. */
  readonly initial?: Readonly<Record<string, number>>;
}

/** 1-based position of `token` as a whole word in `expression`, when it can be found. */
function positionOf(expression: string, token: string): number | undefined {
  const escaped = token.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const match = new RegExp(`(^|[^A-Za-z0-9_$\\u0370-\\u03FF])(${escaped})(?![A-Za-z0-9_$\\u0370-\\u03FF])`).exec(expression);
  return match ? match.index + match[1].length + 1 : undefined;
}

function reject(expression: string, token: string, why: string): never {
  const position = positionOf(expression, token);
  const where = position === undefined ? '' : ` at character ${position}`;
  throw new ModelDefinitionError(`'${token}'${where}: ${why}`, token, position);
}

function parseExpression(expression: string): MathNode {
  if (expression.trim() === '') throw new ModelDefinitionError('the model expression is empty');
  try {
    return parse(expression);
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    const char = (error as { char?: number }).char;
    const token = char === undefined ? undefined : expression.charAt(char - 1) || 'end of expression';
    throw new ModelDefinitionError(`cannot read the model expression: ${message}`, token, char);
  }
}

/** Walks the tree, rejecting anything but arithmetic, allowed functions and plain names; returns free symbols in order. */
function freeSymbols(expression: string, root: MathNode): string[] {
  const symbols: string[] = [];
  const visit = (node: MathNode, isCallee: boolean): void => {
    switch (node.type) {
      case 'ConstantNode': {
        if (typeof (node as unknown as { value: unknown }).value !== 'number') {
          reject(expression, String((node as unknown as { value: unknown }).value), 'only numbers are allowed as constants');
        }
        return;
      }
      case 'SymbolNode': {
        const name = (node as unknown as { name: string }).name;
        if (isCallee) {
          if (!ALLOWED_FUNCTIONS.has(name)) {
            reject(expression, name, `unknown function; allowed: ${[...ALLOWED_FUNCTIONS].join(', ')}`);
          }
          return;
        }
        if (FREQUENCY_SYMBOLS.has(name) || name === 'j' || CONSTANTS.has(name)) return;
        if (ALLOWED_FUNCTIONS.has(name)) reject(expression, name, 'is a function; call it with parentheses');
        if (!PARAMETER_NAME.test(name)) {
          reject(expression, name, 'a parameter name must start with a letter and use only letters, digits and _');
        }
        if (!symbols.includes(name)) symbols.push(name);
        return;
      }
      case 'OperatorNode': {
        const op = node as unknown as { op: string; fn: string; args: MathNode[] };
        if (!ALLOWED_OPERATORS.has(op.fn) && !ALLOWED_OPERATORS.has(op.op)) {
          reject(expression, op.op, 'only + − * / ^ are allowed');
        }
        op.args.forEach((a) => visit(a, false));
        return;
      }
      case 'ParenthesisNode':
        visit((node as unknown as { content: MathNode }).content, false);
        return;
      case 'FunctionNode': {
        const fn = node as unknown as { fn: MathNode; args: MathNode[] };
        if (fn.fn.type !== 'SymbolNode') reject(expression, fn.fn.toString(), 'only named functions may be called');
        visit(fn.fn, true);
        fn.args.forEach((a) => visit(a, false));
        return;
      }
      default:
        reject(expression, node.toString(), `${node.type.replace(/Node$/, '').toLowerCase()} syntax is not allowed in a model`);
    }
  };
  visit(root, false);
  return symbols;
}

function usesFrequency(root: MathNode): boolean {
  return root.filter((node) => node.type === 'SymbolNode' && FREQUENCY_SYMBOLS.has((node as unknown as { name: string }).name)).length > 0;
}

/**
 * Defines an impedance model from an expression in ω (rad/s, also written `omega`) and the
 * imaginary unit j, e.g. `r + 1/(q*(j*ω)^n)`. Every other name is a parameter. The expression is
 * checked now: a bad token raises ModelDefinitionError naming it and its character position.
 */
export function defineExpressionModel(expression: string, options: ExpressionModelOptions = {}): ImpedanceModel {
  const root = parseExpression(expression);
  const names = freeSymbols(expression, root);
  if (!usesFrequency(root)) {
    throw new ModelDefinitionError('the expression does not use ω (or omega), so it cannot describe a spectrum');
  }
  const given = new Map((options.parameters ?? []).map((p) => [p.name, p]));
  for (const name of given.keys()) {
    if (!names.includes(name)) throw new ModelDefinitionError(`parameter '${name}' does not appear in the expression`, name);
  }
  const parameters: ModelParameter[] = names.map((name) => {
    const p = given.get(name);
    return {
      name,
      unit: p?.unit ?? '',
      description: p?.description ?? `Parameter ${name}`,
      lower: p?.lower === undefined ? 0 : p.lower,
      upper: p?.upper === undefined ? null : p.upper,
    };
  });
  const code: EvalFunction = root.compile();
  const j = mathComplex(0, 1);
  const initial = Float64Array.from(names, (n) => options.initial?.[n] ?? 1);
  return {
    name: options.name ?? 'expression',
    label: options.label ?? 'Lab-defined model',
    formula: `Z = ${expression}`,
    parameters,
    evaluate(p, omega, re, im) {
      const scope: Record<string, unknown> = { j };
      names.forEach((n, k) => (scope[n] = p[k]));
      for (let i = 0; i < omega.length; i++) {
        scope['ω'] = omega[i];
        scope['omega'] = omega[i];
        const z = code.evaluate(scope) as unknown;
        if (typeof z === 'number') {
          re[i] = z;
          im[i] = 0;
        } else if (z !== null && typeof z === 'object' && 're' in z && 'im' in z) {
          re[i] = (z as { re: number }).re;
          im[i] = (z as { im: number }).im;
        } else {
          re[i] = NaN;
          im[i] = NaN;
        }
      }
    },
    initialGuess: () => initial.slice(),
  };
}
