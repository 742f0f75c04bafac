/**
 * Numbers in fixed-width columns (PDB coordinates): the column's own bytes
 * only, blanks either side, and always the value parseNumberBytes gives for
 * the trimmed text, which itself agrees with JavaScript's Number().
 */
import { describe, expect, it } from 'vitest';
import { parseColumnNumber } from '../../../server/formats/column-number.ts';
import { parseNumberBytes } from '../../../server/formats/number-bytes.ts';
import { random } from './synthetic.ts';

const column = (text: string) => parseColumnNumber(Buffer.from(text, 'latin1'), 0, text.length);

describe('numbers in fixed-width columns', () => {
  it('when a column holds a right-aligned decimal, then its value is read, sign included', () => {
    expect([column('   1.234'), column('  -0.500'), column('-123.456'), column('+12.5000'), column('      7.')]).toEqual([1.234, -0.5, -123.456, 12.5, 7]);
  });

  it('when blanks or tabs surround the number, then they are ignored', () => {
    expect([column(' 1.5    '), column('\t-2.25\t'), column('3       ')]).toEqual([1.5, -2.25, 3]);
  });

  it('when columns abut with no blank between them, then each is read from its own bytes only', () => {
    const buf = Buffer.from('-999.999-888.888 777.777');
    expect([parseColumnNumber(buf, 0, 8), parseColumnNumber(buf, 8, 16), parseColumnNumber(buf, 16, 24)]).toEqual([-999.999, -888.888, 777.777]);
  });

  it('when digits, a point or blanks run on into the next column, then only the column\'s own part is read', () => {
    const buf = Buffer.from('1234567812345678   12345.678-       1.000');
    expect([parseColumnNumber(buf, 0, 8), parseColumnNumber(buf, 8, 16), parseColumnNumber(buf, 16, 24), parseColumnNumber(buf, 24, 28)]).toEqual([
      12345678, 12345678, 12345, 0.678,
    ]);
    expect(parseColumnNumber(buf, 28, 36)).toBeNaN();
    expect(parseColumnNumber(buf, 29, 35)).toBeNaN();
  });

  it('when a column is blank or holds no decimal number, then the result is NaN', () => {
    for (const text of ['        ', '', '-', '+', '.', '  x.yz  ', '1 2', '1.2.3', '0x1A', '--1', '1e', 'NaN', 'Infinity', '- 1.0']) {
      expect(column(text), JSON.stringify(text)).toBeNaN();
    }
  });

  it('when a column holds an exponent or a Fortran D exponent, then it reads as the general parser reads it', () => {
    expect([column('  1.5e2 '), column('-2.5E-01'), column('1.5D+02 ')]).toEqual([150, -0.25, 150]);
    expect(column(' 9e999  ')).toBe(Infinity);
  });

  it('when random fields are read, then each value is exactly the one parseNumberBytes gives for the trimmed text', () => {
    const rnd = random(11);
    for (let k = 0; k < 20_000; k++) {
      const digits = Math.floor(rnd() * 20) + 1;
      let mantissa = '';
      for (let d = 0; d < digits; d++) mantissa += Math.floor(rnd() * 10);
      const dot = Math.floor(rnd() * (digits + 2));
      let token = dot > digits ? mantissa : `${mantissa.slice(0, dot)}.${mantissa.slice(dot)}`;
      if (rnd() < 0.1) token += `e${rnd() < 0.5 ? '-' : ''}${Math.floor(rnd() * 30)}`;
      if (rnd() < 0.5) token = `${rnd() < 0.8 ? '-' : '+'}${token}`;
      const text = `${' '.repeat(Math.floor(rnd() * 4))}${token}${' '.repeat(Math.floor(rnd() * 3))}`;
      const line = Buffer.from(`ATOM${text}9.0`);
      const expected = parseNumberBytes(Buffer.from(token), 0, token.length);
      expect(Object.is(parseColumnNumber(line, 4, 4 + text.length), expected), text).toBe(true);
    }
  });
});
