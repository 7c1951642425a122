// Where the title, the conditions line(s) and the legend go on an exported chart image. Pure: the
// caller passes a text-measuring function (the canvas's measureText in the browser), so the layout
// is tested without a canvas.

export interface LegendEntry {
  label: string;
  colour: string;
}

export interface ExportLayoutInput {
  /** Width of the plot image, in canvas pixels. */
  width: number;
  /** Height of the plot image, in canvas pixels. */
  plotHeight: number;
  title: string;
  conditions: string;
  legend: readonly LegendEntry[];
  /** Canvas pixels per CSS pixel. */
  scale: number;
  /** Width of a text in canvas pixels, for the font of its role. */
  measure: (text: string, role: 'title' | 'conditions' | 'legend') => number;
}

export interface ExportLayout {
  width: number;
  height: number;
  /** Top of the plot image. */
  plotY: number;
  title: { text: string; x: number; y: number };
  conditions: { text: string; x: number; y: number }[];
  /** Each entry: a colour swatch at (x, y) of size swatch, the label after it. */
  legend: { label: string; colour: string; x: number; y: number; textX: number }[];
  swatch: number;
  /** Font sizes in canvas pixels. */
  fonts: { title: number; conditions: number; legend: number };
}

/** Breaks text at spaces (or the " · " separators) into lines no wider than maxWidth. */
export function wrapText(text: string, maxWidth: number, measure: (t: string) => number): string[] {
  const words = text.split(' ').filter((w) => w !== '');
  const lines: string[] = [];
  let cur = '';
  for (const w of words) {
    const next = cur === '' ? w : `${cur} ${w}`;
    if (cur !== '' && measure(next) > maxWidth) {
      lines.push(cur);
      cur = w;
    } else cur = next;
  }
  if (cur !== '') lines.push(cur);
  return lines;
}

export function exportLayout(input: ExportLayoutInput): ExportLayout {
  const { width, plotHeight, scale } = input;
  const pad = Math.round(12 * scale);
  const fonts = { title: Math.round(16 * scale), conditions: Math.round(12 * scale), legend: Math.round(12 * scale) };
  const lineGap = Math.round(4 * scale);
  const inner = width - 2 * pad;
  let y = pad;
  const title = { text: input.title, x: pad, y };
  y += fonts.title + lineGap * 2;
  const conditions = wrapText(input.conditions, inner, (t) => input.measure(t, 'conditions')).map((text) => {
    const line = { text, x: pad, y };
    y += fonts.conditions + lineGap;
    return line;
  });
  y += lineGap;
  const plotY = y;
  y += plotHeight + lineGap * 2;
  const swatch = fonts.legend;
  const gap = Math.round(16 * scale);
  const legend: ExportLayout['legend'] = [];
  let x = pad;
  for (const e of input.legend) {
    const w = swatch + lineGap * 2 + input.measure(e.label, 'legend');
    if (x > pad && x + w > width - pad) {
      x = pad;
      y += fonts.legend + lineGap * 2;
    }
    legend.push({ label: e.label, colour: e.colour, x, y, textX: x + swatch + lineGap * 2 });
    x += w + gap;
  }
  if (legend.length > 0) y += fonts.legend + lineGap * 2;
  return { width, height: y + pad, plotY, title, conditions, legend, swatch, fonts };
}
