// Which limits judge a reading, which profile a part follows and how a typed tolerance is read: the
// rules the bench form and the server share (shared/analysis/reading-verdict.ts, profile-match.ts,
// tolerance.ts). They are Lugbook's own rules (no published source) except the limits themselves,
// nominal × (1 ∓ tolerance), and the two-sided tolerance −20 %/+80 % of IEC 60062:2016 letter Z.
import { describe, expect, it } from 'vitest';
import { calibrationOverdue, judgeReading, nominalQuantity, type ProfileSpec } from '@shared/analysis/reading-verdict';
import { chooseProfile, type MatchableProfile } from '@shared/analysis/profile-match';
import { isSymmetric, parseToleranceText, toleranceOf, toleranceWords } from '@shared/analysis/tolerance';

const capProfile: ProfileSpec = { name: 'film caps', tolerancePct: 10, rules: { dissipationMax: 0.01, esrMax: 2 } };
const pickupProfile: ProfileSpec = { name: 'neck pickups', tolerancePct: 5, rules: { inductanceNominal: 2.5, inductanceTolerancePct: 10 } };

describe('judgeReading: which limit applies', () => {
  it('the nominal quantity of a part: capacitance for capacitors, resistance for everything else', () => {
    expect(nominalQuantity('capacitor')).toBe('capacitance');
    expect(nominalQuantity('resistor')).toBe('resistance');
    expect(nominalQuantity('pot')).toBe('resistance');
    expect(nominalQuantity('pickup')).toBe('resistance');
  });

  it("the part's own tolerance wins over the profile's, and names itself", () => {
    const part = { kind: 'capacitor' as const, nominal: 100e-9, tolerancePct: 5 };
    const r = judgeReading(part, { quantity: 'capacitance', value: 104e-9 }, { profile: capProfile })!;
    // 100 nF ± 5 %: 95 … 105 nF, so 104 nF passes; with the profile's ±10 % the limits would be 90 … 110 nF.
    expect(r.lower).toBeCloseTo(95e-9, 18);
    expect(r.upper).toBeCloseTo(105e-9, 18);
    expect(r.verdict).toBe('pass');
    expect(r.source).toBe('part tolerance ±5 %');
    expect(r.deviationPct).toBeCloseTo(4, 9);
  });

  it("a part without its own tolerance takes the profile's, and names the profile", () => {
    const part = { kind: 'capacitor' as const, nominal: 100e-9, tolerancePct: null };
    const r = judgeReading(part, { quantity: 'capacitance', value: 108e-9 }, { profile: capProfile })!;
    expect(r.lower).toBeCloseTo(90e-9, 18);
    expect(r.upper).toBeCloseTo(110e-9, 18);
    expect(r.source).toBe('profile "film caps"');
    expect(r.verdict).toBe('pass');
  });

  it('a two-sided tolerance (IEC 60062 Z, −20 %/+80 %) sets both limits and is named so', () => {
    const part = { kind: 'capacitor' as const, nominal: 100e-9, tolerancePct: 20, tolerancePlusPct: 80 };
    const r = judgeReading(part, { quantity: 'capacitance', value: 170e-9 })!;
    expect(r.lower).toBeCloseTo(80e-9, 18);
    expect(r.upper).toBeCloseTo(180e-9, 18);
    expect(r.verdict).toBe('pass');
    expect(r.source).toBe('part tolerance −20 %/+80 %');
  });

  it('no verdict without a tolerance from part or profile, without a nominal, or for another quantity', () => {
    expect(judgeReading({ kind: 'resistor', nominal: 1000, tolerancePct: null }, { quantity: 'resistance', value: 1000 })).toBeNull();
    expect(judgeReading({ kind: 'resistor', nominal: null, tolerancePct: 5 }, { quantity: 'resistance', value: 1000 })).toBeNull();
    // A capacitor's resistance reading is not judged against its capacitance tolerance.
    expect(judgeReading({ kind: 'capacitor', nominal: 1e-7, tolerancePct: 5 }, { quantity: 'resistance', value: 1e-7 })).toBeNull();
    expect(judgeReading({ kind: 'resistor', nominal: 1000, tolerancePct: 5 }, { quantity: 'capacitance', value: 1000 })).toBeNull();
  });

  it('dissipation factor and ESR are judged against the profile maxima, from 0 up', () => {
    const part = { kind: 'capacitor' as const, nominal: 100e-9, tolerancePct: 5 };
    const d = judgeReading(part, { quantity: 'dissipation', value: 0.012 }, { profile: capProfile })!;
    expect(d).toMatchObject({ verdict: 'fail', lower: 0, upper: 0.01, source: 'profile "film caps"' });
    expect(d.reason).toMatch(/above the upper limit 0\.01 by 0\.002/);
    const e = judgeReading(part, { quantity: 'esr', value: 1.5 }, { profile: capProfile })!;
    expect(e).toMatchObject({ verdict: 'pass', lower: 0, upper: 2, source: 'profile "film caps"' });
    expect(e.reason).toContain('Ω');
    // Without those rules the same readings are information only.
    expect(judgeReading(part, { quantity: 'dissipation', value: 0.012 }, { profile: { ...capProfile, rules: {} } })).toBeNull();
    expect(judgeReading(part, { quantity: 'esr', value: 1.5 })).toBeNull();
    // The ESR rule does not judge a dissipation reading, nor the reverse.
    expect(judgeReading(part, { quantity: 'esr', value: 1.5 }, { profile: { ...capProfile, rules: { dissipationMax: 0.01 } } })).toBeNull();
    expect(judgeReading(part, { quantity: 'dissipation', value: 0.005 }, { profile: { ...capProfile, rules: { esrMax: 2 } } })).toBeNull();
  });

  it("a pickup's inductance is judged against the profile's inductance nominal and tolerance, only for pickups", () => {
    const pickup = { kind: 'pickup' as const, nominal: 6000, tolerancePct: 10 };
    const r = judgeReading(pickup, { quantity: 'inductance', value: 2.8 }, { profile: pickupProfile })!;
    // 2.5 H ± 10 %: 2.25 … 2.75 H; 2.8 H is above by 0.05 H.
    expect(r).toMatchObject({ verdict: 'fail', source: 'profile "neck pickups"' });
    expect(r.lower).toBeCloseTo(2.25, 12);
    expect(r.upper).toBeCloseTo(2.75, 12);
    expect(r.deviationPct).toBeCloseTo(12, 9);
    expect(judgeReading({ ...pickup, kind: 'resistor' }, { quantity: 'inductance', value: 2.8 }, { profile: pickupProfile })).toBeNull();
    // The inductance rule judges only inductance: a pickup's Q or self-capacitance reading stays information.
    expect(judgeReading(pickup, { quantity: 'q', value: 2.8 }, { profile: pickupProfile })).toBeNull();
    expect(judgeReading(pickup, { quantity: 'capacitance', value: 2.8e-10 }, { profile: pickupProfile })).toBeNull();
    const noTolerance = { ...pickupProfile, rules: { inductanceNominal: 2.5 } };
    expect(judgeReading(pickup, { quantity: 'inductance', value: 2.8 }, { profile: noTolerance })).toBeNull();
    const noNominal = { ...pickupProfile, rules: { inductanceTolerancePct: 10 } };
    expect(judgeReading(pickup, { quantity: 'inductance', value: 2.8 }, { profile: noNominal })).toBeNull();
  });

  it('with an instrument accuracy the guarded rule applies: U = 1 % of reading + 2 counts of 0.1 Ω', () => {
    const part = { kind: 'resistor' as const, nominal: 1000, tolerancePct: 1 };
    const accuracy = { pctOfReading: 1, counts: 2, resolution: 0.1 };
    const r = judgeReading(part, { quantity: 'resistance', value: 1005 }, { accuracy })!;
    // U = 0.01 × 1005 + 2 × 0.1 = 10.25 Ω; 1005 ± 10.25 reaches past 1010: marginal.
    expect(r.uncertainty).toBeCloseTo(10.25, 9);
    expect(r.rule).toBe('guarded');
    expect(r.verdict).toBe('marginal');
    const simple = judgeReading(part, { quantity: 'resistance', value: 1005 })!;
    expect(simple.uncertainty).toBeNull();
    expect(simple.rule).toBe('simple');
  });

  it('calibration is overdue from the day after its due date', () => {
    const day = new Date('2026-12-02T10:00:00Z');
    expect(calibrationOverdue('2026-12-01', day)).toBe(true);
    expect(calibrationOverdue('2026-12-02', day)).toBe(false);
    expect(calibrationOverdue('2026-12-03', day)).toBe(false);
    expect(calibrationOverdue(null, day)).toBe(false);
    expect(calibrationOverdue(undefined, day)).toBe(false);
    expect(calibrationOverdue('', day)).toBe(false);
  });
});

