// The Harness editor's state: typed text, errors per field, taper laws by their mid-rotation share,
// values taken from measured parts (and let go when typed over), and the saved-design link.
import { describe, expect, it } from 'vitest';
import { getLayout } from '@shared/circuit/layouts';
import {
  activeErrors,
  defOf,
  describeValue,
  designFromSaved,
  designReducer,
  partRefsOf,
  presetDesign,
  quickStartOf,
  usedValues,
  type DesignState,
} from '@/features/harness/components/design-state';

const start = () => presetDesign('independent-tone');
const def = (key: string, layout = 'one-pickup') => defOf(getLayout(layout)!, key)!;

describe('designReducer', () => {
  it('typed text becomes the value; bad text keeps the value and names the problem on its field', () => {
    let s = designReducer(start(), { type: 'text', key: 'toneC', text: '47n' });
    expect(s.values.toneC).toBeCloseTo(47e-9, 20);
    expect(s.texts.toneC).toBe('47n');
    expect(s.errors.toneC).toBeUndefined();
    s = designReducer(s, { type: 'text', key: 'toneC', text: 'lots' });
    expect(s.values.toneC).toBeCloseTo(47e-9, 20);
    expect(s.texts.toneC).toBe('lots');
    expect(s.errors.toneC).toBeTruthy();
    expect(activeErrors(s)).toEqual(['toneC']);
    s = designReducer(s, { type: 'text', key: 'toneC', text: '22n' });
    expect(s.errors).toEqual({});
  });

  it('errors of fields the options do not use do not count', () => {
    const s = designReducer(start(), { type: 'text', key: 'bleedC', text: 'x' });
    expect(s.errors.bleedC).toBeTruthy();
    expect(activeErrors(s)).toEqual([]);
    expect(activeErrors(designReducer(s, { type: 'quick-start', preset: 'bleed-cap' }))).toEqual(['bleedC']);
    expect(activeErrors(designReducer(s, { type: 'option', id: 'bleed', choice: 'cap-series-r' }))).toEqual(['bleedC']);
  });

  it('clearing the optional loss resistance removes it', () => {
    let s = designReducer(start(), { type: 'text', key: 'pickupRp', text: '250k' });
    expect(s.values.pickupRp).toBe(250e3);
    s = designReducer(s, { type: 'text', key: 'pickupRp', text: '' });
    expect('pickupRp' in s.values).toBe(false);
  });

  it('a law is set by its kind and its share at mid-rotation', () => {
    let s = designReducer(start(), { type: 'law-kind', key: 'volumeLaw', kind: 'linear' });
    expect(describeValue(def('volumeLaw'), s.values)).toBe('Linear');
    // From linear to a curved law: the usual 15 % — common practice (no published source).
    s = designReducer(s, { type: 'law-kind', key: 'volumeLaw', kind: 'audio' });
    expect(describeValue(def('volumeLaw'), s.values)).toBe('Audio, 15 % at mid-rotation');
    s = designReducer(s, { type: 'law-mid', key: 'volumeLaw', text: '20 %' });
    expect(describeValue(def('volumeLaw'), s.values)).toBe('Audio, 20 % at mid-rotation');
    const bad = designReducer(s, { type: 'law-mid', key: 'volumeLaw', text: '0' });
    expect(bad.errors['volumeLaw.m']).toBeTruthy();
    expect(describeValue(def('volumeLaw'), bad.values)).toBe('Audio, 20 % at mid-rotation');
  });

  it('values from a measured part remember the part until one of them is typed over or detached', () => {
    let s = designReducer(start(), {
      type: 'apply',
      values: { pickupR: 7.9e3, pickupL: 4.1, pickupC: 110e-12 },
      ref: { partId: 42, label: 'PU-004', source: 'coil fit' },
    });
    expect(s.values.pickupR).toBe(7.9e3);
    expect(s.texts.pickupR).not.toBe(start().texts.pickupR);
    expect(partRefsOf(s)).toEqual({ pickupR: 42, pickupL: 42, pickupC: 42 });
    s = designReducer(s, { type: 'text', key: 'pickupL', text: '4.4' });
    expect(partRefsOf(s)).toEqual({ pickupR: 42, pickupC: 42 });
    s = designReducer(s, { type: 'detach', keys: ['pickupR', 'pickupC'] });
    expect(partRefsOf(s)).toEqual({});
  });

  it('the saved-design link: saved sets it, deleting that design clears it, deleting another does not', () => {
    const loaded = { id: 7, name: 'Bright', notes: null, ownerId: 'u1' };
    let s: DesignState = designReducer(start(), { type: 'saved', loaded });
    expect(s.loaded).toEqual(loaded);
    s = designReducer(s, { type: 'deleted', id: 8 });
    expect(s.loaded).toEqual(loaded);
    s = designReducer(s, { type: 'deleted', id: 7 });
    expect(s.loaded).toBeNull();
  });

  it('only the values the options use are saved', () => {
    const used = usedValues(start());
    expect('bleedC' in used).toBe(false);
    expect('toneC' in used).toBe(true);
    expect('pedalR' in used).toBe(false);
    expect('bleedC' in usedValues(presetDesign('bleed-cap'))).toBe(true);
    const pedal = designReducer(start(), { type: 'option', id: 'load', choice: 'low-impedance-pedal' });
    expect(Object.keys(usedValues(pedal)).filter((k) => /^(amp|pedal|buffer|cable)/.test(k))).toEqual([
      'cableCapPerMetre',
      'cableLength',
      'pedalR',
    ]);
  });

  it('the presets are quick starts: the one-pickup layout with their options, recognised back from the options', () => {
    const s = presetDesign('dual-cap-tone');
    expect(s.layout).toBe('one-pickup');
    expect(s.options).toMatchObject({ toneNetwork: 'floor-and-second-cap', bleed: 'none', load: 'amp' });
    expect(quickStartOf(s)).toBe('dual-cap-tone');
    // a stacked network no preset has
    expect(quickStartOf(designReducer(s, { type: 'option', id: 'bleed', choice: 'cap' }))).toBeNull();
    // a quick start keeps the values typed so far
    const typed = designReducer(start(), { type: 'text', key: 'toneC', text: '47n' });
    expect(designReducer(typed, { type: 'quick-start', preset: 'bleed-cap' }).values.toneC).toBeCloseTo(47e-9, 20);
  });

  it('a layout design: dotted keys, measured capacitors in capacitor slots, opened back from its saved shape', () => {
    let s = designReducer(start(), { type: 'layout', layout: 'two-pickups-3way' });
    expect(s.values['neck.toneC']).toBeDefined();
    s = designReducer(s, { type: 'option', id: 'bleed', choice: 'cap' });
    s = designReducer(s, {
      type: 'apply',
      values: { 'bridge.bleedC': 1.03e-9 },
      ref: { partId: 9, label: 'CAP-9', source: 'capacitance reading' },
    });
    s = designReducer(s, { type: 'selector', index: 2 });
    expect(partRefsOf(s)).toEqual({ 'bridge.bleedC': 9 });
    expect(usedValues(s)['bridge.bleedC']).toBe(1.03e-9);
    const back = designFromSaved({
      id: 3,
      name: 'Saved',
      notes: null,
      ownerId: 'u1',
      layout: s.layout,
      selector: s.selector,
      options: s.options,
      knobs: null,
      values: usedValues(s),
      partRefs: partRefsOf(s),
    });
    expect(back.layout).toBe('two-pickups-3way');
    expect(back.selector).toBe(2);
    expect(back.options.bleed).toBe('cap');
    expect(back.values['bridge.bleedC']).toBe(1.03e-9);
    expect(back.refs['bridge.bleedC']).toEqual({ partId: 9 });
    expect(back.texts['bridge.bleedC']).toBe('1.03 nF');
    // a ref on a value the options no longer use is not saved
    expect(partRefsOf(designReducer(s, { type: 'option', id: 'bleed', choice: 'none' }))).toEqual({});
    expect(def('bridge.bleedC', 'two-pickups-3way').quantity).toBe('capacitance');
  });
});
