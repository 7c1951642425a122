import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readNumberCell } from '@shared/csv/cell-number';
import { readTable } from '@shared/csv/read-table';
import { parseSweepCsv } from '@shared/csv/sweeps';

const positive = fc.double({ min: 1e-9, max: 1e12, noNaN: true, noDefaultInfinity: true }).filter((x) => x > 0);
// Comma as the decimal separator only with a semicolon or tab delimiter, as exports do.
const layout = fc.constantFrom(
  { delimiter: ',', decimalComma: false },
  { delimiter: ';', decimalComma: false },
  { delimiter: '\t', decimalComma: false },
  { delimiter: ';', decimalComma: true },
  { delimiter: '\t', decimalComma: true },
);
const write = (x: number, comma: boolean) => (comma ? String(x).replace('.', ',') : String(x));

describe('round trip: write a table, read it back', () => {
  it('random positive numbers, random delimiter / decimal comma / BOM / CRLF / preamble → the same values', () => {
    fc.assert(
      fc.property(
        fc
          .integer({ min: 2, max: 5 })
          .chain((cols) =>
            fc.tuple(
              fc.constant(cols),
              fc.array(fc.array(positive, { minLength: cols, maxLength: cols }), { minLength: 1, maxLength: 30 }),
            ),
          ),
        layout,
        fc.boolean(),
        fc.boolean(),
        fc.boolean(),
        ([cols, table], { delimiter, decimalComma }, bom, crlf, preamble) => {
          // The property needs at least one cell with a fractional part so the separator is decidable.
          fc.pre(table.some((row) => row.some((x) => String(x).includes('.'))) || !decimalComma);
          const eol = crlf ? '\r\n' : '\n';
          const header = Array.from({ length: cols }, (_, i) => `Col ${i + 1} (ohm)`).join(delimiter);
          const lines = [
            ...(preamble ? ['# invented test table', `Device${delimiter}fixture`] : []),
            header,
            ...table.map((row) => row.map((x) => write(x, decimalComma)).join(delimiter)),
          ];
          const text = (bom ? '\uFEFF' : '') + lines.join(eol) + eol;
          const r = readTable(text);
          if (!r.ok) throw new Error(JSON.stringify(r.issues));
          expect(r.delimiter).toBe(delimiter);
          expect(r.headerLine).toBe(preamble ? 3 : 1);
          const back = r.rows.map((row) => row.cells.map((c) => readNumberCell(c, r.decimalComma, null)));
          expect(back).toEqual(table);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('a taper sweep in kΩ: resistances come back in Ω as the double nearest value × 1000', () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.integer({ min: 0, max: 300 }), { minLength: 3, maxLength: 40 }),
        layout,
        fc.array(positive, { minLength: 40, maxLength: 40 }),
        (rotations, { delimiter, decimalComma }, values) => {
          const rows = rotations.map((rot, i) => `${rot}${delimiter}${write(values[i]!, decimalComma)}`);
          const r = parseSweepCsv(['Rotation (°)', 'R (kΩ)'].join(delimiter) + '\n' + rows.join('\n'), 'taper');
          if (!r.ok) throw new Error(JSON.stringify(r.issues));
          const expected = rotations.map((rot, i) => ({ rotation: rot, resistance: values[i]! })).sort((a, b) => a.rotation - b.rotation);
          expect(r.points.map((p) => p.rotation)).toEqual(expected.map((p) => p.rotation));
          r.points.forEach((p, i) => {
            const want = expected[i]!.resistance * 1000;
            expect(Math.abs(p.resistance - want)).toBeLessThanOrEqual(Math.abs(want) * 2.3e-16);
          });
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe('readNumberCell: the allocation-free fast path agrees with Number() on the decimal text', () => {
  it('random decimal texts and column powers of ten give exactly Number(`${mantissa}e${exponent + power}`)', () => {
    const text = fc.record({
      sign: fc.constantFrom('', '-', '+'),
      int: fc.stringMatching(/^\d{0,19}$/),
      frac: fc.option(fc.stringMatching(/^\d{0,19}$/), { nil: undefined }),
      e: fc.option(fc.integer({ min: -330, max: 330 }), { nil: undefined }),
    });
    fc.assert(
      fc.property(text, fc.integer({ min: -15, max: 15 }), fc.boolean(), ({ sign, int, frac, e }, power, comma) => {
        fc.pre(int.length + (frac?.length ?? 0) > 0);
        const mantissa = `${sign}${int}${frac === undefined ? '' : `.${frac}`}`;
        const written = `${comma ? mantissa.replace('.', ',') : mantissa}${e === undefined ? '' : `e${e}`}`;
        const want = Number(`${mantissa}e${(e ?? 0) + power}`);
        const got = readNumberCell(written, comma, null, power);
        if (!Number.isFinite(want)) expect(got).toBe(`"${written}" is too large`);
        else expect(got).toBe(want === 0 ? 0 : want);
      }),
      { numRuns: 3000 },
    );
  });

  it('refuses what is not a plain number, on either path', () => {
    expect(readNumberCell('12k7x', false, 'kΩ')).toBe(`"12k7x" is not a number (write a plain number in kΩ, the column's unit)`);
    expect(readNumberCell('0x10', false, null)).toBe('"0x10" is not a number');
    expect(readNumberCell('1e', false, null)).toBe('"1e" is not a number');
    expect(readNumberCell('.', false, null)).toBe('"." is not a number');
    expect(readNumberCell('1,5', false, null)).toMatch(/uses decimal points/);
    expect(readNumberCell('1.5', true, null)).toMatch(/uses decimal commas/);
    expect(readNumberCell('  ', false, null)).toBe('the cell is empty');
    expect(readNumberCell(' 12.5 kΩ ', false, 'kΩ', 3)).toBe(12500);
    expect(readNumberCell('-0', false, null)).toBe(0);
  });
});
