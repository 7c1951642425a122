import { describe, expect, it } from 'vitest';
import { exportLayout, wrapText } from '@/lib/chart-export';

// A monospace stand-in for measureText: every character 7 px wide.
const mono = (t: string) => t.length * 7;

describe('wrapText', () => {
  it('breaks at spaces so no line is wider than the limit, keeping every word', () => {
    const text = 'design: Two knobs · volume knob: 7.5 · tone knob: 10.0 · cable: 3 m';
    const lines = wrapText(text, 140, mono);
    expect(lines.length).toBeGreaterThan(1);
    for (const l of lines) expect(mono(l)).toBeLessThanOrEqual(140);
    expect(lines.join(' ')).toBe(text);
  });
  it('keeps a word longer than the limit on its own line rather than dropping it', () => {
    expect(wrapText('a verylongwordthatdoesnotfit b', 49, mono)).toEqual(['a', 'verylongwordthatdoesnotfit', 'b']);
  });
});

describe('exportLayout', () => {
  const base = {
    width: 600,
    plotHeight: 300,
    title: 'Harness response',
    conditions: 'design: A · volume knob: 10.0',
    scale: 1,
    measure: (t: string) => mono(t),
  };

  it('puts the title, then the conditions, then the plot, then the legend, without overlap', () => {
    const l = exportLayout({
      ...base,
      legend: [
        { label: 'Now', colour: '#2d5189' },
        { label: 'Volume 8', colour: '#c2571a' },
      ],
    });
    expect(l.title.y).toBeLessThan(l.conditions[0]!.y);
    expect(l.conditions[0]!.y + l.fonts.conditions).toBeLessThanOrEqual(l.plotY);
    expect(l.legend[0]!.y).toBeGreaterThanOrEqual(l.plotY + base.plotHeight);
    expect(l.height).toBeGreaterThan(l.legend[0]!.y + l.swatch);
    // Two short entries fit on one row, the second after the first's label.
    expect(l.legend[1]!.y).toBe(l.legend[0]!.y);
    expect(l.legend[1]!.x).toBeGreaterThan(l.legend[0]!.textX + mono('Now'));
  });

  it('wraps long conditions and legends onto more rows inside the width, growing the image', () => {
    const long = Array.from({ length: 30 }, (_, i) => `key${i}: value${i}`).join(' · ');
    const legend = Array.from({ length: 12 }, (_, i) => ({ label: `Curve number ${i}`, colour: '#000' }));
    const short = exportLayout({ ...base, legend: legend.slice(0, 1) });
    const l = exportLayout({ ...base, conditions: long, legend });
    expect(l.conditions.length).toBeGreaterThan(2);
    for (const c of l.conditions) expect(c.x + mono(c.text)).toBeLessThanOrEqual(base.width);
    for (const e of l.legend) expect(e.textX + mono(e.label)).toBeLessThanOrEqual(base.width);
    expect(new Set(l.legend.map((e) => e.y)).size).toBeGreaterThan(1);
    expect(l.height).toBeGreaterThan(short.height);
  });

  it('scales fonts and margins with the device pixel ratio', () => {
    const one = exportLayout({ ...base, legend: [] });
    const two = exportLayout({ ...base, width: 1200, plotHeight: 600, scale: 2, legend: [] });
    expect(two.fonts.title).toBe(one.fonts.title * 2);
    expect(two.plotY).toBe(one.plotY * 2);
  });
});
