// What the player hears: the level at 1 kHz against the volume knob for each pot as the volume
// control between a chosen pickup and load, computed here with the shared harness engine.
import { useMemo, useRef, useState } from 'react';
import type uPlot from 'uplot';
import type { AlignedData, Options } from 'uplot';
import { PICKUP_PRESETS } from '@shared/circuit/presets';
import { CompareSettingsSchema, type CompareSettings } from '@shared/schemas/compare';
import { formatValue } from '@shared/units/format';
import { tryParseValue } from '@shared/units/parse';
import { axis, downloadPng, Plot } from '@/components/charts/plot';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { downloadCsv } from '@/lib/download';
import type { Condition } from '@shared/csv/conditions';
import type { CandidatePickup, TaperPot } from '../api/types';
import { dial, LEVEL_MARKS, withAlpha, type PotLoaded } from './compare-model';

type LoadSettings = Pick<CompareSettings, 'pickup' | 'cableLength' | 'ampR'>;

function pickupValue(p: CompareSettings['pickup']) {
  return p.source === 'preset' ? `preset:${p.id}` : `part:${p.partId}`;
}

export function LoadControls({
  settings,
  pickups,
  onChange,
}: {
  settings: LoadSettings;
  pickups: CandidatePickup[];
  onChange: (s: Partial<CompareSettings>) => void;
}) {
  const [cableText, setCableText] = useState(String(settings.cableLength));
  const [ampText, setAmpText] = useState(formatValue(settings.ampR, 'Ω'));
  const [cableError, setCableError] = useState<string>();
  const [ampError, setAmpError] = useState<string>();
  const amp = tryParseValue(ampText, 'resistance');

  const commitCable = (text: string) => {
    setCableText(text);
    const n = Number(text.replace(',', '.').replace(/\s*m$/i, ''));
    const check = CompareSettingsSchema.shape.cableLength.safeParse(text.trim() === '' ? Number.NaN : n);
    if (!check.success)
      return setCableError(
        Number.isNaN(n) || text.trim() === '' ? 'Type the cable length in metres, e.g. 3 or 4.5.' : check.error.issues[0]!.message,
      );
    setCableError(undefined);
    onChange({ cableLength: check.data });
  };
  const commitAmp = (text: string) => {
    setAmpText(text);
    const r = tryParseValue(text, 'resistance');
    if (!r.ok) return setAmpError(r.error);
    if (!(r.value > 0)) return setAmpError('The input resistance must be more than zero.');
    setAmpError(undefined);
    onChange({ ampR: r.value });
  };

  return (
    <div className="grid gap-4 sm:grid-cols-3">
      <SelectField
        label="Pickup"
        value={pickupValue(settings.pickup)}
        onChange={(e) => {
          const [source, id] = e.target.value.split(':') as [string, string];
          onChange({
            pickup:
              source === 'part'
                ? { source: 'part', partId: Number(id) }
                : { source: 'preset', id: id as 'humbucker-like' | 'single-coil-like' },
          });
        }}
        hint="A typical coil, or a measured pickup's current coil fit."
      >
        <optgroup label="Typical coils">
          {PICKUP_PRESETS.map((p) => (
            <option key={p.id} value={`preset:${p.id}`}>
              {p.name} ({formatValue(p.values.pickupL, 'H')}, {formatValue(p.values.pickupR, 'Ω')})
            </option>
          ))}
        </optgroup>
        {pickups.length > 0 && (
          <optgroup label="Measured pickups">
            {pickups.map((p) => (
              <option key={p.id} value={`part:${p.id}`}>
                {p.label} ({formatValue(p.L, 'H')}, {formatValue(p.R, 'Ω')})
              </option>
            ))}
          </optgroup>
        )}
      </SelectField>
      <TextField
        label="Cable length (m)"
        inputMode="decimal"
        value={cableText}
        onChange={(e) => commitCable(e.target.value)}
        error={cableError}
        hint={`${formatValue(settings.cableLength * 100e-12, 'F')} at 100 pF per metre`}
        inputClassName="num"
      />
      <TextField
        label="Amplifier input"
        value={ampText}
        onChange={(e) => commitAmp(e.target.value)}
        error={ampError}
        hint={amp.ok ? `Reads as ${formatValue(amp.value, 'Ω')}` : 'Engineering notation: 1M, 470k'}
        inputClassName="num"
      />
    </div>
  );
}

const GUIDE = '#857b70';

