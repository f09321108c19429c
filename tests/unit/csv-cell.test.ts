import { describe, expect, it } from 'vitest';
import { csvText, neutraliseFormula as sut } from '../../src-api/exports/csv-cell';

describe('neutraliseFormula', () => {
  // The trigger characters are common practice for CSV injection: OWASP CSV Injection (memory).
  it.each([
    ['=HYPERLINK("http://evil.test","click")', `'=HYPERLINK("http://evil.test","click")`],
    ['+1+cmd|/C calc!A0', `'+1+cmd|/C calc!A0`],
    ['-2+3', `'-2+3`],
    ['@SUM(A1:A9)', `'@SUM(A1:A9)`],
    ['\t=1+1', `'\t=1+1`],
    ['\r=1+1', `'\r=1+1`],
  ])('prefixes %j with a single quote', (input, expected) => {
    expect(sut(input)).toBe(expected);
  });

  it.each(['SL-4471', 'H42531', 'a=b', '1-2', ' =leading space is not a formula start', '', "'already quoted"])('leaves %j as it is', (input) => {
    expect(sut(input)).toBe(input);
  });

  it('neutralises only the start: a formula character later in the text is harmless', () => {
    expect(sut('PO 12=3')).toBe('PO 12=3');
    expect(sut('=x=y')).toBe("'=x=y");
  });
});

describe('csvText', () => {
  it('keeps numbers as numbers, so a negative reading is not turned into text', () => {
    expect(csvText(-0.02)).toBe(-0.02);
    expect(csvText(0)).toBe(0);
    expect(csvText(Number.NaN)).toBe('');
  });

  it('writes nothing for null, ISO for instants, true/false for booleans', () => {
    expect(csvText(null)).toBe('');
    expect(csvText(undefined)).toBe('');
    expect(csvText(new Date('2026-03-14T09:12:00.000Z'))).toBe('2026-03-14T09:12:00.000Z');
    expect(csvText(true)).toBe('true');
    expect(csvText(false)).toBe('false');
  });

  it('joins lists and neutralises text that comes from them or from JSON', () => {
    expect(csvText(['H1', 'H2'])).toBe('H1; H2');
    expect(csvText(['-1+1', 'H2'])).toBe("'-1+1; H2");
    expect(csvText([18, 21.5])).toBe('18; 21.5');
    expect(csvText({ a: 1 })).toBe('{"a":1}');
    expect(csvText('@me')).toBe("'@me");
  });
});
