import { describe, expect, it } from 'vitest';
import { readTable } from '@shared/csv/read-table';
import { MAX_ISSUES } from '@shared/csv/issues';

function ok(text: string, minRows = 1) {
  const r = readTable(text, { minRows });
  if (!r.ok) throw new Error(`expected ok, got ${JSON.stringify(r.issues)}`);
  return r;
}
function fail(text: string, minRows = 1) {
  const r = readTable(text, { minRows });
  if (r.ok) throw new Error('expected a failure');
  return r.issues;
}

describe('readTable: delimiters, decimal separators, line numbers', () => {
  it('reads a plain comma file', () => {
    const r = ok('Rotation (°),R (kΩ)\n0,0.3\n150,73.2\n300,486.7\n');
    expect(r.delimiter).toBe(',');
    expect(r.decimalComma).toBe(false);
    expect(r.header).toEqual(['Rotation (°)', 'R (kΩ)']);
    expect(r.headerLine).toBe(1);
    expect(r.rows.map((x) => x.line)).toEqual([2, 3, 4]);
    expect(r.rows[1]!.cells).toEqual(['150', '73.2']);
  });

  it('detects semicolon + decimal comma (1,5;2,3), where a comma split would also be regular', () => {
    const r = ok('A (Hz);B (ohm)\n1,5;2,3\n2,5;3,25\n4,5;6,75\n');
    expect(r.delimiter).toBe(';');
    expect(r.decimalComma).toBe(true);
    expect(r.rows[0]!.cells).toEqual(['1,5', '2,3']);
  });

  it('detects tab + decimal comma', () => {
    const r = ok('Freq (Hz)\t|Z| (kOhm)\tPhase (deg)\n20\t7,69\t4,01\n40\t7,71\t8,02\n80\t7,8\t15,9\n');
    expect(r.delimiter).toBe('\t');
    expect(r.decimalComma).toBe(true);
    expect(r.rows[2]!.cells).toEqual(['80', '7,8', '15,9']);
  });

  it('BOM + preamble + semicolons + decimal commas + CRLF + blank lines anywhere and trailing', () => {
    const text =
      '\uFEFFDevice;Bench fixture 2\r\nSample;250k audio\r\nDate;2026-02-03\r\nRotation (°);R1-W (kΩ)\r\n0;0,21\r\n\r\n150;25,4\r\n300;252,5\r\n\r\n\r\n';
    const r = ok(text);
    expect(r.header).toEqual(['Rotation (°)', 'R1-W (kΩ)']);
    expect(r.headerLine).toBe(4);
    expect(r.rows.map((x) => x.line)).toEqual([5, 7, 8]);
    expect(r.decimalComma).toBe(true);
  });

  it('skips "Instrument:" and "# comment" preamble lines and keeps the line numbers of the file', () => {
    const r = ok('Instrument: bench LCR meter\n# sweep 3 of 5\n\nFreq (Hz),Z (ohm),Phase (deg)\n20,7800,4\n40,7810,8\n');
    expect(r.headerLine).toBe(4);
    expect(r.rows[0]!.line).toBe(5);
  });

  it('quoted cells: delimiters, doubled quotes and a line break inside quotes (RFC 4180 §2 rules 5–7, from memory)', () => {
    const text = 'Item,"C (nF)",Note\n"1","47,1","a ""quoted"" note"\n2,47.2,"two\nlines"\n3,47.3,plain\n';
    const r = ok(text);
    expect(r.rows[0]!.cells).toEqual(['1', '47,1', 'a "quoted" note']);
    expect(r.rows[1]!.cells[2]).toBe('two\nlines');
    // The row after the two-line cell starts on line 5 of the file.
    expect(r.rows.map((x) => x.line)).toEqual([2, 3, 5]);
  });

  it('lone CR line ends are read like LF', () => {
    const r = ok('f (Hz),Z (ohm)\r20,7800\r40,7810\r');
    expect(r.rows.map((x) => x.line)).toEqual([2, 3]);
  });

  it('a trailing delimiter on every line gives no extra column', () => {
    const r = ok('Rotation (°),R (kΩ),\n0,0.3,\n10,2.2,\n');
    expect(r.header).toEqual(['Rotation (°)', 'R (kΩ)']);
    expect(r.rows[1]!.cells).toEqual(['10', '2.2']);
  });
});

