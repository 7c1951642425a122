// The client's form parsers: what a person types into the part, lot and harness forms, read into
// the values the API takes, with a message naming what is wrong otherwise. Values: IEC 60062
// markings as in tests/fixtures/iec/iec60062-marking-codes.txt (473 = 47 nF, J = ±5 %, 4K7 = 4.7 kΩ).
import { describe, expect, it } from 'vitest';
import { CreatePartFormSchema, emptyPartForm, parseNominal, parseTolerance } from '@/features/parts/components/part-form-schema';
import { readNominal, readPercent, readSecondLimit } from '@/features/lots/components/lot-form-schema';
import { getLayout } from '@shared/circuit/layouts';
import { defOf, parseField, parseMid } from '@/features/harness/components/design-state';

const fieldOf = (key: string) => defOf(getLayout('one-pickup')!, key)!;

describe('part form', () => {
  it('tolerance: "10", "±10 %", "2,5" read as both sides; "−20/+80" as two; blank is none; words are refused by name', () => {
    expect(parseTolerance('10')).toEqual({ ok: true, value: { minusPct: 10, plusPct: 10 } });
    expect(parseTolerance('±10 %')).toEqual({ ok: true, value: { minusPct: 10, plusPct: 10 } });
    expect(parseTolerance('2,5')).toEqual({ ok: true, value: { minusPct: 2.5, plusPct: 2.5 } });
    // IEC 60062 letter Z: −20 %/+80 %
    expect(parseTolerance('−20/+80')).toEqual({ ok: true, value: { minusPct: 20, plusPct: 80 } });
    expect(parseTolerance('  ')).toEqual({ ok: true, value: null });
    const bad = parseTolerance('ten');
    expect(bad.ok).toBe(false);
    expect(!bad.ok && bad.error).toMatch(/"ten" is not a tolerance/);
  });

  it('nominal by the kind: 500k on a pot is 500 000 Ω, 22n on a capacitor is 22 nF, blank is none', () => {
    const pot = parseNominal('pot', '500k');
    expect(pot.ok && pot.value).toBe(500e3);
    const cap = parseNominal('capacitor', '22n');
    expect(cap.ok && cap.value).toBeCloseTo(22e-9, 20);
    const blank = parseNominal('resistor', '');
    expect(blank.ok && blank.value).toBeNull();
    expect(parseNominal('capacitor', '1m').ok).toBe(false);
  });

  it('the whole form: a bad nominal and a bad tolerance are reported on their own fields', () => {
    const r = CreatePartFormSchema.safeParse({ ...emptyPartForm('pot'), label: 'POT-900', nominal: '500q', tolerancePct: 'x' });
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => i.path.join('.'));
    expect(paths).toContain('nominal');
    expect(paths).toContain('tolerancePct');
    const ok = CreatePartFormSchema.safeParse({ ...emptyPartForm('pot'), label: 'POT-900', nominal: '500k', tolerancePct: '20' });
    expect(ok.success).toBe(true);
    expect(ok.data).toMatchObject({ kind: 'pot', label: 'POT-900', nominal: 500e3, tolerancePct: 20, tolerancePlusPct: 20 });
    const z = CreatePartFormSchema.safeParse({ ...emptyPartForm('capacitor'), label: 'CAP-900', nominal: '100n', tolerancePct: '-20 +80' });
    expect(z.success && z.data).toMatchObject({ tolerancePct: 20, tolerancePlusPct: 80 });
  });
});

