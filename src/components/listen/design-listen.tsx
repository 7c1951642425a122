// Listen on a saved design's page and on a job's page: the Listen panel with a slider per knob of
// the design. With a second design (a job's wiring before the work) it is pinned as A and heard at
// the same knob settings (same knob id, else the same role: shared/audio/carry-knobs.ts), as the
// customer report's clips are rendered.
import { useId, useMemo, useState } from 'react';
import { carryKnobs } from '@shared/audio/carry-knobs';
import { getLayout, layoutKnobs } from '@shared/circuit/layouts';
import { instrumentChainOf, listenInstrumentOf, type ListenInstrument } from './listen-design';
import { ListenPanel } from './listen-panel';

/** A stored design as Listen needs it (a saved design, or a job's before wiring kept as a body). */
export interface ListenableDesign {
  label: string;
  layout: string;
  selector: number;
  options: Record<string, string>;
  values: Record<string, unknown>;
  knobs: Record<string, number> | null;
}

const asInstrument = (d: ListenableDesign, knobs: Record<string, number>): ListenInstrument => ({
  layout: d.layout,
  selector: d.selector,
  options: d.options,
  values: d.values as Record<string, number>,
  knobs,
});

function KnobRange({ label, value, onChange }: { label: string; value: number; onChange: (v: number) => void }) {
  const id = useId();
  return (
    <div>
      <div className="mb-1 flex items-baseline justify-between gap-2 text-sm">
        <label htmlFor={id} className="font-medium">
          {label}
        </label>
        <output htmlFor={id} className="num">
          {value.toFixed(1)}
        </output>
      </div>
      <input
        id={id}
        type="range"
        min={0}
        max={10}
        step={0.1}
        value={value}
        aria-valuetext={`${value.toFixed(1)} of 10`}
        onChange={(e) => onChange(Number(e.currentTarget.value))}
        className="block w-full accent-accent"
      />
    </div>
  );
}

export function DesignListen({ design, before, panelId }: { design: ListenableDesign; before?: ListenableDesign | null; panelId: string }) {
  const layout = getLayout(design.layout);
  const beforeLayout = before ? getLayout(before.layout) : undefined;
  const [knobs, setKnobs] = useState(() => (layout ? layoutKnobs(layout, design.knobs ?? {}) : {}));
  const designs = useMemo(() => {
    const b = listenInstrumentOf(asInstrument(design, knobs));
    const beforeKnobs = layout && beforeLayout ? carryKnobs(layout, knobs, beforeLayout) : null;
    const a = before && beforeKnobs ? listenInstrumentOf(asInstrument(before, beforeKnobs)) : null;
    return {
      A: a && before ? { ...a, label: `${before.label} (${a.label})` } : null,
      B: b ? { ...b, label: `${design.label} (${b.label})` } : null,
    };
  }, [design, before, knobs, layout, beforeLayout]);
  if (!layout) return <p className="text-sm text-fail">This design's layout ({design.layout}) is unknown here; it cannot be played.</p>;
  const present = before ?? design;
  return (
    <ListenPanel
      panelId={panelId}
      designs={designs}
      chainFor={(inputR, cable) => instrumentChainOf(asInstrument(present, {}), inputR, cable)}
      instrument={designs.A && designs.B ? `${designs.A.label} as A and ${designs.B.label} as B` : designs.B?.label}
    >
      <fieldset className="mt-3">
        <legend className="mb-1 text-sm font-medium">
          Knobs{before ? ' (both wirings at the same settings: the same knob, else the same role)' : ''}
        </legend>
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          {layout.knobs.map((k) => (
            <KnobRange key={k.id} label={k.name} value={knobs[k.id] ?? 10} onChange={(v) => setKnobs((old) => ({ ...old, [k.id]: v }))} />
          ))}
        </div>
        {!designs.B && <p className="mt-2 text-sm text-fail">This design cannot be solved with its saved values; it cannot be played.</p>}
      </fieldset>
    </ListenPanel>
  );
}
