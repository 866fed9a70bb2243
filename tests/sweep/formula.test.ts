// sweep stage: area formulas are parsed by mathjs under a checked grammar, evaluated and differentiated.
import { describe, expect, it } from 'vitest';
import { parseAreaFormulas, parseFormula, splitFormulas } from '../../src/sweep/formula.ts';
import { FormulaError } from '../../src/errors.ts';

describe('splitFormulas', () => {
  it('splitFormulas splits at top-level commas only', () => {
    expect(splitFormulas('1, max(1, t), 2 * (t + 1)')).toEqual(['1', 'max(1, t)', '2 * (t + 1)']);
  });

  it('splitFormulas refuses an empty formula and unbalanced parentheses', () => {
    expect(() => splitFormulas('1,,t')).toThrow(FormulaError);
    expect(() => splitFormulas('1, (t')).toThrow(FormulaError);
    expect(() => splitFormulas('1, t)')).toThrow(FormulaError);
  });
});

describe('parseFormula', () => {
  it('parseFormula evaluates to the closed form (arithmetic, constants, functions)', () => {
    // reference values: the formulas' own closed forms
    expect(parseFormula('1 + t^2', ['t']).value({ t: 3 })).toBe(10);
    expect(parseFormula('2t', ['t']).value({ t: 1.5 })).toBe(3); // implicit multiplication
    expect(parseFormula('pi * s * t', ['s', 't']).value({ s: 2, t: 0.5 })).toBeCloseTo(Math.PI, 15);
    expect(parseFormula('sqrt(t) + exp(0) + log(e)', ['t']).value({ t: 4 })).toBe(4);
  });

  it('parseFormula gives the derivative: symbolic, and by central difference for max', () => {
    // d/dt t^3 = 3 t^2, d/dt sqrt(t) = 1 / (2 sqrt t), d/dt max(1, 2t) = 2 for t > 1/2 (calculus)
    expect(parseFormula('t^3', ['t']).slope({ t: 2 }, 't')).toBeCloseTo(12, 12);
    expect(parseFormula('sqrt(t)', ['t']).slope({ t: 4 }, 't')).toBeCloseTo(0.25, 12);
    expect(parseFormula('max(1, 2t)', ['t']).slope({ t: 3 }, 't')).toBeCloseTo(2, 8);
    expect(parseFormula('3', ['t']).slope({ t: 3 }, 't')).toBe(0);
    expect(parseFormula('s * t', ['s', 't']).slope({ s: 5, t: 3 }, 's')).toBe(3);
  });

  it('parseFormula keys identical formulas alike (one area class for the sweep)', () => {
    expect(parseFormula('1.0', ['t']).key).toBe(parseFormula('1', ['t']).key);
    expect(parseFormula('2*t', ['t']).key).toBe(parseFormula('2 * t', ['t']).key);
    expect(parseFormula('t', ['t']).key).not.toBe(parseFormula('1', ['t']).key);
  });

  it('parseFormula refuses what is not a real formula of the parameters', () => {
    for (const text of ['1 +', 'u + 1', 'a = 3', 'f(x) = x', '[1, 2]', '"x"', 't > 1 ? 1 : 2', 'evaluate("1")', 'import({})', 't.x', 't == 1']) {
      expect(() => parseFormula(text, ['t']), text).toThrow(FormulaError);
    }
  });

  it('parseFormula names the unknown symbol in one line', () => {
    expect(() => parseFormula('1 + u', ['t'], 'Area 3 "1 + u"')).toThrow(/^Area 3 "1 \+ u" names the unknown symbol "u" .*\.$/);
  });

  it('parseFormula gives NaN, not a complex number, where mathjs has no real value', () => {
    expect(Number.isNaN(parseFormula('sqrt(t)', ['t']).value({ t: -1 }))).toBe(true);
  });
});

describe('parseAreaFormulas', () => {
  it('parseAreaFormulas parses one formula per cell and records which parameters each uses', () => {
    const f = parseAreaFormulas('1, 1, s, s * t', ['s', 't']);
    expect(f.map((x) => x.source)).toEqual(['1', '1', 's', 's * t']);
    expect(f.map((x) => x.uses)).toEqual([[], [], ['s'], ['s', 't']]);
  });
});
