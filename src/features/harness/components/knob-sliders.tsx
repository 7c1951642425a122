// One slider per knob of the layout on the 0–10 dial. Native range inputs: arrow keys move 0.1, Page Up /
// Page Down move 1, Home / End go to the stops; the value is announced as "6.5 of 10".
import { useId } from 'react';
import { formatKnob } from './harness-format';

const TICKS = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10];

function KnobSlider({ name, label, value, onChange }: { name: string; label: string; value: number; onChange: (v: number) => void }) {
  const id = useId();
  const listId = `${id}-ticks`;
  return (
    <div>
      <div className="mb-1 flex items-baseline justify-between gap-2">
        <label htmlFor={id} className="text-sm font-medium">
          {label}
        </label>
        <output htmlFor={id} className="num min-w-[3ch] rounded bg-paper-deep px-1.5 text-right text-base font-semibold" aria-live="off">
          {formatKnob(value)}
        </output>
      </div>
      <input
        id={id}
        name={name}
        type="range"
        min={0}
        max={10}
        step={0.1}
        value={value}
        list={listId}
        aria-valuetext={`${formatKnob(value)} of 10`}
        onChange={(e) => onChange(Number(e.currentTarget.value))}
        onKeyDown={(e) => {
          // Page keys move a whole number on the dial in every browser.
          if (e.key === 'PageUp' || e.key === 'PageDown') {
            e.preventDefault();
            const next = Math.min(10, Math.max(0, Math.round(value) + (e.key === 'PageUp' ? 1 : -1)));
            onChange(next);
          }
        }}
        className="block h-8 w-full cursor-pointer accent-accent"
      />
      <datalist id={listId}>
        {TICKS.map((t) => (
          <option key={t} value={t} />
        ))}
      </datalist>
      <div aria-hidden="true" className="num mt-0.5 flex justify-between px-[2px] text-[10px] text-ink-faint">
        {TICKS.map((t) => (
          <span key={t} className="w-3 text-center">
            {t}
          </span>
        ))}
      </div>
    </div>
  );
}

/** Sliders named "<knob name> knob" ("Volume knob", "Neck tone knob"); `knobs` holds every knob's setting. */
export function KnobSliders({
  defs,
  knobs,
  onChange,
}: {
  defs: readonly { id: string; name: string }[];
  knobs: Readonly<Record<string, number>>;
  onChange: (k: Record<string, number>) => void;
}) {
  return (
    <div className="space-y-4">
      {defs.map((d) => (
        <KnobSlider
          key={d.id}
          name={d.id}
          label={`${d.name} knob`}
          value={knobs[d.id] ?? 10}
          onChange={(v) => onChange({ ...knobs, [d.id]: v })}
        />
      ))}
      <p className="text-xs text-ink-soft">Arrow keys move 0.1, Page Up / Page Down a whole step, Home / End to the stops.</p>
    </div>
  );
}
