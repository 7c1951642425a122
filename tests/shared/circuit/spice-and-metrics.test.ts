// The SPICE export's text and the metrics' definitions (their numbers against ngspice and the
// closed forms of standard theory are in ngspice-agreement.test.ts and textbook-formulas.test.ts).
import { describe, expect, it } from 'vitest';
import { getPreset, HARNESS_PRESETS, HARNESS_VALUE_FIELDS } from '@shared/circuit/presets';
import { spiceNumber, toSpiceNetlist } from '@shared/circuit/spice';
import { DEFAULT_FREQUENCIES, gridCurve, logFrequencies, simulate, sweepKnobs } from '@shared/circuit/metrics';
import { lawValue } from '@shared/taper/law';
import { compileHarness } from '@shared/circuit/solver';
import { MIN_POT_RESISTANCE } from '@shared/circuit/netlist';

describe('toSpiceNetlist', () => {
  // Built inside each test, never while the file loads: the mutation runs count what a test covers
  // only while it runs.
  const preset = () => getPreset('interactive-tone')!;
  const deckLines = () => toSpiceNetlist(preset().build(preset().defaults), { volume: 3, tone: 8 }).trim().split('\n');

  it('is a SPICE3 deck: title first, an AC 1 source, .ac dec 50 20 20k, .end last', () => {
    const lines = deckLines();
    expect(lines[0]).toMatch(/^Interactive tone harness/);
    expect(lines.some((l) => /^V\S+ \S+ 0 DC 0 AC 1$/.test(l))).toBe(true);
    expect(lines).toContain('.ac dec 50 20 20000');
    expect(lines.at(-1)).toBe('.end');
    expect(lines.filter((l) => / out( |$)/.test(l)).length).toBeGreaterThan(2);
  });

  it('writes the pot halves at the knob setting with 12 significant digits', () => {
    const lines = deckLines();
    const y = lawValue(preset().defaults.volumeLaw, 0.3);
    const toGround = lines.find((l) => l.startsWith('Rvolume_aw '))!;
    expect(toGround.split(' ')).toEqual(['Rvolume_aw', '0', 'out', spiceNumber(500e3 * y)]);
    expect(Number(toGround.split(' ')[3]) / (500e3 * y)).toBeCloseTo(1, 11);
    expect(spiceNumber(1 / 3)).toBe('0.333333333333');
    expect(spiceNumber(2.2e-8)).toBe('2.2e-8');
    expect(spiceNumber(500000)).toBe('500000');
  });

  it('clamps a pot at its end stop to MIN_POT_RESISTANCE rather than writing 0', () => {
    const t = toSpiceNetlist(preset().build(preset().defaults), { volume: 10, tone: 0 });
    expect(t).toContain(`Rvolume_wb out n_hot ${spiceNumber(MIN_POT_RESISTANCE)}`);
    expect(t).toContain(`Rtone_aw out n_tone ${spiceNumber(MIN_POT_RESISTANCE)}`);
  });

  it('honours the frequency options', () => {
    expect(
      toSpiceNetlist(preset().build(preset().defaults), { volume: 3, tone: 8 }, { fStart: 10, fStop: 40000, pointsPerDecade: 20 }),
    ).toContain('.ac dec 20 10 40000');
  });
});

