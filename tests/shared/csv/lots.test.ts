import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { createLotRowReader, createRowLineCounter, isBlankRow, isCsvIssue, parseLotRows, sniffTable, type LotRow } from '@shared/csv/lots';

const LOT = '# lot 473J\nItem;C (nF);D;Freq (kHz)\nA1;47,12;0,0008;1\nA2;46,98;0,0011;1\n\nA3;47,30;;1\n';

describe('lot rows', () => {
  it('parses a decimal-comma lot with preamble, blank line and an empty D cell', () => {
    const r = parseLotRows(LOT, { quantity: 'capacitance' });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.headerLine).toBe(2);
    expect(r.secondQuantity).toBe('dissipation');
    expect(r.columns).toEqual({ item: 'Item', value: 'C (nF)', second: 'D', testFrequency: 'Freq (kHz)' });
    expect(r.rows).toEqual([
      { item: 'A1', value: 47.12e-9, second: 0.0008, frequency: 1000 },
      { item: 'A2', value: 46.98e-9, second: 0.0011, frequency: 1000 },
      { item: 'A3', value: 47.3e-9, second: null, frequency: 1000 },
    ]);
  });

  it('stops at the first bad row, naming line and column', () => {
    const text = 'Item,C (nF),D\n1,47.1,0.001\n2,4x7,0.001\n3,-47,0.001\n';
    const r = parseLotRows(text, { quantity: 'capacitance' });
    expect(!r.ok && r.issues).toEqual([
      {
        line: 3,
        column: 'C (nF)',
        message: 'Line 3, column "C (nF)": "4x7" is not a number (write a plain number in nF, the column\'s unit).',
      },
    ]);
  });

  it.each([
    ['Item,C (nF),D\n1,47.1,0.001\n2,-47.0,0.001\n', 'Line 3, column "C (nF)": -47.0 is negative; a capacitance cannot be.'],
    ['Item,C (nF),D\n1,47.1,0.001\n,47.0,0.001\n', 'Line 3, column "Item": the item is empty; every row needs its item label or number.'],
    ['Item,C (nF),D\n1,47.1,0.001\n2,47.0\n', 'Line 3: the row has 2 cells, but the header (line 1) has 3.'],
    ['Item,C (nF),ESR (Ω)\n1,47.1,0.5\n2,47.0,-0.2\n', 'Line 3, column "ESR (Ω)": -0.2 is negative; an ESR cannot be.'],
    [
      'Item,C (nF),Freq (kHz)\n1,47.1,1\n2,47.0,0\n',
      'Line 3, column "Freq (kHz)": 0 is not a test frequency: it must be greater than zero.',
    ],
  ])('refuses %j', (text, message) => {
    const r = parseLotRows(text, { quantity: 'capacitance' });
    expect(!r.ok && r.issues.map((i) => i.message)).toEqual([message]);
  });

  it('a value column in the wrong unit for the lot', () => {
    const r = parseLotRows('Item,R (kΩ)\n1,10\n', { quantity: 'capacitance' });
    expect(!r.ok && r.issues[0]!.message).toBe('Line 1, column "R (kΩ)": the value column is in kΩ, but this lot is of capacitors (F).');
  });

  it('unknown headers → needsMapping; an explicit mapping then reads the rows', () => {
    const text = 'Teil,Messwert\nx1,47.1\nx2,46.9\n';
    const first = parseLotRows(text, { quantity: 'capacitance' });
    expect(!first.ok && first.needsMapping?.missing).toEqual(['item', 'value']);
    const r = parseLotRows(text, { quantity: 'capacitance', mapping: { item: { column: 0 }, value: { column: 'Messwert', unit: 'nF' } } });
    expect(r.ok && r.rows.map((x) => x.value)).toEqual([47.1e-9, 46.9e-9]);
  });

  it('resistor lot in kΩ', () => {
    const r = parseLotRows('Serial\tR (kΩ)\n1\t9,93\n2\t10,04\n', { quantity: 'resistance' });
    expect(r.ok && r.rows.map((x) => x.value)).toEqual([9930, 10040]);
  });

  it('too many rows', () => {
    const rows = Array.from({ length: 6 }, (_, i) => `${i},47`).join('\n');
    const r = parseLotRows(`Item,C (nF)\n${rows}\n`, { quantity: 'capacitance', maxRows: 5 });
    expect(!r.ok && r.issues[0]!.message).toBe('Line 7: the lot has more than 5 rows, the most one upload may hold.');
  });

  it('streamed: sniff the head, then papaparse step with chunks gives the same rows and line numbers', () => {
    const lines = ['Instrument: bench LCR meter', 'Item;C (nF);D'];
    for (let i = 1; i <= 3000; i++) lines.push(`P${i};${(47 + (i % 17) / 10).toFixed(2).replace('.', ',')};0,001`);
    lines.splice(1500, 0, ''); // a blank line in the middle
    const text = lines.join('\r\n') + '\r\n';
    const whole = parseLotRows(text, { quantity: 'capacitance' });
    if (!whole.ok) throw new Error(JSON.stringify(whole.issues));

    const sniff = sniffTable(text.slice(0, 2000));
    if (!sniff.ok) throw new Error(JSON.stringify(sniff.issues));
    expect([sniff.headerLine, sniff.delimiter, sniff.decimalComma]).toEqual([2, ';', true]);
    const reader = createLotRowReader(sniff.header, {
      quantity: 'capacitance',
      decimalComma: sniff.decimalComma,
      headerLine: sniff.headerLine,
    });
    if (!reader.ok) throw new Error('reader');
    const lineOf = createRowLineCounter();
    const rows: LotRow[] = [];
    const lines3000: number[] = [];
    Papa.parse<string[]>(text, {
      delimiter: sniff.delimiter,
      chunkSize: 4096,
      step: (res) => {
        const cells = res.data;
        const line = lineOf(cells);
        if (line <= sniff.headerLine || isBlankRow(cells)) return;
        const r = reader.read(cells, line);
        if (isCsvIssue(r)) throw new Error(r.message);
        rows.push(r);
        if (r.item === 'P3000') lines3000.push(line);
      },
    });
    expect(rows).toEqual(whole.rows);
    expect(lines3000).toEqual([3003]); // 2 lines before the data, one blank line inside it
  });

  it('line numbers count line breaks inside quoted cells', () => {
    const r = parseLotRows('Item,C (nF),Note\n1,47.1,"two\nlines"\n2,oops,x\n', { quantity: 'capacitance' });
    expect(!r.ok && r.issues[0]!.line).toBe(4);
  });
});

