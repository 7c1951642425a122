// The lot's histogram (Freedman–Diaconis bins from the engine) with the nominal and the tolerance
// limits drawn as vertical lines. Bars come from uPlot's own bars path builder.
import { useMemo, useRef } from 'react';
import uPlot, { type AlignedData } from 'uplot';
import { Button } from '@/components/ui/button';
import { Plot, axis, downloadPng } from '@/components/charts/plot';
import type { LotStats } from '../api/types';
import { displayScale } from './lot-format';
import type { Condition } from '@shared/csv/conditions';

const QUANTITY_NAME: Record<string, string> = { capacitance: 'Capacitance', resistance: 'Resistance' };
const BAR = '#2d5189';
const NOMINAL = '#26221e';
const LIMIT = '#a2312a';

interface Props {
  stats: LotStats;
  nominal: number;
  unit: string;
  quantity: string;
  code: string;
  /** The lot's conditions (lotConditions), as the CSV export states them. */
  conditions: Condition[];
}

export function LotHistogram({ stats, nominal, unit, quantity, code, conditions }: Props) {
  const plotRef = useRef<uPlot | null>(null);
  const scale = displayScale(nominal, unit);
  const { edges, counts } = stats.histogram;

  const data = useMemo<AlignedData>(() => {
    const x = counts.map((_, i) => ((edges[i]! + edges[i + 1]!) / 2) * scale.factor);
    return [x, counts];
  }, [edges, counts, scale.factor]);

  const options = useMemo(() => {
    const marks = [
      { at: stats.lower * scale.factor, colour: LIMIT, dash: [6, 4], text: 'lower limit' },
      { at: nominal * scale.factor, colour: NOMINAL, dash: [], text: 'nominal' },
      { at: stats.upper * scale.factor, colour: LIMIT, dash: [6, 4], text: 'upper limit' },
    ];
    const lo = edges[0]! * scale.factor;
    const hi = edges[edges.length - 1]! * scale.factor;
    const pad = (hi - lo) * 0.03 || Math.abs(lo) * 0.01 || 1;
    const bars = uPlot.paths.bars!({ size: [1, Infinity, 1], align: 0, gap: 1 });
    return {
      height: 300,
      legend: { show: false },
      cursor: { drag: { x: false, y: false }, points: { show: false } },
      scales: {
        x: { time: false, range: [lo - pad, hi + pad] as [number, number] },
        y: { range: (_u: uPlot, _min: number, max: number) => [0, Math.max(1, max * 1.12)] as [number, number] },
      },
      axes: [axis(`${QUANTITY_NAME[quantity] ?? 'Value'} (${scale.unit})`), axis('Parts (count)', { size: 56 })],
      series: [{}, { label: 'Parts', stroke: BAR, fill: `${BAR}bb`, width: 1, paths: bars, points: { show: false } }],
      hooks: {
        // The limits and the nominal over the bars, each with its name at the top.
        draw: [
          (u: uPlot) => {
            const ctx = u.ctx;
            const dpr = uPlot.pxRatio;
            const top = u.bbox.top;
            const bottom = u.bbox.top + u.bbox.height;
            ctx.save();
            ctx.font = `${11 * dpr}px "IBM Plex Sans", sans-serif`;
            ctx.textBaseline = 'top';
            for (const m of marks) {
              const x = Math.round(u.valToPos(m.at, 'x', true));
              if (x < u.bbox.left || x > u.bbox.left + u.bbox.width) continue;
              ctx.strokeStyle = m.colour;
              ctx.lineWidth = 1.5 * dpr;
              ctx.setLineDash(m.dash.map((d) => d * dpr));
              ctx.beginPath();
              ctx.moveTo(x, top);
              ctx.lineTo(x, bottom);
              ctx.stroke();
              ctx.fillStyle = m.colour;
              const w = ctx.measureText(m.text).width;
              const right = x + 4 * dpr + w < u.bbox.left + u.bbox.width;
              ctx.textAlign = right ? 'left' : 'right';
              ctx.fillText(m.text, right ? x + 4 * dpr : x - 4 * dpr, top + 2 * dpr);
            }
            ctx.restore();
          },
        ],
      },
    };
    // Rebuilt only when the lot's layout changes.
  }, [stats.lower, stats.upper, nominal, scale.factor, scale.unit, quantity, edges]);

  return (
    <div>
      <Plot
        options={options}
        data={data}
        label={`Histogram of ${stats.n} readings in ${counts.length} bins of ${(stats.histogram.binWidth * scale.factor).toPrecision(3)} ${scale.unit}, with the nominal and the tolerance limits marked.`}
        onReady={(u) => (plotRef.current = u)}
      />
      <div className="mt-2 flex flex-wrap items-center justify-between gap-2 text-xs text-ink-soft">
        <p>
          <span className="inline-block h-0.5 w-4 align-middle" style={{ background: NOMINAL }} /> nominal ·{' '}
          <span className="inline-block w-4 border-t-2 border-dashed align-middle" style={{ borderColor: LIMIT }} /> tolerance limits · bin
          width{' '}
          <span className="num">
            {(stats.histogram.binWidth * scale.factor).toPrecision(3)} {scale.unit}
          </span>{' '}
          (Freedman–Diaconis)
        </p>
        <Button
          size="sm"
          onClick={() =>
            plotRef.current &&
            downloadPng(plotRef.current, `${code}-histogram`, {
              title: `Lot ${code}: histogram of ${QUANTITY_NAME[quantity]?.toLowerCase() ?? 'values'}`,
              conditions: [
                ...conditions,
                {
                  key: 'bins',
                  value: `${counts.length}, width ${(stats.histogram.binWidth * scale.factor).toPrecision(3)} ${scale.unit} (Freedman–Diaconis)`,
                },
              ],
              legend: [
                { label: 'Parts per bin', colour: BAR },
                { label: 'Nominal', colour: NOMINAL },
                { label: 'Tolerance limits', colour: LIMIT },
              ],
            })
          }
        >
          Save PNG
        </Button>
      </div>
    </div>
  );
}