export function LoadedChart({
  loaded,
  colours,
  pickupName,
  conditions,
}: {
  loaded: PotLoaded[];
  colours: Map<string, string>;
  pickupName: string;
  conditions: Condition[];
}) {
  const plotRef = useRef<uPlot | null>(null);
  const [readout, setReadout] = useState<string | null>(null);
  const { options, data } = useMemo(() => {
    const x = loaded[0]?.taper.dial ?? [];
    const series: uPlot.Series[] = [{ label: 'Volume' }];
    const columns: (number | null)[][] = [];
    for (const l of loaded) {
      series.push({
        label: l.pot.label,
        stroke: withAlpha(colours.get(l.pot.group) ?? '#5a5248', 0.8),
        width: 1.25,
        points: { show: false },
      });
      columns.push(l.taper.relativeDb);
    }
    for (const db of LEVEL_MARKS) {
      series.push({ label: `${db} dB`, stroke: GUIDE, width: 1, dash: [2, 4], points: { show: false } });
      columns.push(x.map(() => db));
    }
    // The series uPlot's cursor focus is on, -1 for none; an object the chart hooks update.
    const focus = { series: -1 };
    const update = (u: uPlot) => {
      const idx = u.cursor.idx;
      if (idx === null || idx === undefined || focus.series < 1 || focus.series > loaded.length) return setReadout(null);
      const v = u.data[focus.series]?.[idx];
      setReadout(
        v === null || v === undefined
          ? null
          : `${String(u.series[focus.series]!.label)} · volume ${u.data[0][idx]!.toFixed(1)} · ${v.toFixed(1)} dB`,
      );
    };
    const opts: Omit<Options, 'width' | 'height'> & { height?: number } = {
      height: 340,
      legend: { show: false },
      scales: { x: { time: false, range: [0, 10] }, y: { range: [-60, 2] } },
      axes: [axis('Volume knob (0–10)'), axis('Level at 1 kHz re full volume (dB)')],
      series,
      focus: { alpha: 0.35 },
      cursor: { focus: { prox: 24 }, drag: { x: false, y: false } },
      hooks: {
        setCursor: [(u) => update(u)],
        setSeries: [
          (u, sidx, o) => {
            const f = (o as { focus?: boolean } | undefined)?.focus;
            if (f !== undefined) focus.series = f && sidx !== null ? sidx : -1;
            update(u);
          },
        ],
      },
    };
    return { options: opts, data: [x, ...columns] as AlignedData };
  }, [loaded, colours]);

  return (
    <div>
      <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <p className="num min-h-5 text-sm text-ink-soft">
          {readout ?? <span className="font-sans">Point at a curve to read its part, knob setting and level.</span>}
        </p>
        <div className="flex flex-wrap gap-2">
          <Button
            size="sm"
            onClick={() =>
              downloadCsv(
                [
                  ['volume_dial', ...loaded.map((l) => l.pot.label)],
                  ...(loaded[0]?.taper.dial ?? []).map((d, i) => [d, ...loaded.map((l) => Number(l.taper.relativeDb[i]!.toFixed(4)))]),
                ],
                'loaded-taper.csv',
                conditions,
              )
            }
          >
            Curves as CSV
          </Button>
          <Button
            size="sm"
            onClick={() =>
              plotRef.current &&
              downloadPng(plotRef.current, 'loaded-taper.png', { title: 'Loaded volume taper: level against the volume knob', conditions })
            }
          >
            Chart as PNG
          </Button>
        </div>
      </div>
      <Plot
        options={options}
        data={data}
        label={`Loaded volume taper of ${loaded.length} pots with the ${pickupName}: level at 1 kHz relative to full volume against the volume knob, with guide lines at −6, −12 and −20 dB.`}
        onReady={(u) => (plotRef.current = u)}
      />
    </div>
  );
}

const TH = 'border-b border-paper-edge px-3 py-2 text-left text-xs font-semibold uppercase tracking-wide text-ink-soft';
const TD = 'border-b border-paper-edge/60 px-3 py-1.5';

export function LoadedTable({
  loaded,
  colours,
  groupLabel,
  conditions,
}: {
  loaded: PotLoaded[];
  colours: Map<string, string>;
  groupLabel: (p: TaperPot) => string;
  conditions: Condition[];
}) {
  return (
    <div>
      <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <h3 className="text-sm font-semibold text-ink">Where each pot reaches −6, −12 and −20 dB</h3>
        <Button
          size="sm"
          onClick={() =>
            downloadCsv(
              loaded.map((l) => ({
                part: l.pot.label,
                group: groupLabel(l.pot),
                dial_at_minus6_db: l.marks[0] ?? '',
                dial_at_minus12_db: l.marks[1] ?? '',
                dial_at_minus20_db: l.marks[2] ?? '',
                level_at_5_db: Number(l.taper.relativeDb[50]!.toFixed(4)),
              })),
              'loaded-taper-marks.csv',
              conditions,
            )
          }
        >
          Table as CSV
        </Button>
      </div>
      <div className="max-h-[24rem] overflow-auto rounded-md border border-paper-edge">
        <table className="w-full min-w-[560px] border-collapse text-sm">
          <caption className="sr-only">Knob settings at which each pot's loaded level falls to −6, −12 and −20 dB</caption>
          <thead className="sticky top-0 bg-paper-deep">
            <tr>
              <th scope="col" className={TH}>
                Part
              </th>
              <th scope="col" className={TH}>
                Group
              </th>
              <th scope="col" className={`${TH} text-right`}>
                Knob at −6 dB
              </th>
              <th scope="col" className={`${TH} text-right`}>
                at −12 dB
              </th>
              <th scope="col" className={`${TH} text-right`}>
                at −20 dB
              </th>
              <th scope="col" className={`${TH} text-right`}>
                Level at 5
              </th>
            </tr>
          </thead>
          <tbody>
            {loaded.map((l) => (
              <tr key={l.pot.partId}>
                <th scope="row" className={`${TD} text-left font-medium`}>
                  {l.pot.label}
                </th>
                <td className={`${TD} whitespace-nowrap`}>
                  <span
                    className="mr-2 inline-block size-2.5 rounded-full align-middle"
                    style={{ background: colours.get(l.pot.group) }}
                    aria-hidden="true"
                  />
                  {groupLabel(l.pot)}
                </td>
                {l.marks.map((m, i) => (
                  <td key={i} className={`${TD} num text-right`}>
                    {dial(m)}
                  </td>
                ))}
                <td className={`${TD} num text-right whitespace-nowrap`}>{l.taper.relativeDb[50]!.toFixed(1)} dB</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

export function MissingPickup() {
  return <Alert title="That measured pickup has no current coil fit">Choose another pickup; the loaded taper needs its R, L and C.</Alert>;
}
