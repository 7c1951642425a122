// One uPlot chart that follows its container's width. Every plot in Lugbook goes through this
// component, so axes, fonts, colours and the PNG export look the same everywhere.
import { useEffect, useLayoutEffect, useRef } from 'react';
import uPlot, { type AlignedData, type Options } from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { conditionsLine, type Condition } from '@shared/csv/conditions';
import { exportLayout, type LegendEntry } from '@/lib/chart-export';
import { stampExport } from '@/lib/download';

export interface PlotProps {
  /** uPlot options without width (taken from the container); height defaults to 320. */
  options: Omit<Options, 'width' | 'height'> & { height?: number };
  data: AlignedData;
  /** Accessible description of what the chart shows. */
  label: string;
  className?: string;
  /** Receives the uPlot instance (e.g. for a PNG export); called with null on unmount. */
  onReady?: (plot: uPlot | null) => void;
}

export function Plot({ options, data, label, className, onReady }: PlotProps) {
  const host = useRef<HTMLDivElement>(null);
  const plot = useRef<uPlot | null>(null);
  const readyRef = useRef(onReady);
  // The latest callback, stored after each render (layout effects run before the effect below).
  useLayoutEffect(() => {
    readyRef.current = onReady;
  });

  // Rebuild when the options change (series, scales); data alone is set in place below.
  useEffect(() => {
    const el = host.current;
    if (!el) return;
    const width = Math.max(el.clientWidth, 200);
    const u = new uPlot({ ...options, width, height: options.height ?? 320 } as Options, data, el);
    plot.current = u;
    readyRef.current?.(u);
    const ro = new ResizeObserver(() => {
      const w = Math.max(el.clientWidth, 200);
      if (Math.abs(w - u.width) > 1) u.setSize({ width: w, height: u.height });
    });
    ro.observe(el);
    return () => {
      ro.disconnect();
      u.destroy();
      plot.current = null;
      readyRef.current?.(null);
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps -- data is set in place by the next effect; a rebuild per data change would lose zoom and cursor
  }, [options]);

  useEffect(() => {
    plot.current?.setData(data);
  }, [data]);

  return <div ref={host} role="img" aria-label={label} className={className} />;
}

/** Lugbook's series colours, in order: distinct on paper and for common colour-vision deficiencies. */
export const SERIES_COLOURS = ['#2d5189', '#c2571a', '#2d6a39', '#7b3f98', '#a2312a', '#1d7f86', '#865707', '#5a5248'];

const AXIS = {
  stroke: '#5a5248',
  grid: { stroke: '#e6dcc9', width: 1 },
  ticks: { stroke: '#d9cdb8', width: 1 },
  font: '12px "IBM Plex Mono", monospace',
  labelFont: '600 12px "IBM Plex Sans", sans-serif',
};

/** An axis with its name and unit in the label, in Lugbook's style. */
export function axis(label: string, extra: Partial<uPlot.Axis> = {}): uPlot.Axis {
  return { ...AXIS, label, ...extra };
}

/** Tick labels for a log-frequency axis: 20, 50, 100, 200, 500, 1k, 2k, 5k, 10k, 20k. */
export function hzTicks(_u: uPlot, splits: number[]): string[] {
  return splits.map((v) => {
    const m = v / Math.pow(10, Math.floor(Math.log10(v)));
    if (![1, 2, 5].some((k) => Math.abs(m - k) < 1e-6)) return '';
    return v >= 1000 ? `${v / 1000}k` : String(v);
  });
}

/** A log-frequency x scale and axis (hertz), as every frequency plot in Lugbook uses. */
export const frequencyX = {
  scale: { time: false, distr: 3, log: 10 } as uPlot.Scale,
  axis: axis('Frequency (Hz)', { values: hzTicks }),
};

export interface PngExport {
  /** What the chart shows, e.g. "Harness response". */
  title: string;
  /** The conditions it was made under; the time of the export is added. */
  conditions: readonly Condition[];
  /** The legend, when the chart's own series labels are not the right key (one entry per group). */
  legend?: LegendEntry[];
}

/** The series a legend shows: every visible series after x with a label, in its stroke colour. */
export function legendOf(u: uPlot): LegendEntry[] {
  return u.series.slice(1).flatMap((s) => {
    const label = typeof s.label === 'string' ? s.label : '';
    if (!label || s.show === false) return [];
    const stroke = typeof s.stroke === 'function' ? s.stroke(u, u.series.indexOf(s)) : s.stroke;
    return [{ label, colour: typeof stroke === 'string' ? stroke : '#5a5248' }];
  });
}

/**
 * Saves the chart as a PNG file on a white background: the title and the conditions line above the
 * plot (axes with their names and units, as drawn on screen), the legend below it.
 */
export function downloadPng(u: uPlot, fileName: string, info: PngExport): void {
  const src = u.ctx.canvas;
  const scale = src.width / Math.max(u.width, 1);
  const fontOf = {
    title: (px: number) => `600 ${px}px "IBM Plex Sans", sans-serif`,
    conditions: (px: number) => `${px}px "IBM Plex Sans", sans-serif`,
    legend: (px: number) => `${px}px "IBM Plex Sans", sans-serif`,
  };
  const out = document.createElement('canvas');
  const ctx = out.getContext('2d')!;
  const sizes = { title: Math.round(16 * scale), conditions: Math.round(12 * scale), legend: Math.round(12 * scale) };
  const layout = exportLayout({
    width: src.width,
    plotHeight: src.height,
    title: info.title,
    conditions: conditionsLine(stampExport(info.conditions)),
    legend: info.legend ?? legendOf(u),
    scale,
    measure: (t, role) => {
      ctx.font = fontOf[role](sizes[role]);
      return ctx.measureText(t).width;
    },
  });
  out.width = layout.width;
  out.height = layout.height;
  ctx.fillStyle = '#ffffff';
  ctx.fillRect(0, 0, out.width, out.height);
  ctx.textBaseline = 'top';
  ctx.fillStyle = '#2a2520';
  ctx.font = fontOf.title(layout.fonts.title);
  ctx.fillText(layout.title.text, layout.title.x, layout.title.y);
  ctx.fillStyle = '#5a5248';
  ctx.font = fontOf.conditions(layout.fonts.conditions);
  for (const l of layout.conditions) ctx.fillText(l.text, l.x, l.y);
  ctx.drawImage(src, 0, layout.plotY);
  ctx.font = fontOf.legend(layout.fonts.legend);
  for (const e of layout.legend) {
    ctx.fillStyle = e.colour;
    ctx.fillRect(e.x, e.y, layout.swatch, layout.swatch);
    ctx.fillStyle = '#2a2520';
    ctx.fillText(e.label, e.textX, e.y);
  }
  const a = document.createElement('a');
  a.href = out.toDataURL('image/png');
  a.download = fileName.endsWith('.png') ? fileName : `${fileName}.png`;
  a.click();
}
