/**
 * The analyst's derived variables: a formula in mathjs expression syntax over a cast's columns
 * (`CT - 2*SA`, `sigma2 - sigma0`, `sqrt(N2)`), checked and then evaluated column-wise.
 *
 * Safety: the text is only *parsed* by mathjs (a restricted instance whose evaluate/import/
 * createUnit/parse/... are replaced by functions that throw, as defence in depth). The parse tree
 * is then walked and only these nodes pass: number constants, symbols that name an allowed
 * column or a constant (pi, e, NaN, Infinity), arithmetic / comparison / logical operators,
 * parentheses, the conditional `a ? b : c`, chained comparisons, and calls of a fixed list of
 * math functions by plain name. Everything else (assignment, function definition, property or
 * index access, matrices, objects, ranges, blocks, strings, units, unknown names) is refused with
 * a message and, where it can be found, the character position. The tree is never handed back to
 * mathjs for evaluation: the checked tree is compiled here into closures over Float64Array
 * columns, so nothing but the listed arithmetic can run.
 */
import { create, all } from 'mathjs';
import type { MathNode } from 'mathjs';

const math = create(all);
/** The restricted instance (exported for its tests only). */
export const restrictedMath = math;
// Keep the one entry point we use, then disable everything that can reach code or the instance.
const parseExpression = math.parse.bind(math);
const refuse = (name: string) => () => {
  throw new Error(`${name} is disabled in formulas`);
};
math.import(
  {
    import: refuse('import'),
    createUnit: refuse('createUnit'),
    evaluate: refuse('evaluate'),
    parse: refuse('parse'),
    compile: refuse('compile'),
    simplify: refuse('simplify'),
    derivative: refuse('derivative'),
    resolve: refuse('resolve'),
    reviver: refuse('reviver'),
    chain: refuse('chain'),
  },
  { override: true },
);

/** Longest formula accepted, characters. */
export const MAX_FORMULA_LENGTH = 500;
/** Deepest parse tree accepted (guards the recursive compiler). */
const MAX_DEPTH = 64;

type Unary = (x: number) => number;
type Binary = (x: number, y: number) => number;

/** Whitelisted functions: name → arity range and scalar implementation. */
const FUNCTIONS: Record<string, { min: number; max: number; fn: (...xs: number[]) => number }> = {
  sqrt: { min: 1, max: 1, fn: Math.sqrt as Unary },
  cbrt: { min: 1, max: 1, fn: Math.cbrt as Unary },
  abs: { min: 1, max: 1, fn: Math.abs as Unary },
  exp: { min: 1, max: 1, fn: Math.exp as Unary },
  log: { min: 1, max: 2, fn: (x: number, b?: number) => (b === undefined ? Math.log(x) : Math.log(x) / Math.log(b)) },
  log10: { min: 1, max: 1, fn: Math.log10 as Unary },
  log2: { min: 1, max: 1, fn: Math.log2 as Unary },
  sin: { min: 1, max: 1, fn: Math.sin as Unary },
  cos: { min: 1, max: 1, fn: Math.cos as Unary },
  tan: { min: 1, max: 1, fn: Math.tan as Unary },
  asin: { min: 1, max: 1, fn: Math.asin as Unary },
  acos: { min: 1, max: 1, fn: Math.acos as Unary },
  atan: { min: 1, max: 1, fn: Math.atan as Unary },
  atan2: { min: 2, max: 2, fn: Math.atan2 as Binary },
  sinh: { min: 1, max: 1, fn: Math.sinh as Unary },
  cosh: { min: 1, max: 1, fn: Math.cosh as Unary },
  tanh: { min: 1, max: 1, fn: Math.tanh as Unary },
  pow: { min: 2, max: 2, fn: Math.pow as Binary },
  hypot: { min: 2, max: 8, fn: Math.hypot },
  min: { min: 1, max: 8, fn: Math.min },
  max: { min: 1, max: 8, fn: Math.max },
  sign: { min: 1, max: 1, fn: Math.sign as Unary },
  floor: { min: 1, max: 1, fn: Math.floor as Unary },
  ceil: { min: 1, max: 1, fn: Math.ceil as Unary },
  round: { min: 1, max: 1, fn: Math.round as Unary },
  square: { min: 1, max: 1, fn: (x: number) => x * x },
  cube: { min: 1, max: 1, fn: (x: number) => x * x * x },
  mod: { min: 2, max: 2, fn: (x: number, y: number) => x - y * Math.floor(x / y) },
  isNaN: { min: 1, max: 1, fn: (x: number) => (Number.isNaN(x) ? 1 : 0) },
};

