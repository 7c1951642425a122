import { describe, expect, it } from 'vitest';
import { conditionsHeader, conditionsLine, conditionText, lotConditions, readConditions, withConditions } from '@shared/csv/conditions';
import { readTable } from '@shared/csv/read-table';
import { parseSweepCsv } from '@shared/csv/sweeps';
import { csvText } from '@/lib/download';

describe('the conditions header', () => {
  it('writes one `# key: value` line per condition, in order', () => {
    expect(
      conditionsHeader([
        { key: 'design', value: 'Two knobs' },
        { key: 'volume knob', value: '7.5' },
        { key: 'cable', value: 3 },
      ]),
    ).toBe('# design: Two knobs\n# volume knob: 7.5\n# cable: 3\n');
  });

  it('writes unknown values as "not set" or "not measured", never blank', () => {
    expect(conditionText({ key: 'a', value: null })).toBe('not set');
    expect(conditionText({ key: 'a', value: undefined, unknown: 'not measured' })).toBe('not measured');
    expect(conditionText({ key: 'a', value: '  ' })).toBe('not set');
    expect(conditionText({ key: 'a', value: Number.NaN, unknown: 'not measured' })).toBe('not measured');
    expect(conditionText({ key: 'a', value: 0 })).toBe('0');
    expect(conditionText({ key: 'a', value: false })).toBe('no');
  });

  it('keeps each condition on its own line: line breaks, quotes and colons in keys are neutralised', () => {
    const text = conditionsHeader([
      { key: 'design', value: 'Line one\r\nline two "quoted"' },
      { key: 'odd: key', value: '=cmd|x' },
    ]);
    expect(text.split('\n')).toEqual(["# design: Line one line two 'quoted'", '# odd key: =cmd|x', '']);
    // A formula-looking value cannot become a cell formula: the line starts with "#".
    expect(text.split('\n').every((l) => l === '' || l.startsWith('# '))).toBe(true);
    expect(() => conditionsHeader([{ key: ' : ', value: 1 }])).toThrow(/key/);
  });

  it('reads back what it wrote, stopping at the header row', () => {
    const conds = [
      { key: 'design', value: 'Bleed, 1 nF: parallel' },
      { key: 'tone knob', value: '10.0' },
      { key: 'pickup', value: null },
    ];
    const text = withConditions(conds, 'frequency_Hz,level_dB\n100,-1\n# key: not preamble\n');
    expect(readConditions(text)).toEqual([
      { key: 'design', value: 'Bleed, 1 nF: parallel' },
      { key: 'tone knob', value: '10.0' },
      { key: 'pickup', value: 'not set' },
    ]);
    expect(readConditions('\uFEFF# a: 1\r\n# b: 2\r\nx,y\r\n')).toEqual([
      { key: 'a', value: '1' },
      { key: 'b', value: '2' },
    ]);
  });

  it('puts the conditions on one line for a PNG', () => {
    expect(
      conditionsLine([
        { key: 'lot', value: 'L-1' },
        { key: 'test frequency', value: null },
      ]),
    ).toBe('lot: L-1 · test frequency: not set');
  });

  it("states a lot's conditions with SI prefixes and the matching options used", () => {
    const c = lotConditions(
      { code: 'LOT-7', quantity: 'resistance', nominal: 250e3, tolerancePct: 20, status: 'open', testFrequency: 1000 },
      { readings: 40, matchPct: 2, setSize: 4, madeAt: new Date('2026-03-01T10:20:30.456Z') },
    );
    const m = Object.fromEntries(c.map((x) => [x.key, conditionText(x)]));
    expect(m).toMatchObject({
      lot: 'LOT-7',
      nominal: '250 kΩ',
      tolerance: '±20 %',
      'test frequency': '1 kHz',
      readings: '40',
      'matched sets': 'within ±2 % of each other, 4 parts a set',
      exported: '2026-03-01T10:20:30Z',
    });
  });
});

describe('round trip: an export read back by the importers uploads use', () => {
  const conditions = [
    { key: 'design', value: 'One pickup, one volume, one tone (unsaved)' },
    { key: 'volume knob', value: '7.5' },
    { key: 'Cable capacitance', value: '100 pF/m (typed)' },
    { key: 'pickup', value: null, unknown: 'not measured' as const },
  ];

  it('harness curves: the reader skips the conditions, finds the header and gets the same numbers', () => {
    const rows = [
      ['frequency_Hz', 'now_v7.5_t10.0_dB', 'volume_8_t10.0_dB'],
      [20, -0.51234567, -3.25],
      [1000, -1.2, -4.0625],
      [20000, -18.75, -22.5],
    ];
    const text = csvText(rows, conditions);
    expect(text.startsWith('# design: One pickup, one volume, one tone (unsaved)\n# volume knob: 7.5\n')).toBe(true);
    const table = readTable(text);
    if (!table.ok) throw new Error(JSON.stringify(table.issues));
    expect(table.header).toEqual(rows[0]);
    expect(table.headerLine).toBe(conditions.length + 1);
    expect(table.rows.map((r) => r.cells.map(Number))).toEqual(rows.slice(1));
    expect(readConditions(text)).toEqual([
      { key: 'design', value: 'One pickup, one volume, one tone (unsaved)' },
      { key: 'volume knob', value: '7.5' },
      { key: 'Cable capacitance', value: '100 pF/m (typed)' },
      { key: 'pickup', value: 'not measured' },
    ]);
  });

  it('a taper sweep written with conditions reads back through the sweep upload reader unchanged', () => {
    const rows = [
      ['Rotation (°)', 'R (Ω)', 'R W-3 (Ω)'],
      [0, 300, 486670],
      [150, 73260, 413710],
      [300, 486700, 270],
    ];
    const text = csvText(rows, [
      { key: 'part', value: 'POT-005' },
      { key: 'instrument', value: null },
    ]);
    const r = parseSweepCsv(text, 'taper');
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.points).toEqual([
      { rotation: 0, resistance: 300, resistanceW3: 486670 },
      { rotation: 150, resistance: 73260, resistanceW3: 413710 },
      { rotation: 300, resistance: 486700, resistanceW3: 270 },
    ]);
    expect(readConditions(text)).toEqual([
      { key: 'part', value: 'POT-005' },
      { key: 'instrument', value: 'not set' },
    ]);
  });
});
