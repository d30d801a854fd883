// The jet filter of a map's selection: an expression over per-jet columns such as `pt > 400 and m_g < 40`.
// mathjs parses it; the tree is then checked against a restricted scope (known column names and constants, plain
// arithmetic, comparisons and logic, a short list of functions) and anything else is refused with a message naming
// it: assignments, function definitions, imports, unknown names (all listed), units, strings, matrices, indexing.
// An accepted tree is evaluated column-wise over typed arrays (one pass per operation, no code generated), with
// mathjs's own semantics for comparisons (its relative tolerance); tests check it against mathjs's evaluate.
// Results that mathjs would make complex (sqrt of a negative number, a log of one) are NaN here, i.e. not selected.
import { type MathNode, parse } from 'mathjs';

/** Names a filter may use, and the jet column each reads. */
export const FILTER_COLUMNS = {
  pt: 'pt',
  y: 'y',
  phi: 'phi',
  m: 'm',
  n: 'n',
  weight: 'weight',
  m_g: 'mg',
  z_g: 'zg',
  R_g: 'Rg',
  multiplicity: 'multiplicity',
} as const;
export type FilterName = keyof typeof FILTER_COLUMNS;
export type FilterColumn = (typeof FILTER_COLUMNS)[FilterName];

const CONSTANTS: Record<string, number> = { pi: Math.PI, e: Math.E, true: 1, false: 0 };

type Fn = (...args: number[]) => number;
const FUNCTIONS: Record<string, { arity: [number, number]; fn: Fn }> = {
  abs: { arity: [1, 1], fn: Math.abs },
  sqrt: { arity: [1, 1], fn: Math.sqrt },
  exp: { arity: [1, 1], fn: Math.exp },
  log: { arity: [1, 2], fn: (x, base) => (base === undefined ? Math.log(x) : Math.log(x) / Math.log(base)) },
  log10: { arity: [1, 1], fn: Math.log10 },
  min: { arity: [2, 8], fn: Math.min },
  max: { arity: [2, 8], fn: Math.max },
  cos: { arity: [1, 1], fn: Math.cos },
  sin: { arity: [1, 1], fn: Math.sin },
  floor: { arity: [1, 1], fn: Math.floor },
  ceil: { arity: [1, 1], fn: Math.ceil },
};

/** mathjs's default tolerances for comparisons (config relTol, absTol). */
const REL_TOL = 1e-12;
const ABS_TOL = 1e-15;
function nearlyEqual(a: number, b: number): boolean {
  if (a === b) return true;
  if (!Number.isFinite(a) || !Number.isFinite(b)) return false;
  return Math.abs(a - b) <= Math.max(REL_TOL * Math.max(Math.abs(a), Math.abs(b)), ABS_TOL);
}
const truthy = (v: number) => v !== 0 && !Number.isNaN(v);

const OPERATORS: Record<string, Fn> = {
  add: (a, b) => a + b,
  subtract: (a, b) => a - b,
  multiply: (a, b) => a * b,
  divide: (a, b) => a / b,
  pow: (a, b) => a ** b,
  mod: (a, b) => (b === 0 ? a : a - b * Math.floor(a / b)),
  unaryMinus: (a) => -a,
  unaryPlus: (a) => a,
  larger: (a, b) => (a > b && !nearlyEqual(a, b) ? 1 : 0),
  largerEq: (a, b) => (a > b || nearlyEqual(a, b) ? 1 : 0),
  smaller: (a, b) => (a < b && !nearlyEqual(a, b) ? 1 : 0),
  smallerEq: (a, b) => (a < b || nearlyEqual(a, b) ? 1 : 0),
  equal: (a, b) => (nearlyEqual(a, b) ? 1 : 0),
  unequal: (a, b) => (nearlyEqual(a, b) ? 0 : 1),
  and: (a, b) => (truthy(a) && truthy(b) ? 1 : 0),
  or: (a, b) => (truthy(a) || truthy(b) ? 1 : 0),
  xor: (a, b) => (truthy(a) !== truthy(b) ? 1 : 0),
  not: (a) => (truthy(a) ? 0 : 1),
};

export const FILTER_MAX_LENGTH = 500;
const MAX_DEPTH = 40;

/** A refused expression: the message says what and where, for the field the expression was typed in. */
export class FilterError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'FilterError';
  }
}

/** A checked filter: its tree and the columns it reads. */
export interface CompiledFilter {
  source: string;
  columns: FilterColumn[];
  node: MathNode;
}

function refusal(node: MathNode): string | null {
  switch (node.type) {
    case 'AssignmentNode':
      return 'assignments are not allowed (use == to compare)';
    case 'FunctionAssignmentNode':
      return 'function definitions are not allowed';
    case 'BlockNode':
      return 'write a single expression (no ";" or line breaks between several)';
    case 'AccessorNode':
    case 'IndexNode':
      return 'indexing and property access are not allowed';
    case 'ArrayNode':
    case 'ObjectNode':
    case 'RangeNode':
      return 'matrices, objects and ranges are not allowed';
    default:
      return null;
  }
}

