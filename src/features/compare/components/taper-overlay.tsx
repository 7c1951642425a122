// The overlay of normalised taper curves: every pot thin in its group's colour, each group's mean
// bold with its envelope as a band, and the nominal law of each class dashed for reference.
import { useMemo, useRef, useState } from 'react';
import type uPlot from 'uplot';
import type { AlignedData, Options } from 'uplot';
import { TAPER_LAW_LABEL, TAPER_LAWS, taperLawValue, TYPICAL_MID, type TaperLawKind } from '@shared/taper/law';
import { axis, downloadPng, Plot } from '@/components/charts/plot';
import { Button } from '@/components/ui/button';
import type { CompareTapersResponse } from '../api/types';
import { withAlpha } from './compare-model';
import type { Condition } from '@shared/csv/conditions';

interface Readout {
  series: string;
  rotation: number;
  value: number;
}

export function TaperOverlay({
  data,
  colours,
  envelope,
  conditions,
}: {
  data: CompareTapersResponse;
  colours: Map<string, string>;
  envelope: 'min-max' | 'two-sd';
  conditions: Condition[];
}) {
  const plotRef = useRef<uPlot | null>(null);
  const [readout, setReadout] = useState<Readout | null>(null);

  // Nominal laws of the classes present (the part's recorded m, else the class's usual value).
  const references = useMemo(() => {
    const seen = new Map<string, { law: TaperLawKind; m: number }>();
    for (const p of data.pots) {
      const law = TAPER_LAWS.find((l) => l === p.taperClass);
      if (!law) continue;
      const m = law === 'linear' ? 0.5 : (p.taperM ?? TYPICAL_MID[law]);
      seen.set(`${law}:${m}`, { law, m });
    }
    return [...seen.values()];
  }, [data.pots]);

  const { options, aligned } = useMemo(() => {
    const x = data.grid.map((g) => g * 100);
    const series: uPlot.Series[] = [{ label: 'Rotation' }];
    const columns: (number | null)[][] = [];
    const bands: uPlot.Band[] = [];
    const scale = (ys: (number | null)[]) => ys.map((v) => (v === null ? null : v * 100));
    for (const p of data.pots) {
      series.push({ label: p.label, stroke: withAlpha(colours.get(p.group) ?? '#5a5248', 0.45), width: 1, points: { show: false } });
      columns.push(scale(p.gridCurve));
    }
    for (const g of data.groups) {
      const c = colours.get(g.key) ?? '#5a5248';
      const lo = envelope === 'min-max' ? g.envelope.min : g.envelope.lower2Sd;
      const hi = envelope === 'min-max' ? g.envelope.max : g.envelope.upper2Sd;
      const what = envelope === 'min-max' ? 'min–max' : '±2σ';
      series.push({ label: `${g.label} ${what} upper`, stroke: withAlpha(c, 0.7), width: 1, dash: [3, 3], points: { show: false } });
      columns.push(scale(hi));
      series.push({ label: `${g.label} ${what} lower`, stroke: withAlpha(c, 0.7), width: 1, dash: [3, 3], points: { show: false } });
      columns.push(scale(lo));
      bands.push({ series: [series.length - 2, series.length - 1], fill: withAlpha(c, 0.12) });
      series.push({ label: `${g.label} mean`, stroke: c, width: 3, points: { show: false } });
      columns.push(scale(g.envelope.mean));
    }
    for (const r of references) {
      series.push({
        label: `Nominal ${TAPER_LAW_LABEL[r.law]}${r.law === 'linear' ? '' : ` (${Math.round(r.m * 100)} %)`}`,
        stroke: '#26221e',
        width: 1.5,
        dash: [8, 5],
        points: { show: false },
      });
      columns.push(data.grid.map((g) => taperLawValue(r.law, r.m, g) * 100));
    }
    const opts: Omit<Options, 'width' | 'height'> & { height?: number } = {
      height: 380,
      legend: { show: false },
      scales: { x: { time: false, range: [0, 100] }, y: { range: [0, 100] } },
      axes: [axis('Rotation (% of travel)'), axis('R(lug 1–wiper) / R13 (%)')],
      series,
      bands,
      focus: { alpha: 0.35 },
      cursor: { focus: { prox: 24 }, drag: { x: false, y: false } },
      hooks: {
        setCursor: [(u) => updateReadout(u)],
        setSeries: [
          (u, sidx, opts) => {
            const f = (opts as { focus?: boolean } | undefined)?.focus;
            if (f !== undefined) focus.series = f && sidx !== null ? sidx : -1;
            updateReadout(u);
          },
        ],
      },
    };
    // The series uPlot's cursor focus is on (the curve nearest the pointer), -1 for none; an
    // object the chart hooks update.
    const focus = { series: -1 };
    function updateReadout(u: uPlot) {
      const idx = u.cursor.idx;
      if (idx === null || idx === undefined || focus.series < 1) return setReadout(null);
      const v = u.data[focus.series]?.[idx];
      if (v === null || v === undefined) return setReadout(null);
      setReadout({ series: String(u.series[focus.series]!.label), rotation: u.data[0][idx]!, value: v });
    }
    return { options: opts, aligned: [x, ...columns] as AlignedData };
  }, [data, colours, envelope, references]);

  return (
    <div>
      <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <p className="num min-h-5 text-sm text-ink-soft" aria-live="off">
          {readout ? (
            <>
              <span className="font-sans font-medium text-ink">{readout.series}</span> · rotation {readout.rotation.toFixed(0)} % ·{' '}
              {readout.value.toFixed(1)} % of R13
            </>
          ) : (
            <span className="font-sans">Point at a curve to read its part, rotation and value.</span>
          )}
        </p>
        <Button
          size="sm"
          onClick={() =>
            plotRef.current &&
            downloadPng(plotRef.current, 'taper-overlay.png', {
              title: 'Taper curves: R(lug 1–wiper) / R13 against rotation',
              conditions: [
                ...conditions,
                { key: 'envelope', value: envelope === 'min-max' ? 'min–max of each group' : '±2σ of each group' },
              ],
              // The screen's key: one entry per group (the chart has a series per pot) and per nominal law.
              legend: [
                ...data.groups.map((g) => ({
                  label: `${g.label} (${g.partIds.length}), bold line: mean`,
                  colour: colours.get(g.key) ?? '#5a5248',
                })),
                ...references.map((r) => ({
                  label: `Nominal ${TAPER_LAW_LABEL[r.law]}${r.law === 'linear' ? '' : ` (${Math.round(r.m * 100)} %)`}, dashed`,
                  colour: '#26221e',
                })),
              ],
            })
          }
        >
          Chart as PNG
        </Button>
      </div>
      <Plot
        options={options}
        data={aligned}
        label={`Taper curves of ${data.pots.length} pots in ${data.groups.length} groups: resistance from lug 1 to the wiper as a percentage of the total against rotation, with each group's mean and ${envelope === 'min-max' ? 'min–max' : '±2σ'} envelope.`}
        onReady={(u) => (plotRef.current = u)}
      />
      <ul className="mt-3 flex flex-wrap gap-x-5 gap-y-1 text-sm" aria-label="Chart key">
        {data.groups.map((g) => (
          <li key={g.key} className="flex items-center gap-2">
            <span className="inline-block h-1 w-6 rounded" style={{ background: colours.get(g.key) }} aria-hidden="true" />
            {g.label} <span className="text-ink-soft">({g.partIds.length})</span>
          </li>
        ))}
        {references.map((r) => (
          <li key={`${r.law}:${r.m}`} className="flex items-center gap-2">
            <span className="inline-block w-6 border-t-2 border-dashed border-ink" aria-hidden="true" />
            Nominal {TAPER_LAW_LABEL[r.law]}
            {r.law === 'linear' ? '' : ` (${Math.round(r.m * 100)} %)`}
          </li>
        ))}
        <li className="flex items-center gap-2 text-ink-soft">
          <span className="inline-block h-3 w-6 rounded-sm bg-ink/10" aria-hidden="true" />
          Band: {envelope === 'min-max' ? 'min–max of the group' : 'mean ± 2 SD'}; bold line: group mean
        </li>
      </ul>
    </div>
  );
}
