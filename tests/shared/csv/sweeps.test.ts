import { describe, expect, it } from 'vitest';
import { parseSweepCsv } from '@shared/csv/sweeps';
import type { CsvIssue } from '@shared/csv/issues';

function issuesOf(text: string, kind: 'taper' | 'impedance', opts = {}): CsvIssue[] {
  const r = parseSweepCsv(text, kind, opts);
  if (r.ok) throw new Error('expected a failure');
  return r.issues;
}
const messages = (issues: CsvIssue[]) => issues.map((i) => i.message);

const TAPER_HEAD = 'Rotation (°),R (kΩ),R W-3 (kΩ)';
const taper = (...rows: string[]) => [TAPER_HEAD, ...rows].join('\n') + '\n';

describe('taper sweeps: values', () => {
  it('reads, scales kΩ to Ω and sorts by rotation (order in the file does not matter)', () => {
    const r = parseSweepCsv(taper('300,486.7,0.27', '0,0.3,486.67', '150,73.26,413.71'), 'taper');
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.rotationUnit).toBe('deg');
    expect(r.points).toEqual([
      { rotation: 0, resistance: 300, resistanceW3: 486670 },
      { rotation: 150, resistance: 73260, resistanceW3: 413710 },
      { rotation: 300, resistance: 486700, resistanceW3: 270 },
    ]);
    expect(r.columns).toEqual({ rotation: 'Rotation (°)', resistance: 'R (kΩ)', resistanceW3: 'R W-3 (kΩ)' });
    expect(r.rowCount).toBe(3);
  });

  it('text in a number column names line and column', () => {
    const issues = issuesOf(taper('0,0.3,486', '10,2.2,484', '20,12k7x,482', '30,6.8,480'), 'taper');
    expect(messages(issues)).toEqual([`Line 4, column "R (kΩ)": "12k7x" is not a number (write a plain number in kΩ, the column's unit).`]);
    expect(issues[0]).toMatchObject({ line: 4, column: 'R (kΩ)' });
  });

  it('an SI prefix in a cell is refused, the column unit after a number is accepted', () => {
    expect(messages(issuesOf(taper('0,0.3,486', '10,2.2k,484', '20,4.4,482'), 'taper'))[0]).toMatch(
      /^Line 3, column "R \(kΩ\)": "2.2k" is not a number/,
    );
    const r = parseSweepCsv(taper('0,0.3 kΩ,486', '10,2.2kΩ,484', '20,4.4,482'), 'taper');
    expect(r.ok && r.points.map((p) => p.resistance)).toEqual([300, 2200, 4400]);
  });

  it('negative resistance, in either resistance column', () => {
    const issues = issuesOf(taper('0,0.3,486', '10,-2.2,484', '20,4.4,-482', '30,6.8,480'), 'taper');
    expect(messages(issues)).toEqual([
      'Line 3, column "R (kΩ)": -2.2 is negative; a resistance cannot be.',
      'Line 4, column "R W-3 (kΩ)": -482 is negative; a resistance cannot be.',
    ]);
  });

  it('duplicate rotation points are named with both lines', () => {
    const issues = issuesOf(taper('0,0.3,486', '10,2.2,484', '20,4.4,482', '10,2.3,484'), 'taper');
    expect(messages(issues)).toEqual([
      'Line 5, column "Rotation (°)": the rotation 10° appears twice (also on line 3); each point must be measured once.',
    ]);
  });

  it('rotation outside 0–360° and outside 0–100 %', () => {
    expect(messages(issuesOf(taper('0,0.3,486', '10,2.2,484', '370,4.4,482'), 'taper'))).toEqual([
      'Line 4, column "Rotation (°)": 370° is outside the rotation range 0–360°.',
    ]);
    const pct = 'Position %,R (kOhm)\n0,0.1\n50,125\n100,250\n101,251\n-1,0\n';
    expect(messages(issuesOf(pct, 'taper'))).toEqual([
      'Line 5, column "Position %": 101 % is outside the rotation range 0–100 %.',
      'Line 6, column "Position %": -1 % is outside the rotation range 0–100 %.',
    ]);
  });

  it('percent versus degrees: from the header, or from the values when the header has no unit', () => {
    const pct = parseSweepCsv('Position %,R (kOhm)\n0,0.1\n50,125\n100,250\n', 'taper');
    expect(pct.ok && pct.rotationUnit).toBe('percent');
    const deg = parseSweepCsv('Angle (deg),R (ohm)\n0,100\n50,125\n100,250\n', 'taper');
    expect(deg.ok && deg.rotationUnit).toBe('deg');
    const bareDeg = parseSweepCsv('Rotation,R (ohm)\n0,100\n150,125\n300,250\n', 'taper');
    expect(bareDeg.ok && [bareDeg.rotationUnit, bareDeg.notes[0]]).toEqual([
      'deg',
      'The rotation column "Rotation" names no unit; read as degrees, since a value exceeds 100.',
    ]);
    const barePct = parseSweepCsv('Rotation,R (ohm)\n0,100\n50,125\n100,250\n', 'taper');
    expect(barePct.ok && barePct.rotationUnit).toBe('percent');
  });

  it('reports ALL problems in line order, not only the first', () => {
    const issues = issuesOf(taper('0,0.3,486', '10,abc,484', '20,4.4', '30,-1,480', '40,,478', '50,9.9,x'), 'taper');
    expect(issues.map((i) => [i.line, i.column])).toEqual([
      [3, 'R (kΩ)'],
      [4, null],
      [5, 'R (kΩ)'],
      [6, 'R (kΩ)'],
      [7, 'R W-3 (kΩ)'],
    ]);
    expect(issues[3]!.message).toBe('Line 6, column "R (kΩ)": the cell is empty.');
  });

  it('an empty wiper-to-lug-3 cell means "not measured"', () => {
    const r = parseSweepCsv(taper('0,0.3,486', '10,2.2,', '20,4.4,482'), 'taper');
    expect(r.ok && r.points[1]).toEqual({ rotation: 10, resistance: 2200 });
  });

  it('too few points (1 data row) and too many rows', () => {
    expect(messages(issuesOf(taper('0,0.3,486'), 'taper'))).toEqual([
      'The file has a header (line 1) but only 1 data row; at least 3 are needed.',
    ]);
    const rows = Array.from({ length: 12 }, (_, i) => `${i},${i + 1},1`);
    expect(messages(issuesOf(taper(...rows), 'taper', { maxRows: 10 }))).toEqual([
      'The file has 12 data rows; a rotation sweep may have at most 10.',
    ]);
  });

  it('decimal comma + semicolon + BOM + preamble + trailing blanks + CRLF', () => {
    const text =
      '\uFEFFDevice;Bench fixture 2\r\nSample;250k audio\r\nDate;2026-02-03\r\nRotation (°);R1-W (kΩ)\r\n0;0,211\r\n150;25,45\r\n300;252,5\r\n\r\n\r\n';
    const r = parseSweepCsv(text, 'taper');
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.points.map((p) => p.resistance)).toEqual([211, 25450, 252500]);
  });

  it('a decimal point in a decimal-comma file is named, not guessed', () => {
    const text = 'Rotation (°);R (kΩ)\n0;0,3\n10;2,2\n20;4.4\n30;6,8\n';
    expect(messages(issuesOf(text, 'taper'))).toEqual([
      'Line 4, column "R (kΩ)": "4.4" is not a number: this file uses decimal commas, and digit grouping is not accepted.',
    ]);
  });

  it('quoted cells', () => {
    const r = parseSweepCsv('"Rotation (°)","R (kΩ)"\n"0","0.3"\n"150","73.2"\n"300","486.7"\n', 'taper');
    expect(r.ok && r.points.map((p) => p.resistance)).toEqual([300, 73200, 486700]);
  });

  it('CRLF line ends keep the line numbers', () => {
    const issues = issuesOf('Rotation (°),R (kΩ)\r\n0,0.3\r\n10,oops\r\n20,4.4\r\n', 'taper');
    expect(issues[0]!.line).toBe(3);
  });
});