describe('chooseProfile: ranges, laws and specificity', () => {
  const profile = (id: number, extra: Partial<MatchableProfile>): MatchableProfile => ({
    id,
    name: `profile ${id}`,
    kind: 'resistor',
    nominalMin: null,
    nominalMax: null,
    tolerancePct: 5,
    rules: {},
    ...extra,
  });
  const part = (nominal: number | null, taperClass: string | null = null, kind: MatchableProfile['kind'] = 'resistor') => ({
    kind,
    nominal,
    profileId: null,
    taperClass,
  });

  it('a nominal range holds its ends and nothing beyond them', () => {
    const ranged = profile(1, { nominalMin: 1000, nominalMax: 2000 });
    expect(chooseProfile([ranged], part(1000))).toBe(ranged);
    expect(chooseProfile([ranged], part(2000))).toBe(ranged);
    expect(chooseProfile([ranged], part(999.9))).toBeNull();
    expect(chooseProfile([ranged], part(2000.1))).toBeNull();
    // A part without a nominal fits no ranged profile, but an open one.
    expect(chooseProfile([ranged], part(null))).toBeNull();
    expect(chooseProfile([profile(2, { nominalMax: 5000 })], part(null))).toBeNull();
    const open = profile(3, {});
    expect(chooseProfile([ranged, open], part(null))).toBe(open);
  });

  it('specificity counts each bound and a law: two bounds beat one, one beats none, whatever the order', () => {
    const none = profile(1, {});
    const oneBound = profile(2, { nominalMin: 100 });
    const upperOnly = profile(3, { nominalMax: 1e6 });
    const both = profile(4, { nominalMin: 100, nominalMax: 1e6 });
    expect(chooseProfile([none, oneBound, both], part(1000))).toBe(both);
    expect(chooseProfile([both, oneBound, none], part(1000))).toBe(both);
    expect(chooseProfile([none, oneBound], part(1000))).toBe(oneBound);
    expect(chooseProfile([none, upperOnly], part(1000))).toBe(upperOnly);
    // Equal specificity: the oldest (smallest id) wins, in either order.
    const oneBoundLater = profile(7, { nominalMax: 1e6 });
    expect(chooseProfile([oneBoundLater, oneBound], part(1000))).toBe(oneBound);
    expect(chooseProfile([oneBound, oneBoundLater], part(1000))).toBe(oneBound);
  });

  it('a law counts as specific; a pot without a taper class fits any law; a lawless profile fits any pot', () => {
    const any = profile(1, { kind: 'pot' });
    const audio = profile(2, { kind: 'pot', rules: { law: 'audio' } });
    const linear = profile(3, { kind: 'pot', rules: { law: 'linear' } });
    expect(chooseProfile([any, audio], part(500e3, 'audio', 'pot'))).toBe(audio);
    expect(chooseProfile([any, linear], part(500e3, 'audio', 'pot'))).toBe(any);
    expect(chooseProfile([linear], part(500e3, 'audio', 'pot'))).toBeNull();
    expect(chooseProfile([linear], part(500e3, null, 'pot'))).toBe(linear);
    expect(chooseProfile([any], part(500e3, 'linear', 'pot'))).toBe(any);
  });
});

