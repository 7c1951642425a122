// The coil fit's body (POST /api/analysis/coil) takes points as magnitude/phase or as re/im. Its union
// must read a re/im list without first reading every point as magnitude/phase (that cost tens of
// milliseconds of the request thread at 5,000 points), and must answer every input as the plain union
// of the two point lists did: the same parsed points, the same refusals with the same messages and paths.
// The expected refusals below are what the plain union answered before the change.
import { describe, expect, test } from 'vitest';
import { CoilRequestSchema } from '@shared/schemas/analysis';

const reIm = (n: number) => Array.from({ length: n }, (_, i) => ({ frequency: 20 + i, re: 6000 + i, im: 3 * i }));
const magPhase = (n: number) => Array.from({ length: n }, (_, i) => ({ frequency: 20 + i, magnitude: 6000 + i, phaseDeg: 10 }));

/** The refusal as the API words it: one message per path (server/http/validate.ts keeps the first). */
function refusal(body: unknown): Record<string, string> | null {
  const r = CoilRequestSchema.safeParse(body);
  if (r.success) return null;
  const fields: Record<string, string> = {};
  for (const issue of r.error.issues) fields[issue.path.join('.')] ??= issue.message;
  return fields;
}

describe('coil fit points', () => {
  test('a re/im list is read without reading any point beyond the first as magnitude/phase', () => {
    const reads: Record<string, number> = {};
    const points = reIm(5000).map(
      (p) =>
        new Proxy(p, {
          get(target, key, receiver) {
            if (typeof key === 'string') reads[key] = (reads[key] ?? 0) + 1;
            return Reflect.get(target, key, receiver) as unknown;
          },
        }),
    );
    const r = CoilRequestSchema.safeParse({ points });
    expect(r.success).toBe(true);
    expect(r.data!.points).toEqual(reIm(5000));
    // The magnitude/phase kind gives up at the first point, which has no magnitude.
    expect((reads.magnitude ?? 0) + (reads.phaseDeg ?? 0)).toBeLessThanOrEqual(2);
  });

  test('both kinds parse to their points; extra fields are dropped; a point with both kinds reads as magnitude/phase', () => {
    expect(CoilRequestSchema.parse({ points: reIm(6) }).points).toEqual(reIm(6));
    expect(CoilRequestSchema.parse({ points: magPhase(6), withRp: 'auto' })).toEqual({ points: magPhase(6), withRp: 'auto' });
    const both = reIm(5).map((p, i) => ({ ...p, magnitude: 1000, phaseDeg: i, note: 'x' }));
    expect(CoilRequestSchema.parse({ points: both }).points).toEqual(
      both.map(({ frequency, magnitude, phaseDeg }) => ({ frequency, magnitude, phaseDeg })),
    );
  });

  test('refusals keep their messages and paths', () => {
    const cases: [string, unknown[], Record<string, string>][] = [
      ['a re/im point with a text value', reIm(10).map((p, i) => (i === 3 ? { ...p, re: 'x' } : p)), { points: 'Invalid input' }],
      ['kinds mixed in one list', reIm(10).map((p, i) => (i === 3 ? magPhase(10)[3] : p)), { points: 'Invalid input' }],
      ['numbers instead of points', [1, 2, 3, 4, 5, 6], { points: 'Invalid input' }],
      ['an array as a point', [[20, 1, 2], ...reIm(5)], { points: 'Invalid input' }],
      ['a point with neither kind', [{ frequency: 20 }, ...reIm(5)], { points: 'Invalid input' }],
      [
        'a phase beyond 180°',
        magPhase(10).map((p, i) => (i === 2 ? { ...p, phaseDeg: 200 } : p)),
        { 'points.2.phaseDeg': 'Too big: expected number to be <=180' },
      ],
      [
        'a negative magnitude',
        magPhase(10).map((p, i) => (i === 4 ? { ...p, magnitude: -1 } : p)),
        { 'points.4.magnitude': 'Must be zero or more.' },
      ],
      [
        'frequencies out of range in both kinds',
        reIm(10).map((p, i) => (i === 0 ? { ...p, frequency: -1 } : i === 7 ? { ...p, frequency: 2e6 } : p)),
        {
          'points.0.frequency': 'Must be a frequency from 1 Hz to 1 MHz.',
          'points.7.frequency': 'Must be a frequency from 1 Hz to 1 MHz.',
        },
      ],
      ['too few points', reIm(3), { points: 'A coil fit needs at least five points.' }],
      ['no points', [], { points: 'A coil fit needs at least five points.' }],
      [
        'too few points, one of them out of range',
        magPhase(3).map((p, i) => (i === 1 ? { ...p, phaseDeg: -181 } : p)),
        { 'points.1.phaseDeg': 'Too small: expected number to be >=-180', points: 'A coil fit needs at least five points.' },
      ],
      [
        'every field of both kinds, out of range in both',
        reIm(6).map((p) => ({ ...p, magnitude: 1, phaseDeg: 0, frequency: 0 })),
        { points: 'Invalid input' },
      ],
      [
        'more than 5,000 points',
        reIm(5001),
        { points: 'A coil fit takes at most 5,000 points, as many as an impedance sweep upload; this one has 5,001.' },
      ],
    ];
    for (const [what, points, fields] of cases) expect(refusal({ points }), what).toEqual(fields);
  });
});