describe('taper sweeps: columns not recognised', () => {
  const text = 'Winkel,Widerstand\n0,0.3\n150,73.2\n300,486.7\n';

  it('unknown headers → needsMapping with the header and the detected part', () => {
    const r = parseSweepCsv('Rotation (°),Widerstand\n0,0.3\n150,73.2\n300,486.7\n', 'taper');
    if (r.ok) throw new Error('expected needsMapping');
    expect(r.needsMapping?.header).toEqual(['Rotation (°)', 'Widerstand']);
    expect(r.needsMapping?.detected.rotation?.index).toBe(0);
    expect(r.needsMapping?.missing).toEqual(['resistance']);
    expect(r.issues[0]!.message).toBe(
      'Line 1: no column found for the resistance lug 1 to wiper (the header has "Rotation (°)", "Widerstand"); choose the columns by hand.',
    );
  });

  it('the explicit mapping then succeeds, with its units', () => {
    const first = parseSweepCsv(text, 'taper');
    expect(first.ok).toBe(false);
    const r = parseSweepCsv(text, 'taper', {
      mapping: { rotation: { column: 'Winkel', unit: 'deg' }, resistance: { column: 1, unit: 'kΩ' } },
    });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.rotationUnit).toBe('deg');
    expect(r.points.map((p) => p.resistance)).toEqual([300, 73200, 486700]);
    expect(r.columns).toEqual({ rotation: 'Winkel', resistance: 'Widerstand' });
  });
});

