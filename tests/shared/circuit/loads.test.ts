import { describe, expect, it } from 'vitest';
import { buildLayoutNetlist, getLayout, LAYOUTS, resolveLayoutConfig } from '@shared/circuit/layouts';
import { loadedResponse } from '@shared/circuit/loaded-response';
import {
  ampLoad,
  DEFAULT_CABLE,
  isLoadId,
  LOAD_IDS,
  LOAD_VALUES,
  LOADS,
  loadParts,
  loadSettingOf,
  loadValueKeys,
} from '@shared/circuit/loads';
import { simulate } from '@shared/circuit/metrics';
import { DEFAULT_HARNESS_VALUES, getPreset } from '@shared/circuit/presets';

// Textbook LC resonance f0 = 1/(2π√(LC)) (any circuits text, e.g. Horowitz & Hill, "The Art of
// Electronics", 3rd ed., §1.7.14): the pickup's inductance with its own capacitance plus the cable's.
const f0 = (L: number, C: number) => 1 / (2 * Math.PI * Math.sqrt(L * C));

describe('loaded resonance of a measured pickup (harness engine)', () => {
  const pickup = { R: 6e3, L: 2.5, C: 100e-12 };

  it('into an amplifier through 3 m of 100 pF/m cable: near the LC resonance with 400 pF', () => {
    const m = loadedResponse(pickup, { load: 'amp', cable: DEFAULT_CABLE });
    expect(m.peak.interior).toBe(true);
    // With pots at 10 (≈ 200 kΩ of load) the peak sits a few per cent below the undamped f0.
    const want = f0(2.5, 400e-12);
    expect(m.peak.frequency / want).toBeGreaterThan(0.9);
    expect(m.peak.frequency / want).toBeLessThan(1.02);
    expect(m.peakRiseDb).toBeGreaterThan(3);
  });

  it('a longer cable lowers the resonance as √(C) says', () => {
    const short = loadedResponse(pickup, { cable: { lengthM: 1, capPerMetre: 100e-12 } }).peak.frequency;
    const long = loadedResponse(pickup, { cable: { lengthM: 6, capPerMetre: 100e-12 } }).peak.frequency;
    expect(long).toBeLessThan(short);
    expect(short / long).toBeCloseTo(Math.sqrt(700 / 200), 0);
  });

  it('a measured loss resistance is part of the model: the same as the independent-tone preset with that Rp', () => {
    const withLoss = loadedResponse({ ...pickup, Rp: 150e3 });
    const p = getPreset('independent-tone')!;
    const values = { ...DEFAULT_HARNESS_VALUES, pickupR: 6e3, pickupL: 2.5, pickupC: 100e-12, pickupRp: 150e3 };
    const preset = simulate(p.build(values), { volume: 10, tone: 10 }).metrics;
    expect(withLoss.peak.levelDb).toBeCloseTo(preset.peak.levelDb, 9);
    expect(withLoss.peak.levelDb).toBeLessThan(loadedResponse(pickup).peak.levelDb - 0.5);
    expect(loadedResponse({ ...pickup, Rp: null }).peak.levelDb).toBe(loadedResponse(pickup).peak.levelDb);
  });

  it("a pickup the layout refuses is refused with the layout check's words", () => {
    expect(() => loadedResponse({ ...pickup, R: -1 })).toThrow('Must be more than zero.');
  });

  it('a low-impedance pedal input damps the peak away', () => {
    const m = loadedResponse(pickup, { load: 'low-impedance-pedal' });
    expect(m.peakRiseDb).toBeLessThan(1);
  });

  it('into a buffered pedal the cable given is the one before the buffer: 1 m resonates as 1 m into an amplifier', () => {
    const cable = { lengthM: 1, capPerMetre: 100e-12 };
    const buffered = loadedResponse(pickup, { load: 'buffer', cable });
    const amp = loadedResponse(pickup, { load: 'amp', cable });
    // Both inputs default to 1 MΩ (common practice, no published source), so the two agree.
    expect(buffered.peak.frequency).toBeCloseTo(amp.peak.frequency, 6);
  });
});