const CONSTANTS: Record<string, number> = {
  pi: Math.PI,
  e: Math.E,
  NaN: Number.NaN,
  Infinity: Number.POSITIVE_INFINITY,
};

const truth = (x: number): boolean => x !== 0 && !Number.isNaN(x);
const BINARY: Record<string, Binary> = {
  add: (a, b) => a + b,
  subtract: (a, b) => a - b,
  multiply: (a, b) => a * b,
  dotMultiply: (a, b) => a * b,
  divide: (a, b) => a / b,
  dotDivide: (a, b) => a / b,
  pow: Math.pow,
  dotPow: Math.pow,
  mod: (a, b) => a - b * Math.floor(a / b),
  smaller: (a, b) => (a < b ? 1 : 0),
  larger: (a, b) => (a > b ? 1 : 0),
  smallerEq: (a, b) => (a <= b ? 1 : 0),
  largerEq: (a, b) => (a >= b ? 1 : 0),
  equal: (a, b) => (a === b ? 1 : 0),
  unequal: (a, b) => (a !== b ? 1 : 0),
  and: (a, b) => (truth(a) && truth(b) ? 1 : 0),
  or: (a, b) => (truth(a) || truth(b) ? 1 : 0),
  xor: (a, b) => (truth(a) !== truth(b) ? 1 : 0),
};
const UNARY: Record<string, Unary> = {
  unaryMinus: (a) => -a,
  unaryPlus: (a) => a,
  not: (a) => (truth(a) ? 0 : 1),
};
const RELATIONAL: Record<string, Binary> = {
  smaller: BINARY.smaller,
  larger: BINARY.larger,
  smallerEq: BINARY.smallerEq,
  largerEq: BINARY.largerEq,
  equal: BINARY.equal,
  unequal: BINARY.unequal,
};

/** A compiled node: fills `out` (length n) from the columns. */
type Kernel = (cols: Readonly<Record<string, Float64Array>>, n: number) => Float64Array;

export interface FormulaError {
  message: string;
  /** 0-based character position in the formula, when known. */
  position: number | null;
}

export type CompiledFormula =
  | {
      ok: true;
      text: string;
      /** Column names the formula reads, in first-use order. */
      variables: string[];
      /** Evaluate over columns of equal length; returns a new column. */
      evaluate(columns: Readonly<Record<string, Float64Array>>): Float64Array;
    }
  | { ok: false; error: FormulaError };

class FormulaRejection extends Error {
  constructor(
    message: string,
    readonly needle: string | null,
  ) {
    super(message);
  }
}

/** First position of a name as a whole word, for pointing at the offending part. */
function positionOf(text: string, needle: string | null): number | null {
  if (!needle) return null;
  const escaped = needle.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const m = new RegExp(`(^|[^A-Za-z0-9_])(${escaped})`).exec(text);
  return m ? m.index + m[1].length : text.indexOf(needle) >= 0 ? text.indexOf(needle) : null;
}

function mapInto(n: number, f: (i: number) => number): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = f(i);
  return out;
}

