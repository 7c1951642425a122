// The Harness editor's state: typed text, errors per field, taper laws by their mid-rotation share,
// values taken from measured parts (and let go when typed over), and the saved-design link.
import { describe, expect, it } from 'vitest';
import {
  activeErrors,
  describeValue,
  designReducer,
  initialDesign,
  partRefsOf,
  usedValues,
  type DesignState,
} from '@/features/harness/components/design-state';

const start = () => initialDesign('independent-tone');

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

  it('errors of fields the preset does not use do not count', () => {
    const s = designReducer(start(), { type: 'text', key: 'bleedC', text: 'x' });
    expect(s.errors.bleedC).toBeTruthy();
    expect(activeErrors(s)).toEqual([]);
    expect(activeErrors(designReducer(s, { type: 'preset', preset: 'bleed-cap' }))).toEqual(['bleedC']);
  });

  it('clearing the optional loss resistance removes it', () => {
    let s = designReducer(start(), { type: 'text', key: 'pickupRp', text: '250k' });
    expect(s.values.pickupRp).toBe(250e3);
    s = designReducer(s, { type: 'text', key: 'pickupRp', text: '' });
    expect('pickupRp' in s.values).toBe(false);
  });

  it('a law is set by its kind and its share at mid-rotation', () => {
    let s = designReducer(start(), { type: 'law-kind', key: 'volumeLaw', kind: 'linear' });
    expect(describeValue('volumeLaw', s.values)).toBe('Linear');
    // From linear to a curved law: the usual 15 % — common practice (no published source).
    s = designReducer(s, { type: 'law-kind', key: 'volumeLaw', kind: 'audio' });
    expect(describeValue('volumeLaw', s.values)).toBe('Audio, 15 % at mid-rotation');
    s = designReducer(s, { type: 'law-mid', key: 'volumeLaw', text: '20 %' });
    expect(describeValue('volumeLaw', s.values)).toBe('Audio, 20 % at mid-rotation');
    const bad = designReducer(s, { type: 'law-mid', key: 'volumeLaw', text: '0' });
    expect(bad.errors['volumeLaw.m']).toBeTruthy();
    expect(describeValue('volumeLaw', bad.values)).toBe('Audio, 20 % at mid-rotation');
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

  it('only the values the preset uses are saved', () => {
    const used = usedValues('independent-tone', start().values);
    expect('bleedC' in used).toBe(false);
    expect('toneC' in used).toBe(true);
    expect('bleedC' in usedValues('bleed-cap', start().values)).toBe(true);
  });
});
