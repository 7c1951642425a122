import { describe, expect, it } from 'vitest';
import {
  COLOUR_DIGIT,
  COLOUR_MULTIPLIER_EXP,
  COLOUR_TCR_PPM,
  COLOUR_TOLERANCE_PCT,
  decodeColourBands,
  type BandColour,
} from '@shared/markings/colour-bands';
import { MarkingError } from '@shared/markings/tolerance-letters';
import { IEC60062_TEXT, rows } from './iec60062-fixture';

// Source for every table check: tests/fixtures/iec/iec60062-marking-codes.txt (IEC 60062 as stated
// by public secondary sources; the fixture's first line names them).
describe('colour tables against the IEC 60062 fixture', () => {
  it('the fixture keeps its source line', () => {
    expect(IEC60062_TEXT.split('\n')[0]).toMatch(/^# Source: .*IEC 60062/);
  });

  it('digit and multiplier of every colour row', () => {
    const colourRows = rows('colour');
    expect(colourRows.length).toBe(13);
    for (const r of colourRows) {
      const c = r.key as BandColour;
      const digit = /digit=(\w+)/.exec(r.value)![1]!;
      const mult = Number(/multiplier=([-\de.]+)/.exec(r.value)![1]);
      expect(COLOUR_DIGIT[c], `digit of ${c}`).toBe(digit === 'none' ? undefined : Number(digit));
      expect(10 ** COLOUR_MULTIPLIER_EXP[c], `multiplier of ${c}`).toBeCloseTo(mult, 15);
    }
  });

  it('tolerance colours: CONSENSUS rows decoded, CONFLICT rows refused', () => {
    for (const r of rows('tolerance-colour')) {
      const pct = Number(/±([\d.]+)%/.exec(r.value)![1]);
      if (r.key === 'none') {
        // No tolerance band: ±20 %, i.e. a three-band resistor.
        expect(decodeColourBands('brown black red').tolerancePct).toBe(pct);
        continue;
      }
      const c = r.key as BandColour;
      if (r.note.startsWith('CONSENSUS')) {
        expect(COLOUR_TOLERANCE_PCT[c], `tolerance of ${c}`).toBe(pct);
        expect(decodeColourBands(['brown', 'black', 'red', c]).tolerancePct).toBe(pct);
      } else {
        expect(r.note).toMatch(/^CONFLICT/);
        expect(() => decodeColourBands(['brown', 'black', 'red', c])).toThrow(/tolerance by hand/);
      }
    }
  });

  it('temperature-coefficient band of every tcr row', () => {
    for (const r of rows('tcr-colour')) {
      const ppm = Number(/^(\d+)/.exec(r.value)![1]);
      expect(COLOUR_TCR_PPM[r.key as BandColour]).toBe(ppm);
      expect(decodeColourBands(['brown', 'black', 'black', 'red', 'brown', r.key]).tcrPpmPerK).toBe(ppm);
    }
  });
});

describe('decodeColourBands', () => {
  // Examples worked by hand from the IEC 60062 digit/multiplier table above.
  it.each([
    ['yellow violet red gold', 4700, 5, 4],
    ['brown black yellow silver', 100e3, 10, 4],
    ['Brown, Black, Black, Red, Brown', 10e3, 1, 5],
    ['orange orange gold gold', 3.3, 5, 4],
    ['green blue silver gold', 0.56, 5, 4],
    ['brown black pink brown', 0.01, 1, 4], // pink multiplier 10^-3, IEC 60062:2016 abstract
    ['gray red brown gold', 820, 5, 4], // "gray" accepted for grey
    ['blue purple black', 67, 20, 3], // "purple" for violet; three bands: ±20 %
    ['black', 0, null, 1], // zero-ohm link — common practice (no published source)
  ] as const)('%s → %d Ω ±%s %%', (bands, nominal, tol, count) => {
    const r = decodeColourBands(bands);
    expect(r.nominal).toBe(nominal);
    expect(r.tolerancePct).toBe(tol);
    expect(r.bands).toBe(count);
    expect(r.unit).toBe('Ω');
  });

  it('refuses impossible bands with a clear reason', () => {
    const msg = (bands: string) => {
      try {
        decodeColourBands(bands);
      } catch (e) {
        expect(e).toBeInstanceOf(MarkingError);
        return (e as Error).message;
      }
      throw new Error(`expected ${bands} to be refused`);
    };
    expect(msg('gold red violet yellow')).toMatch(/wrong end/);
    expect(msg('red gold red gold')).toMatch(/Band 2 .*gold.*no digit/);
    expect(msg('red red red white')).toMatch(/white.*not a tolerance colour/);
    expect(msg('red red')).toMatch(/2 bands/);
    expect(msg('red red red red red red red')).toMatch(/7 bands/);
    expect(msg('red red red magenta')).toMatch(/magenta.*not a resistor band colour/);
    expect(msg('brown black black red brown pink')).toMatch(/sixth band/);
  });
});