describe('readTable: refusals', () => {
  it('empty file', () => {
    expect(fail('')[0]!.message).toBe('The file is empty.');
    expect(fail('\uFEFF')[0]!.message).toBe('The file is empty.');
    expect(fail('\n\n  \r\n')[0]!.message).toMatch(/empty/);
  });

  it('binary file named .csv: NUL bytes', () => {
    const bytes = 'PK\u0003\u0004\u0000\u0000\u0008\u0000lots of zip data\u0000\u0000';
    expect(fail(bytes)[0]!.message).toMatch(/^This is not a text CSV file/);
  });

  it('binary file decoded as UTF-8: mostly replacement characters, no NUL', () => {
    const garbage = Array.from({ length: 400 }, (_, i) => (i % 3 === 0 ? '\uFFFD' : String.fromCharCode(65 + (i % 26)))).join('');
    expect(fail(garbage)[0]!.message).toMatch(/not a text CSV file/);
  });

  it('UTF-16 text read as bytes (a NUL after every ASCII character) is refused, with the hint', () => {
    const utf16 = 'Rotation,R\n0,1\n'
      .split('')
      .map((c) => c + '\u0000')
      .join('');
    expect(fail(utf16)[0]!.message).toMatch(/UTF-16/);
  });

  it('header only', () => {
    const issues = fail('Rotation (°),R (kΩ)\n\n', 3);
    expect(issues[0]!.message).toBe('The file has a header (line 1) but no data rows; at least 3 are needed.');
  });

  it('one data row when three are needed names the header line', () => {
    const issues = fail('# sweep\nRotation (°),R (kΩ)\n0,0.3\n', 3);
    expect(issues[0]!.message).toBe('The file has a header (line 2) but only 1 data row; at least 3 are needed.');
  });

  it('no header: numbers from the first line', () => {
    const issues = fail('0,0.3\n10,2.2\n20,4.4\n');
    expect(issues[0]!.message).toMatch(/No header line found: the rows of numbers \(from line 1\)/);
  });

  it('no header and no numbers', () => {
    expect(fail('hello world\nthis is a letter\n')[0]!.message).toMatch(/^No header line found/);
  });

  it('ragged rows: each line named, all of them, in line order', () => {
    const issues = fail('Rotation (°),R (kΩ),R W-3 (kΩ)\n0,0.3,486\n10,2.2\n20,4.4,482,9\n30,6.8,480\n');
    expect(issues.map((i) => i.line)).toEqual([3, 4]);
    expect(issues[0]!.message).toBe('Line 3: the row has 2 cells, but the header (line 1) has 3.');
    expect(issues[1]!.message).toBe('Line 4: the row has 4 cells, but the header (line 1) has 3.');
  });

  it('wrong delimiter mix: a semicolon line in a comma file is named with a hint', () => {
    const issues = fail('Rotation (°),R (kΩ)\n0,0.3\n10,2.2\n20;4.4\n30,6.8\n');
    expect(issues).toHaveLength(1);
    expect(issues[0]!.line).toBe(4);
    expect(issues[0]!.message).toBe(
      'Line 4: the row has 1 cell, but the header (line 1) has 2. It seems to use the semicolon as its delimiter, while the file uses the comma.',
    );
  });

  it('unclosed quote is reported', () => {
    const issues = fail('Item,C (nF)\n1,47.1\n2,"47.2\n3,47.3\n');
    expect(issues.some((i) => /quoted cell is not closed/.test(i.message))).toBe(true);
  });

  it('caps the list at MAX_ISSUES and counts the rest', () => {
    const rows = Array.from({ length: 30 }, (_, i) => `${i},1,2`).join('\n');
    const issues = fail(`A (Hz),B (ohm)\n${rows}\n`);
    expect(issues).toHaveLength(MAX_ISSUES + 1);
    expect(issues[0]!.line).toBe(2);
    expect(issues[MAX_ISSUES - 1]!.line).toBe(MAX_ISSUES + 1);
    expect(issues[MAX_ISSUES]!.message).toBe('… and 10 more problems not listed; fix these first.');
  });
});

describe('readTable: finding the header among key/value preamble lines', () => {
  it('a text pair followed by a numeric pair in the preamble is not the header', () => {
    const r = ok('Range;Auto\nPoints;3\nRotation;R (kΩ)\n0;0,3\n150;73,2\n300;486,7\n');
    expect([r.headerLine, r.header]).toEqual([3, ['Rotation', 'R (kΩ)']]);
  });

  it('a two-column lot with text item labels (one number per row)', () => {
    const r = ok('Instrument: LCR meter\nDate: 2026-02-03\nItem,C (nF)\nC001,47.1\nC002,46.9\n');
    expect([r.headerLine, r.rows.length]).toEqual([3, 2]);
  });
});