describe('one load definition', () => {
  it('every layout carries the load values of loads.ts and offers its loads as the `load` option', () => {
    for (const layout of LAYOUTS) {
      for (const def of LOAD_VALUES) expect(layout.values.find((v) => v.key === def.key)).toEqual(def);
      expect(layout.options.find((o) => o.id === 'load')!.choices.map((c) => c.id)).toEqual([...LOAD_IDS]);
    }
  });

  it("a load's figures come from its own keys; the others do not matter", () => {
    const values = {
      cableCapPerMetre: 120e-12,
      cableLength: 5,
      cableBeforeBuffer: 0.5,
      ampR: 470e3,
      ampC: 50e-12,
      bufferR: 2e6,
      pedalR: 8e3,
    };
    expect(loadSettingOf('amp', values)).toEqual({ id: 'amp', R: 470e3, C: 50e-12, cableC: 120e-12 * 5 });
    expect(loadSettingOf('buffer', values)).toEqual({ id: 'buffer', R: 2e6, C: 0, cableC: 120e-12 * 0.5 });
    expect(loadSettingOf('low-impedance-pedal', values)).toEqual({ id: 'low-impedance-pedal', R: 8e3, C: 0, cableC: 120e-12 * 5 });
    expect(loadValueKeys('buffer')).toEqual(['cableCapPerMetre', 'cableBeforeBuffer', 'bufferR']);
    expect(LOADS.amp.inputDefault).toBe(DEFAULT_HARNESS_VALUES.ampR);
  });

  it('the one-pickup layout into the default amplifier gives the independent-tone preset exactly (same parts, same figures)', () => {
    const layout = getLayout('one-pickup')!;
    const { config } = resolveLayoutConfig(layout, {});
    const a = simulate(buildLayoutNetlist(layout, config), { volume: 6, tone: 4 });
    const b = simulate(getPreset('independent-tone')!.build(DEFAULT_HARNESS_VALUES), { volume: 6, tone: 4 });
    for (let k = 0; k < a.magnitudeDb.length; k++) expect(Math.abs(a.magnitudeDb[k]! - b.magnitudeDb[k]!)).toBeLessThan(1e-9);
  });
});

describe('the load table', () => {
  it('each load under its own id; isLoadId knows exactly these', () => {
    for (const id of LOAD_IDS) {
      expect(LOADS[id].id).toBe(id);
      expect(isLoadId(id)).toBe(true);
    }
    for (const other of ['pedal', 'Amp', '', 42, undefined, null]) expect(isLoadId(other)).toBe(false);
  });

  it('the value keys of each load, and the parts it adds with their ids', () => {
    expect(loadValueKeys('amp')).toEqual(['cableCapPerMetre', 'cableLength', 'ampR', 'ampC']);
    expect(loadValueKeys('buffer')).toEqual(['cableCapPerMetre', 'cableBeforeBuffer', 'bufferR']);
    expect(loadValueKeys('low-impedance-pedal')).toEqual(['cableCapPerMetre', 'cableLength', 'pedalR']);
    expect(loadParts({ id: 'amp', R: 1e6, C: 150e-12, cableC: 300e-12 }).map((p) => p.id)).toEqual(['cable', 'amp', 'amp-c']);
    expect(loadParts({ id: 'buffer', R: 1e6, C: 0, cableC: 100e-12 }).map((p) => p.id)).toEqual(['cable', 'buffer']);
    expect(loadParts({ id: 'low-impedance-pedal', R: 10e3, C: 0, cableC: 0 }).map((p) => p.id)).toEqual(['pedal']);
  });

  it('values left out, or not finite numbers, take their defaults', () => {
    // 3 m at 100 pF/m (the default cable) into 1 MΩ
    expect(loadSettingOf('amp', {})).toEqual({ id: 'amp', R: 1e6, C: 0, cableC: 3 * 100e-12 });
    for (const bad of ['2e6', Number.NaN, Number.POSITIVE_INFINITY, null]) {
      expect(loadSettingOf('amp', { ampR: bad, ampC: bad, cableLength: bad, cableCapPerMetre: bad })).toEqual(loadSettingOf('amp', {}));
    }
    expect(loadSettingOf('amp', { ampR: 2e6, ampC: 50e-12, cableLength: 5, cableCapPerMetre: 80e-12 })).toEqual({
      id: 'amp',
      R: 2e6,
      C: 50e-12,
      cableC: 5 * 80e-12,
    });
    expect(loadSettingOf('low-impedance-pedal', {}).R).toBe(10e3);
    // One of the two cable values given, the other its default: 5 m at 100 pF/m, 2 m of 150 pF/m.
    expect(loadSettingOf('amp', { cableLength: 5 }).cableC).toBeCloseTo(500e-12, 24);
    expect(loadSettingOf('buffer', { cableCapPerMetre: 150e-12 }).cableC).toBeCloseTo(450e-12, 24);
  });

  it('ampLoad: an amplifier input through the default cable, or the one given', () => {
    expect(ampLoad(2e6)).toEqual({ id: 'amp', R: 2e6, C: 0, cableC: DEFAULT_CABLE.lengthM * DEFAULT_CABLE.capPerMetre });
    expect(ampLoad(1e6, { lengthM: 2, capPerMetre: 150e-12 }).cableC).toBeCloseTo(300e-12, 24);
  });
});
