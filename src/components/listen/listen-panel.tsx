// Listen: hear the design at the current knobs (on the Harness screen, a saved design's page and a job's page), with the built-in phrase (plucked strings made in
// the browser, no recording shipped) or the user's own direct-input recording. Knob moves crossfade
// within 50 ms; A/B switches between the pinned design and the editor at the same point of the
// phrase; loop; output level with a limiter; a level meter; a caution to start low.
import { useId, useMemo, useState, type ReactNode } from 'react';
import type { ResponseFunction } from '@shared/audio/impulse';
import { synthesizePhrase } from '@shared/audio/phrase';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Panel } from '@/components/ui/page-header';
import { RecordingChainFields } from './recording-chain-fields';
import { useListenAudio, type ListenDesign, type ListenSource, type Slot } from './use-listen-audio';

export interface ListenPanelProps {
  /** A: the pinned design (or null); B: the design in the editor. */
  designs: Record<Slot, ListenDesign | null>;
  /** The recording chain of an own recording: the present wiring at full volume and tone into the recorder's input. */
  chainFor: (inputR: number, cableLength: number) => ResponseFunction;
  /** Set when B is the whole instrument of the instrument panel (layout and selector position, in words). */
  instrument?: string;
  /** The panel's element id (default `harness-listen`, the Harness screen's). */
  panelId?: string;
  /** Extra controls shown at the top of the panel (the knobs of a saved design's or a job's page). */
  children?: ReactNode;
}

/** The channels of a decoded recording mixed to one track. */
function mono(buffer: AudioBuffer): Float32Array {
  const out = new Float32Array(buffer.length);
  for (let c = 0; c < buffer.numberOfChannels; c++) {
    const ch = buffer.getChannelData(c);
    for (let i = 0; i < out.length; i++) out[i]! += ch[i]! / buffer.numberOfChannels;
  }
  return out;
}

