// The SPICE export (shared/circuit/spice.ts) read back by the tests' own AC solver
// (tests/support/spice-reference.ts, modified nodal analysis sharing no code with the engine) and solved:
// the exported text must describe the very network the engine solves, for every kind of part. The text's
// own lines (title with the knob settings, comments, the .ac line) are checked as written. No ngspice
// here: this file also runs in the mutation runs.
import { describe, expect, it } from 'vitest';
import { simulate } from '@shared/circuit/metrics';
import type { Netlist, Part } from '@shared/circuit/netlist';
import { HARNESS_PRESETS } from '@shared/circuit/presets';
import { spiceNumber, toSpiceNetlist } from '@shared/circuit/spice';
import { parseSpice, solveAc } from '../../support/spice-reference';

const FREQS = [20, 150, 1000, 4000, 9000, 20000];

/**
 * The exported text solved by the reference solver, against the engine: within 5e-7 dB and 5e-5° (the
 * 12-digit numbers and a pot's 1 mΩ end-stop clamp leave about 1e-8 dB between the two solvers).
 */
function expectExportSolvesAsEngine(netlist: Netlist, knobs: Record<string, number>) {
  const text = toSpiceNetlist(netlist, knobs);
  const ref = solveAc(parseSpice(text), FREQS);
  const engine = simulate(netlist, knobs, FREQS);
  ref.forEach((z, k) => {
    expect(10 * Math.log10(z.re ** 2 + z.im ** 2)).toBeCloseTo(engine.magnitudeDb[k]!, 6);
    expect((Math.atan2(z.im, z.re) * 180) / Math.PI).toBeCloseTo(engine.phaseDeg[k]!, 4);
  });
  // SPICE needs every element name once.
  const names = text
    .split('\n')
    .slice(1)
    .filter((l) => /^[RCLV]/.test(l))
    .map((l) => l.split(' ')[0]);
  expect(new Set(names).size).toBe(names.length);
  return text;
}

describe('the exported netlist solves as the engine', () => {
  for (const p of HARNESS_PRESETS) {
    it(`${p.id} at volume 3, tone 8 and at 10, 0`, () => {
      expectExportSolvesAsEngine(p.build(p.defaults), { volume: 3, tone: 8 });
      expectExportSolvesAsEngine(p.build(p.defaults), { volume: 10, tone: 0 });
    });
  }

  it('every kind of part: an inductor, a reversed source of a group, an ideal resistive source, a loss, a fixed pot, names that collide', () => {
    const parts: Part[] = [
      { kind: 'pickup', id: 'Neck-A', hot: 'N-1', cold: '0', R: 4e3, L: 2, C: 90e-12, Rp: 400e3, group: 'neck' },
      { kind: 'pickup', id: 'neck_a', hot: 'n_1', cold: '0', R: 5e3, L: 0, C: 0, emf: -0.5, group: 'neck' },
      // "N-1" and "n_1" are two nodes whose SPICE names would both be n_n_1; ids "Neck-A" and "neck_a" likewise.
      { kind: 'resistor', id: 'R1', a: 'N-1', b: 'mid', R: 10e3 },
      { kind: 'resistor', id: 'r1', a: 'n_1', b: 'mid', R: 33e3 },
      { kind: 'inductor', id: 'choke', a: 'mid', b: 'out', L: 0.5 },
      { kind: 'pot', id: 'trim', a: 'out', b: '0', w: 'tap', R: 100e3, law: { kind: 'linear' }, knob: { fixed: 7 } },
      { kind: 'capacitor', id: 'c1', a: 'tap', b: '0', C: 4.7e-9 },
      { kind: 'resistor', id: 'load', a: 'out', b: '0', R: 1e6 },
    ];
    const text = expectExportSolvesAsEngine({ title: 'Two\r\n\nlines', parts }, {});
    const lines = text.split('\n');
    expect(lines[0]).toBe('Two lines');
    expect(lines[1]).toBe('* Exported by the Lugbook harness engine: small-signal AC, transfer = V(out) per volt of pickup EMF.');
    expect(lines).toContain('* pot trim: 100000 ohm at knob 7');
    expect(lines).toContain('* pickup Neck-A (of neck): EMF in series with R and L from cold to hot, C (and Rp) across');
    expect(lines).toContain('* pickup neck_a (of neck): EMF in series with R and L from cold to hot, C (and Rp) across; reversed');
    expect(lines).toContain('Vneck_a_2 n_neck_a_emf_2 0 DC 0 AC 0.5 180');
    expect(lines).toContain('Rneck_a_dc_2 n_neck_a_emf_2 n_n_1_2 5000');
    expect(lines).toContain('Lchoke n_mid out 0.5');
    expect(lines).toContain('Rneck_a_dc n_neck_a_emf n_neck_a_coil 4000');
    expect(lines).toContain('Lneck_a n_neck_a_coil n_n_1 2');
    expect(lines).toContain('Cneck_a_self n_n_1 0 9e-11');
    expect(lines).toContain('Rneck_a_loss n_n_1 0 400000');
    // The ideal resistive source has no L and no C line, not lines of 0 H and 0 F.
    expect(lines.filter((l) => /^(Lneck_a_2|Cneck_a_self_2) /.test(l))).toEqual([]);
    expect(lines.slice(-3)).toEqual(['.ac dec 50 20 20000', '.end', '']);
  });

  it('names that collide three times are numbered in order; a group named as its pickup is not repeated', () => {
    const parts: Part[] = [
      { kind: 'pickup', id: 'p', hot: 'x.y', cold: '0', R: 6e3, L: 2.5, C: 0, group: 'p' },
      { kind: 'resistor', id: 'a.b', a: 'x.y', b: 'x-y', R: 1e3 },
      { kind: 'resistor', id: 'a-b', a: 'x-y', b: 'x_y', R: 2e3 },
      { kind: 'resistor', id: 'a_b', a: 'x_y', b: 'out', R: 3e3 },
      { kind: 'resistor', id: 'load', a: 'out', b: '0', R: 1e6 },
    ];
    const lines = expectExportSolvesAsEngine({ parts }, {}).split('\n');
    expect(lines).toContain('Ra_b n_x_y n_x_y_2 1000');
    expect(lines).toContain('Ra_b_2 n_x_y_2 n_x_y_3 2000');
    expect(lines).toContain('Ra_b_3 n_x_y_3 out 3000');
    expect(lines).toContain('* pickup p: EMF in series with R and L from cold to hot, C (and Rp) across');
  });
});

