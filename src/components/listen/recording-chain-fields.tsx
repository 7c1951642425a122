// The recording chain a direct-input recording went through: the recorder's input resistance (kΩ)
// and the cable to it (m). The Listen panel and a job's before-and-after panel both ask for it.
import { useId } from 'react';

export function RecordingChainFields(props: {
  inputKOhm: string;
  cableM: string;
  onInputKOhm: (v: string) => void;
  onCableM: (v: string) => void;
  className?: string;
}) {
  const ids = { input: useId(), cable: useId() };
  return (
    <div className={props.className ?? 'flex flex-wrap gap-3'}>
      <label htmlFor={ids.input} className="grid gap-0.5 text-sm">
        Recorder input (kΩ)
        <input
          id={ids.input}
          type="number"
          min={1}
          max={100000}
          step="any"
          value={props.inputKOhm}
          onChange={(e) => props.onInputKOhm(e.currentTarget.value)}
          className="w-28 rounded border border-paper-edge px-2 py-1"
        />
      </label>
      <label htmlFor={ids.cable} className="grid gap-0.5 text-sm">
        Cable to the recorder (m)
        <input
          id={ids.cable}
          type="number"
          min={0}
          max={100}
          step="any"
          value={props.cableM}
          onChange={(e) => props.onCableM(e.currentTarget.value)}
          className="w-28 rounded border border-paper-edge px-2 py-1"
        />
      </label>
    </div>
  );
}
