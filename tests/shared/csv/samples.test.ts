// Every file in samples/ is read here; the sweeps are also checked against the model they were
// generated from, so a sample that drifted from its README line would fail.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { coilImpedance } from '@shared/analysis/coil';
import { fitTaper } from '@shared/analysis/taper';
import { parseLotRows } from '@shared/csv/lots';
import { parseSweepCsv } from '@shared/csv/sweeps';

const sample = (name: string) => readFileSync(fileURLToPath(new URL(`../../../samples/${name}`, import.meta.url)), 'utf8');

describe('sample files', () => {
  it('pot-500k-audio-sweep.csv: 31 points 0–300°, both halves, fits an audio law with m near 0.15', () => {
    const r = parseSweepCsv(sample('pot-500k-audio-sweep.csv'), 'taper');
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.rotationUnit).toBe('deg');
    expect(r.points).toHaveLength(31);
    expect(r.points.every((p) => p.resistanceW3 !== undefined)).toBe(true);
    expect(r.points[0]!.resistance).toBeCloseTo(300, -1); // ~300 Ω end resistance
    const fit = fitTaper({ points: r.points, rotationUnit: r.rotationUnit });
    expect(['audio', 'two-segment']).toContain(fit.law);
    expect(fit.m).toBeGreaterThan(0.13);
    expect(fit.m).toBeLessThan(0.17);
  });

  it('pot-250k-linear-percent.csv: tab-separated percent rotation, linear', () => {
    const r = parseSweepCsv(sample('pot-250k-linear-percent.csv'), 'taper');
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.rotationUnit).toBe('percent');
    expect(r.points).toHaveLength(21);
    expect(fitTaper({ points: r.points, rotationUnit: 'percent' }).law).toBe('linear');
  });

  it('pot-sweep-decimal-comma.csv: BOM, preamble, semicolons, decimal commas, trailing blanks', () => {
    const text = sample('pot-sweep-decimal-comma.csv');
    expect(text.charCodeAt(0)).toBe(0xfeff);
    const r = parseSweepCsv(text, 'taper');
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.points).toHaveLength(21);
    expect(r.points[0]).toEqual({ rotation: 0, resistance: 211, resistanceW3: 252853 });
    const fit = fitTaper({ points: r.points, rotationUnit: 'deg' });
    expect(fit.m).toBeGreaterThan(0.08);
    expect(fit.m).toBeLessThan(0.12);
  });

  it.each([
    ['pickup-impedance-magphase.csv', { R: 7800, L: 4.3, C: 130e-12, Rp: 500e3 }, 200, 'magnitude-phase'],
    ['pickup-impedance-reim.csv', { R: 6000, L: 2.4, C: 110e-12, Rp: 400e3 }, 160, 're-im'],
  ] as const)('%s matches the coil model it was made from (within the added noise)', (name, params, n, form) => {
    const r = parseSweepCsv(sample(name), 'impedance');
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.points).toHaveLength(n);
    expect(r.points[0]!.frequency).toBe(20);
    expect(r.points[n - 1]!.frequency).toBeCloseTo(20000, 6);
    for (const p of r.points) {
      const z = coilImpedance(params, p.frequency);
      // each file is read in its own form; the phase (given, or from re/im) is checked either way
      expect('phaseDeg' in p).toBe(form === 'magnitude-phase');
      const mag = 'magnitude' in p ? p.magnitude : Math.hypot(p.re, p.im);
      const phase = 'phaseDeg' in p ? p.phaseDeg : (Math.atan2(p.im, p.re) * 180) / Math.PI;
      expect(Math.abs(mag / Math.hypot(z.re, z.im) - 1)).toBeLessThan(0.012); // 0.2 % noise, 6 σ
      expect(Math.abs(phase - (Math.atan2(z.im, z.re) * 180) / Math.PI)).toBeLessThan(0.6);
    }
  });

  it('capacitor-lot-473J.csv: 500 rows, the outliers and lossy parts where the README says', () => {
    const r = parseLotRows(sample('capacitor-lot-473J.csv'), { quantity: 'capacitance' });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.rows).toHaveLength(500);
    expect(r.secondQuantity).toBe('dissipation');
    // 473J: 47 nF ±5 % (IEC 60062 code and letter) → 44.65–49.35 nF.
    const out = r.rows.filter((x) => x.value < 44.65e-9 || x.value > 49.35e-9).map((x) => x.item);
    expect(out).toEqual(['233', '391']);
    expect(r.rows.filter((x) => (x.second ?? 0) > 0.01).map((x) => x.item)).toEqual(['302', '455']);
  });

  it('broken-sweep.csv fails with the intended line/column messages', () => {
    const r = parseSweepCsv(sample('broken-sweep.csv'), 'taper');
    if (r.ok) throw new Error('the broken sample parsed');
    expect(r.issues.map((i) => i.message)).toEqual([
      'Line 6, column "R (kΩ)": the cell is empty.',
      `Line 8, column "R (kΩ)": "12k7x" is not a number (write a plain number in kΩ, the column's unit).`,
      'Line 9: the row has 2 cells, but the header (line 2) has 3.',
      'Line 10, column "R (kΩ)": -161.98 is negative; a resistance cannot be.',
    ]);
  });
});
