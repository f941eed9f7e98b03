/**
 * The analyst's derived variables: formulas are evaluated column-wise, and anything but
 * arithmetic and whitelisted math on the named columns is refused with a clear message.
 * The columns below are hand-made vectors for arithmetic checks (no science is asserted).
 */
import { describe, expect, it } from 'vitest';
import { compileFormula } from '../../shared/derived';
import { restrictedMath } from '../../shared/derived/formula';

const cols = {
  CT: Float64Array.from([10, 2, -1]),
  SA: Float64Array.from([35, 34.9, 34.2]),
  sigma0: Float64Array.from([26.9, 27.8, 27.3]),
  sigma2: Float64Array.from([36.1, 36.9, 36.4]),
  N2: Float64Array.from([1e-4, -1e-6, 4e-6]),
};
const names = Object.keys(cols);

function values(text: string): number[] {
  const r = compileFormula(text, names);
  if (!r.ok) throw new Error(`rejected: ${r.error.message}`);
  return Array.from(r.evaluate(cols));
}

describe('derived formulas: evaluation', () => {
  it('arithmetic over columns, element by element', () => {
    expect(values('CT - 2*SA')).toEqual([10 - 70, 2 - 69.8, -1 - 68.4]);
    expect(values('sigma2 - sigma0')).toEqual([36.1 - 26.9, 36.9 - 27.8, 36.4 - 27.3]);
    expect(values('(CT + 1) / 2 ^ 2')).toEqual([11 / 4, 3 / 4, 0]);
    expect(values('-CT')).toEqual([-10, -2, 1]);
    expect(values('2 CT')).toEqual([20, 4, -2]); // implicit multiplication
  });
  it('math functions, comparisons and the conditional', () => {
    const sq = values('sqrt(N2)');
    expect(sq[0]).toBeCloseTo(0.01, 15);
    expect(sq[1]).toBeNaN();
    expect(values('N2 > 0 ? sqrt(N2) : 0')[1]).toBe(0);
    expect(values('max(CT, 0)')).toEqual([10, 2, 0]);
    expect(values('0 < CT and CT < 5')).toEqual([0, 1, 0]);
    expect(values('0 < CT < 5')).toEqual([0, 1, 0]); // chained comparison
    expect(values('abs(CT) + cos(pi)')).toEqual([9, 1, 0]);
    expect(values('log(100, 10)')[0]).toBeCloseTo(2, 14);
  });
  it('reports the columns it reads, in first-use order', () => {
    const r = compileFormula('sigma2 - sigma0 + 0*sigma2', names);
    expect(r.ok && r.variables).toEqual(['sigma2', 'sigma0']);
  });
  it("a bare column returns a copy, not the caller's array", () => {
    const r = compileFormula('CT', names);
    if (!r.ok) throw new Error('rejected');
    const out = r.evaluate(cols);
    out[0] = 99;
    expect(cols.CT[0]).toBe(10);
  });
  it('columns of unequal length or missing columns are an error at evaluation', () => {
    const r = compileFormula('CT + SA', names);
    if (!r.ok) throw new Error('rejected');
    expect(() => r.evaluate({ CT: cols.CT, SA: Float64Array.from([1]) })).toThrow(/expected 3/);
    expect(() => r.evaluate({ CT: cols.CT })).toThrow(/SA/);
  });
});

describe('derived formulas: hostile and broken input is refused', () => {
  const refused: [string, RegExp][] = [
    ['x = 1', /assignment/],
    ['CT = 0', /assignment/],
    ['f(x) = x^2', /defining functions/],
    ['import({a: 1})', /not allowed/],
    ['createUnit("furlong")', /not allowed/],
    ['evaluate("1+1")', /not allowed/],
    ['parse("1")', /not allowed/],
    ['compile("1")', /not allowed/],
    ['simplify("x")', /not allowed/],
    ['CT.constructor', /property and index access/],
    ['CT["constructor"]', /property and index access/],
    ['CT.__proto__', /property and index access/],
    ['constructor', /unknown variable/],
    ['__proto__', /unknown variable/],
    ['toString(CT)', /not allowed/],
    ['cos.constructor("return process")()', /syntax error|property and index access|not allowed/],
    ['cos.constructor("return process")(1)', /only named math functions/],
    ['[1, 2, 3]', /matrices/],
    ['{a: CT}', /objects/],
    ['1:10', /ranges/],
    ['CT; SA', /one expression/],
    ['"a string"', /only numbers/],
    ['5 cm', /unknown variable "cm"/],
    ['foo + 1', /unknown variable "foo"/],
    ['sqrt', /is a function/],
    ['sqrt(1, 2)', /takes 1/],
    ['CT(1)', /not allowed/],
    ['1 + * 2', /syntax error/],
    ['(CT', /syntax error/],
    ['', /empty/],
  ];
  for (const [text, message] of refused) {
    it(`refuses ${JSON.stringify(text)}`, () => {
      const r = compileFormula(text, names);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.error.message).toMatch(message);
    });
  }
  it('gives the position of the offending part', () => {
    const unknown = compileFormula('CT + salinity * 2', names);
    expect(!unknown.ok && unknown.error.position).toBe(5);
    const syntax = compileFormula('CT + * 2', names);
    expect(!syntax.ok && syntax.error.position).toBe(5);
    const access = compileFormula('CT.constructor', names);
    expect(!access.ok && access.error.position).toBe(2);
  });
  it('refuses over-long formulas and deep nesting without blowing the stack', () => {
    expect(compileFormula('CT+'.repeat(300) + 'CT', names).ok).toBe(false);
    const deep = '('.repeat(120) + 'CT' + ')'.repeat(120);
    const r = compileFormula(deep, names);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.message).toMatch(/nested too deeply/);
  });
  it('the mathjs instance behind the parser has its dangerous entry points disabled', () => {
    // defence in depth: even if a tree reached mathjs, these would throw
    expect(() => restrictedMath.evaluate('1 + 1')).toThrow(/disabled/);
    expect(() => restrictedMath.import({}, {})).toThrow(/disabled/);
    expect(() => restrictedMath.createUnit('furlong')).toThrow(/disabled/);
    expect(() => restrictedMath.parse('1')).toThrow(/disabled/);
  });
});