describe('tolerances as typed and as written', () => {
  it('stored sides: the upper side defaults to the lower; none without a lower side', () => {
    expect(toleranceOf(5)).toEqual({ minusPct: 5, plusPct: 5 });
    expect(toleranceOf(20, 80)).toEqual({ minusPct: 20, plusPct: 80 });
    expect(toleranceOf(20, null)).toEqual({ minusPct: 20, plusPct: 20 });
    expect(toleranceOf(null, 80)).toBeNull();
    expect(isSymmetric({ minusPct: 5, plusPct: 5 })).toBe(true);
    expect(isSymmetric({ minusPct: 20, plusPct: 80 })).toBe(false);
    expect(toleranceWords(2.5)).toBe('±2.5 %');
    expect(toleranceWords(20, 80)).toBe('−20 %/+80 %');
    expect(toleranceWords(1 / 3)).toBe('±0.333 %');
    expect(toleranceWords(null)).toBe('not set');
  });

  it.each([
    ['5', 5, 5],
    ['±2.5 %', 2.5, 2.5],
    ['± 10%', 10, 10],
    ['2,5', 2.5, 2.5],
    ['100', 100, 100],
    ['12.25', 12.25, 12.25],
    ['−20/+80', 20, 80],
    ['-20 % +80 %', 20, 80],
    ['+80/-20', 20, 80],
    ['-20, +80', 20, 80],
    ['-20;+80', 20, 80],
    ['-0/+10', 0, 10],
    ['-10.5 / +20.25', 10.5, 20.25],
    ['-100/+1000', 100, 1000],
    ['-10.25/+20', 10.25, 20],
    ['-5/+0', 5, 0],
    ['  5  ', 5, 5],
  ])('%s reads as −%d %/+%d %', (text, minus, plus) => {
    expect(parseToleranceText(text)).toEqual({ ok: true, value: { minusPct: minus, plusPct: plus } });
  });

  it('blank is no tolerance', () => {
    expect(parseToleranceText('   ')).toEqual({ ok: true, value: null });
  });

  it.each([
    ['abc', 'Type a percentage such as 5 or ±2.5, or two sides such as −20/+80.'],
    ['-20/-80', 'Type a percentage such as 5 or ±2.5, or two sides such as −20/+80.'],
    ['-20 x +80', 'Type a percentage such as 5 or ±2.5, or two sides such as −20/+80.'],
    ['-20/+80/', 'Type a percentage such as 5 or ±2.5, or two sides such as −20/+80.'],
    ['x-20/+80', 'Type a percentage such as 5 or ±2.5, or two sides such as −20/+80.'],
    ['-20/+8.', 'Type a percentage such as 5 or ±2.5, or two sides such as −20/+80.'],
    ['-2a/+80', 'Type a percentage such as 5 or ±2.5, or two sides such as −20/+80.'],
    ['0', 'Must be more than 0 % and at most 100 %.'],
    ['100.5', 'Must be more than 0 % and at most 100 %.'],
    ['-100.5/+10', 'The side below nominal must be 0 % to 100 %.'],
    ['-10/+1000.5', 'The side above nominal must be 0 % to 1000 %.'],
    ['-0/+0', 'A tolerance of 0 % on both sides admits no part.'],
  ])('%s is refused: %s', (text, error) => {
    expect(parseToleranceText(text)).toEqual({ ok: false, error });
  });
});