describe('metrics', () => {
  it('logFrequencies: 151 points from 20 Hz to 20 kHz, 50 a decade', () => {
    const f = logFrequencies(20, 20000, 151);
    expect(f.length).toBe(151);
    expect(f[0]).toBe(20);
    expect(f[150]).toBe(20000);
    expect(f[50]).toBeCloseTo(200, 9);
    expect(f[100]).toBeCloseTo(2000, 9);
  });

  it('simulate: curve, peak, corners and the 1 kHz level are consistent with each other', () => {
    const p = getPreset('independent-tone')!;
    const s = simulate(p.build(p.defaults), { volume: 10, tone: 10 });
    const m = s.metrics;
    expect(s.magnitudeDb.length).toBe(151);
    expect(m.peak.interior).toBe(true);
    // the refined peak is at least as high as every grid point
    expect(Math.max(...s.magnitudeDb)).toBeLessThanOrEqual(m.peak.levelDb + 1e-12);
    expect(m.cornerHz!).toBeGreaterThan(m.peak.frequency);
    expect(m.peakMinus3DbHz!).toBeGreaterThan(m.peak.frequency);
    expect(m.peakMinus3DbHz!).toBeLessThan(m.cornerHz!);
    // the corner is where the level is 3 dB below the level at 20 Hz
    const atCorner = simulate(p.build(p.defaults), { volume: 10, tone: 10 }, [m.cornerHz!]).magnitudeDb[0]!;
    expect(atCorner).toBeCloseTo(m.lowFrequencyDb - 3, 6);
    const at1k = simulate(p.build(p.defaults), { volume: 10, tone: 10 }, [1000]).magnitudeDb[0]!;
    expect(m.level1kDb).toBeCloseTo(at1k, 12);
  });

  it('sweepKnobs: every curve equals simulate at the same setting; sweep figures follow their definitions', () => {
    const p = getPreset('interactive-tone')!;
    const c = compileHarness(p.build(p.defaults));
    const volume = [2, 5, 10];
    const tone = [0, 10];
    const g = sweepKnobs(c, { volume, tone });
    for (let ti = 0; ti < tone.length; ti++) {
      for (let vi = 0; vi < volume.length; vi++) {
        const s = simulate(c, { volume: volume[vi]!, tone: tone[ti]! });
        const curve = gridCurve(g, vi, ti);
        curve.forEach((x, k) => expect(x).toBeCloseTo(s.magnitudeDb[k]!, 9));
        expect(g.level1kDb[ti * 3 + vi]).toBeCloseTo(s.metrics.level1kDb, 9);
      }
    }
    const lvl = (v: number, t: number) => simulate(c, { volume: v, tone: t }, [200, 1000, 3000]).magnitudeDb;
    const full = lvl(10, 0);
    const half = lvl(5, 0);
    expect(g.volumeTaperDb[0 * 3 + 1]).toBeCloseTo(half[1]! - full[1]!, 9);
    expect(g.trebleRetentionDb[0 * 3 + 1]).toBeCloseTo(half[2]! - half[0]! - (full[2]! - full[0]!), 9);
    // interaction index: RMS of L(v,t) − L(10,t) − L(v,10) + L(10,10) over the grid
    let sum = 0;
    for (const t of tone) for (const v of volume) sum += (lvl(v, t)[1]! - lvl(10, t)[1]! - lvl(v, 10)[1]! + lvl(10, 10)[1]!) ** 2;
    expect(g.interactionIndexDb).toBeCloseTo(Math.sqrt(sum / 6), 9);
    expect(g.frequencies).toEqual(DEFAULT_FREQUENCIES);
  });
});

describe('presets', () => {
  it('have the seven ids, words for names and descriptions, and fields that name existing presets', () => {
    expect(HARNESS_PRESETS.map((p) => p.id)).toEqual([
      'independent-tone',
      'interactive-tone',
      'bleed-cap',
      'bleed-cap-parallel-r',
      'bleed-cap-series-r',
      'tone-floor-resistor',
      'dual-cap-tone',
    ]);
    for (const p of HARNESS_PRESETS) expect(p.description.length).toBeGreaterThan(60);
    const ids = new Set(HARNESS_PRESETS.map((p) => p.id));
    for (const f of HARNESS_VALUE_FIELDS) for (const id of f.presets) expect(ids.has(id)).toBe(true);
    expect(getPreset('nope')).toBeUndefined();
  });

  it("every value field a preset lists changes that preset's response, and no other field does", () => {
    for (const p of HARNESS_PRESETS) {
      const base = simulate(p.build(p.defaults), { volume: 6, tone: 4 }, [300, 3000]).magnitudeDb;
      for (const f of HARNESS_VALUE_FIELDS) {
        if (f.quantity === 'law') continue;
        const current = p.defaults[f.key];
        const changed = { ...p.defaults, [f.key]: typeof current === 'number' ? current * 1.5 : 100e3 };
        const after = simulate(p.build(changed), { volume: 6, tone: 4 }, [300, 3000]).magnitudeDb;
        const moved = Math.abs(after[0]! - base[0]!) + Math.abs(after[1]! - base[1]!) > 1e-9;
        expect(moved, `${p.id} / ${f.key}`).toBe(f.presets.includes(p.id));
      }
    }
  });
});
