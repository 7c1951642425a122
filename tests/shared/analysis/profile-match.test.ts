// The profile choice is Lugbook's own rule (no published source): the part's named profile, else
// the most specific profile of its kind whose nominal range and law fit the part.
import { describe, expect, test } from 'vitest';
import { chooseProfile, type MatchableProfile } from '@shared/analysis/profile-match';

const profile = (id: number, extra: Partial<MatchableProfile>): MatchableProfile => ({
  id,
  name: `profile ${id}`,
  kind: 'pot',
  nominalMin: null,
  nominalMax: null,
  tolerancePct: 20,
  rules: {},
  ...extra,
});

const general = profile(1, { rules: { law: 'audio-any' } });
const strict250k = profile(2, { nominalMin: 200e3, nominalMax: 300e3, rules: { law: 'audio' } });
const linear = profile(3, { rules: { law: 'linear' } });
const caps = profile(4, { kind: 'capacitor', tolerancePct: 10 });
const all = [general, strict250k, linear, caps];

describe('chooseProfile', () => {
  test('a named profile wins, even of another kind', () => {
    expect(chooseProfile(all, { kind: 'pot', nominal: 250e3, profileId: 4, taperClass: 'audio' })).toBe(caps);
  });
  test('the most specific matching profile: nominal range and law', () => {
    expect(chooseProfile(all, { kind: 'pot', nominal: 250e3, profileId: null, taperClass: 'audio' })).toBe(strict250k);
    expect(chooseProfile(all, { kind: 'pot', nominal: 500e3, profileId: null, taperClass: 'audio' })).toBe(general);
  });
  test("'audio-any' takes the two-segment law; a linear pot finds the linear profile", () => {
    expect(chooseProfile(all, { kind: 'pot', nominal: 500e3, profileId: null, taperClass: 'two-segment' })).toBe(general);
    expect(chooseProfile(all, { kind: 'pot', nominal: 500e3, profileId: null, taperClass: 'linear' })).toBe(linear);
  });
  test('a part with no nominal skips profiles with a nominal range; no profile of the kind gives null', () => {
    expect(chooseProfile(all, { kind: 'pot', nominal: null, profileId: null, taperClass: 'audio' })).toBe(general);
    expect(chooseProfile(all, { kind: 'pickup', nominal: 8e3, profileId: null, taperClass: null })).toBeNull();
  });
});