function compileNode(node: MathNode, allowed: ReadonlySet<string>, used: string[], depth: number): Kernel {
  if (depth > MAX_DEPTH) throw new FormulaRejection('formula is nested too deeply', null);
  switch (node.type) {
    case 'ConstantNode': {
      const value = (node as unknown as { value: unknown }).value;
      if (typeof value !== 'number')
        throw new FormulaRejection(
          'only numbers may appear as constants (no strings or other values)',
          typeof value === 'string' ? `"${value}` : null,
        );
      return (_c, n) => new Float64Array(n).fill(value);
    }
    case 'SymbolNode': {
      const name = (node as unknown as { name: string }).name;
      if (Object.prototype.hasOwnProperty.call(CONSTANTS, name)) {
        const value = CONSTANTS[name];
        return (_c, n) => new Float64Array(n).fill(value);
      }
      if (!allowed.has(name)) {
        if (Object.prototype.hasOwnProperty.call(FUNCTIONS, name))
          throw new FormulaRejection(`${name} is a function; call it as ${name}(…)`, name);
        throw new FormulaRejection(`unknown variable "${name}" (available: ${[...allowed].join(', ')})`, name);
      }
      if (!used.includes(name)) used.push(name);
      return (cols) => {
        const col = cols[name];
        if (!col) throw new Error(`column "${name}" is missing`);
        return col;
      };
    }
    case 'ParenthesisNode':
      return compileNode((node as unknown as { content: MathNode }).content, allowed, used, depth + 1);
    case 'OperatorNode': {
      const { fn, op, args } = node as unknown as { fn: string; op: string; args: MathNode[] };
      const kids = args.map((a) => compileNode(a, allowed, used, depth + 1));
      if (kids.length === 1 && Object.prototype.hasOwnProperty.call(UNARY, fn)) {
        const u = UNARY[fn];
        const [a] = kids;
        return (c, n) => {
          const x = a(c, n);
          return mapInto(n, (i) => u(x[i]));
        };
      }
      if (kids.length === 2 && Object.prototype.hasOwnProperty.call(BINARY, fn)) {
        const b = BINARY[fn];
        const [ka, kb] = kids;
        return (c, n) => {
          const x = ka(c, n),
            y = kb(c, n);
          return mapInto(n, (i) => b(x[i], y[i]));
        };
      }
      throw new FormulaRejection(`operator "${op}" is not allowed in formulas`, op);
    }
    case 'ConditionalNode': {
      const { condition, trueExpr, falseExpr } = node as unknown as {
        condition: MathNode;
        trueExpr: MathNode;
        falseExpr: MathNode;
      };
      const kc = compileNode(condition, allowed, used, depth + 1);
      const kt = compileNode(trueExpr, allowed, used, depth + 1);
      const kf = compileNode(falseExpr, allowed, used, depth + 1);
      return (c, n) => {
        const x = kc(c, n),
          t = kt(c, n),
          e = kf(c, n);
        return mapInto(n, (i) => (truth(x[i]) ? t[i] : e[i]));
      };
    }
    case 'RelationalNode': {
      const { conditionals, params } = node as unknown as { conditionals: string[]; params: MathNode[] };
      const kids = params.map((p) => compileNode(p, allowed, used, depth + 1));
      const rels = conditionals.map((name) => {
        if (!Object.prototype.hasOwnProperty.call(RELATIONAL, name))
          throw new FormulaRejection(`comparison "${name}" is not allowed`, null);
        return RELATIONAL[name];
      });
      return (c, n) => {
        const vals = kids.map((k) => k(c, n));
        return mapInto(n, (i) => {
          for (let r = 0; r < rels.length; r++) if (rels[r](vals[r][i], vals[r + 1][i]) === 0) return 0;
          return 1;
        });
      };
    }
    case 'FunctionNode': {
      const { fn, args } = node as unknown as { fn: MathNode; args: MathNode[] };
      if (fn.type !== 'SymbolNode') throw new FormulaRejection('only named math functions may be called', null);
      const name = (fn as unknown as { name: string }).name;
      if (!Object.prototype.hasOwnProperty.call(FUNCTIONS, name)) {
        throw new FormulaRejection(
          `function "${name}" is not allowed (allowed: ${Object.keys(FUNCTIONS).join(', ')})`,
          name,
        );
      }
      const spec = FUNCTIONS[name];
      if (args.length < spec.min || args.length > spec.max) {
        throw new FormulaRejection(
          `${name} takes ${spec.min === spec.max ? spec.min : `${spec.min} to ${spec.max}`} argument(s), got ${args.length}`,
          name,
        );
      }
      const kids = args.map((a) => compileNode(a, allowed, used, depth + 1));
      const g = spec.fn;
      if (kids.length === 1) {
        const [a] = kids;
        return (c, n) => {
          const x = a(c, n);
          return mapInto(n, (i) => g(x[i]));
        };
      }
      return (c, n) => {
        const xs = kids.map((k) => k(c, n));
        const buf = new Array<number>(xs.length);
        return mapInto(n, (i) => {
          for (let k = 0; k < xs.length; k++) buf[k] = xs[k][i];
          return g(...buf);
        });
      };
    }
    case 'AssignmentNode':
      throw new FormulaRejection('assignments are not allowed in formulas', '=');
    case 'FunctionAssignmentNode':
      throw new FormulaRejection('defining functions is not allowed in formulas', '=');
    case 'AccessorNode':
    case 'IndexNode': {
      const dot = (node as unknown as { index?: { dotNotation?: boolean } }).index?.dotNotation;
      throw new FormulaRejection('property and index access is not allowed in formulas', dot ? '.' : '[');
    }
    case 'ArrayNode':
      throw new FormulaRejection('matrices and lists are not allowed in formulas', '[');
    case 'ObjectNode':
      throw new FormulaRejection('objects are not allowed in formulas', '{');
    case 'RangeNode':
      throw new FormulaRejection('ranges are not allowed in formulas', ':');
    case 'BlockNode':
      throw new FormulaRejection('a formula is one expression (no ; or line breaks)', null);
    default:
      throw new FormulaRejection(`"${node.type}" is not allowed in formulas`, null);
  }
}