interface Check {
  unknown: Set<string>;
  problems: string[];
  columns: Set<FilterColumn>;
}

function check(node: MathNode, depth: number, c: Check): void {
  if (depth > MAX_DEPTH) {
    c.problems.push(`the expression is nested more than ${MAX_DEPTH} levels deep`);
    return;
  }
  const refused = refusal(node);
  if (refused) {
    c.problems.push(refused);
    return;
  }
  const n = node as MathNode & Record<string, unknown>;
  switch (node.type) {
    case 'ConstantNode': {
      const value = n.value;
      if (typeof value !== 'number' && typeof value !== 'boolean') c.problems.push(`only numbers are allowed as values (not ${JSON.stringify(value)})`);
      return;
    }
    case 'SymbolNode': {
      const name = n.name as string;
      if (name in FILTER_COLUMNS) c.columns.add(FILTER_COLUMNS[name as FilterName]);
      else if (!(name in CONSTANTS)) c.unknown.add(name);
      return;
    }
    case 'ParenthesisNode':
      check(n.content as MathNode, depth + 1, c);
      return;
    case 'ConditionalNode':
      for (const part of [n.condition, n.trueExpr, n.falseExpr] as MathNode[]) check(part, depth + 1, c);
      return;
    case 'RelationalNode':
      for (const condition of n.conditionals as string[]) {
        if (!(condition in OPERATORS)) c.problems.push(`the comparison "${condition}" is not allowed`);
      }
      for (const part of n.params as MathNode[]) check(part, depth + 1, c);
      return;
    case 'OperatorNode': {
      const fn = n.fn as string;
      if (!(fn in OPERATORS)) c.problems.push(`the operator "${String(n.op)}" is not allowed`);
      for (const part of n.args as MathNode[]) check(part, depth + 1, c);
      return;
    }
    case 'FunctionNode': {
      const fnNode = n.fn as MathNode & { name?: string };
      const name = fnNode.type === 'SymbolNode' ? fnNode.name! : '';
      const args = n.args as MathNode[];
      if (name === 'import') c.problems.push('importing is not allowed');
      else if (!(name in FUNCTIONS)) c.problems.push(`the function "${name || '(expression)'}" is not allowed (allowed: ${Object.keys(FUNCTIONS).join(', ')})`);
      else {
        const [least, most] = FUNCTIONS[name].arity;
        if (args.length < least || args.length > most) c.problems.push(`${name} takes ${least === most ? least : `${least} to ${most}`} argument(s), not ${args.length}`);
      }
      for (const part of args) check(part, depth + 1, c);
      return;
    }
    default:
      c.problems.push(`"${node.toString()}" is not allowed here`);
  }
}

/** Parses and checks a filter; throws FilterError with every problem found. An empty text is no filter (null). */
export function compileFilter(source: string): CompiledFilter | null {
  const text = source.trim();
  if (text === '') return null;
  if (text.length > FILTER_MAX_LENGTH) throw new FilterError(`The filter is longer than ${FILTER_MAX_LENGTH} characters.`);
  let node: MathNode;
  try {
    node = parse(text);
  } catch (error) {
    throw new FilterError(`The filter cannot be read: ${(error as Error).message}.`);
  }
  const c: Check = { unknown: new Set(), problems: [], columns: new Set() };
  check(node, 0, c);
  const messages = [...new Set(c.problems)];
  if (c.unknown.size > 0) {
    messages.push(`unknown name${c.unknown.size > 1 ? 's' : ''} ${[...c.unknown].join(', ')} (columns: ${Object.keys(FILTER_COLUMNS).join(', ')}; constants: pi, e, true, false)`);
  }
  if (messages.length > 0) throw new FilterError(`The filter is refused: ${messages.join('; ')}.`);
  return { source: text, columns: [...c.columns], node };
}

type Value = number | Float64Array;

/**
 * The common two-operand operators as plain loops (a filter on a million jets runs them on every request; through
 * the generic `apply` each element costs a call that the engine cannot inline). Same results as OPERATORS.
 */