export function ListenPanel({ designs, chainFor, instrument, panelId = 'harness-listen', children }: ListenPanelProps) {
  const { state, play, stop, setActive, setLoop, setLevelDb } = useListenAudio(designs);
  const [sourceKind, setSourceKind] = useState<'phrase' | 'recording'>('phrase');
  const [file, setFile] = useState<File | null>(null);
  const [inputKOhm, setInputKOhm] = useState('1000');
  const [cableM, setCableM] = useState('3');
  const ids = { level: useId(), meter: useId(), file: useId(), caution: useId() };
  const inputR = Number(inputKOhm) * 1e3;
  const cable = Number(cableM);
  const chainOk = Number.isFinite(inputR) && inputR >= 1e3 && inputR <= 1e8 && Number.isFinite(cable) && cable >= 0 && cable <= 100;
  const canPlay = designs.B !== null && (sourceKind === 'phrase' || (file !== null && chainOk));

  const start = () =>
    play(async (sampleRate, ctx): Promise<ListenSource> => {
      if (sourceKind === 'phrase') {
        // one track per place along the string that either design has a pickup at
        const positions = [...new Set([...(designs.A?.pickups ?? []), ...(designs.B?.pickups ?? [])].map((p) => p.position))];
        return { kind: 'phrase', tracks: synthesizePhrase({ sampleRate, pickupPositions: positions }).tracks, positions };
      }
      const decoded = await ctx.decodeAudioData(await file!.arrayBuffer());
      return { kind: 'recording', track: mono(decoded), chain: chainFor(inputR, cable) };
    });

  const meterValue = state.meterDb === null ? -60 : Math.max(-60, Math.min(0, state.meterDb));
  const meterText = useMemo(
    () => (state.meterDb === null ? 'silent' : `${state.meterDb.toFixed(1).replace('-', '−')} dBFS`),
    [state.meterDb],
  );

  return (
    <Panel id={panelId} title="Listen">
      <p id={ids.caution} className="rounded border-l-4 border-marginal bg-marginal-tint px-3 py-2 text-sm text-ink">
        <strong>Start quiet.</strong> Set your speakers or headphones low before pressing Play and raise them slowly; loud sound, above all
        through headphones, harms hearing for good.
      </p>

      {children}

      {instrument && (
        <p className="mt-3 text-sm" data-testid="listen-instrument">
          Playing the whole instrument: <strong>{instrument}</strong>, at its knobs. Simplified: every pickup is a unit source and pickups
          differ only by their place along the string (and their own values); coils do not couple (no mutual inductance).
        </p>
      )}

      <div className="mt-3 grid gap-4 md:grid-cols-2">
        <fieldset>
          <legend className="mb-1 text-sm font-medium">What to play</legend>
          <label className="flex items-center gap-2 text-sm">
            <input
              type="radio"
              name="listen-source"
              value="phrase"
              checked={sourceKind === 'phrase'}
              onChange={() => setSourceKind('phrase')}
            />
            Built-in phrase (plucked strings, synthesised here)
          </label>
          <label className="mt-1 flex items-center gap-2 text-sm">
            <input
              type="radio"
              name="listen-source"
              value="recording"
              checked={sourceKind === 'recording'}
              onChange={() => setSourceKind('recording')}
            />
            My own direct-input recording
          </label>
          {sourceKind === 'recording' && (
            <div className="mt-2 grid gap-2 text-sm">
              <label htmlFor={ids.file}>Recording (any format this browser plays)</label>
              <input id={ids.file} type="file" accept="audio/*" onChange={(e) => setFile(e.currentTarget.files?.[0] ?? null)} />
              <p className="text-xs text-ink-soft">
                The recording already carries the instrument&apos;s present wiring. It is filtered by this design divided by that wiring at
                full volume and tone into your recorder (at most +12 dB of boost), so the pickup is not counted twice.
              </p>
              <RecordingChainFields inputKOhm={inputKOhm} cableM={cableM} onInputKOhm={setInputKOhm} onCableM={setCableM} />
              {!chainOk && <p className="text-xs text-fail">The recorder input goes from 1 kΩ to 100 MΩ and the cable from 0 to 100 m.</p>}
            </div>
          )}
        </fieldset>

        <div className="grid content-start gap-3">
          <div className="flex flex-wrap items-center gap-3">
            {state.playing ? (
              <Button onClick={stop}>Stop</Button>
            ) : (
              <Button variant="primary" onClick={() => void start()} disabled={!canPlay} aria-describedby={ids.caution}>
                Play
              </Button>
            )}
            <label className="flex items-center gap-2 text-sm">
              <input type="checkbox" checked={state.loop} onChange={(e) => setLoop(e.currentTarget.checked)} />
              Loop
            </label>
          </div>

          {designs.A && (
            <fieldset>
              <legend className="mb-1 text-sm font-medium">Hear</legend>
              <div className="flex flex-wrap gap-3 text-sm">
                <label className="flex items-center gap-2">
                  <input type="radio" name="listen-slot" value="A" checked={state.active === 'A'} onChange={() => setActive('A')} />
                  A: {designs.A.label}
                </label>
                <label className="flex items-center gap-2">
                  <input type="radio" name="listen-slot" value="B" checked={state.active === 'B'} onChange={() => setActive('B')} />
                  B: {designs.B?.label ?? 'the editor'}
                </label>
              </div>
              <p className="mt-1 text-xs text-ink-soft">Both play all the time; switching changes over at the same point of the phrase.</p>
            </fieldset>
          )}

          <div>
            <div className="flex items-baseline justify-between text-sm">
              <label htmlFor={ids.level} className="font-medium">
                Output level
              </label>
              <output htmlFor={ids.level} className="num">
                {state.levelDb.toFixed(0).replace('-', '−')} dB
              </output>
            </div>
            <input
              id={ids.level}
              type="range"
              min={-40}
              max={0}
              step={1}
              value={state.levelDb}
              aria-valuetext={`${state.levelDb} dB`}
              onChange={(e) => setLevelDb(Number(e.currentTarget.value))}
              className="block w-full accent-accent"
            />
            <p className="text-xs text-ink-soft">
              A limiter (20:1 above −6 dBFS) keeps peaks down; it is no substitute for a low starting level.
            </p>
          </div>

          <div className="flex items-center gap-2 text-sm">
            <label htmlFor={ids.meter}>Level meter</label>
            <meter id={ids.meter} min={-60} max={0} low={-18} high={-6} optimum={-24} value={meterValue} className="h-3 flex-1">
              {meterText}
            </meter>
            <span className="num w-24 text-right" data-testid="listen-meter-text">
              {state.playing ? meterText : 'stopped'}
            </span>
          </div>
        </div>
      </div>

      {state.error && (
        <div className="mt-3">
          <Alert title="Could not play">{state.error}</Alert>
        </div>
      )}
      <p className="mt-3 text-xs text-ink-soft">
        The phrase is plucked strings made by a plucked-string model (K. Karplus and A. Strong, 1983), heard by the pickup at its place
        along the string, then filtered by the design at the current knobs; moving a knob changes the sound within 50 ms.
        {instrument
          ? ' Each pickup hears the string at its own place and goes through its own transfer.'
          : ' One pickup, in the middle of the usual range.'}
      </p>
    </Panel>
  );
}