describe('the text', () => {
  it('title: the netlist title and the knobs the pots follow, in order of first use', () => {
    const p = HARNESS_PRESETS.find((x) => x.id === 'independent-tone')!;
    const text = toSpiceNetlist(p.build(p.defaults), { tone: 8, volume: 3 }, { fStart: 10, fStop: 40000, pointsPerDecade: 20 });
    expect(text.split('\n')[0]).toBe('Independent tone harness (volume 3, tone 8)');
    expect(text).toContain('\n* pot volume: 500000 ohm at knob volume 3\n');
    expect(text).toContain('\n.ac dec 20 10 40000\n');
    const plain: Netlist = {
      parts: [
        { kind: 'pickup', id: 'p', hot: 'out', cold: '0', R: 6e3, L: 2.5, C: 100e-12 },
        { kind: 'resistor', id: 'rl', a: 'out', b: '0', R: 1e6 },
      ],
    };
    expect(toSpiceNetlist(plain, {}).split('\n')[0]).toBe('harness');
  });

  it('refuses a netlist the engine would refuse, in its words', () => {
    const bad: Netlist = { parts: [{ kind: 'resistor', id: 'rl', a: 'out', b: '0', R: 1e6 }] };
    expect(() => toSpiceNetlist(bad, {})).toThrow('invalid harness netlist: no pickup (source) in the netlist');
    const twoFaults: Netlist = { parts: [{ kind: 'resistor', id: 'rl', a: 'out', b: '0', R: -1 }] };
    expect(() => toSpiceNetlist(twoFaults, {})).toThrow(
      'invalid harness netlist: rl: R must be a positive finite number (got -1); no pickup (source) in the netlist',
    );
  });

  it('numbers to 12 significant digits, without trailing zeros; never a number SPICE cannot read', () => {
    expect(spiceNumber(150000)).toBe('150000');
    expect(spiceNumber(1e-9)).toBe('1e-9');
    expect(spiceNumber(4.7e-9)).toBe('4.7e-9');
    expect(spiceNumber(0.1)).toBe('0.1');
    expect(spiceNumber(100)).toBe('100');
    expect(spiceNumber(1 / 3)).toBe('0.333333333333');
    expect(spiceNumber(2.5e12)).toBe('2.5e+12');
    // twelve digits and no decimal point: nothing to trim
    expect(spiceNumber(100000000000)).toBe('100000000000');
    expect(() => spiceNumber(Number.NaN)).toThrow('SPICE export: value NaN is not finite');
    expect(() => spiceNumber(Number.POSITIVE_INFINITY)).toThrow('not finite');
  });
});