describe('lot form', () => {
  it('a capacitor marking is decoded with its tolerance letter', () => {
    const r = readNominal('capacitor', '473J');
    expect(r).toMatchObject({ ok: true, empty: false, tolerance: { minusPct: 5, plusPct: 5 }, marking: '473J' });
    expect(r.ok && !r.empty && r.nominal).toBeCloseTo(47e-9, 20);
  });

  it('a Z marking keeps both sides: 104Z is 100 nF −20 %/+80 % (IEC 60062)', () => {
    const z = readNominal('capacitor', '104Z');
    expect(z).toMatchObject({ ok: true, empty: false, tolerance: { minusPct: 20, plusPct: 80 }, text: '100 nF −20 %/+80 %' });
  });

  it('engineering notation, an RKM marking on resistors, and a marking of the wrong kind is refused', () => {
    const n = readNominal('resistor', '4k7');
    expect(n.ok && !n.empty && n.nominal).toBe(4700);
    const rkm = readNominal('resistor', '4K7J');
    expect(rkm).toMatchObject({ ok: true, empty: false, nominal: 4700, tolerance: { minusPct: 5, plusPct: 5 } });
    const wrong = readNominal('resistor', '2n2J');
    expect(wrong.ok).toBe(false);
    expect(!wrong.ok && wrong.error).toMatch(/capacitor marking/);
    expect(readNominal('pot', '')).toEqual({ ok: true, empty: true });
    expect(readNominal('pot', '0').ok).toBe(false);
  });

  it('percent and the second-quantity limit: D as a fraction or in %, ESR in Ω', () => {
    expect(readPercent('±5 %')).toEqual({ ok: true, value: { minusPct: 5, plusPct: 5 } });
    expect(readPercent('')).toEqual({ ok: true, value: null });
    expect(readPercent('five').ok).toBe(false);
    expect(readSecondLimit('dissipation', '1 %')).toEqual({ ok: true, value: 0.01 });
    expect(readSecondLimit('dissipation', '0.02')).toEqual({ ok: true, value: 0.02 });
    expect(readSecondLimit('esr', '0R5')).toEqual({ ok: true, value: 0.5 });
    expect(readSecondLimit('esr', '')).toEqual({ ok: true, value: null });
    expect(readSecondLimit('dissipation', 'low').ok).toBe(false);
  });
});

describe('harness value fields', () => {
  it('cable length in metres ("4.5 m"), within 0 (no cable) to 100 m', () => {
    const len = fieldOf('cableLength');
    expect(parseField(len, '4.5 m')).toEqual({ ok: true, value: 4.5 });
    expect(parseField(len, '3')).toEqual({ ok: true, value: 3 });
    expect(parseField(len, '0')).toEqual({ ok: true, value: 0 });
    expect(parseField(len, '-1').ok).toBe(false);
    expect(parseField(len, '150').ok).toBe(false);
  });

  it('an amplifier input capacitance may be 0 (none), never negative; a tone capacitor must be more than 0', () => {
    expect(parseField(fieldOf('ampC'), '0')).toEqual({ ok: true, value: 0 });
    expect(parseField(fieldOf('ampC'), '0 pF')).toEqual({ ok: true, value: 0 });
    const c = parseField(fieldOf('ampC'), '150p');
    expect(c.ok && c.value).toBeCloseTo(150e-12, 22);
    expect(parseField(fieldOf('ampC'), '-1n').ok).toBe(false);
    expect(parseField(fieldOf('toneC'), '0').ok).toBe(false);
  });

  it('capacitance per metre ("100 pF/m"), a part value, and the optional loss resistance', () => {
    const r = parseField(fieldOf('cableCapPerMetre'), '100 pF/m');
    expect(r.ok && r.value).toBeCloseTo(100e-12, 22);
    const c = parseField(fieldOf('toneC'), '22n');
    expect(c.ok && c.value).toBeCloseTo(22e-9, 20);
    expect(parseField(fieldOf('toneC'), '').ok).toBe(false);
    expect(parseField(fieldOf('pickupRp'), '')).toEqual({ ok: true, value: undefined });
    expect(parseField(fieldOf('volumeR'), '-5k').ok).toBe(false);
  });

  it('mid-rotation in percent: "15", "15 %", "12,5" read; the ends and words refused', () => {
    expect(parseMid('15')).toEqual({ ok: true, value: 0.15 });
    expect(parseMid('15 %')).toEqual({ ok: true, value: 0.15 });
    expect(parseMid('12,5')).toEqual({ ok: true, value: 0.125 });
    expect(parseMid('0').ok).toBe(false);
    expect(parseMid('100').ok).toBe(false);
    expect(parseMid('half').ok).toBe(false);
  });
});