describe('a capacitance column whose header names no unit (common practice)', () => {
  it('is read in farads when every value is below 1e-3', () => {
    const r = parseLotRows('Item,C\n1,4.7e-8\n2,4.71e-8\n', { quantity: 'capacitance' });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.rows.map((row) => row.value)).toEqual([4.7e-8, 4.71e-8]);
  });
  it('opens the mapping step for the unit when a value is 1e-3 or more (47 is not 47 F)', () => {
    const r = parseLotRows('Item,C\n1,47.1\n2,46.9\n', { quantity: 'capacitance' });
    if (r.ok) throw new Error('47.1 F was accepted');
    expect(r.issues[0]!.message).toMatch(/give the column's unit/);
    expect(r.issues[0]!.column).toBe('C');
    // the columns were found; only the value column's unit is asked for
    expect(r.needsMapping?.missing).toEqual([]);
    expect(r.needsMapping?.detected.item?.index).toBe(0);
    expect(r.needsMapping?.unitNeeded).toEqual([
      { role: 'value', index: 1, header: 'C', reason: expect.stringMatching(/cannot be farads/) },
    ]);
    // the unit stated in the mapping step reads the same file
    const mapped = parseLotRows('Item,C\n1,47.1\n2,46.9\n', { quantity: 'capacitance', mapping: { value: { column: 1, unit: 'nF' } } });
    if (!mapped.ok) throw new Error(JSON.stringify(mapped.issues));
    expect(mapped.rows.map((row) => row.value)).toEqual([47.1e-9, 46.9e-9]);
  });
  it('a value refused for another reason does not open the mapping step', () => {
    const r = parseLotRows('Item,C\n1,4.7e-8\n2,-4.7e-8\n', { quantity: 'capacitance' });
    expect(!r.ok && r.needsMapping).toBeUndefined();
  });
  it('lists the columns it does not use', () => {
    const r = parseLotRows('Item,C (nF),Bin,Operator\n1,47.1,A,x\n', { quantity: 'capacitance' });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.ignored).toEqual(['Bin', 'Operator']);
    const clean = parseLotRows('Item,C (nF)\n1,47.1\n', { quantity: 'capacitance' });
    expect(clean.ok && clean.ignored).toEqual([]);
  });
  it('keeps reading a header unit as given: C (nF)', () => {
    const r = parseLotRows('Item,C (nF)\n1,47.1\n', { quantity: 'capacitance' });
    expect(r.ok).toBe(true);
  });
});
