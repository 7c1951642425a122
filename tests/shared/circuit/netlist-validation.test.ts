// validateNetlist (shared/circuit/netlist.ts): what the solver relies on, each refusal in words that
// name the part and the value. One fault per case, so each message is checked on its own.
import { describe, expect, it } from 'vitest';
import { validateNetlist, type Netlist, type Part } from '@shared/circuit/netlist';

const pickup = (extra: Partial<Extract<Part, { kind: 'pickup' }>> = {}): Part => ({
  kind: 'pickup',
  id: 'pu',
  hot: 'out',
  cold: '0',
  R: 6e3,
  L: 2.5,
  C: 100e-12,
  ...extra,
});
const load: Part = { kind: 'resistor', id: 'rl', a: 'out', b: '0', R: 1e6 };
const net = (...parts: Part[]): Netlist => ({ parts });

describe('validateNetlist', () => {
  it('a usable netlist has no problems; L and C of a pickup may be 0; a pot may leave its b end out', () => {
    expect(validateNetlist(net(pickup(), load))).toEqual([]);
    expect(validateNetlist(net(pickup({ L: 0, C: 0, Rp: 300e3, emf: -0.5 }), load))).toEqual([]);
    const rheostat: Part = { kind: 'pot', id: 'vr', a: 'out', w: 'x', R: 250e3, law: { kind: 'linear' }, knob: 'tone' };
    expect(validateNetlist(net(pickup(), load, rheostat, { kind: 'capacitor', id: 'c', a: 'x', b: '0', C: 22e-9 }))).toEqual([]);
  });

  const cases: { name: string; parts: Part[]; problems: string[] }[] = [
    { name: 'a resistor of 0 Ω', parts: [pickup(), { ...load, R: 0 }], problems: ['rl: R must be a positive finite number (got 0)'] },
    {
      name: 'a capacitor of −1 nF',
      parts: [pickup(), load, { kind: 'capacitor', id: 'c1', a: 'out', b: '0', C: -1e-9 }],
      problems: ['c1: C must be a positive finite number (got -1e-9)'],
    },
    {
      name: 'an inductor of infinite L',
      parts: [pickup(), load, { kind: 'inductor', id: 'l1', a: 'out', b: '0', L: Infinity }],
      problems: ['l1: L must be a positive finite number (got Infinity)'],
    },
    {
      name: 'a pot of NaN Ω',
      parts: [pickup(), load, { kind: 'pot', id: 'vol', a: 'out', b: '0', w: 'w', R: NaN, law: { kind: 'linear' }, knob: 'volume' }],
      problems: ['vol: R must be a positive finite number (got NaN)'],
    },
    { name: 'a pickup of 0 Ω', parts: [pickup({ R: 0 }), load], problems: ['pu: R must be a positive finite number (got 0)'] },
    { name: 'a pickup of negative L', parts: [pickup({ L: -1 }), load], problems: ['pu: L must be a finite number ≥ 0 (got -1)'] },
    {
      name: 'a pickup of infinite C',
      parts: [pickup({ C: Infinity }), load],
      problems: ['pu: C must be a finite number ≥ 0 (got Infinity)'],
    },
    { name: 'a pickup loss of 0 Ω', parts: [pickup({ Rp: 0 }), load], problems: ['pu: Rp must be a positive finite number (got 0)'] },
    { name: 'a pickup of 0 V', parts: [pickup({ emf: 0 }), load], problems: ['pu: emf must be a finite non-zero number (got 0)'] },
    {
      name: 'a pickup of infinite EMF',
      parts: [pickup({ emf: Infinity }), load],
      problems: ['pu: emf must be a finite non-zero number (got Infinity)'],
    },
    {
      name: 'a pickup whose ends are one node',
      parts: [pickup({ hot: 'out', cold: 'out' }), load],
      problems: ['pu: hot and cold are the same node'],
    },
    { name: 'two parts with one id', parts: [pickup(), load, { ...load }], problems: ['duplicate part id "rl"'] },
    { name: 'no pickup', parts: [load], problems: ['no pickup (source) in the netlist'] },
    {
      name: 'no output node',
      parts: [pickup({ hot: 'h' }), { ...load, a: 'h' }],
      problems: ['no output node "out"'],
    },
    {
      name: 'no ground node',
      parts: [pickup({ cold: 'c' }), { ...load, b: 'c' }],
      problems: ['no ground node "0"'],
    },
  ];
  for (const c of cases) {
    it(`refuses ${c.name}`, () => {
      expect(validateNetlist(net(...c.parts))).toEqual(c.problems);
    });
  }

  it('two pickups count as two sources; the b end of a pot is a node of the netlist', () => {
    // The output reached only through a pot's b end still counts as present.
    const pot: Part = { kind: 'pot', id: 'vol', a: '0', b: 'out', w: 'w', R: 500e3, law: { kind: 'linear' }, knob: 'volume' };
    expect(validateNetlist(net(pickup({ hot: 'w' }), pot))).toEqual([]);
    expect(validateNetlist(net(pickup(), pickup({ id: 'pu2' }), load))).toEqual([]);
  });
});