function binaryLoop(name: string, a: Value, b: Value, rows: number): Float64Array | null {
  const A = typeof a === 'number' ? null : a;
  const B = typeof b === 'number' ? null : b;
  const sa = typeof a === 'number' ? a : 0;
  const sb = typeof b === 'number' ? b : 0;
  const out = new Float64Array(rows);
  switch (name) {
    case 'larger':
      for (let i = 0; i < rows; i++) {
        const x = A ? A[i] : sa;
        const y = B ? B[i] : sb;
        out[i] = x > y && !nearlyEqual(x, y) ? 1 : 0;
      }
      return out;
    case 'largerEq':
      for (let i = 0; i < rows; i++) {
        const x = A ? A[i] : sa;
        const y = B ? B[i] : sb;
        out[i] = x > y || nearlyEqual(x, y) ? 1 : 0;
      }
      return out;
    case 'smaller':
      for (let i = 0; i < rows; i++) {
        const x = A ? A[i] : sa;
        const y = B ? B[i] : sb;
        out[i] = x < y && !nearlyEqual(x, y) ? 1 : 0;
      }
      return out;
    case 'smallerEq':
      for (let i = 0; i < rows; i++) {
        const x = A ? A[i] : sa;
        const y = B ? B[i] : sb;
        out[i] = x < y || nearlyEqual(x, y) ? 1 : 0;
      }
      return out;
    case 'and':
      for (let i = 0; i < rows; i++) out[i] = truthy(A ? A[i] : sa) && truthy(B ? B[i] : sb) ? 1 : 0;
      return out;
    case 'or':
      for (let i = 0; i < rows; i++) out[i] = truthy(A ? A[i] : sa) || truthy(B ? B[i] : sb) ? 1 : 0;
      return out;
    case 'add':
      for (let i = 0; i < rows; i++) out[i] = (A ? A[i] : sa) + (B ? B[i] : sb);
      return out;
    case 'subtract':
      for (let i = 0; i < rows; i++) out[i] = (A ? A[i] : sa) - (B ? B[i] : sb);
      return out;
    case 'multiply':
      for (let i = 0; i < rows; i++) out[i] = (A ? A[i] : sa) * (B ? B[i] : sb);
      return out;
    case 'divide':
      for (let i = 0; i < rows; i++) out[i] = (A ? A[i] : sa) / (B ? B[i] : sb);
      return out;
    default:
      return null;
  }
}

function apply(fn: Fn, args: Value[], rows: number): Value {
  if (args.every((a) => typeof a === 'number')) return fn(...(args as number[]));
  const out = new Float64Array(rows);
  if (args.length === 1) {
    const a = args[0] as Float64Array;
    for (let i = 0; i < rows; i++) out[i] = fn(a[i]);
  } else if (args.length === 2) {
    const [a, b] = args;
    if (typeof a === 'number') for (let i = 0; i < rows; i++) out[i] = fn(a, (b as Float64Array)[i]);
    else if (typeof b === 'number') for (let i = 0; i < rows; i++) out[i] = fn(a[i], b);
    else for (let i = 0; i < rows; i++) out[i] = fn(a[i], b[i]);
  } else {
    const row = new Array<number>(args.length);
    for (let i = 0; i < rows; i++) {
      for (let k = 0; k < args.length; k++) row[k] = typeof args[k] === 'number' ? (args[k] as number) : (args[k] as Float64Array)[i];
      out[i] = fn(...row);
    }
  }
  return out;
}

function evaluateNode(node: MathNode, columns: Record<string, ArrayLike<number>>, rows: number): Value {
  const n = node as MathNode & Record<string, unknown>;
  switch (node.type) {
    case 'ConstantNode':
      return Number(n.value);
    case 'SymbolNode': {
      const name = n.name as string;
      if (name in CONSTANTS) return CONSTANTS[name];
      const column = columns[FILTER_COLUMNS[name as FilterName]];
      return column instanceof Float64Array ? column : Float64Array.from(column);
    }
    case 'ParenthesisNode':
      return evaluateNode(n.content as MathNode, columns, rows);
    case 'ConditionalNode': {
      const [condition, yes, no] = [n.condition, n.trueExpr, n.falseExpr].map((part) => evaluateNode(part as MathNode, columns, rows));
      return apply((c, a, b) => (truthy(c) ? a : b), [condition, yes, no], rows);
    }
    case 'RelationalNode': {
      const params = (n.params as MathNode[]).map((part) => evaluateNode(part, columns, rows));
      const conditionals = n.conditionals as string[];
      let result: Value = 1;
      conditionals.forEach((condition, k) => {
        const step = apply(OPERATORS[condition], [params[k], params[k + 1]], rows);
        result = apply(OPERATORS.and, [result, step], rows);
      });
      return result;
    }
    case 'OperatorNode': {
      const args = (n.args as MathNode[]).map((part) => evaluateNode(part, columns, rows));
      const name = n.fn as string;
      const fast = args.length === 2 && (typeof args[0] !== 'number' || typeof args[1] !== 'number') ? binaryLoop(name, args[0], args[1], rows) : null;
      return fast ?? apply(OPERATORS[name], args, rows);
    }
    case 'FunctionNode': {
      const name = (n.fn as { name: string }).name;
      return apply(FUNCTIONS[name].fn, (n.args as MathNode[]).map((part) => evaluateNode(part, columns, rows)), rows);
    }
    default:
      throw new FilterError(`"${node.toString()}" cannot be evaluated`);
  }
}

/**
 * 1 for the rows (jets) the filter keeps: where its value is neither 0 nor NaN. `columns` holds the jet columns
 * the filter reads (compiled.columns), each `rows` long.
 */
export function evaluateFilter(compiled: CompiledFilter, columns: Record<string, ArrayLike<number>>, rows: number): Uint8Array {
  const value = evaluateNode(compiled.node, columns, rows);
  const keep = new Uint8Array(rows);
  if (typeof value === 'number') keep.fill(truthy(value) ? 1 : 0);
  else for (let i = 0; i < rows; i++) keep[i] = truthy(value[i]) ? 1 : 0;
  return keep;
}
