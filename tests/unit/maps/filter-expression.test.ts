// Jet filter expressions: accepted and refused ones (with the message a person sees), and the column-wise
// evaluation checked against mathjs's own evaluate on the same rows.
import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { compileFilter, evaluateFilter, FILTER_COLUMNS, FilterError } from '@/lib/maps/filter-expression';

const refusal = (source: string) => {
  try {
    compileFilter(source);
  } catch (error) {
    expect(error).toBeInstanceOf(FilterError);
    return (error as Error).message;
  }
  throw new Error(`"${source}" was accepted`);
};

describe('accepted filters', () => {
  it.each([
    'pt > 400 and m_g < 40',
    'abs(y) < 1.5 or not (multiplicity >= 10)',
    '200 <= pt < 800',
    'z_g > 0.1 ? R_g > 0.05 : true',
    'log(pt, 10) > 2.5 xor n > 30',
    'max(m, m_g) / pt < 0.2 and weight != 0',
    'sqrt(phi) + exp(-R_g) > pi / e',
  ])('%s', (source) => {
    const compiled = compileFilter(source)!;
    expect(compiled.source).toBe(source);
  });

  it('an empty text is no filter', () => {
    expect(compileFilter('  ')).toBeNull();
  });

  it('reads only the columns it names', () => {
    expect(compileFilter('pt > 400 and m_g < 40')!.columns.sort()).toEqual(['mg', 'pt']);
  });
});

describe('refused filters, with a message naming the problem', () => {
  it.each([
    ['pt = 400', /assignments are not allowed/],
    ['f(x) = x^2', /function definitions are not allowed/],
    ['import({x: 1})', /importing is not allowed/],
    ['pt > 1; m > 2', /single expression/],
    ['createUnit("foo")', /the function "createUnit" is not allowed/],
    ['evaluate("1+1") > 0', /the function "evaluate" is not allowed/],
    ['pt[1] > 3', /indexing and property access are not allowed/],
    ['[1, 2] > 0', /matrices, objects and ranges are not allowed/],
    ['pt > "400"', /only numbers are allowed/],
    ['pt > 5 GeV', /unknown name GeV/],
    ['pt!', /the operator "!" is not allowed/],
    ['pt > (', /cannot be read/],
    ['abs(pt, 2) > 1', /abs takes 1 argument/],
  ])('%s', (source, message) => {
    expect(refusal(source)).toMatch(message);
  });

  it('lists every unknown name, and the names that are allowed', () => {
    const message = refusal('ptt > 400 and mass < 40 and foo');
    expect(message).toMatch(/unknown names ptt, mass, foo/);
    expect(message).toMatch(/columns: pt, y, phi, m, n, weight, m_g, z_g, R_g, multiplicity/);
  });

  it('refuses over-long and deeply nested text', () => {
    expect(refusal(`pt > ${'1'.repeat(600)}`)).toMatch(/longer than 500 characters/);
    expect(refusal(`${'('.repeat(60)}pt${')'.repeat(60)} > 1`)).toMatch(/nested more than 40 levels/);
  });
});

describe('evaluation over columns agrees with mathjs evaluate, row by row', () => {
  const rows = 400;
  let state = 12345;
  const random = () => ((state = (state * 16807) % 2147483647) / 2147483647);
  const columns: Record<string, Float64Array> = {};
  for (const column of Object.values(FILTER_COLUMNS)) columns[column] = Float64Array.from({ length: rows }, () => Math.round(random() * 1000) / 10);
  // exact ties and values missing as in SoftDrop's tagging mode
  columns.pt[0] = 40;
  columns.mg[1] = Number.NaN;

  it.each([
    'pt > 40 and m_g < 40',
    'pt >= 40 or not (z_g > 50)',
    '20 <= pt < 60',
    'z_g > 50 ? R_g > 20 : n < 30',
    'pt == 40 xor multiplicity > 80',
    'max(m, m_g) / pt < 0.5 and weight != 0',
    'abs(y - phi) + log(pt + 1) > 4',
    '(pt mod 7) > 3',
  ])('%s', (source) => {
    const compiled = compileFilter(source)!;
    const keep = evaluateFilter(compiled, columns, rows);
    for (let i = 0; i < rows; i++) {
      const scope: Record<string, number> = {};
      for (const [name, column] of Object.entries(FILTER_COLUMNS)) scope[name] = columns[column][i];
      const value = evaluate(source, scope) as number | boolean;
      expect(keep[i], `row ${i}`).toBe(value && !Number.isNaN(value) ? 1 : 0);
    }
  });
});