/**
 * Check and compile a derived-variable formula over the named columns.
 * Returns the evaluator and the columns it reads, or an error with a message and position.
 */
export function compileFormula(text: string, allowedColumns: Iterable<string>): CompiledFormula {
  if (typeof text !== 'string' || text.trim() === '')
    return { ok: false, error: { message: 'the formula is empty', position: 0 } };
  if (text.length > MAX_FORMULA_LENGTH) {
    return {
      ok: false,
      error: { message: `the formula is longer than ${MAX_FORMULA_LENGTH} characters`, position: MAX_FORMULA_LENGTH },
    };
  }
  const allowed = new Set<string>();
  for (const c of allowedColumns) if (/^[A-Za-z_][A-Za-z0-9_]*$/.test(c) && !(c in CONSTANTS)) allowed.add(c);
  let tree: MathNode;
  try {
    tree = parseExpression(text);
  } catch (err) {
    const e = err as { message?: string; char?: number };
    const position = typeof e.char === 'number' ? Math.max(0, e.char - 1) : null;
    return {
      ok: false,
      error: {
        message: `syntax error: ${(e.message ?? 'cannot read the formula').replace(/ \(char \d+\)$/, '')}`,
        position,
      },
    };
  }
  const used: string[] = [];
  let kernel: Kernel;
  try {
    kernel = compileNode(tree, allowed, used, 0);
  } catch (err) {
    if (err instanceof FormulaRejection)
      return { ok: false, error: { message: err.message, position: positionOf(text, err.needle) } };
    throw err;
  }
  return {
    ok: true,
    text,
    variables: used,
    evaluate(columns) {
      let n = -1;
      for (const name of used) {
        const col = columns[name];
        if (!(col instanceof Float64Array)) throw new Error(`column "${name}" is missing`);
        if (n < 0) n = col.length;
        else if (col.length !== n) throw new RangeError(`column "${name}" has ${col.length} values, expected ${n}`);
      }
      if (n < 0) {
        // A formula of constants only: as long as any column given, else one value.
        const first = Object.values(columns)[0];
        n = first ? first.length : 1;
      }
      const result = kernel(columns, n);
      // A bare column name returns the column itself; hand back a copy the caller may own.
      return used.length === 1 && tree.type === 'SymbolNode' ? Float64Array.from(result) : result;
    },
  };
}