describe('impedance sweeps', () => {
  const polar = (head: string, rows: string[]) => [head, ...rows].join('\n');
  const five = ['0.02,7.8,4', '0.1,7.9,18', '1,9.6,62', '5,180,-10', '10,60,-80'];

  it('kHz and kΩ are scaled to Hz and Ω; phase in degrees', () => {
    const r = parseSweepCsv(polar('f [kHz],|Z| (kOhm),Phase (deg)', five), 'impedance');
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.points[0]).toEqual({ frequency: 20, magnitude: 7800, phaseDeg: 4 });
    expect(r.points[4]).toEqual({ frequency: 10000, magnitude: 60000, phaseDeg: -80 });
  });

  it('MΩ scaling', () => {
    const r = parseSweepCsv(
      polar('Freq (Hz),Z (MΩ),Phase (deg)', ['20,0.0078,4', '100,0.0079,18', '1000,0.0096,62', '5000,0.18,-10', '10000,0.06,-80']),
      'impedance',
    );
    expect(r.ok && r.points.map((p) => ('magnitude' in p ? p.magnitude : NaN))).toEqual([7800, 7900, 9600, 180000, 60000]);
  });

  it('phase in radians is converted to degrees', () => {
    const r = parseSweepCsv(
      polar('Freq (Hz),Mag (ohm),θ (rad)', ['20,7800,0.1', '100,7900,0.5', '1000,9600,1', '5000,180000,-0.5', '10000,60000,-1.5']),
      'impedance',
    );
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.points.map((p) => ('phaseDeg' in p ? p.phaseDeg : NaN))).toEqual([0.1, 0.5, 1, -0.5, -1.5].map((x) => (x * 180) / Math.PI));
  });

  it('re/im columns give rectangular points', () => {
    const r = parseSweepCsv(
      polar('Frequency,Re(Z),Im(Z)', ['20,5900,290', '100,5950,1500', '1000,8000,16000', '5000,20000,-90000', '10000,1000,-30000']),
      'impedance',
    );
    expect(r.ok && r.points[2]).toEqual({ frequency: 1000, re: 8000, im: 16000 });
  });

  it('zero or negative frequency, negative magnitude, duplicate frequency', () => {
    const issues = issuesOf(
      polar('Freq (Hz),|Z| (ohm),Phase (deg)', [
        '0,7800,4',
        '-20,7800,4',
        '100,-7900,18',
        '1000,9600,62',
        '1000,9700,61',
        '5000,180000,-10',
      ]),
      'impedance',
    );
    expect(messages(issues)).toEqual([
      'Line 2, column "Freq (Hz)": 0 is not a frequency: it must be greater than zero.',
      'Line 3, column "Freq (Hz)": -20 is not a frequency: it must be greater than zero.',
      'Line 4, column "|Z| (ohm)": -7900 is not an impedance magnitude: it must be greater than zero.',
      'Line 6, column "Freq (Hz)": the frequency 1000 Hz appears twice (also on line 5); each point must be measured once.',
    ]);
  });

  it('a phase beyond ±180° is refused', () => {
    const issues = issuesOf(
      polar('Freq (Hz),|Z| (ohm),Phase (deg)', ['20,7800,4', '100,7900,18', '1000,9600,62', '5000,180000,-190', '10000,60000,-80']),
      'impedance',
    );
    expect(messages(issues)).toEqual(['Line 5, column "Phase (deg)": the phase -190° is outside ±180°.']);
  });

  it('fewer than 5 points', () => {
    expect(messages(issuesOf(polar('Freq (Hz),|Z| (ohm),Phase (deg)', ['20,7800,4', '100,7900,18', '1000,9600,62']), 'impedance'))).toEqual(
      ['The file has a header (line 1) but only 3 data rows; at least 5 are needed.'],
    );
  });

  it('missing phase column → needsMapping names the phase', () => {
    const r = parseSweepCsv(polar('Freq (Hz),|Z| (ohm),Kanal 3', five), 'impedance');
    expect(!r.ok && r.needsMapping?.missing).toEqual(['phase']);
  });
});
